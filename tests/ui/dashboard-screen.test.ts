import { afterEach, describe, expect, it } from 'vitest';
import { blessedTerminal, freezeSnapshot, openDashboard, useColour } from '../../src/ui/dashboard-screen.js';
import type { Dashboard } from '../../src/ui/dashboard-screen.js';
import { fakeMonitor, fakeTerminal, until } from './fake-terminal.js';
import { KINDS, runDiagnosis, seriesDiagnosis, steadyStore } from './run-fixture.js';

let open: Dashboard[] = [];
afterEach(() => {
  for (const dashboard of open) dashboard.close();
  open = [];
});

async function start(options: { cols?: number; rows?: number; env?: NodeJS.ProcessEnv; runs?: number } = {}) {
  const terminal = fakeTerminal(options.cols ?? 120, options.rows ?? 40);
  const monitors = Array.from({ length: options.runs ?? 1 }, (_, i) => fakeMonitor(`run-${i}.log`, steadyStore(500 + i)));
  const dashboard = await openDashboard({
    runs: monitors.map((monitor) => ({ label: monitor.label, monitor })),
    input: terminal.input,
    output: terminal.output,
    env: options.env ?? { TERM: 'xterm-256color' },
    frameMs: 20,
  });
  open.push(dashboard);
  const screenText = (): string => dashboard.text().join('\n');
  return { terminal, monitors, dashboard, screenText };
}

describe('openDashboard on a fake terminal', () => {
  it('draws the series names, the iteration and the verdict, and redraws when the diagnosis changes', async () => {
    const { monitors, screenText } = await start();
    monitors[0].setDiagnosis(runDiagnosis({ verdict: 'converging', records: 500, series: [seriesDiagnosis('res_p')] }));
    await until(() => screenText().includes('CONVERGING'), 'the verdict');
    const text = screenText();
    for (const name of ['res_p', 'res_u', 'res_T', 'nu_hot', 'iteration 500', 'run-0.log']) expect(text).toContain(name);
    monitors[0].setDiagnosis(runDiagnosis({ verdict: 'diverging', advice: 'stop now: res_p is rising' }));
    await until(() => screenText().includes('DIVERGING'), 'the new verdict');
    expect(screenText()).toContain('stop now: res_p is rising');
  });

  it('opens the help on ? and closes it on the next key', async () => {
    const { terminal, screenText } = await start();
    await until(() => screenText().includes('res_p'), 'a first frame');
    terminal.press('?');
    await until(() => screenText().includes('show or hide this help'), 'the help');
    terminal.press('x');
    await until(() => !screenText().includes('show or hide this help'), 'the help to close');
  });

  it('lays itself out again on resize, keeping every panel at 80×24', async () => {
    const { terminal, dashboard, screenText } = await start();
    await until(() => screenText().includes('res_p'), 'a first frame');
    terminal.resize(80, 24);
    await until(() => dashboard.text().length === 24 && dashboard.text()[0].length === 80, 'the new size');
    await until(() => screenText().includes('series') && screenText().includes('state changes'), 'the panels');
    for (const text of ['residuals', 'nu_hot', 'iteration 500', 'keys']) expect(screenText()).toContain(text);
  });

  it('quits on q: done resolves and the terminal leaves the alternate screen with the cursor shown', async () => {
    const { terminal, dashboard, screenText } = await start();
    await until(() => screenText().includes('res_p'), 'a first frame');
    terminal.press('q');
    await dashboard.done;
    const written = terminal.written();
    // xterm control sequences (XTerm Control Sequences, DEC private modes 1049 and 25).
    expect(written.lastIndexOf('\x1b[?1049l')).toBeGreaterThan(written.lastIndexOf('\x1b[?1049h'));
    expect(written.lastIndexOf('\x1b[?25h')).toBeGreaterThan(written.lastIndexOf('\x1b[?25l'));
    expect(terminal.input.isRaw).toBe(false);
  });

  it('writes colour escapes by default and none with NO_COLOR (https://no-color.org)', async () => {
    // SGR foreground/background colour parameters (ECMA-48 §8.3.117): 30–37, 40–47, 90–97, 38;5;n.
    const colourSgr = new RegExp(`${String.fromCharCode(27)}\\[[0-9;]*(?:3[0-7]|4[0-7]|9[0-7]|38;5;\\d+)m`);
    const coloured = await start();
    await until(() => coloured.screenText().includes('res_p'), 'a coloured frame');
    expect(colourSgr.test(coloured.terminal.written())).toBe(true);
    const plain = await start({ env: { TERM: 'xterm-256color', NO_COLOR: '1' } });
    await until(() => plain.screenText().includes('res_p'), 'a monochrome frame');
    expect(colourSgr.test(plain.terminal.written())).toBe(false);
  });

  it('freezes the view on pause while data keeps arriving, and catches up on resume', async () => {
    const { terminal, monitors, screenText } = await start();
    await until(() => screenText().includes('iteration 500'), 'a first frame');
    terminal.press(' ');
    await until(() => screenText().includes('PAUSED'), 'the pause');
    const store = monitors[0].store;
    store.add({ iteration: 501, values: new Map([['res_p', 1e-3]]) }, (name) => ({ name, kind: KINDS[name] ?? 'quantity' }));
    monitors[0].emitter.emit('records', 1);
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(screenText()).toContain('iteration 500');
    terminal.press(' ');
    await until(() => screenText().includes('iteration 501'), 'the resumed view');
  });

  it('opens on an overview of several runs; enter opens one and o goes back', async () => {
    const { terminal, monitors, screenText } = await start({ runs: 2 });
    monitors[1].setDiagnosis(runDiagnosis({ verdict: 'diverging' }));
    await until(() => screenText().includes('run-0.log') && screenText().includes('run-1.log'), 'the overview');
    expect(screenText().indexOf('run-1.log')).toBeLessThan(screenText().indexOf('run-0.log'));
    terminal.press('\r');
    await until(() => screenText().includes('iteration 501'), 'the worst run opened');
    terminal.press('o');
    await until(() => screenText().includes('worst first'), 'the overview again');
  });

  it('shows news about a run, such as a log that cannot be read', async () => {
    const { dashboard, screenText } = await start();
    await until(() => screenText().includes('res_p'), 'a first frame');
    dashboard.note(0, 'cannot read this log: permission denied');
    await until(() => screenText().includes('cannot read this log: permission denied'), 'the note');
  });

  it('restores the terminal and rejects done when drawing fails', async () => {
    const { terminal, monitors, dashboard, screenText } = await start();
    await until(() => screenText().includes('res_p'), 'a first frame');
    monitors[0].snapshotFailure = new Error('broken store');
    monitors[0].emitter.emit('records', 1);
    await expect(dashboard.done).rejects.toThrow('broken store');
    const written = terminal.written();
    expect(written.lastIndexOf('\x1b[?1049l')).toBeGreaterThan(written.lastIndexOf('\x1b[?1049h'));
  });
});

describe('terminal choices', () => {
  it.each([
    ['xterm-256color', 'xterm-256color'],
    ['tmux-256color', 'xterm-256color'],
    ['screen-256color', 'xterm-256color'],
    ['screen', 'xterm'],
    ['xterm', 'xterm'],
    [undefined, 'xterm'],
  ])('TERM=%s is drawn as %s (blessed cannot read current *-256color terminfo entries)', (term, expected) => {
    expect(blessedTerminal(term)).toBe(expected);
  });

  it.each([
    [{}, 256, true],
    [{ NO_COLOR: '1' }, 256, false],
    [{ NO_COLOR: '' }, 256, true],
    [{}, 2, false],
  ])('env %j with %i colours: colour %s', (env, colours, expected) => {
    expect(useColour(env, colours)).toBe(expected);
  });

  it('freezes a snapshot so later records do not change it', () => {
    const store = steadyStore(10);
    const frozen = freezeSnapshot(store.snapshot());
    store.add({ iteration: 11, values: new Map([['res_p', 5]]) }, (name) => ({ name, kind: 'residual' }));
    expect(frozen.series[0].length).toBe(10);
    expect(frozen.lastIteration).toBe(10);
    expect(store.snapshot().series[0].length).toBe(11);
  });
});

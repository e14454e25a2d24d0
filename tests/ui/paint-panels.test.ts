import { describe, expect, it } from 'vitest';
import { paintDashboard, paintHeader, paintTable, paintVerdict, splitAtWord, tableTitle } from '../../src/ui/paint-panels.js';
import { buildViewModel } from '../../src/ui/build-view-model.js';
import { buildOverviewModel } from '../../src/ui/build-overview-model.js';
import { initialViewState, KEY_HELP } from '../../src/ui/view-state.js';
import { lineWidth, plainText } from '../../src/ui/styled-text.js';
import type { SeriesRow } from '../../src/ui/dashboard-model.js';
import { pace, runDiagnosis, seriesDiagnosis, steadyStore } from './run-fixture.js';

const diagnosis = runDiagnosis({ verdict: 'converging', series: [seriesDiagnosis('res_p', { ordersPerKilo: 3, eta: 400 }), seriesDiagnosis('nu_hot', { mean: 4.519, halfWidth: 0.002 })] });
const model = (cols: number, rows: number, help = false) =>
  buildViewModel(diagnosis, steadyStore(500).snapshot(), { ...initialViewState(1), help }, pace({ linesPerSecond: 50, lastGrowthAt: 0 }), { cols, rows }, 2000, { label: 'case/run.log', parser: 'settle-kv', runCount: 1 });

describe('paintDashboard', () => {
  it.each([[80, 24], [120, 40], [200, 60]])('at %i×%i gives every panel exactly its interior, line by line', (cols, rows) => {
    const panels = paintDashboard(model(cols, rows), true);
    for (const panel of Object.values(panels)) {
      const boxed = panel.title !== undefined ? 2 : 0;
      expect(panel.lines).toHaveLength(panel.rect.height - boxed);
      for (const line of panel.lines) expect(lineWidth(line)).toBe(panel.rect.width - boxed);
    }
  });

  it('at 80×24 still shows the verdict, the series names, the iteration and the state of each series', () => {
    const panels = paintDashboard(model(80, 24), true);
    const text = Object.values(panels).flatMap((panel) => panel.lines.map(plainText)).join('\n');
    for (const expected of ['CONVERGING', 'res_p', 'res_u', 'nu_hot', 'iteration 500', 'converging', 'keys']) expect(text).toContain(expected);
  });

  it('overlays the help listing every key', () => {
    const help = paintDashboard(model(120, 40, true), true).help;
    expect(help).toBeDefined();
    const text = (help?.lines ?? []).map(plainText).join('\n');
    for (const entry of KEY_HELP) expect(text).toContain(entry.action.slice(0, 20));
  });

  it('replaces everything with a notice when the terminal is too small', () => {
    const panels = paintDashboard(model(50, 15), true);
    expect(Object.keys(panels)).toEqual(['notice']);
    expect(plainText(panels.notice?.lines[0] ?? [])).toContain('needs at least 60×18');
  });

  it('paints the overview of several runs', () => {
    const runs = [0, 1].map((i) => ({ label: `run-${i}.log`, diagnosis: runDiagnosis({ verdict: i === 0 ? 'converged' : 'diverging' }), snapshot: steadyStore(10).snapshot(), pace: pace() }));
    const panels = paintDashboard(buildOverviewModel(runs, initialViewState(2), { cols: 100, rows: 30 }, 0), true);
    const rows = (panels.overview?.lines ?? []).map(plainText);
    expect(rows[1]).toContain('run-1.log');
    expect(rows[1]).toContain('diverging');
    expect(rows[2]).toContain('run-0.log');
  });
});

describe('paintHeader', () => {
  it('cuts a long file name from the left, keeping its end', () => {
    const header = model(80, 24).header;
    const line = plainText(paintHeader({ ...header, file: '/scratch/projects/wing/very/long/path/to/case-17/run.log' }, 80));
    expect(line.startsWith('…')).toBe(true);
    expect(line).toContain('case-17/run.log');
    expect(line).toContain('iteration 500');
  });
});

describe('paintTable', () => {
  const row = (i: number, changes: Partial<SeriesRow> = {}): SeriesRow => ({
    name: `res_${i}`, kind: 'residual', style: i, hidden: false, cursor: false, state: 'converging', stateText: 'converging',
    last: '1e-3', trend: '-2.0/1k', etaIterations: '~400', etaTime: '3 min', settled: '', reason: 'falling', ...changes,
  });

  it('drops the least important columns first when narrow', () => {
    expect(plainText(paintTable([row(0)], 78, 3)[0])).toContain('settled');
    const narrow = plainText(paintTable([row(0)], 60, 3)[0]);
    expect(narrow).toContain('trend');
    expect(narrow).not.toContain('settled');
    expect(plainText(paintTable([row(0)], 160, 3)[0])).toContain('why');
  });

  it('scrolls to keep the cursor row in view', () => {
    const rows = Array.from({ length: 12 }, (_, i) => row(i, { cursor: i === 10 }));
    const text = paintTable(rows, 78, 5).map(plainText);
    expect(text).toHaveLength(5);
    expect(text.some((line) => line.includes('res_10'))).toBe(true);
    expect(text.some((line) => line.includes('res_0 '))).toBe(false);
  });
});

describe('paintHeader when narrow', () => {
  const header = model(80, 24).header;
  it('drops the reading pace before cutting the file name to its base name', () => {
    const full = { ...header, file: 'sample-logs/cavity-healthy.block.log', position: 'iteration 2 214', growth: 'grew 2 s ago' };
    const line = plainText(paintHeader(full, 80));
    expect(line).toMatch(/^…\/cavity-healthy\.block\.log · settle-kv · /);
    expect(line).toContain('iteration 2 214');
    expect(line).toContain('grew 2 s ago');
    expect(line).not.toContain('lines/s');
    // 120 columns have room for everything.
    const wide = plainText(paintHeader(full, 120));
    expect(wide).toContain('lines/s');
    expect(wide).toContain('settle-kv');
  });
  it('cuts a path at a folder boundary where it can', () => {
    const line = plainText(paintHeader({ ...header, file: '/scratch/projects/wing/very/long/path/to/case-17/run.log', position: 'time step 250 · t 1.250 · iteration 3 216' }, 80));
    expect(line).toMatch(/^…\/[\w/-]*case-17\/run\.log /);
  });
});

describe('paintVerdict', () => {
  const verdict = { state: 'converged' as const, headline: 'CONVERGED (confirmed)', advice: 'stop: all residuals 5.9 orders down and 4 quantities settled to 0.1 %', details: 'res_psi 6 decades below its peak' };
  it('lets the advice run on into the second line instead of cutting it, details after it', () => {
    const [first, second] = paintVerdict(verdict, 80).map(plainText);
    expect(first.length).toBe(80);
    expect(`${first.trim()} ${second.trim()}`).toContain(verdict.advice);
    expect(second).toContain('— res_psi 6 decades');
    expect(first.trimEnd().endsWith('…')).toBe(false);
  });
  it('keeps advice and details on their own lines when the advice fits', () => {
    const [first, second] = paintVerdict(verdict, 120).map(plainText);
    expect(first).toContain(verdict.advice);
    expect(second.trim()).toBe(verdict.details);
  });
});

describe('splitAtWord', () => {
  it.each([
    ['keep going: about 340 iterations', 40, ['keep going: about 340 iterations', '']],
    ['keep going: about 340 iterations', 17, ['keep going: about', '340 iterations']],
    ['keep going: about 340 iterations', 11, ['keep going:', 'about 340 iterations']],
    ['abcdefghij more', 5, ['abcd…', 'efghij more']],
    ['', 5, ['', '']],
  ])('%j in %i cells: %j', (text, width, expected) => {
    expect(splitAtWord(text, width)).toEqual(expected);
  });
});

describe('tableTitle', () => {
  const rows = (count: number, cursor: number) => Array.from({ length: count }, (_, i) => ({ cursor: i === cursor }));
  it('counts the series scrolled out of view', () => {
    expect(tableTitle(rows(3, 0), 5)).toBe(' series ');
    // 5 lines: titles and 4 series; 7 series with the cursor on the first: 3 below.
    expect(tableTitle(rows(7, 0), 5)).toBe(' series (7; 3 below: j k scroll) ');
    expect(tableTitle(rows(7, 5), 5)).toBe(' series (7; 2 above, 1 below: j k scroll) ');
    expect(tableTitle(rows(7, 6), 5)).toBe(' series (7; 3 above: j k scroll) ');
  });
});

import { Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { NO_TTY_NOTICE, plainWatch } from '../../src/ui/plain-watch.js';
import { EXIT_CODES } from '../../src/analysis/diagnosis.js';
import { fakeMonitor } from './fake-terminal.js';
import { change, runDiagnosis } from './run-fixture.js';

const collector = (): Writable & { text: () => string } => {
  let text = '';
  return Object.assign(new Writable({ write(chunk, _e, cb) { text += String(chunk); cb(); } }), { text: () => text });
};

describe('plainWatch (no terminal)', () => {
  it('says it will not draw, prints each state change as a plain line with the run name when several, and exits with the worst final verdict', async () => {
    const a = fakeMonitor('a.log');
    const b = fakeMonitor('b.log');
    a.run = () => {
      a.emitter.emit('state-change', change(40, 'res_p', 'undecided', 'converging'));
      return Promise.resolve(runDiagnosis({ verdict: 'converged', iterations: 900, advice: 'stop: all residuals 3 orders down' }));
    };
    b.run = () => {
      b.emitter.emit('state-change', change(70, null, 'converging', 'diverging'));
      return Promise.resolve(runDiagnosis({ verdict: 'diverging', iterations: 120, advice: 'stop now' }));
    };
    const stdout = collector();
    const stderr = collector();
    const code = await plainWatch([{ label: 'a.log', monitor: a }, { label: 'b.log', monitor: b }], stdout, stderr);
    expect(stderr.text()).toBe(NO_TTY_NOTICE);
    expect(stdout.text().split('\n')).toEqual([
      'a.log: it 40: res_p converging',
      'b.log: it 70: run diverging',
      'a.log: final verdict: converged at iteration 900: stop: all residuals 3 orders down',
      'b.log: final verdict: diverging at iteration 120: stop now',
      '',
    ]);
    expect(code).toBe(EXIT_CODES.diverging);
  });

  it('leaves the run name out for a single run', async () => {
    const a = fakeMonitor('a.log');
    a.run = () => {
      a.emitter.emit('state-change', change(40, 'res_p', 'undecided', 'stalled'));
      return Promise.resolve(runDiagnosis({ verdict: 'stalled', iterations: 500, advice: 'stop' }));
    };
    const stdout = collector();
    expect(await plainWatch([{ label: 'a.log', monitor: a }], stdout, collector())).toBe(EXIT_CODES.stalled);
    expect(stdout.text()).toBe('it 40: res_p stalled\nfinal verdict: stalled at iteration 500: stop\n');
  });
});

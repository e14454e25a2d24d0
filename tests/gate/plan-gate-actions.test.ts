import { describe, expect, it } from 'vitest';
import { FINAL_STATES, type State } from '../../src/analysis/diagnosis.js';
import { describeAction, planGateActions, reasonLine, type GateRequest } from '../../src/gate/plan-gate-actions.js';
import { shouldStopFollowing } from '../../src/gate/should-stop-following.js';
import { STOP_FILE_FIRST_LINE } from '../../src/gate/stop-file-text.js';
import { makeDiagnosis } from './make-diagnosis.js';

const request = (overrides: Partial<GateRequest> = {}): GateRequest => ({
  log: 'case/solver.log',
  on: FINAL_STATES,
  minIterations: 100,
  stopFile: 'case/STOP',
  signal: { pid: 4242, signal: 'SIGUSR1' },
  exec: 'notify "$SETTLE_VERDICT"',
  ...overrides,
});

describe('planGateActions', () => {
  it('plans every asked action, in order stop file, signal, command, for a final verdict', () => {
    const plan = planGateActions(makeDiagnosis({ verdict: 'converged', iterations: 1840 }), { kind: 'final' }, request());
    expect(plan.act).toBe(true);
    expect(plan.actions.map((a) => a.kind)).toEqual(['stop-file', 'signal', 'exec']);
    expect(plan.exitCode).toBe(0);
    expect(plan.endedBy).toBe('the verdict held for the confirmation window');
  });

  it('puts verdict, reason and log in the environment, never in the command line', () => {
    const plan = planGateActions(makeDiagnosis({ verdict: 'diverging', iterations: 260, reasons: ['res_p grew 4 decades in 60 iterations', 'res_u grew too'] }),
      { kind: 'final' }, request({ log: 'a b/$(rm -rf x).log' }));
    const exec = plan.actions.find((a) => a.kind === 'exec');
    expect(exec).toEqual({
      kind: 'exec',
      command: 'notify "$SETTLE_VERDICT"',
      env: {
        SETTLE_VERDICT: 'diverging',
        SETTLE_REASON: 'res_p grew 4 decades in 60 iterations; res_u grew too',
        SETTLE_ADVICE: 'stop: all residuals 3 orders down',
        SETTLE_LOG: 'a b/$(rm -rf x).log',
        SETTLE_EXIT_CODE: '30',
        SETTLE_ITERATION: '260',
      },
    });
  });

  it('writes verdict and reason into the stop file text', () => {
    const plan = planGateActions(makeDiagnosis({ verdict: 'stalled', iterations: 3000, reasons: ['res_T flat at 2.1e-4\nfor 800 iterations'] }),
      { kind: 'idle', idleMs: 30_000 }, request({ on: new Set<State>(['stalled']) }));
    const stop = plan.actions.find((a) => a.kind === 'stop-file');
    expect(stop?.kind === 'stop-file' && stop.content.split('\n')).toEqual([
      STOP_FILE_FIRST_LINE,
      'verdict: stalled',
      'exit-code: 20',
      'iteration: 3000',
      'log: case/solver.log',
      'ended-by: the log did not grow for 30s',
      'reason: res_T flat at 2.1e-4 for 800 iterations',
      'advice: stop: all residuals 3 orders down',
      '',
    ]);
  });

  it.each([
    ['before the minimum iterations', makeDiagnosis({ iterations: 99 }), request(), /fewer than --min-iterations 100/],
    ['with no iterations at all', makeDiagnosis({ iterations: Number.NaN }), request(), /no iterations logged/],
    ['for a verdict not in --on', makeDiagnosis({ verdict: 'converged' }), request({ on: new Set<State>(['diverging']) }), /not one of --on diverging/],
    ['for a stopping verdict not yet confirmed', makeDiagnosis({ verdict: 'diverging', final: false }), request(), /has not held for the confirmation window/],
    ['for converging under the default --on', makeDiagnosis({ verdict: 'converging', final: false }), request(), /not one of --on/],
    ['when no action was asked for', makeDiagnosis(), request({ stopFile: undefined, signal: undefined, exec: undefined }), /no action was asked/],
  ])('does nothing %s', (_label, diagnosis, req, why) => {
    const plan = planGateActions(diagnosis, { kind: 'final' }, req);
    expect(plan.act).toBe(false);
    expect(plan.actions).toEqual([]);
    expect(plan.why).toMatch(why);
    expect(plan.exitCode).toBe(diagnosis.exitCode);
  });

  it('acts on converging when --on asks for it and the watched process ended', () => {
    const plan = planGateActions(makeDiagnosis({ verdict: 'converging', final: false }), { kind: 'process-ended', pid: 4242 },
      request({ on: new Set<State>(['converging']), signal: undefined, exec: undefined }));
    expect(plan.act).toBe(true);
    expect(plan.endedBy).toBe('process 4242 ended');
    expect(plan.exitCode).toBe(10);
  });

  it('describes each action in one line', () => {
    const plan = planGateActions(makeDiagnosis(), { kind: 'final' }, request());
    expect(plan.actions.map(describeAction)).toEqual([
      'write stop file case/STOP',
      'send SIGUSR1 to process 4242',
      "run 'notify \"$SETTLE_VERDICT\"' with SETTLE_VERDICT, SETTLE_REASON, SETTLE_ADVICE, SETTLE_LOG, SETTLE_EXIT_CODE, SETTLE_ITERATION set",
    ]);
  });

  it('does not change the diagnosis it reads', () => {
    const diagnosis = Object.freeze(makeDiagnosis({ reasons: Object.freeze(['a']) as readonly string[] }));
    expect(() => planGateActions(diagnosis, { kind: 'final' }, request())).not.toThrow();
  });
});

describe('reasonLine', () => {
  it('falls back to the advice when there are no reasons', () => {
    expect(reasonLine(makeDiagnosis({ reasons: [], advice: 'keep going' }))).toBe('keep going');
  });
});

describe('shouldStopFollowing', () => {
  it.each([
    [true, 100, 100, true],
    [true, 99, 100, false],
    [false, 5000, 100, false],
    [true, Number.NaN, 0, false],
  ])('final=%s at iteration %d with minimum %d → %s', (final, iterations, min, expected) => {
    expect(shouldStopFollowing(makeDiagnosis({ final, iterations }), min)).toBe(expected);
  });
});

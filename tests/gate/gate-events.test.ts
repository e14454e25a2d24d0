import { describe, expect, it } from 'vitest';
import { actionEvent, stateChangeEvent, verdictEvent } from '../../src/gate/gate-events.js';
import { planGateActions } from '../../src/gate/plan-gate-actions.js';
import { FINAL_STATES } from '../../src/analysis/diagnosis.js';
import { makeDiagnosis } from './make-diagnosis.js';

describe('gate events (NDJSON)', () => {
  it('writes a state change as one line of JSON with the issue 5 fields', () => {
    const line = stateChangeEvent({ iteration: 4210, series: 'res_p', from: 'converging', to: 'stalled', text: 'it 4210: res_p stalled at 2.1e-4' });
    expect(line).not.toContain('\n');
    expect(JSON.parse(line)).toEqual({ type: 'state-change', iteration: 4210, series: 'res_p', from: 'converging', to: 'stalled', text: 'it 4210: res_p stalled at 2.1e-4' });
    expect(JSON.parse(stateChangeEvent({ iteration: 9, series: null, from: 'undecided', to: 'converging', text: 't' })).series).toBeNull();
  });

  it('writes the final verdict and the actions', () => {
    const diagnosis = makeDiagnosis({ verdict: 'diverging', iterations: 260 });
    const plan = planGateActions(diagnosis, { kind: 'final' }, { log: 'r.log', on: FINAL_STATES, minIterations: 100, stopFile: 'STOP' });
    expect(JSON.parse(actionEvent(plan.actions[0], { dryRun: true, ok: true }))).toEqual({ type: 'action', action: 'stop-file', description: 'write stop file STOP', dryRun: true, ok: true });
    expect(JSON.parse(verdictEvent(plan, { final: true, advice: diagnosis.advice, log: 'r.log' }))).toEqual({
      type: 'verdict', iteration: 260, verdict: 'diverging', exitCode: 30, final: true,
      endedBy: 'the verdict held for the confirmation window', reason: 'res_p down 3.2 decades from its peak',
      advice: diagnosis.advice, acted: true, why: expect.stringContaining('diverging'), log: 'r.log',
    });
  });
});

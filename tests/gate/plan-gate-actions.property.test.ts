/** Safety properties of the gate's planning, over arbitrary diagnoses and requests (fast-check,
 * seeded): whatever the inputs, nothing acts too early, on an unwanted verdict, or on an
 * unconfirmed stopping verdict, and the exit code is always the verdict's. */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EXIT_CODES, FINAL_STATES, type State } from '../../src/analysis/diagnosis.js';
import { planGateActions } from '../../src/gate/plan-gate-actions.js';
import type { GateEnding } from '../../src/gate/gate-ending.js';
import { makeDiagnosis } from './make-diagnosis.js';

const states = Object.keys(EXIT_CODES) as State[];
const state = fc.constantFrom(...states);
const ending: fc.Arbitrary<GateEnding> = fc.oneof(
  fc.constant({ kind: 'final' } as const),
  fc.integer({ min: 1, max: 1e7 }).map((idleMs) => ({ kind: 'idle', idleMs }) as const),
  fc.integer({ min: 2, max: 1e6 }).map((pid) => ({ kind: 'process-ended', pid }) as const),
  fc.constant({ kind: 'source-ended' } as const),
);

describe('planGateActions, for any input', () => {
  it('acts exactly when past the minimum, on a wanted verdict, confirmed when it is a stopping one', () => {
    fc.assert(fc.property(
      state, fc.boolean(), fc.oneof(fc.integer({ min: 0, max: 100_000 }), fc.constant(Number.NaN)),
      fc.integer({ min: 0, max: 10_000 }), fc.uniqueArray(state, { minLength: 1 }), ending,
      fc.option(fc.constant('STOP'), { nil: undefined }), fc.option(fc.constant('echo'), { nil: undefined }),
      (verdict, final, iterations, minIterations, on, why, stopFile, exec) => {
        const diagnosis = makeDiagnosis({ verdict, final, iterations });
        const plan = planGateActions(diagnosis, why, { log: 'r.log', on: new Set(on), minIterations, stopFile, exec });
        expect(plan.exitCode).toBe(EXIT_CODES[verdict]);
        if (plan.act) {
          expect(iterations).toBeGreaterThanOrEqual(minIterations);
          expect(on).toContain(verdict);
          if (FINAL_STATES.has(verdict)) expect(final).toBe(true);
          expect(plan.actions.length).toBe((stopFile ? 1 : 0) + (exec ? 1 : 0));
        } else {
          expect(plan.actions).toEqual([]);
          // ...and it does act whenever all of that holds and an action was asked for.
          const allowed = iterations >= minIterations && on.includes(verdict) && (!FINAL_STATES.has(verdict) || final);
          expect(allowed && (stopFile !== undefined || exec !== undefined)).toBe(false);
        }
      },
    ), { seed: 20261201, numRuns: 500 });
  });
});

/** Test helper: a RunDiagnosis built by hand (the shape of src/analysis/diagnosis.ts), so the gate's
 * pure parts can be tested without the analysis. Only what a test sets differs from a plain
 * "converged at iteration 500" diagnosis. */
import { EXIT_CODES, FINAL_STATES, type RunDiagnosis, type SeriesDiagnosis, type State } from '../../src/analysis/diagnosis.js';

export function makeSeries(overrides: Partial<SeriesDiagnosis> & { name: string }): SeriesDiagnosis {
  return { kind: 'residual', state: 'converged', last: 1e-4, reason: 'test series', ...overrides };
}

export function makeDiagnosis(overrides: Partial<RunDiagnosis> & { verdict?: State } = {}): RunDiagnosis {
  const verdict = overrides.verdict ?? 'converged';
  return {
    verdict,
    exitCode: EXIT_CODES[verdict],
    iterations: 500,
    records: 500,
    advice: 'stop: all residuals 3 orders down',
    reasons: ['res_p down 3.2 decades from its peak'],
    series: [makeSeries({ name: 'res_p' })],
    timeline: [],
    criteria: [],
    final: FINAL_STATES.has(verdict),
    ...overrides,
  };
}

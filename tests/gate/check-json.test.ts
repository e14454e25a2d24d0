/** Pins the `settle check --json` contract of issue 3 ("settle check"): key names and order,
 * optional fields only when they apply, non-finite numbers as strings. */
import { describe, expect, it } from 'vitest';
import { checkJson, runJson, seriesJson, OPTIONAL_SERIES_FIELDS } from '../../src/gate/check-json.js';
import { worstVerdict } from '../../src/gate/worst-verdict.js';
import { makeDiagnosis, makeSeries } from './make-diagnosis.js';
import type { State } from '../../src/analysis/diagnosis.js';

describe('check JSON, one log', () => {
  it('has exactly the contract keys, in order', () => {
    const json = runJson(makeDiagnosis());
    expect(Object.keys(json)).toEqual(['verdict', 'exitCode', 'iterations', 'advice', 'reasons', 'series']);
    expect(Object.keys(json.series[0])).toEqual(['name', 'kind', 'state', 'last']);
  });

  it('lists the optional series fields of the issue, in its order', () => {
    expect(OPTIONAL_SERIES_FIELDS).toEqual(['rho', 'ordersPerKilo', 'eta', 'period', 'amplitudeDecades', 'mean', 'halfWidth', 'iterationError']);
  });

  it('includes optional fields only when the analysis gave them, and never the others', () => {
    const residual = seriesJson(makeSeries({ name: 'res_p', rho: 0.99, ordersPerKilo: 4.4, eta: 800, dropDecades: 2.1, target: 1e-6, reason: 'x' }));
    expect(residual).toEqual({ name: 'res_p', kind: 'residual', state: 'converged', last: 1e-4, rho: 0.99, ordersPerKilo: 4.4, eta: 800 });
    const quantity = seriesJson(makeSeries({ name: 'cd', kind: 'quantity', last: 0.3312, mean: 0.3312, halfWidth: 0.0004, iterationError: 2e-6, settledFrom: 400, limit: 0.3311 }));
    expect(quantity).toEqual({ name: 'cd', kind: 'quantity', state: 'converged', last: 0.3312, mean: 0.3312, halfWidth: 0.0004, iterationError: 2e-6 });
    const cycling = seriesJson(makeSeries({ name: 'res_u', state: 'oscillating', period: 37, amplitudeDecades: 0.8 }));
    expect(cycling).toEqual({ name: 'res_u', kind: 'residual', state: 'oscillating', last: 1e-4, period: 37, amplitudeDecades: 0.8 });
  });

  it.each([
    [Number.NaN, 'NaN'],
    [Infinity, 'Infinity'],
    [-Infinity, '-Infinity'],
    [0, 0],
    [-1.5e-300, -1.5e-300],
  ])('prints %s as %j', (value, expected) => {
    const json = runJson(makeDiagnosis({ iterations: value, series: [makeSeries({ name: 'res_p', last: value, eta: value })] }));
    expect(json.iterations).toBe(expected);
    expect(json.series[0].last).toBe(expected);
    expect(json.series[0].eta).toBe(expected);
    expect(JSON.parse(JSON.stringify(json)).series[0].last).toBe(expected);
  });
});

describe('check JSON, several logs', () => {
  it('is {verdict, exitCode, runs:[{log, ...}]} with the worst verdict on top', () => {
    const json = checkJson([
      { log: 'a.log', diagnosis: makeDiagnosis({ verdict: 'converged' }) },
      { log: 'b.log', diagnosis: makeDiagnosis({ verdict: 'stalled' }) },
      { log: 'c.log', diagnosis: makeDiagnosis({ verdict: 'converging' }) },
    ]);
    expect(Object.keys(json)).toEqual(['verdict', 'exitCode', 'runs']);
    expect(json).toMatchObject({ verdict: 'stalled', exitCode: 20 });
    const runs = (json as unknown as { runs: Record<string, unknown>[] }).runs;
    expect(runs.map((run) => run.log)).toEqual(['a.log', 'b.log', 'c.log']);
    expect(Object.keys(runs[0])).toEqual(['log', 'verdict', 'exitCode', 'iterations', 'advice', 'reasons', 'series']);
  });

  it('is the plain one-log object for one log (no "log" key)', () => {
    const json = checkJson([{ log: 'a.log', diagnosis: makeDiagnosis() }]);
    expect(Object.keys(json)).not.toContain('log');
    expect(Object.keys(json)).not.toContain('runs');
  });
});

describe('worstVerdict', () => {
  // The order is SEVERITY of src/analysis/diagnosis.ts, which follows the exit codes of issue 3.
  it.each([
    [['converged', 'converging'], 'converging'],
    [['converging', 'undecided'], 'undecided'],
    [['undecided', 'stalled', 'converged'], 'stalled'],
    [['oscillating', 'stalled'], 'oscillating'],
    [['diverging', 'oscillating', 'converged'], 'diverging'],
    [['converged', 'failed', 'diverging'], 'failed'],
    [['converged'], 'converged'],
    [[], 'undecided'],
  ])('worst of %j is %s', (verdicts, expected) => {
    expect(worstVerdict(verdicts as State[])).toBe(expected);
  });
});

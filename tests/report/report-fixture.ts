/**
 * A run built by hand for report tests: a real SeriesStore fed with synthetic records (residuals
 * falling geometrically, one restart, a quantity settling to 2.0) and a RunDiagnosis written out
 * field by field, so the report's content can be checked without the analysis.
 */
import { SeriesStore } from '../../src/series/series-store.js';
import type { SeriesInfo } from '../../src/parse/log-record.js';
import type { RunDiagnosis } from '../../src/analysis/diagnosis.js';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import type { ReportInput, ReportRun } from '../../src/report/report-input.js';

export function fixtureRun(log = 'case/run.log'): ReportRun {
  const store = new SeriesStore();
  const kinds: Record<string, SeriesInfo> = {
    res_p: { name: 'res_p', kind: 'residual' },
    res_u: { name: 'res_u', kind: 'residual' },
    nu_hot: { name: 'nu_hot', kind: 'quantity', unit: '-' },
    cfl: { name: 'cfl', kind: 'other' },
  };
  for (let it = 1; it <= 600; it++) {
    const restart = it === 301;
    store.add({
      iteration: it,
      restart,
      values: new Map([
        ['res_p', 10 ** (-it / 100)],
        ['res_u', 0.5 * 10 ** (-it / 120)],
        ['nu_hot', 2 + 0.5 * Math.exp(-it / 40)],
        ['cfl', 0.8],
      ]),
    }, (name) => kinds[name]);
  }
  const diagnosis: RunDiagnosis = {
    verdict: 'converged',
    exitCode: 0,
    iterations: 600,
    records: 600,
    advice: 'Stop now: every residual and quantity meets the criteria.',
    reasons: ['res_p and res_u fell more than 3 decades', 'nu_hot settled to 0.01 % (95 %)'],
    series: [
      { name: 'res_p', kind: 'residual', state: 'converged', last: 1e-6, reason: 'fell 6 decades from its peak', rho: 0.977237, ordersPerKilo: 10, dropDecades: 6, target: 1e-5 },
      { name: 'res_u', kind: 'residual', state: 'converged', last: 5e-6, reason: 'fell 5 decades from its peak', rho: 0.980995, ordersPerKilo: 8.333, dropDecades: 5, target: 1e-5 },
      { name: 'nu_hot', kind: 'quantity', unit: '-', state: 'converged', last: 2.0000001, reason: 'settled from iteration 310', mean: 2.0001, halfWidth: 0.00012, settledFrom: 310, iterationError: 3.1e-7, limit: 2.0 },
      { name: 'cfl', kind: 'other', state: 'undecided', last: 0.8, reason: 'not judged' },
    ],
    timeline: [
      { iteration: 20, series: 'res_p', from: 'undecided', to: 'converging', text: 'it 20: res_p converging' },
      { iteration: 310, series: 'nu_hot', from: 'undecided', to: 'converged', text: 'it 310: nu_hot settled at 2.0001' },
      { iteration: 500, series: null, from: 'converging', to: 'converged', text: 'it 500: run converged' },
    ],
    criteria: [
      { description: 'res_p down 3 decades from peak', met: true, detail: '6 of 3 decades' },
      { description: 'nu_hot settled to 1e-3 relative', met: false, detail: '0.06 of 0.1 %' },
    ],
    final: true,
  };
  return { log, diagnosis, snapshot: store.snapshot(), parser: { id: 'settle-kv', explanation: 'spec settle-kv (built-in): name=value pairs matched' } };
}

export function fixtureInput(runs = [fixtureRun()]): ReportInput {
  return { runs, criteria: { ...DEFAULT_CRITERIA, target: 1e-5 }, version: '0.1.0' };
}

/**
 * A solver that prints only every 250th iteration (reviewer's defect 1): the trailing window then holds
 * fewer than two points, so there is no trend to report. Rates are left out, never NaN. Data: real
 * optimal-SOR iterations on the 2-D Poisson model problem (src/model-problems/poisson-2d.ts; Young
 * 1971), relabelled as iterations 250, 500, …
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_CRITERIA, type Criteria } from '../../src/analysis/criteria.js';
import { diagnoseRun } from '../../src/analysis/diagnose-run.js';
import type { RunDiagnosis } from '../../src/analysis/diagnosis.js';
import { solvePoisson2d } from '../../src/model-problems/poisson-2d.js';
import { follow, storeOf } from './run-fixtures.js';
import type { LogRecord } from '../../src/parse/log-record.js';

const history = solvePoisson2d({ n: 31, method: 'sor', iterations: 150 });
const records: LogRecord[] = history.map((h, i) => ({ iteration: (i + 1) * 250, values: new Map([['res', h.residualL2]]) }));
const kinds = { res: 'residual' } as const;

function nanFields(d: RunDiagnosis): string[] {
  return d.series.flatMap((s) => Object.entries(s).filter(([, v]) => typeof v === 'number' && Number.isNaN(v)).map(([k]) => `${s.name}.${k}`));
}

describe('a log printed every 250 iterations, window 200 (one point in the window)', () => {
  it('converged at the end: the window stretches back to 5 points, so the rate is real, never NaN', () => {
    const d = diagnoseRun(storeOf(records, kinds).snapshot(), { ...DEFAULT_CRITERIA, drop: 6 });
    expect(d.series[0].state).toBe('converged');
    expect(nanFields(d)).toEqual([]);
    expect(d.series[0].eta).toBe(0);
    // Decades per 1000 iterations over the last 5 printed points (4 gaps of 250 iterations), from the
    // data itself; Theil–Sen on a nearly geometric tail agrees within 25 %.
    const r = history.map((h) => h.residualL2);
    const expected = ((Math.log10(r[r.length - 5]) - Math.log10(r[r.length - 1])) / (4 * 250)) * 1000;
    expect(d.series[0].ordersPerKilo!).toBeGreaterThan(0.75 * expected);
    expect(d.series[0].ordersPerKilo!).toBeLessThan(1.25 * expected);
  });

  it('half-way, still falling: judged converging from the stretched window, not left undecided', () => {
    const d = diagnoseRun(storeOf(records.slice(0, 30), kinds).snapshot(), { ...DEFAULT_CRITERIA, drop: 12 });
    expect(d.series[0].state).toBe('converging');
    expect(d.series[0].ordersPerKilo!).toBeGreaterThan(0);
  });

  it('followed evaluation by evaluation: no NaN field at any evaluation', () => {
    for (const d of follow(records, kinds, { ...DEFAULT_CRITERIA, drop: 6 })) expect(nanFields(d), `record ${d.records}`).toEqual([]);
  });

  it('with the smallest window allowed (5 iterations) no NaN either', () => {
    const criteria: Criteria = { ...DEFAULT_CRITERIA, drop: 6, window: 5 };
    expect(nanFields(diagnoseRun(storeOf(records, kinds).snapshot(), criteria))).toEqual([]);
  });
});

describe('window minimum', () => {
  it.each([1, 4])('a window of %i iterations is refused (at least 5 points are needed for a trend)', (window) => {
    expect(() => diagnoseRun(storeOf(records, kinds).snapshot(), { ...DEFAULT_CRITERIA, window })).toThrow(/window: must be a whole number ≥ 5/);
  });
});

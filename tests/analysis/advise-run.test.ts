/**
 * Advice on a verdict held by the confirmation rule while no counted series shows that state any
 * more: it used to read the reason of a series that did not exist (a TypeError on the sample logs
 * cavity-diverging.kv.log and cavity-oscillating.table.log).
 */
import { describe, expect, it } from 'vitest';
import { adviseRun, type CountedSeries } from '../../src/analysis/advise-run.js';
import type { SeriesDiagnosis, State } from '../../src/analysis/diagnosis.js';

const rule = { drop: 3, qoiTol: 1e-3, counted: true };
const series = (name: string, state: State, reason: string, extra: Partial<SeriesDiagnosis> = {}): CountedSeries => ({
  diagnosis: { name, kind: 'residual', state, last: 1, reason, ...extra },
  rule,
});
// Now: the residual reads converged (or converging), a quantity looks oscillating, none diverging.
const now = [series('res_p', 'converged', 'res_p 4 decades below its peak'), { ...series('q', 'converging', 'q still moving'), diagnosis: { name: 'q', kind: 'quantity', state: 'converging', last: 2, reason: 'q still moving' } } as CountedSeries];

describe('adviseRun with a held verdict', () => {
  it.each([
    ['diverging', /^stop now: res_p grew 5 decades in 60 iterations$/],
    ['oscillating', /^stop: res_p cycles every 2 iterations; more iterations will not settle it/],
    ['stalled', /^stop: res_p flat at 1e-2; more iterations will not help/],
  ] as const)('%s: quotes the reason that raised the alarm', (verdict, advice) => {
    const held = { diverging: 'res_p grew 5 decades in 60 iterations', oscillating: 'res_p cycles every 2 iterations', stalled: 'res_p flat at 1e-2' };
    const out = adviseRun(verdict, now, undefined, 20, held);
    expect(out.advice).toMatch(advice);
    expect(out.reasons[0]).toBe(`confirmed earlier: ${held[verdict]}`);
  });

  it.each(['diverging', 'oscillating', 'stalled'] as const)('%s: a plain sentence when no reason was kept', (verdict) => {
    const out = adviseRun(verdict, now, undefined, 20);
    expect(out.advice).toMatch(/^stop/);
    expect(out.advice).not.toMatch(/undefined/);
  });

  it('a series still in the state is preferred to the kept reason', () => {
    const out = adviseRun('diverging', [series('res_u', 'diverging', 'res_u grew 4 decades in 30 iterations')], undefined, 20, { diverging: 'older' });
    expect(out.advice).toBe('stop now: res_u grew 4 decades in 30 iterations');
  });
});

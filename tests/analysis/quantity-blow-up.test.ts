/**
 * A monitored quantity blowing up (quantity-blow-up.ts): growth by 3 decades or more above the level it
 * held is divergence; a healthy rise from zero or from near zero to its working level is not. The
 * 3-decade threshold is the trade's rule of thumb for "a jump of several decades" (common practice,
 * methods.md). Tolerances: decades within 1e-9 (exact arithmetic on exact inputs).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { quantityBlowUp } from '../../src/analysis/quantity-blow-up.js';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import { diagnoseRun } from '../../src/analysis/diagnose-run.js';
import type { LogRecord, SeriesKind } from '../../src/parse/log-record.js';
import { storeOf } from './run-fixtures.js';

const iterationsOf = (n: number): Float64Array => Float64Array.from({ length: n }, (_, k) => k + 1);

describe('quantityBlowUp', () => {
  it('a level of 10 for 60 iterations, then ×10 per iteration for 6 iterations: 5 decades above the level', () => {
    const values = Float64Array.from({ length: 66 }, (_, k) => (k < 60 ? 10 : 10 * 10 ** (k - 59)));
    const b = quantityBlowUp(values, iterationsOf(66), 0, 66)!;
    expect(b).not.toBeNull();
    expect(b.scale).toBe(10);
    expect(b.decades).toBeCloseTo(6, 9);
    expect(b.fromValue).toBe(10);
    expect(b.fromIteration).toBe(60);
    expect(b.toIteration).toBe(66);
  });

  it.each([
    ['starts at exactly 0 and rises to 1', (k: number) => (k < 30 ? 0 : 1 - 0.9 ** (k - 30))],
    ['rises from 1e-8 to 1 geometrically (no established level)', (k: number) => Math.min(1, 1e-8 * 1.5 ** k)],
    ['one misprinted last sample 5 decades up', (k: number) => (k === 99 ? 1e5 : 1)],
    ['grows 100-fold only (2 decades)', (k: number) => (k < 80 ? 1 : 1.3 ** (k - 79))],
    ['all zeros', () => 0],
  ])('%s: not a blow-up', (_, f) => {
    const values = Float64Array.from({ length: 100 }, (_, k) => f(k));
    expect(quantityBlowUp(values, iterationsOf(100), 0, 100)).toBeNull();
  });

  it('a level of about 1e-4 crossing zero, then 0.5 and 1: 4 decades above its level is a blow-up (the sign does not matter)', () => {
    const values = Float64Array.from({ length: 100 }, (_, k) => (k === 99 ? 1 : k === 98 ? 0.5 : 1e-4 * Math.sin(k)));
    const b = quantityBlowUp(values, iterationsOf(100), 0, 100)!;
    expect(b).not.toBeNull();
    expect(b.decades).toBeGreaterThan(4);
    expect(b.toValue).toBe(1);
  });

  it('rounding noise around 0 that finds a working level of 0.1 and stays there is a change of regime, not a blow-up', () => {
    // A lift-like quantity: ~1e-10 noise while the flow is symmetric, then 0.1 for 30 iterations.
    const values = Float64Array.from({ length: 90 }, (_, k) => (k < 60 ? 1e-10 * (1 + 0.3 * Math.sin(k)) : 0.1));
    expect(quantityBlowUp(values, iterationsOf(90), 0, 90)).toBeNull();
  });

  it('the same noise followed by growth of ×1.5 per iteration that is still going on is a blow-up', () => {
    const values = Float64Array.from({ length: 120 }, (_, k) => (k < 60 ? 1e-10 * (1 + 0.3 * Math.sin(k)) : 1e-10 * 1.5 ** (k - 59)));
    const b = quantityBlowUp(values, iterationsOf(120), 0, 120)!;
    expect(b).not.toBeNull();
    expect(b.decades).toBeGreaterThan(9);
  });

  it.each([
    ['too few samples', 19],
    ['empty range', 0],
  ])('invalid: %s → null', (_, n) => {
    const values = Float64Array.from({ length: n }, (_, k) => (k < n - 3 ? 1 : 1e6));
    expect(quantityBlowUp(values, iterationsOf(n), 0, n)).toBeNull();
  });

  it('does not modify its inputs', () => {
    const values = Float64Array.from({ length: 66 }, (_, k) => (k < 60 ? 10 : 10 * 10 ** (k - 59)));
    const copy = values.slice();
    quantityBlowUp(values, iterationsOf(66), 0, 66);
    expect(values).toEqual(copy);
  });
});

/** The sample log of a crashing cavity run (sample-logs/cavity-crash.kv.log, written by the demo's
 * solver): u_max and v_max go from about 10 to 1e178 and 1e180 in the last 15 iterations. */
function readKvLog(path: string): { records: LogRecord[]; kinds: Record<string, SeriesKind> } {
  const records: LogRecord[] = [];
  const kinds: Record<string, SeriesKind> = {};
  for (const line of readFileSync(path, 'utf8').split('\n')) {
    if (!line.startsWith('iter=')) continue;
    const values = new Map<string, number>();
    let iteration = Number.NaN;
    for (const pair of line.trim().split(/\s+/)) {
      const [key, text] = pair.split('=');
      if (key === 'iter') iteration = Number(text);
      else {
        values.set(key, Number(text.replace(/^Inf$/, 'Infinity')));
        kinds[key] = key.startsWith('res_') ? 'residual' : 'quantity';
      }
    }
    records.push({ iteration, values });
  }
  return { records, kinds };
}

describe('a quantity blowing up in a run', () => {
  it('cavity-crash: u_max and v_max are diverging with the growth in plain words; nu_cold (starts at 0) is not', () => {
    const { records, kinds } = readKvLog(join(import.meta.dirname, '..', '..', 'sample-logs', 'cavity-crash.kv.log'));
    expect(records.length).toBe(90);
    const d = diagnoseRun(storeOf(records, kinds).snapshot(), DEFAULT_CRITERIA);
    const u = d.series.find((s) => s.name === 'u_max')!;
    const v = d.series.find((s) => s.name === 'v_max')!;
    const nuCold = d.series.find((s) => s.name === 'nu_cold')!;
    expect(u.state).toBe('diverging');
    expect(v.state).toBe('diverging');
    expect(u.reason).toMatch(/^u_max grew from [\d.]+ to 5\.3e178 in \d+ iterations/);
    expect(v.reason).toMatch(/^v_max grew from [\d.]+ to 8\.3e180 in \d+ iterations/);
    expect(nuCold.state).not.toBe('diverging');
    expect(d.verdict).toBe('failed');
  });
});

/**
 * The cycle-test memo (cycle-test-memo.ts): which evaluations may reuse a no-cycle result, and what
 * that does to a followed run. The rule is settle's own (for cost); expected values follow from it.
 */
import { describe, expect, it, vi } from 'vitest';
import { noCycleStillHolds, recordCycleTest, RETEST_FRACTION, type CycleTestClock } from '../../src/analysis/cycle-test-memo.js';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import { diagnoseRun } from '../../src/analysis/diagnose-run.js';
import { follow, recordsOf, seededNormal, storeOf } from './run-fixtures.js';

const calls = vi.hoisted(() => ({ count: 0 }));
vi.mock('../../src/analysis/detect-oscillation.js', async (importOriginal) => {
  const original = await importOriginal<typeof import('../../src/analysis/detect-oscillation.js')>();
  return {
    ...original,
    detectOscillation: (...args: Parameters<typeof original.detectOscillation>) => {
      calls.count++;
      return original.detectOscillation(...args);
    },
  };
});

const clockOf = (memo: { points: number; segment: number } | undefined, points: number, segment = 1): CycleTestClock => ({ slot: { memo }, points, segment });

describe('noCycleStillHolds', () => {
  it.each([
    ['no memo', false, undefined, 1000, 1, 800],
    ['same points', true, { points: 1000, segment: 1 }, 1000, 1, 800],
    ['199 new points, region 800 (a quarter is 200)', true, { points: 1000, segment: 1 }, 1199, 1, 800],
    ['200 new points, region 800', false, { points: 1000, segment: 1 }, 1200, 1, 800],
    ['after a restart (segment 2)', false, { points: 1000, segment: 1 }, 1001, 2, 800],
    ['points went back (a different store)', false, { points: 1000, segment: 1 }, 900, 1, 800],
    ['late in a long run: fewer new points than 1/32 of all', true, { points: 640_000, segment: 1 }, 659_999, 1, 800],
    ['late in a long run: 1/32 of all or more', false, { points: 640_000, segment: 1 }, 661_000, 1, 800],
  ] as const)('%s: reused %s', (_, expected, memo, points, segment, region) => {
    expect(noCycleStillHolds(clockOf(memo, points, segment), region)).toBe(expected);
  });

  it('without a clock nothing holds, and recording does nothing', () => {
    expect(noCycleStillHolds(undefined, 800)).toBe(false);
    expect(() => recordCycleTest(undefined, false)).not.toThrow();
  });

  it('remembers a test that found no cycle; forgets one that found a cycle', () => {
    const clock = clockOf(undefined, 5000, 3);
    recordCycleTest(clock, false);
    expect(clock.slot.memo).toEqual({ points: 5000, segment: 3 });
    recordCycleTest(clock, true);
    expect(clock.slot.memo).toBeUndefined();
    expect(RETEST_FRACTION).toBeGreaterThan(0);
  });
});

describe('a followed run with the memo', () => {
  // A residual flat at 1e-2 with noise of 0.05 decades (stalled, the cycle test runs at every
  // evaluation without the memo), then from iteration 20 000 a cycle of period 50 and ±0.5 decades.
  const normal = seededNormal(11);
  const onset = 20_000;
  const values = Array.from({ length: 30_000 }, (_, k) => 1e-2 * 10 ** (0.05 * normal() + (k >= onset ? 0.5 * Math.sin((2 * Math.PI * k) / 50) : 0)));
  const records = recordsOf([{ name: 'res_p', kind: 'residual', values }]);

  it('runs the cycle test on a fraction of the evaluations, and still reports the late cycle within 2 000 iterations (10 % of the run) of its onset', () => {
    calls.count = 0;
    const all = follow(records, { res_p: 'residual' }, DEFAULT_CRITERIA);
    const tests = calls.count;
    expect(all.length).toBeGreaterThan(300);
    expect(tests).toBeLessThan(0.5 * all.length);
    expect(all.some((d) => d.iterations < onset && d.verdict === 'stalled')).toBe(true);
    const first = all.find((d) => d.verdict === 'oscillating');
    expect(first).toBeDefined();
    expect(first!.iterations - onset).toBeLessThanOrEqual(2000);
    expect(first!.iterations).toBeGreaterThan(onset);
    // The end: the same verdict as a one-shot diagnosis of the same records.
    expect(all[all.length - 1].verdict).toBe(diagnoseRun(storeOf(records, { res_p: 'residual' }).snapshot(), DEFAULT_CRITERIA).verdict);
  });
});

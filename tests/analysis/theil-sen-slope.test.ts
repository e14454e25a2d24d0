import { describe, expect, it } from 'vitest';
import { medianInPlace, theilSenSlope } from '../../src/analysis/theil-sen-slope.js';
import { seededNormal } from './run-fixtures.js';

/** The batch twin: every pair, no thinning (Sen 1968, definition). */
function bruteForce(xs: number[], ys: number[]): number {
  const slopes: number[] = [];
  for (let i = 0; i < xs.length; i++) for (let j = i + 1; j < xs.length; j++) if (xs[j] !== xs[i]) slopes.push((ys[j] - ys[i]) / (xs[j] - xs[i]));
  slopes.sort((a, b) => a - b);
  const h = slopes.length >> 1;
  return slopes.length % 2 ? slopes[h] : (slopes[h - 1] + slopes[h]) / 2;
}

describe('theilSenSlope (Theil 1950; Sen 1968)', () => {
  it('recovers an exact line to 1e-12', () => {
    const xs = Array.from({ length: 30 }, (_, i) => i * 3);
    expect(theilSenSlope(xs, xs.map((x) => 2 - 0.25 * x), 0, 30)).toBeCloseTo(-0.25, 12);
  });

  it('ignores an outlier (breakdown point about 29 %, Sen 1968): the doc example gives 2', () => {
    expect(theilSenSlope([0, 1, 2, 3, 4], [0, 2, 4, 6, 100], 0, 5)).toBe(2); // 6 of 10 pair slopes are 2
  });

  it('equals the all-pairs definition when the window is not thinned (to 1e-12)', () => {
    const normal = seededNormal(7);
    const xs = Array.from({ length: 40 }, (_, i) => i + 1);
    const ys = xs.map((x) => -0.01 * x + 0.05 * normal());
    expect(theilSenSlope(xs, ys, 0, 40, 48)).toBeCloseTo(bruteForce(xs, ys), 12);
  });

  it('stays close to the all-pairs value when a long window is thinned to 48 points (within 10 % on a noisy decay)', () => {
    const normal = seededNormal(8);
    const xs = Array.from({ length: 400 }, (_, i) => i + 1);
    const ys = xs.map((x) => -0.01 * x + 0.1 * normal());
    expect(theilSenSlope(xs, ys, 0, 400) / bruteForce(xs, ys)).toBeGreaterThan(0.9);
    expect(theilSenSlope(xs, ys, 0, 400) / bruteForce(xs, ys)).toBeLessThan(1.1);
  });

  it.each([
    ['one point', [1], [1], 0, 1],
    ['empty range', [1, 2], [1, 2], 1, 1],
    ['all x equal', [3, 3, 3], [1, 2, 3], 0, 3],
    ['a NaN value', [1, 2, 3], [1, Number.NaN, 3], 0, 3],
    ['an infinite value', [1, 2, 3], [1, 2, Number.POSITIVE_INFINITY], 0, 3],
  ])('returns NaN for %s', (_label, xs, ys, from, to) => {
    expect(theilSenSlope(xs, ys, from, to)).toBeNaN();
  });

  it('does not change its inputs', () => {
    const xs = [1, 2, 3, 4];
    const ys = [4, 1, 3, 2];
    theilSenSlope(Object.freeze(xs), Object.freeze(ys), 0, 4);
    expect(ys).toEqual([4, 1, 3, 2]);
  });

  it('medianInPlace: odd, even, empty', () => {
    expect(medianInPlace(new Float64Array([3, 1, 2]))).toBe(2);
    expect(medianInPlace(new Float64Array([4, 1, 3, 2]))).toBe(2.5);
    expect(medianInPlace(new Float64Array(0))).toBeNaN();
  });
});

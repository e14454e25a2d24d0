/**
 * The geometric tail over blocks (remaining-change.ts), against the exact tail of a geometric series
 * (Ferziger & Perić 2002, "Computational Methods for Fluid Dynamics", 3rd ed., §5.7: the error left is
 * the tail of the geometric series of the changes).
 */
import { describe, expect, it } from 'vitest';
import { printedResolution, remainingChange } from '../../src/analysis/remaining-change.js';

const iterationsOf = (n: number): Float64Array => Float64Array.from({ length: n }, (_, k) => k + 1);
/** Printed with `digits` significant digits, as a solver log would. */
const printed = (x: number, digits: number): number => Number(x.toPrecision(digits));

describe('remainingChange', () => {
  it('a geometric approach: the tail equals limit − last (exact series; tolerance 1e-9 relative)', () => {
    const values = Float64Array.from({ length: 600 }, (_, k) => 2 + 0.5 * 0.99 ** k);
    const r = remainingChange(values, iterationsOf(600), 0, 600, 200)!;
    expect(r).not.toBeNull();
    expect(r.error / (2 - values[599])).toBeCloseTo(1, 9);
    expect(r.limit).toBeCloseTo(2, 9);
    expect(r.windowSpan).toBe(200);
  });

  it('printed with 7 digits, slow decay (ratio near 1, ill-conditioned): the true tail within a factor 2', () => {
    const values = Float64Array.from({ length: 2000 }, (_, k) => printed(19.3115 + 0.01 * 0.999 ** k, 7));
    const r = remainingChange(values, iterationsOf(2000), 0, 2000, 200)!;
    expect(r).not.toBeNull();
    const trueTail = 19.3115 - values[1999];
    expect(r.error / trueTail).toBeGreaterThan(0.5);
    expect(r.error / trueTail).toBeLessThan(2);
    expect(r.resolution).toBeCloseTo(1e-5, 10);
  });

  it('digits that stopped moving: no tail', () => {
    const values = Float64Array.from({ length: 400 }, (_, k) => printed(2.173343 + 0.3 * 0.9 ** k, 7));
    const r = remainingChange(values, iterationsOf(400), 0, 400, 200)!;
    expect(r.error).toBe(0);
    expect(r.windowChange).toBe(0);
  });

  it('printed with 7 digits, the last window moving 2 print units per block: no enormous tail from rounding (exact series: Ferziger & Perić 2002 §5.7; tolerance 2 print units)', () => {
    // Geometric approach with factor 0.986 per iteration, printed with 7 significant digits as the
    // demo log writer does: over the last 200 iterations it moves 6 print units (2 per block), so the
    // block ratio read from one window is 1 up to rounding. The longer window resolves the decay.
    const limit = 3.2541756;
    const values = Float64Array.from({ length: 1150 }, (_, k) => printed(limit + 1e-4 * 0.986 ** (k - 750), 7));
    const r = remainingChange(values, iterationsOf(1150), 20, 1150, 200)!;
    expect(r).not.toBeNull();
    expect(Math.abs(r.limit - limit)).toBeLessThanOrEqual(2e-6);
    expect(Math.abs(r.error)).toBeLessThanOrEqual(2e-6);
    expect(Math.abs(r.windowChange)).toBeLessThan(1e-5);
  });

  it.each([
    ['a linear drift (no decay: the tail is unbounded)', (k: number) => 1 + 1e-6 * k],
    ['a reversal (noise: not monotone)', (k: number) => 1 + 1e-6 * (k % 2)],
    ['a slow sine', (k: number) => 1 + 1e-3 * Math.sin(k / 30)],
  ])('%s gives null', (_, f) => {
    const values = Float64Array.from({ length: 400 }, (_, k) => f(k));
    expect(remainingChange(values, iterationsOf(400), 0, 400, 200)).toBeNull();
  });

  it.each([
    ['window not covered by the samples', 150, 200],
    ['too few samples', 11, 5],
    ['window of zero iterations', 400, 0],
    ['window NaN', 400, Number.NaN],
  ])('invalid: %s → null', (_, n, window) => {
    const values = Float64Array.from({ length: n }, (_, k) => 1 + 0.9 ** k);
    expect(remainingChange(values, iterationsOf(n), 0, n, window)).toBeNull();
  });

  it('does not modify its inputs', () => {
    const values = Float64Array.from({ length: 600 }, (_, k) => 2 + 0.5 * 0.99 ** k);
    const copy = values.slice();
    remainingChange(values, iterationsOf(600), 0, 600, 200);
    expect(values).toEqual(copy);
  });
});

describe('printedResolution (the last printed digit, from ECMAScript Number::toString)', () => {
  it.each([
    [2.17334, 1e-5],
    [120, 1],
    [1.2e-7, 1e-8],
    [-0.047, 1e-3],
    [3e21, 1e21],
    [0, 0],
    [Number.NaN, 0],
  ])('%s → %s', (value, expected) => {
    const got = printedResolution(value);
    if (expected === 0) expect(got).toBe(0);
    else expect(got / expected).toBeCloseTo(1, 12);
  });

  it('gives a quantity that did not change at all over the window the half-width of its last printed digit, not ±0', () => {
    const values = Float64Array.from({ length: 400 }, (_, k) => (k < 100 ? 2 + 1 / (k + 1) : 2.17334));
    const iterations = Float64Array.from({ length: 400 }, (_, k) => k + 1);
    const change = remainingChange(values, iterations, 0, 400, 200);
    expect(change).not.toBeNull();
    expect(change!.windowChange).toBe(0);
    expect(change!.resolution / 1e-5).toBeCloseTo(1, 12);
  });
});

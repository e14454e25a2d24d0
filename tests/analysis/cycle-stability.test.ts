/**
 * Cycle-to-cycle stability (cycle-stability.ts): exact values for sinusoids, whose period mean and
 * RMS are known in closed form (mean over a whole period = offset; RMS = amplitude/√2).
 */
import { describe, expect, it } from 'vitest';
import { cycleStability, refinePeriod } from '../../src/analysis/cycle-stability.js';

const sine = (n: number, period: number, offset: number, amplitude: number): Float64Array =>
  Float64Array.from({ length: n }, (_, k) => offset + amplitude * Math.sin((2 * Math.PI * k) / period + 0.3));

describe('cycleStability', () => {
  it('a pure sinusoid of fractional period: mean and amplitude exact, nothing changes (tolerance 1e-3 of the amplitude)', () => {
    const values = sine(400, 37.3, 0.002, 0.5);
    const s = cycleStability(values, 0, 400, 37.3)!;
    expect(Math.abs(s.mean - 0.002)).toBeLessThan(5e-4);
    expect(Math.abs(s.amplitude - 0.5)).toBeLessThan(5e-3);
    expect(s.lastChange).toBeLessThan(5e-4);
    expect(s.periods).toBe(3);
  });

  it('a cycle whose mean still settles geometrically: changes fall by the decay per period, tail as the geometric series', () => {
    // mean drifts as 0.1·e^(−k/40): per period of 50 the change falls by e^(−1.25)
    const values = Float64Array.from({ length: 500 }, (_, k) => 1 + 0.1 * Math.exp(-k / 40) + 0.2 * Math.sin((2 * Math.PI * k) / 50));
    const s = cycleStability(values, 0, 500, 50)!;
    expect(s.lastChange).toBeGreaterThan(0);
    const r = Math.exp(-1.25);
    expect(s.toCome / s.lastChange).toBeCloseTo(r / (1 - r), 1);
  });

  it.each([
    ['period below 2', 1.5],
    ['fewer than three whole periods', 150],
    ['period NaN', Number.NaN],
  ])('invalid: %s → null', (_, period) => {
    expect(cycleStability(sine(400, 50, 0, 1), 0, 400, period)).toBeNull();
  });
});

describe('refinePeriod (squared difference function; Ross et al. 1974)', () => {
  it('recovers a fractional period within 1 % from a guess 8 % off', () => {
    const values = sine(400, 37.3, 1, 0.2);
    expect(refinePeriod(values, 0, 400, 34.3) / 37.3).toBeCloseTo(1, 2);
  });

  it('returns the guess when the data are too short', () => {
    expect(refinePeriod(sine(60, 37.3, 1, 0.2), 0, 60, 37.3)).toBe(37.3);
  });
});

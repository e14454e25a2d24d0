import { describe, expect, it } from 'vitest';
import { mserTruncation } from '../../src/analysis/mser-truncation.js';
import { batchMeansInterval, studentTQuantile } from '../../src/analysis/batch-means-interval.js';
import { detectOscillation } from '../../src/analysis/detect-oscillation.js';
import { geometricIterationError } from '../../src/analysis/geometric-iteration-error.js';
import { seededNormal } from './run-fixtures.js';

function ar1(n: number, mu: number, phi: number, sigma: number, normal: () => number, start = mu): Float64Array {
  const x = new Float64Array(n);
  let previous = start;
  for (let k = 0; k < n; k++) {
    previous = mu + phi * (previous - mu) + sigma * normal();
    x[k] = previous;
  }
  return x;
}

describe('batchMeansInterval (Schmeiser 1982)', () => {
  it('uses the reference t quantile: t(19, 0.975) = 2.093 (Student t table, e.g. NIST/SEMATECH e-Handbook 1.3.6.7.2), to 1e-3', () => {
    expect(studentTQuantile(0.975, 19)).toBeCloseTo(2.093, 3);
  });

  it('hand-computed example: 4 batches of 2 → mean 2.5, s = 1.291, half-width t(3,0.975)=3.182 × s/2', () => {
    const r = batchMeansInterval([1, 1, 2, 2, 3, 3, 4, 4], 0, 8, 4)!;
    expect(r.mean).toBeCloseTo(2.5, 12);
    expect(r.batchSize).toBe(2);
    expect(r.halfWidth).toBeCloseTo(3.182 * Math.sqrt(5 / 3) / 2, 2); // t(3, .975) = 3.182 (table)
  });

  it('covers the true mean of AR(1), phi = 0.9, in 93–97 % of 1 000 seeded replications (methods.md check; expected 95 %)', () => {
    const normal = seededNormal(2024);
    let covered = 0;
    const replications = 1000;
    for (let r = 0; r < replications; r++) {
      // Start from the stationary distribution (sd = 1/sqrt(1 − 0.81)) so there is no transient.
      const x = ar1(4000, 10, 0.9, 1, normal, 10 + normal() / Math.sqrt(0.19));
      const mser = mserTruncation(x, 0, x.length)!;
      const interval = batchMeansInterval(x, mser.truncatePoints, x.length)!;
      if (Math.abs(interval.mean - 10) <= interval.halfWidth) covered++;
    }
    expect(covered / replications).toBeGreaterThanOrEqual(0.93);
    expect(covered / replications).toBeLessThanOrEqual(0.97);
  });

  it.each([
    ['one value', [1], 0, 1, 20, 0.95],
    ['empty range', [1, 2, 3], 2, 2, 20, 0.95],
    ['confidence 1', [1, 2, 3, 4], 0, 4, 2, 1],
    ['confidence 0', [1, 2, 3, 4], 0, 4, 2, 0],
  ])('returns null for %s', (_label, values, from, to, batches, confidence) => {
    expect(batchMeansInterval(values, from, to, batches, confidence)).toBeNull();
  });
});

describe('mserTruncation (White 1997; MSER-5, White, Cobb & Spratt 2000)', () => {
  it('truncates an exponential start-up transient of known length near that length', () => {
    // 5·exp(−k/40) falls below the noise (sd 0.1) after about 40·ln(50) ≈ 156 values.
    const normal = seededNormal(11);
    const x = Array.from({ length: 3000 }, (_, k) => 1 + 5 * Math.exp(-k / 40) + 0.1 * normal());
    const r = mserTruncation(x, 0, x.length)!;
    expect(r.settled).toBe(true);
    expect(r.truncatePoints).toBeGreaterThanOrEqual(100);
    expect(r.truncatePoints).toBeLessThanOrEqual(250);
  });

  it('keeps nearly everything of a stationary series (truncation below 10 %)', () => {
    const normal = seededNormal(12);
    const x = Array.from({ length: 2000 }, () => normal());
    const r = mserTruncation(x, 0, x.length)!;
    expect(r.settled).toBe(true);
    expect(r.truncatePoints).toBeLessThan(200);
  });

  it('says a steadily rising series has not settled (minimum in the second half)', () => {
    const x = Array.from({ length: 1000 }, (_, k) => k * 0.01);
    expect(mserTruncation(x, 0, x.length)!.settled).toBe(false);
  });

  it('returns null with fewer than 10 batches of 5', () => {
    expect(mserTruncation(new Float64Array(49), 0, 49)).toBeNull();
  });
});

describe('detectOscillation (ACF; Box, Jenkins & Reinsel, Time Series Analysis, ch. 2)', () => {
  it.each([17, 40, 73.5, 120])('recovers the period of a sinusoid on a trend within 5 % (period %s)', (period) => {
    const normal = seededNormal(Math.round(period));
    const x = Array.from({ length: 1500 }, (_, k) => -3 - 0.002 * k + 0.4 * Math.sin((2 * Math.PI * k) / period) + 0.05 * normal());
    const r = detectOscillation(x, 0, x.length)!;
    expect(r).not.toBeNull();
    expect(Math.abs(r.period / period - 1)).toBeLessThan(0.05);
    expect(r.amplitude).toBeGreaterThan(0.35); // 0.4 plus a little noise in the peak-to-peak
    expect(r.amplitude).toBeLessThan(0.55);
  });

  it('never calls white noise periodic (200 seeded series)', () => {
    for (let seed = 1; seed <= 200; seed++) {
      const normal = seededNormal(seed);
      const x = Array.from({ length: 600 }, () => normal());
      expect(detectOscillation(x, 0, x.length)).toBeNull();
    }
  });

  it('never calls a clean geometric decay periodic, in log or linear scale', () => {
    for (const rho of [0.9, 0.99, 0.999]) {
      const linear = Array.from({ length: 1000 }, (_, k) => rho ** k);
      expect(detectOscillation(linear.map(Math.log10), 0, 1000)).toBeNull();
      expect(detectOscillation(linear, 0, 1000)).toBeNull();
    }
  });

  it('needs three whole periods', () => {
    const x = Array.from({ length: 200 }, (_, k) => Math.sin((2 * Math.PI * k) / 90));
    expect(detectOscillation(x, 0, x.length)).toBeNull();
  });
});

describe('geometricIterationError (Ferziger & Perić 2002, §5.7; Aitken 1926)', () => {
  it('is exact on a geometric sequence: the doc example', () => {
    const r = geometricIterationError([2, 1.5, 1.25, 1.125, 1.0625], 0, 5)!;
    expect(r.lambda).toBeCloseTo(0.5, 12);
    expect(r.error).toBeCloseTo(-0.0625, 12);
    expect(r.limit).toBeCloseTo(1, 12);
  });

  it('estimates the limit of phi_n = 0.3312 + 0.2·0.97^n from 30 iterates to 1e-10', () => {
    const x = Array.from({ length: 30 }, (_, n) => 0.3312 + 0.2 * 0.97 ** n);
    const r = geometricIterationError(x, 0, 30)!;
    expect(r.limit).toBeCloseTo(0.3312, 10);
    expect(x[29] + r.error).toBeCloseTo(0.3312, 10);
  });

  it.each([
    ['oscillating approach (sign changes)', Array.from({ length: 20 }, (_, n) => 1 + (-0.5) ** n)],
    ['diverging ratio ≥ 1', Array.from({ length: 20 }, (_, n) => 1.1 ** n)],
    ['a constant', Array.from({ length: 20 }, () => 2)],
    ['noise', [1, 1.2, 0.9, 1.05, 0.97, 1.01, 1.3]],
    ['too short', [1, 0.5, 0.25]],
  ])('does not apply to %s', (_label, values) => {
    expect(geometricIterationError(values, 0, values.length)).toBeNull();
  });
});

/**
 * Autocovariance by FFT (Wiener–Khinchin; Cooley & Tukey 1965) against its batch twin, the direct
 * sums Σ d(i)·d(i+k); and the selection median against a full sort.
 */
import { describe, expect, it } from 'vitest';
import { autocovariance } from '../../src/analysis/autocovariance.js';
import { medianInPlace } from '../../src/analysis/theil-sen-slope.js';
import { seededNormal } from './run-fixtures.js';

const direct = (d: Float64Array, maxLag: number): number[] => Array.from({ length: maxLag + 1 }, (_, k) => {
  let s = 0;
  for (let i = 0; i + k < d.length; i++) s += d[i] * d[i + k];
  return s;
});

describe('autocovariance', () => {
  it.each([100, 1600, 2048])('n = %i: equals the direct sums to 1e-10 of c(0)', (n) => {
    const normal = seededNormal(n);
    const d = Float64Array.from({ length: n }, (_, k) => Math.sin(k / 7) + 0.3 * normal());
    const fast = autocovariance(d, Math.floor(n / 3));
    const slow = direct(d, Math.floor(n / 3));
    for (let k = 0; k < slow.length; k++) expect(Math.abs(fast[k] - slow[k])).toBeLessThan(1e-10 * slow[0]);
  });

  it.each([[0, 5, 1], [1, 5, 1], [3, -1, 1]])('n = %i, maxLag %i: %i value(s) or fewer, no throw', (n, maxLag, most) => {
    expect(autocovariance(new Float64Array(n), maxLag).length).toBeLessThanOrEqual(most);
  });
});

describe('medianInPlace (selection) against a sorted median', () => {
  it.each([1, 2, 7, 8, 1128])('n = %i', (n) => {
    const normal = seededNormal(n + 1);
    const values = Float64Array.from({ length: n }, () => Math.round(normal() * 4)); // ties on purpose
    const sorted = Array.from(values).sort((a, b) => a - b);
    const expected = n % 2 === 1 ? sorted[n >> 1] : (sorted[(n >> 1) - 1] + sorted[n >> 1]) / 2;
    expect(medianInPlace(values.slice()) + 0).toBe(expected + 0); // +0: Math.round gives -0 for small negatives
  });
});

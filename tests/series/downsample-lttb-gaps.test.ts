import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { downsampleLttbSorted } from '../../src/series/downsample-lttb.js';

const range = (n: number): number[] => Array.from({ length: n }, (_, i) => i);

// Properties of Largest-Triangle-Three-Buckets as defined by Steinarsson (2013), "Downsampling Time
// Series for Visual Representation", MSc thesis, University of Iceland, §4.2: first and last points
// kept, exactly `threshold` points out, one point per bucket, extremes of a bucket preferred.
describe('downsampleLttbSorted (Steinarsson 2013)', () => {
  it('returns every index when the range is not longer than the threshold', () => {
    expect(downsampleLttbSorted(range(5), range(5), 0, 5, 10)).toEqual([0, 1, 2, 3, 4]);
    expect(downsampleLttbSorted(range(10), range(10), 3, 6, 10)).toEqual([3, 4, 5]);
    expect(downsampleLttbSorted(range(10), range(10), 4, 4, 10)).toEqual([]);
  });

  it('keeps the first and last points and returns exactly threshold ascending indices', () => {
    fc.assert(fc.property(fc.integer({ min: 20, max: 2000 }), fc.integer({ min: 3, max: 19 }), fc.integer({ min: 0, max: 1000 }), (n, threshold, seed) => {
      const y = range(n).map((i) => Math.sin(i * 0.37 + seed) * (1 + (i % 7)));
      const picks = downsampleLttbSorted(range(n), y, 0, n, threshold);
      expect(picks).toHaveLength(threshold);
      expect(picks[0]).toBe(0);
      expect(picks[picks.length - 1]).toBe(n - 1);
      for (let i = 1; i < picks.length; i++) expect(picks[i]).toBeGreaterThan(picks[i - 1]);
    }));
  });

  it('keeps a lone spike that a stride sampler would miss', () => {
    const n = 1000;
    const y = range(n).map((i) => (i === 517 ? 50 : 0));
    expect(downsampleLttbSorted(range(n), y, 0, n, 20)).toContain(517);
  });

  it('never chooses a non-finite point by area, but leaves one where a whole bucket is a gap', () => {
    const n = 100;
    const y = range(n).map((i) => (i >= 40 && i < 60 ? Number.NaN : i));
    const picks = downsampleLttbSorted(range(n), y, 0, n, 12);
    const chosenY = picks.map((i) => y[i]);
    expect(chosenY.some((v) => Number.isNaN(v))).toBe(true);
    // Isolated non-finite points inside otherwise finite buckets are skipped.
    const sparse = range(n).map((i) => (i % 10 === 5 ? Number.NaN : i * i));
    expect(downsampleLttbSorted(range(n), sparse, 0, n, 12).every((i) => Number.isFinite(sparse[i]))).toBe(true);
  });

  it('with a threshold below 3 keeps the two ends', () => {
    expect(downsampleLttbSorted(range(50), range(50), 0, 50, 2)).toEqual([0, 49]);
    expect(downsampleLttbSorted(range(50), range(50), 10, 11, 2)).toEqual([10]);
  });

  it('does not change its inputs', () => {
    const x = Float64Array.from(range(300));
    const y = Float64Array.from(range(300).map((i) => Math.cos(i)));
    const before = [Array.from(x), Array.from(y)];
    downsampleLttbSorted(x, y, 0, 300, 30);
    expect([Array.from(x), Array.from(y)]).toEqual(before);
  });
});

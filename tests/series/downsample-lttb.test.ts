import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { downsampleLttbSorted } from '../../src/series/downsample-lttb.js';

/** The whole series as one range (the report's use: finite points, gaps split off beforehand). */
const downsampleLttbFinite = (x: ArrayLike<number>, y: ArrayLike<number>, threshold: number): number[] =>
  downsampleLttbSorted(x, y, 0, Math.min(x.length, y.length), threshold);

/**
 * LTTB written straight from its definition in Steinarsson (2013), "Downsampling Time Series for
 * Visual Representation", MSc thesis, University of Iceland, ch. 4 (Algorithm 4.1): buckets as
 * arrays, areas by the shoelace formula, no index arithmetic shared with the implementation.
 */
function referenceLttb(points: readonly [number, number][], threshold: number): [number, number][] {
  const n = points.length;
  if (n <= threshold) return [...points];
  const middle = points.slice(1, n - 1);
  const buckets: [number, number][][] = [];
  const every = (n - 2) / (threshold - 2);
  for (let b = 0; b < threshold - 2; b++) {
    buckets.push(middle.slice(Math.floor(b * every), b === threshold - 3 ? middle.length : Math.floor((b + 1) * every)));
  }
  buckets.push([points[n - 1]]);
  const out: [number, number][] = [points[0]];
  for (let b = 0; b < threshold - 2; b++) {
    const next = buckets[b + 1];
    const c: [number, number] = [next.reduce((s, p) => s + p[0], 0) / next.length, next.reduce((s, p) => s + p[1], 0) / next.length];
    const a = out[out.length - 1];
    let best = buckets[b][0];
    let bestArea = -1;
    for (const p of buckets[b]) {
      const area = Math.abs(a[0] * (p[1] - c[1]) + p[0] * (c[1] - a[1]) + c[0] * (a[1] - p[1])) / 2;
      if (area > bestArea) {
        bestArea = area;
        best = p;
      }
    }
    out.push(best);
  }
  out.push(points[n - 1]);
  return out;
}

describe('downsampleLttbFinite (Steinarsson 2013)', () => {
  it('keeps an isolated spike: [0,0,5,0,0] to 3 points keeps the 5 (worked by hand from the definition)', () => {
    expect(downsampleLttbFinite([0, 1, 2, 3, 4], [0, 0, 5, 0, 0], 3)).toEqual([0, 2, 4]);
  });

  it('returns every index when the series is no longer than the threshold', () => {
    expect(downsampleLttbFinite([1, 2, 3], [3, 1, 2], 3)).toEqual([0, 1, 2]);
    expect(downsampleLttbFinite([1, 2, 3], [3, 1, 2], 10)).toEqual([0, 1, 2]);
    expect(downsampleLttbFinite([], [], 5)).toEqual([]);
  });

  it('keeps only the ends below a threshold of 3', () => {
    expect(downsampleLttbFinite([1, 2, 3, 4], [1, 2, 3, 4], 2)).toEqual([0, 3]);
    expect(downsampleLttbFinite([1, 2, 3, 4], [1, 2, 3, 4], 1)).toEqual([0]);
    expect(downsampleLttbFinite([1, 2, 3, 4], [1, 2, 3, 4], 0)).toEqual([]);
  });

  it.each([[-1], [2.5], [Number.NaN]])('refuses threshold %s', (threshold) => {
    expect(() => downsampleLttbFinite([1, 2, 3, 4], [1, 2, 3, 4], threshold)).toThrow(/threshold/);
  });

  it('keeps the first and last points, the global maximum and minimum of isolated spikes, and returns exactly threshold ascending indices', () => {
    const n = 10_000;
    const x = Float64Array.from({ length: n }, (_, i) => i);
    const y = Float64Array.from({ length: n }, (_, i) => Math.sin(i / 300) * 0.1);
    y[3217] = 40; // spike up
    y[7001] = -35; // spike down
    const kept = downsampleLttbFinite(x, y, 200);
    expect(kept).toHaveLength(200);
    expect(kept[0]).toBe(0);
    expect(kept[kept.length - 1]).toBe(n - 1);
    expect(kept).toContain(3217);
    expect(kept).toContain(7001);
    for (let i = 1; i < kept.length; i++) expect(kept[i]).toBeGreaterThan(kept[i - 1]);
  });

  it('agrees with a reference written from the definition on random series (fast-check, 200 cases)', () => {
    fc.assert(fc.property(
      fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }), { minLength: 0, maxLength: 300 }),
      fc.integer({ min: 3, max: 60 }),
      (ys, threshold) => {
        const points = ys.map((y, i) => [i * 1.5, y] as [number, number]);
        const kept = downsampleLttbFinite(points.map((p) => p[0]), ys, threshold).map((i) => points[i]);
        expect(kept).toEqual(referenceLttb(points, threshold));
      },
    ), { numRuns: 200, seed: 20130601 });
  });

  it('does not mutate its inputs', () => {
    const x = Object.freeze([0, 1, 2, 3, 4, 5, 6]);
    const y = Object.freeze([1, 5, 2, 8, 3, 9, 4]);
    expect(() => downsampleLttbFinite(x, y, 4)).not.toThrow();
    expect(y).toEqual([1, 5, 2, 8, 3, 9, 4]);
  });
});

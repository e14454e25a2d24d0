/**
 * Largest-Triangle-Three-Buckets (LTTB) downsampling: choose, from a long series, at most
 * `threshold` points that keep its visual shape (peaks, dips, turns) on a chart of limited width.
 *
 * Method: Steinarsson (2013), "Downsampling Time Series for Visual Representation", MSc thesis,
 * University of Iceland, ch. 4. The first and last points are always kept. The n − 2 points between
 * are split into threshold − 2 buckets of (nearly) equal count. Bucket by bucket, from left to right,
 * the point kept is the one that forms the largest triangle with the point kept from the previous
 * bucket and the average point (mean x, mean y) of the next bucket; for the last bucket the "next
 * bucket" is the last point. Ties keep the earliest point.
 *
 * Preconditions (the caller's job; the report's charts split a series at gaps first): x ascending and
 * every x and y finite. For residuals on a log axis, pass log10 of the values so the triangles are
 * measured as they will be drawn.
 *
 * Cost: O(n) time (each point is visited twice), O(threshold) memory.
 *
 * Example: downsampleLttbFinite([0,1,2,3,4], [0,0,5,0,0], 3) → [0, 2, 4] (the spike survives).
 */

/** Indices (ascending) of the points LTTB keeps. Every index when n ≤ threshold; the first and last
 * only when threshold < 3. */
export function downsampleLttbFinite(x: ArrayLike<number>, y: ArrayLike<number>, threshold: number): number[] {
  const n = Math.min(x.length, y.length);
  if (!(Number.isInteger(threshold) && threshold >= 0)) throw new RangeError(`LTTB threshold must be a whole number ≥ 0, got ${threshold}`);
  if (n <= threshold) return Array.from({ length: n }, (_, i) => i);
  if (threshold === 0) return [];
  if (threshold < 3) return threshold === 1 ? [0] : [0, n - 1];

  const buckets = threshold - 2;
  const every = (n - 2) / buckets;
  /** First index of bucket b (bucket `buckets` starts at the last point). */
  const bucketStart = (b: number): number => (b >= buckets ? n - 1 : 1 + Math.floor(b * every));

  const kept = [0];
  let a = 0;
  for (let b = 0; b < buckets; b++) {
    const from = bucketStart(b);
    const to = bucketStart(b + 1);
    // Average of the next bucket (or the last point).
    const nextFrom = to;
    const nextTo = b + 1 >= buckets ? n : bucketStart(b + 2);
    let avgX = 0;
    let avgY = 0;
    for (let i = nextFrom; i < nextTo; i++) {
      avgX += x[i];
      avgY += y[i];
    }
    const count = nextTo - nextFrom;
    avgX /= count;
    avgY /= count;

    const ax = x[a];
    const ay = y[a];
    let best = from;
    let bestArea = -1;
    for (let i = from; i < to; i++) {
      // Twice the triangle's area; the factor does not change the choice.
      const area = Math.abs((ax - avgX) * (y[i] - ay) - (ax - x[i]) * (avgY - ay));
      if (area > bestArea) {
        bestArea = area;
        best = i;
      }
    }
    kept.push(best);
    a = best;
  }
  kept.push(n - 1);
  return kept;
}

/**
 * Largest-Triangle-Three-Buckets downsampling: pick, from a long series, the few points that keep
 * its visual shape on a chart of limited width.
 *
 * Method: Steinarsson (2013), "Downsampling Time Series for Visual Representation", MSc thesis,
 * University of Iceland, §4.2. The first and last points are kept; the points between are split
 * into `threshold − 2` buckets of equal count; from each bucket the point that forms the largest
 * triangle with the point chosen in the previous bucket and the average of the next bucket is kept.
 *
 * Gaps: non-finite y values (NaN; the dashboard maps ±Infinity and log10 of 0 to NaN first) are
 * never chosen by area; a bucket with no finite point yields one NaN point, so a gap as wide as a
 * bucket stays visible on the chart.
 *
 * Cost: O(n) time for n points in the range, O(threshold) memory.
 */

/** Indices (ascending, into `x`/`y`) of at most `threshold` points of the range [start, end) chosen by
 * LTTB. `x` must be ascending within the range. When the range has at most `threshold` points,
 * every index is returned; a threshold of 2 keeps the first and last points, 1 the first, 0 none.
 * Shared by the dashboard (braille charts) and the report (SVG charts).
 *
 * Example: downsampleLttbSorted([0,1,2,3,4], [0,0,5,0,0], 0, 5, 3) → [0, 2, 4] (the spike survives). */
export function downsampleLttbSorted(x: ArrayLike<number>, y: ArrayLike<number>, start: number, end: number, threshold: number): number[] {
  if (!(Number.isInteger(threshold) && threshold >= 0)) throw new RangeError(`LTTB threshold must be a whole number ≥ 0, got ${threshold}`);
  const n = end - start;
  if (n <= 0) return [];
  if (n <= threshold) return Array.from({ length: n }, (_, i) => start + i);
  if (threshold < 3) return [start, end - 1].slice(0, threshold);

  const chosen: number[] = [start];
  const bucketSize = (n - 2) / (threshold - 2);
  let previous = start;
  for (let bucket = 0; bucket < threshold - 2; bucket++) {
    const from = start + 1 + Math.floor(bucket * bucketSize);
    const to = Math.min(end - 1, start + 1 + Math.floor((bucket + 1) * bucketSize));
    // Average of the next bucket (the last point when this is the final bucket).
    const nextFrom = to;
    const nextTo = Math.min(end, start + 1 + Math.floor((bucket + 2) * bucketSize));
    let avgX = 0;
    let avgY = 0;
    let count = 0;
    for (let i = nextFrom; i < Math.max(nextTo, nextFrom + 1); i++) {
      if (Number.isFinite(y[i])) {
        avgX += x[i];
        avgY += y[i];
        count++;
      }
    }
    if (count > 0) {
      avgX /= count;
      avgY /= count;
    } else {
      avgX = x[Math.min(nextFrom, end - 1)];
      avgY = Number.isFinite(y[previous]) ? y[previous] : 0;
    }
    const px = x[previous];
    const py = Number.isFinite(y[previous]) ? y[previous] : avgY;
    let best = -1;
    let bestArea = -1;
    for (let i = from; i < to; i++) {
      const yi = y[i];
      if (!Number.isFinite(yi)) continue;
      const area = Math.abs((px - avgX) * (yi - py) - (px - x[i]) * (avgY - py));
      if (area > bestArea) {
        bestArea = area;
        best = i;
      }
    }
    if (best < 0) best = from; // an all-gap bucket: keep one of its (non-finite) points
    chosen.push(best);
    previous = best;
  }
  chosen.push(end - 1);
  return chosen;
}

/**
 * Theil–Sen slope: the median of the slopes between all pairs of points, a robust straight-line fit.
 *
 * Purpose: the trend of log10(residual) against iteration over a trailing window. Being a median, it
 * ignores isolated spikes (breakdown point about 29 %), which a least-squares slope does not.
 * Sources: Theil (1950), "A rank-invariant method of linear and polynomial regression analysis",
 * Proc. KNAW 53; Sen (1968), "Estimates of the regression coefficient based on Kendall's tau", JASA
 * 63(324):1379–1389.
 *
 * Cost: the window [from, to) is first thinned to at most `maxPoints` points spread evenly over it, so
 * one call costs O(m² log m) with m = min(to − from, maxPoints), whatever the window length.
 * `scratch`: the caller's working arrays (analysis-scratch.ts); without it, fresh arrays are used.
 * Pairs with equal x are skipped. Returns NaN when fewer than two distinct x remain or a value is not
 * finite.
 *
 * @example theilSenSlope([0, 1, 2, 3, 4], [0, 2, 4, 6, 100], 0, 5) // → 2 (the outlier does not pull it)
 */
import { scratchView, type AnalysisScratch } from './analysis-scratch.js';

export function theilSenSlope(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  from: number,
  to: number,
  maxPoints = 48,
  scratch?: AnalysisScratch,
): number {
  const length = to - from;
  if (!(length >= 2)) return Number.NaN;
  const m = Math.min(length, Math.max(2, Math.floor(maxPoints)));
  const px = scratchView(scratch?.slopeX, m);
  const py = scratchView(scratch?.slopeY, m);
  for (let k = 0; k < m; k++) {
    const index = from + (m === 1 ? 0 : Math.round((k * (length - 1)) / (m - 1)));
    px[k] = xs[index];
    py[k] = ys[index];
    if (!Number.isFinite(px[k]) || !Number.isFinite(py[k])) return Number.NaN;
  }
  const slopes = scratchView(scratch?.pairSlopes, (m * (m - 1)) / 2);
  let count = 0;
  for (let i = 0; i < m; i++) {
    for (let j = i + 1; j < m; j++) {
      const dx = px[j] - px[i];
      if (dx !== 0) slopes[count++] = (py[j] - py[i]) / dx;
    }
  }
  if (count === 0) return Number.NaN;
  return medianInPlace(slopes.subarray(0, count));
}

/** Median of a typed array, reordering it in place (Hoare's selection, "Find", Comm. ACM 4(7), 1961):
 * O(n) on average instead of a full sort. NaN when empty. */
export function medianInPlace(values: Float64Array): number {
  const n = values.length;
  if (n === 0) return Number.NaN;
  const half = n >> 1;
  const upper = select(values, half);
  if (n % 2 === 1) return upper;
  // The lower middle is the largest value left of `half` after selection.
  let lower = values[0];
  for (let i = 1; i < half; i++) if (values[i] > lower) lower = values[i];
  return (lower + upper) / 2;
}

/** The k-th smallest value; afterwards values[0..k) ≤ values[k] ≤ values(k..n). Deterministic pivot (middle). */
function select(values: Float64Array, k: number): number {
  let lo = 0, hi = values.length - 1;
  while (lo < hi) {
    const pivot = values[(lo + hi) >> 1];
    let i = lo, j = hi;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) {
        const t = values[i]; values[i] = values[j]; values[j] = t;
        i++; j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return values[k];
}

/**
 * Remaining iteration error of a quantity that converges monotonically and geometrically.
 *
 * Method (Ferziger & Perić 2002, §5.7): estimate the dominant eigenvalue of the iteration as
 * λ ≈ |φ(n) − φ(n−1)| / |φ(n−1) − φ(n−2)|, averaged over a window; the error left after iterate n is the
 * tail of the geometric series, (φ(n) − φ(n−1))·λ / (1 − λ) (signed: limit − current). The limit is also
 * estimated by Aitken's Δ² extrapolation of the last three iterates (Aitken 1926, "On Bernoulli's
 * numerical solution of algebraic equations", Proc. R. Soc. Edinburgh 46:289–305).
 * Valid only while convergence is monotone and geometric: every difference in the window has the
 * same sign and the successive ratios stay within a factor `tolerance` of each other and below 1.
 * Otherwise it returns null (and callers say the estimate does not apply).
 * Source: Ferziger & Perić (2002), "Computational Methods for Fluid Dynamics", 3rd ed., Springer, §5.7.
 *
 * Cost: O(w) for a window of w values (callers pass at most a few dozen).
 *
 * @example geometricIterationError([2, 1.5, 1.25, 1.125, 1.0625], 0, 5) // → { lambda: 0.5, error: -0.0625, limit: 1 }
 */
export interface GeometricEstimate {
  /** Dominant eigenvalue estimate (mean ratio of successive differences), in (0, 1). */
  readonly lambda: number;
  /** Estimated limit − current value. */
  readonly error: number;
  /** Aitken-extrapolated limit. */
  readonly limit: number;
}

export function geometricIterationError(values: ArrayLike<number>, from: number, to: number, tolerance = 0.1): GeometricEstimate | null {
  const n = to - from;
  if (n < 4) return null;
  let sign = 0;
  let ratioSum = 0;
  let ratioMin = Number.POSITIVE_INFINITY;
  let ratioMax = 0;
  for (let i = from + 2; i < to; i++) {
    const d1 = values[i - 1] - values[i - 2];
    const d2 = values[i] - values[i - 1];
    if (!Number.isFinite(d1) || !Number.isFinite(d2) || d1 === 0 || d2 === 0) return null;
    const s = Math.sign(d2);
    if (sign === 0) sign = Math.sign(d1);
    if (s !== sign || Math.sign(d1) !== sign) return null;
    const ratio = d2 / d1;
    ratioSum += ratio;
    ratioMin = Math.min(ratioMin, ratio);
    ratioMax = Math.max(ratioMax, ratio);
  }
  const lambda = ratioSum / (n - 2);
  if (!(lambda > 0 && lambda < 1) || ratioMax >= 1 || ratioMax > ratioMin * (1 + tolerance)) return null;
  const last = values[to - 1];
  const dLast = last - values[to - 2];
  const error = (dLast * lambda) / (1 - lambda);
  const x0 = values[to - 3], x1 = values[to - 2], x2 = last;
  const second = x2 - 2 * x1 + x0;
  const limit = second !== 0 ? x2 - ((x2 - x1) * (x2 - x1)) / second : last + error;
  return { lambda, error, limit };
}

/**
 * log10 of a residual, robust to what real histories contain: exact zeros and underflow map to a
 * floor of −300 decades (a residual that reached zero has, for every practical purpose, converged),
 * and a negative value (a signed residual printed by some solvers) is taken by magnitude.
 * Non-finite input gives NaN, so callers can tell a failed value from a small one. Cost O(1).
 */
export const LOG10_FLOOR = -300;

export function safeLog10(value: number): number {
  if (!Number.isFinite(value)) return Number.NaN;
  const magnitude = Math.abs(value);
  if (magnitude === 0) return LOG10_FLOOR;
  const log = Math.log10(magnitude);
  return log < LOG10_FLOOR ? LOG10_FLOOR : log;
}

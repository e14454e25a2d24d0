/**
 * A monitored quantity blowing up: its magnitude grew by orders of magnitude above the level it held.
 *
 * Method (settle's own rule, in the spirit of the residual rule "sustained growth or a jump of several
 * decades", DEVELOPERS.md "Methods and sources"): the reference scale is the median of the non-zero finite |value| over the
 * judged samples (start-up already excluded by the caller; exact zeros ignored, so a quantity that
 * starts at 0 has no scale of 0). The quantity is blowing up when
 * - its last |value| is at least 10^decades (default 10³) times that scale, and the one before is at
 *   least 10 times it (one misprinted sample is not a blow-up), and
 * - the scale is an established level: at least half of the non-zero samples lie within a decade of it.
 *   A quantity that rises from near zero to its working level sweeps through many decades and has no
 *   such level yet, so a healthy start-up rise is not called a blow-up.
 * - it is still growing: the last |value| is at least 10 times the |value| halfway between where it
 *   left its level and now. A quantity that moved once to a new level and stays there (a lift
 *   coefficient that was rounding noise around 0 in a symmetric start and then found its working
 *   value) is a change of regime, not a blow-up.
 * The growth is reported from the last sample at or below twice the scale (where it left its level).
 *
 * Cost: O(n) comparisons over at most BLOW_UP_SCALE_POINTS evenly spaced samples (a deterministic
 * subsample), plus O(m log m) for the median only when the fast test has already found the growth.
 * Pure; does not modify its inputs.
 *
 * @example quantityBlowUp(values, iterations, 0, values.length) // → { scale: 11.3, fromValue: 15.57, … } or null
 */
export interface QuantityBlowUp {
  /** Median of the non-zero |value| over the judged samples (the level it held). */
  readonly scale: number;
  /** Value where the growth started (last sample at or below twice the scale), and its iteration. */
  readonly fromValue: number;
  readonly fromIteration: number;
  /** Last value and its iteration. */
  readonly toValue: number;
  readonly toIteration: number;
  /** Decades of growth of the last |value| above the scale. */
  readonly decades: number;
}

/** Fewest judged samples before a blow-up is looked for. */
export const BLOW_UP_MIN_SAMPLES = 20;
/** Most samples used for the scale (evenly spaced; the last two are always looked at). */
export const BLOW_UP_SCALE_POINTS = 2048;

export function quantityBlowUp(values: ArrayLike<number>, iterations: ArrayLike<number>, from: number, to: number,
  decades = 3): QuantityBlowUp | null {
  if (!(to - from >= BLOW_UP_MIN_SAMPLES) || !(decades > 0)) return null;
  const last = Math.abs(values[to - 1]);
  const before = Math.abs(values[to - 2]);
  if (!Number.isFinite(last) || !(last > 0)) return null;
  const threshold = last / 10 ** decades;
  // Fast test without a median: the median of the non-zero |value| is at most `threshold` exactly when
  // at least half of the non-zero samples are at most `threshold`.
  const stride = Math.max(1, Math.ceil((to - from) / BLOW_UP_SCALE_POINTS));
  let nonZero = 0;
  let low = 0;
  for (let i = to - 1; i >= from; i -= stride) {
    const a = Math.abs(values[i]);
    if (!(a > 0) || !Number.isFinite(a)) continue;
    nonZero++;
    if (a <= threshold) low++;
  }
  if (nonZero === 0 || 2 * low < nonZero) return null;
  const sample = new Float64Array(nonZero);
  let k = 0;
  for (let i = to - 1; i >= from; i -= stride) {
    const a = Math.abs(values[i]);
    if (a > 0 && Number.isFinite(a)) sample[k++] = a;
  }
  sample.sort();
  const scale = nonZero % 2 === 1 ? sample[nonZero >> 1] : 0.5 * (sample[(nonZero >> 1) - 1] + sample[nonZero >> 1]);
  if (!(before >= 10 * scale)) return null;
  let level = 0;
  for (let j = 0; j < nonZero; j++) if (sample[j] >= scale / 10 && sample[j] <= scale * 10) level++;
  if (2 * level < nonZero) return null;
  let start = to - 1;
  while (start > from && !(Math.abs(values[start]) <= 2 * scale)) start--;
  const halfway = start + Math.floor((to - 1 - start) / 2);
  if (to - 1 - start > 2 && !(last >= 10 * Math.abs(values[halfway]))) return null;
  return {
    scale,
    fromValue: values[start],
    fromIteration: iterations[start],
    toValue: values[to - 1],
    toIteration: iterations[to - 1],
    decades: Math.log10(last / scale),
  };
}

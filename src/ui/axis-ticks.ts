/**
 * Tick positions for the dashboard's chart axes. Pure.
 */

/** Round numbers for a linear axis from `min` to `max`, about `count` of them: steps of 1, 2 or 5
 * times a power of ten, the step being (max − min)/count rounded to the nearest such number
 * (mantissa below 1.5 → 1, below 3 → 2, below 7 → 5, else 10). Method: "nice numbers", Heckbert
 * (1990), "Nice numbers for graph labels", Graphics Gems, pp. 61–63. Cost O(count). Returns [] for an
 * empty or non-finite range. */
export function niceTicks(min: number, max: number, count: number): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max) || max < min || count < 1) return [];
  if (max === min) return [min];
  const rough = (max - min) / Math.max(1, count);
  const power = 10 ** Math.floor(Math.log10(rough));
  const fraction = rough / power;
  const step = (fraction < 1.5 ? 1 : fraction < 3 ? 2 : fraction < 7 ? 5 : 10) * power;
  const ticks: number[] = [];
  for (let k = Math.ceil(min / step); k * step <= max + step * 1e-9; k++) {
    // Multiply rather than accumulate, so 0.1-steps do not drift (0.30000000000000004).
    ticks.push(Number((k * step).toPrecision(12)));
  }
  return ticks;
}

/** Whole decades (exponents) from `minExponent` to `maxExponent`, thinned to at most `maxCount`
 * labels by taking every k-th decade counted down from the top. */
export function decadeTicks(minExponent: number, maxExponent: number, maxCount: number): number[] {
  const low = Math.ceil(minExponent);
  const high = Math.floor(maxExponent);
  if (!(high >= low) || maxCount < 1) return [];
  const span = high - low;
  const step = Math.max(1, Math.ceil((span + 1) / maxCount));
  const ticks: number[] = [];
  for (let e = high; e >= low; e -= step) ticks.push(e);
  return ticks.reverse();
}

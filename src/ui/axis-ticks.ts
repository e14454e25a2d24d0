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

/** Decade steps a residual axis may use: 1, 2, 3 or 5 decades, then 10, 20, 50 times a power of ten. */
function decadeStep(minStep: number): number {
  for (const step of [1, 2, 3, 5]) if (step >= minStep) return step;
  for (let power = 10; ; power *= 10) for (const factor of [1, 2, 5]) if (factor * power >= minStep) return factor * power;
}

/** Whole decades (exponents) from `minExponent` to `maxExponent`, every `step`-th one, where `step` is
 * the smallest of 1, 2, 3, 5, 10, 20, 50, 100... decades that is at least `minStep`. The ticks are the
 * multiples of the step, so they sit evenly (1e0, 1e-3, 1e-6) and stay put as the range grows.
 * Cost O(number of ticks). */
export function decadeTicks(minExponent: number, maxExponent: number, minStep: number): number[] {
  const low = Math.ceil(minExponent);
  const high = Math.floor(maxExponent);
  if (!(high >= low) || !Number.isFinite(minStep)) return [];
  const step = decadeStep(Math.max(1, minStep));
  const ticks: number[] = [];
  for (let k = Math.ceil(low / step); k * step <= high; k++) ticks.push(k * step + 0);
  return ticks;
}

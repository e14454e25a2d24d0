/**
 * How much a monotonically converging quantity can still change: the geometric tail over blocks of
 * the trailing window, robust to values printed with few digits.
 *
 * Method (Ferziger & Perić 2002, §5.7, applied to blocks): split the trailing window of the quantity
 * into three equal blocks and take the changes c1, c2, c3 across them. When the iteration converges
 * geometrically with factor λ per iteration, the block changes form a geometric series with ratio
 * Λ = λ^L (L iterations per block), and the change still to come after the last block is its tail,
 * c3·Λ / (1 − Λ): the same formula Ferziger & Perić give per iteration, (φ(n) − φ(n−1))·λ/(1 − λ).
 * Working on blocks rather than on successive iterates keeps the estimate valid when the quantity is
 * printed with a fixed number of digits and many successive differences are exactly zero (there the
 * per-iteration ratio is undefined; see geometric-iteration-error.ts).
 * Conditions (validity of the geometric tail, ours to enforce): the window is monotone (no reversal
 * of sign among the non-zero successive differences), and the block changes do not grow
 * (|c3| ≤ |c2| ≤ |c1|); Λ is taken as the larger of c2/c1 and c3/c2 (the more cautious one) and must
 * be below 1, and stay below 1 when each change is allowed one print unit of rounding (the
 * resolution below): block changes of a few print units each (2, 2, 2) give a ratio of about 1 that
 * is only rounding and would extrapolate an enormous tail, so the decay counts as not shown at that
 * window. A last block with no change at all (the digits stopped moving) has no tail.
 * When the blocks of one window do not decay (a slow approach printed with few digits moves a few
 * print units per block and can look linear), windows of 2, 4, … 16 times the length are tried while
 * the judged history covers them and stays monotone; the first that decays gives the tail.
 * Also reported: the change over the whole window, the quantity the common-practice rule looks at
 * ("change over the last few hundred iterations below about 0.1 % to 1 % of its value", see
 * DEVELOPERS.md, "Methods and sources"), and the print resolution seen (the smallest non-zero step).
 * Source: Ferziger & Perić (2002), "Computational Methods for Fluid Dynamics", 3rd ed., Springer, §5.7.
 *
 * Cost: O(w) for the w samples of the window. Pure; does not modify its inputs.
 *
 * @example remainingChange(values, iterations, 0, values.length, 200) // → { error: -3.1e-5, limit: 2.48831, … } or null
 */
export interface RemainingChange {
  /** Estimated limit − last value (signed; 0 when the last block did not move). */
  readonly error: number;
  /** Last value + error. */
  readonly limit: number;
  /** Block ratio Λ used (0 when the last block did not move), for blocks of the window that decayed. */
  readonly ratio: number;
  /** Last value − first value over the window. */
  readonly windowChange: number;
  /** Iterations the window covers. */
  readonly windowSpan: number;
  /** Smallest non-zero |step| between successive samples in the window (0 when none moved). */
  readonly resolution: number;
}

/** Fewest samples in the window for the estimate. */
export const REMAINING_MIN_SAMPLES = 12;

/** Longest window tried, as a multiple of the trailing window. */
export const REMAINING_MAX_STRETCH = 16;

export function remainingChange(values: ArrayLike<number>, iterations: ArrayLike<number>, from: number, to: number,
  windowIterations: number): RemainingChange | null {
  if (!(to - from >= REMAINING_MIN_SAMPLES) || !(windowIterations > 0)) return null;
  const lastIteration = iterations[to - 1];
  const last = values[to - 1];
  const base = windowStart(iterations, from, to, windowIterations);
  if (base < 0) return null;
  const windowChange = last - values[base];
  const windowSpan = lastIteration - iterations[base];
  // A slow approach printed with few digits can look linear over one window (the block changes are a
  // few print units each); longer windows, while the history is covered and monotone, show the decay.
  for (let stretch = 1; stretch <= REMAINING_MAX_STRETCH; stretch *= 2) {
    const start = stretch === 1 ? base : windowStart(iterations, from, to, stretch * windowIterations);
    if (start < 0) return null;
    const tail = blockTail(values, start, to);
    if (tail === 'not monotone') return null;
    if (tail !== null) return { ...tail, limit: last + tail.error, windowChange, windowSpan };
  }
  return null;
}

/** Index of the first sample of the trailing window of `span` iterations; −1 when the judged samples do
 * not cover it or it holds too few samples. */
function windowStart(iterations: ArrayLike<number>, from: number, to: number, span: number): number {
  const lastIteration = iterations[to - 1];
  if (!(lastIteration - iterations[from] >= span)) return -1;
  let start = to - 1;
  while (start > from && iterations[start] > lastIteration - span) start--;
  return to - start < REMAINING_MIN_SAMPLES ? -1 : start;
}

/** The geometric tail over three blocks of [start, to); null when the blocks do not decay. */
function blockTail(values: ArrayLike<number>, start: number, to: number): { error: number; ratio: number; resolution: number } | null | 'not monotone' {
  let sign = 0;
  let resolution = Number.POSITIVE_INFINITY;
  for (let i = start + 1; i < to; i++) {
    const step = values[i] - values[i - 1];
    if (!Number.isFinite(step)) return 'not monotone';
    if (step === 0) continue;
    const s = Math.sign(step);
    if (sign !== 0 && s !== sign) return 'not monotone';
    sign = s;
    resolution = Math.min(resolution, Math.abs(step));
  }
  // Unchanged over the whole window: the value is known only to its last printed digit.
  if (sign === 0) return { error: 0, ratio: 0, resolution: printedResolution(values[to - 1]) };
  const last = values[to - 1];
  // Three blocks of equal length, anchored at the newest sample.
  const length = Math.floor((to - 1 - start) / 3);
  const b0 = to - 1 - 3 * length;
  const b1 = to - 1 - 2 * length;
  const b2 = to - 1 - length;
  const c1 = Math.abs(values[b1] - values[b0]);
  const c2 = Math.abs(values[b2] - values[b1]);
  const c3 = Math.abs(last - values[b2]);
  if (c3 > c2 || c2 > c1) return null;
  if (c3 === 0) return { error: 0, ratio: 0, resolution };
  // Each block change carries up to one print unit of rounding (half a unit at either end): the decay
  // is resolved only when it stays below 1 with that allowance. Changes of a few print units each
  // (2, 2, 2 units: a ratio of "1" that is only rounding) say nothing about it: a longer window will.
  if (!((c3 + resolution) / (c2 - resolution) < 1) || !((c2 + resolution) / (c1 - resolution) < 1) || !(c2 > resolution)) return null;
  const ratio = Math.max(c2 / c1, c3 / c2);
  if (!(ratio < 1)) return null;
  return { error: (sign * c3 * ratio) / (1 - ratio), ratio, resolution };
}

/**
 * The place value of the last significant digit of a number as it was most likely printed: the
 * shortest decimal that reads back as the same double (ECMAScript Number::toString), so 2.17334 →
 * 1e-5, 120 → 1, 1.2e-7 → 1e-8. A log that printed trailing zeros ("2.173340") had a finer
 * resolution than this; erring coarse keeps an interval honest. Non-finite or zero → 0.
 */
export function printedResolution(value: number): number {
  if (!Number.isFinite(value) || value === 0) return 0;
  const [mantissa, exponentText] = Math.abs(value).toString().split('e');
  const exponent = exponentText === undefined ? 0 : Number(exponentText);
  const point = mantissa.indexOf('.');
  const decimals = point < 0 ? 0 : mantissa.length - point - 1;
  return 10 ** (exponent - decimals);
}

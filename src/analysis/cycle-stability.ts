/**
 * Is a periodic state established? The mean and the amplitude of each of the last whole periods,
 * compared from one period to the next.
 *
 * Purpose: in a transient run driven periodically (or shedding periodically), the goal is a
 * statistically periodic state, not a constant (DEVELOPERS.md "Methods and sources", "Transient runs"). Such a state is
 * reached when the cycle repeats itself: its mean and its amplitude no longer change from period to
 * period (the cycle-to-cycle check of periodic computations, common practice: advance period by
 * period until period-averaged values and amplitudes repeat to a tolerance; the measure below and its
 * details are ours).
 * Method: the period P (in samples, fractional, from detect-oscillation.ts) cuts the newest samples
 * into whole periods counted back from the end. Over each, the mean and the RMS deviation about it are
 * integrals of the piecewise-linear interpolant of the samples (trapezoid rule with interpolated
 * fractional ends), so they do not depend on where the sampling points fall within the cycle. The
 * amplitude is √2 × RMS (the half peak-to-peak of a sinusoid). The change of the mean and of the
 * amplitude between consecutive periods, over the last `compare` pairs, is the measure of stability;
 * when those changes fall from pair to pair, their geometric tail estimates what is still to come.
 *
 * Cost: O(periods · P) = O(samples used). Pure; does not modify its inputs.
 *
 * @example cycleStability(values, 0, values.length, 50) // → { mean: 0.5, amplitude: 0.08, meanChange: 3e-5, amplitudeChange: 1e-5, periods: 4 }
 */
export interface CycleStability {
  /** Mean over the last whole period. */
  readonly mean: number;
  /** √2 × RMS deviation over the last whole period. */
  readonly amplitude: number;
  /** Largest |change of the period mean| between consecutive periods among the last pairs compared. */
  readonly meanChange: number;
  /** Largest |change of the amplitude| between consecutive periods among the last pairs compared. */
  readonly amplitudeChange: number;
  /** Larger of the mean and amplitude changes between the last two periods. */
  readonly lastChange: number;
  /** Change still to come when the period-to-period changes fall geometrically (their tail); Infinity
   * when they do not fall. */
  readonly toCome: number;
  /** Whole periods used. */
  readonly periods: number;
}

/** Pairs of consecutive periods compared by default (three periods). */
export const STABILITY_PAIRS = 2;

export function cycleStability(values: ArrayLike<number>, from: number, to: number, period: number, compare = STABILITY_PAIRS): CycleStability | null {
  if (!(period >= 2) || !(compare >= 1)) return null;
  const periods = compare + 1;
  // Sample positions are 0..n−1 relative to `from`; the last period ends at the last sample.
  const end = to - 1 - from;
  if (end - periods * period < 0) return null;
  const at = (x: number): number => {
    const i = Math.min(Math.floor(x), end - 1);
    const f = x - i;
    return values[from + i] * (1 - f) + values[from + i + 1] * f;
  };
  /** Integral of the interpolant of g(value) over [a, b]. */
  const integrate = (a: number, b: number, g: (v: number) => number): number => {
    let sum = 0;
    let x = a;
    let gx = g(at(a));
    for (let k = Math.floor(a) + 1; k < b; k++) {
      const gk = g(values[from + k]);
      sum += 0.5 * (gx + gk) * (k - x);
      x = k;
      gx = gk;
    }
    const gb = g(at(b));
    return sum + 0.5 * (gx + gb) * (b - x);
  };
  const means: number[] = [];
  const amplitudes: number[] = [];
  for (let p = periods; p >= 1; p--) {
    const a = end - p * period;
    const b = end - (p - 1) * period;
    const mean = integrate(a, b, (v) => v) / period;
    const square = integrate(a, b, (v) => (v - mean) * (v - mean)) / period;
    if (!Number.isFinite(mean) || !Number.isFinite(square)) return null;
    means.push(mean);
    amplitudes.push(Math.SQRT2 * Math.sqrt(Math.max(0, square)));
  }
  const changes: number[] = [];
  let meanChange = 0;
  let amplitudeChange = 0;
  for (let k = 1; k < periods; k++) {
    const dm = Math.abs(means[k] - means[k - 1]);
    const da = Math.abs(amplitudes[k] - amplitudes[k - 1]);
    meanChange = Math.max(meanChange, dm);
    amplitudeChange = Math.max(amplitudeChange, da);
    changes.push(Math.max(dm, da));
  }
  // Still to come, if the cycle settles geometrically (the changes between consecutive periods fall
  // by a steady ratio r): the tail last·r/(1 − r), as in Ferziger & Perić (2002) §5.7 per iteration.
  const lastChange = changes[changes.length - 1];
  const previous = changes.length >= 2 ? changes[changes.length - 2] : Number.NaN;
  const ratio = lastChange / previous;
  const toCome = ratio < 1 ? (lastChange * ratio) / (1 - ratio) : Number.POSITIVE_INFINITY;
  return { mean: means[periods - 1], amplitude: amplitudes[periods - 1], meanChange, amplitudeChange, lastChange, toCome, periods };
}

/**
 * Refines a period estimate by the squared-difference function: the P (in samples) that minimises the
 * mean of (x(i) − x(i−P))² over the newest samples, searched over whole lags within ±25 % of `guess`
 * and refined by a parabola through the minimum and its neighbours. The autocorrelation peak of
 * detect-oscillation.ts is biased when a start-up transient is still in the data; the difference
 * function looks only at the newest periods, where the cycle repeats best.
 * Method: the squared form of the average magnitude difference function, Ross, Shaffer, Cohen,
 * Freudberg & Manley (1974), "Average magnitude difference function pitch extractor", IEEE Trans.
 * Acoustics, Speech, and Signal Processing 22(5):353–362.
 * Cost: O(lags · P) with the compared span two periods long. Returns `guess` when too few samples.
 */
export function refinePeriod(values: ArrayLike<number>, from: number, to: number, guess: number): number {
  const low = Math.max(2, Math.floor(0.75 * guess));
  const high = Math.ceil(1.25 * guess);
  const span = Math.min(Math.round(2 * guess), to - from - high - 1);
  if (span < Math.max(4, guess)) return guess;
  const mismatch = (lag: number): number => {
    let sum = 0;
    for (let i = to - span; i < to; i++) {
      const d = values[i] - values[i - lag];
      sum += d * d;
    }
    return sum / span;
  };
  let best = low;
  let bestValue = Number.POSITIVE_INFINITY;
  const scores = new Float64Array(high - low + 1);
  for (let lag = low; lag <= high; lag++) {
    scores[lag - low] = mismatch(lag);
    if (scores[lag - low] < bestValue) {
      bestValue = scores[lag - low];
      best = lag;
    }
  }
  if (!Number.isFinite(bestValue)) return guess;
  if (best === low || best === high) return best;
  const a = scores[best - 1 - low], b = scores[best - low], c = scores[best + 1 - low];
  const denominator = a - 2 * b + c;
  const offset = denominator > 0 ? (0.5 * (a - c)) / denominator : 0;
  return best + Math.max(-0.5, Math.min(0.5, offset));
}

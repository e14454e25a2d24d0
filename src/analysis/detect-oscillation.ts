/**
 * Detects a persistent cycle in a series from its autocorrelation function (ACF).
 *
 * Method (Box, Jenkins & Reinsel, "Time Series Analysis: Forecasting and Control", ch. 2): remove the
 * least-squares line, compute the sample ACF r(k) for lags up to a third of the points, and look for
 * the first local maximum after the ACF has gone clearly negative. A cycle is reported when that peak
 * is at least `minPeak` (default 0.3; white noise of n points gives |r| ≈ 2/√n, 0.06 for 1 000 points)
 * and at least three whole periods fit the data. The peak lag is refined by a parabola through its
 * neighbours, so the period is not tied to whole samples. A smooth monotone curve (e.g. a geometric
 * decay) has no such ACF peak, so it is not called periodic.
 *
 * Amplitude: the median over whole periods of half the peak-to-peak range of the detrended values.
 * Cost: O(n log n) for n points (the autocovariance by FFT from 1 536 points on, directly below);
 * callers bound n (the run judge uses at most 2 048).
 */
import { autocovariance } from './autocovariance.js';
import { scratchView, type AnalysisScratch } from './analysis-scratch.js';

export interface Oscillation {
  /** Period in samples (fractional). */
  readonly period: number;
  /** ACF at the period, in (0, 1]. */
  readonly strength: number;
  /** Half of peak-to-peak of the detrended values, median over whole periods. */
  readonly amplitude: number;
  /** Mean of the raw values over the last whole periods. */
  readonly meanOverPeriods: number;
  /** Whole periods used for `meanOverPeriods`. */
  readonly periods: number;
}

/** `scratch`: the caller's working arrays (analysis-scratch.ts); without it, fresh arrays are used. */
export function detectOscillation(values: ArrayLike<number>, from: number, to: number, minPeak = 0.3,
  scratch?: AnalysisScratch): Oscillation | null {
  const n = to - from;
  if (n < 24) return null;
  // Detrend by least squares.
  let sx = 0, sy = 0, sxx = 0, sxy = 0;
  for (let i = 0; i < n; i++) {
    const y = values[from + i];
    if (!Number.isFinite(y)) return null;
    sx += i; sy += y; sxx += i * i; sxy += i * y;
  }
  const slope = (n * sxy - sx * sy) / (n * sxx - sx * sx);
  const intercept = (sy - slope * sx) / n;
  const d = scratchView(scratch?.detrended, n);
  let variance = 0;
  let scale = 0;
  for (let i = 0; i < n; i++) {
    d[i] = values[from + i] - (intercept + slope * i);
    variance += d[i] * d[i];
    scale = Math.max(scale, Math.abs(values[from + i]));
  }
  // A series that is a straight line to rounding has nothing periodic in it.
  if (variance <= n * (1e-12 * Math.max(scale, 1e-300)) ** 2) return null;
  const maxLag = Math.floor(n / 3);
  const acf = autocovariance(d, Math.min(maxLag + 1, n - 1), scratch);
  for (let k = 0; k < acf.length; k++) acf[k] /= variance;
  let wentNegative = false;
  for (let k = 1; k <= maxLag; k++) {
    if (acf[k] < -0.1) wentNegative = true;
    if (!wentNegative) continue;
    if (acf[k] >= acf[k - 1] && acf[k] >= acf[k + 1] && acf[k] >= minPeak) {
      const denominator = acf[k - 1] - 2 * acf[k] + acf[k + 1];
      const offset = denominator < 0 ? (0.5 * (acf[k - 1] - acf[k + 1])) / denominator : 0;
      const period = k + Math.max(-0.5, Math.min(0.5, offset));
      const periods = Math.floor(n / period);
      if (periods < 3) return null;
      return { period, strength: acf[k], ...amplitudeAndMean(values, from, to, d, period, periods) };
    }
  }
  return null;
}

function amplitudeAndMean(values: ArrayLike<number>, from: number, to: number, d: Float64Array, period: number, periods: number): { amplitude: number; meanOverPeriods: number; periods: number } {
  const n = to - from;
  const halves: number[] = [];
  for (let p = 0; p < periods; p++) {
    const a = Math.round(n - (p + 1) * period);
    const b = Math.round(n - p * period);
    let lo = Number.POSITIVE_INFINITY, hi = Number.NEGATIVE_INFINITY;
    for (let i = Math.max(0, a); i < b; i++) {
      if (d[i] < lo) lo = d[i];
      if (d[i] > hi) hi = d[i];
    }
    halves.push((hi - lo) / 2);
  }
  halves.sort((x, y) => x - y);
  const amplitude = halves[halves.length >> 1];
  const start = Math.max(0, Math.round(n - periods * period));
  let sum = 0;
  for (let i = start; i < n; i++) sum += values[from + i];
  return { amplitude, meanOverPeriods: sum / (n - start), periods };
}

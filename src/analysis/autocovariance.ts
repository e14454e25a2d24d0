/**
 * Sample autocovariance sums c(k) = Σ_i d(i)·d(i+k), k = 0..maxLag, of a (detrended) series.
 *
 * Method: by the Wiener–Khinchin relation the autocovariance is the inverse Fourier transform of the
 * power spectrum; zero-padding to at least 2n makes the circular correlation equal the linear one
 * (Box, Jenkins & Reinsel, "Time Series Analysis: Forecasting and Control", ch. 2 for the sample
 * ACF; Cooley & Tukey (1965), "An algorithm for the machine calculation of complex Fourier series",
 * Math. Comp. 19:297–301, for the radix-2 FFT). Below 1 536 points the direct sums are as cheap in practice (measured with the analysis bench) and
 * are used instead. The FFT result agrees with the direct sums to rounding (about 1e-13 relative to
 * c(0)).
 * `scratch`: the caller's working arrays (analysis-scratch.ts), so a scheduled evaluation allocates
 * only the result here; without it the FFT arrays are fresh. The result is always a fresh array.
 * Cost: O(n log n) (FFT) or O(n · maxLag) (direct).
 */
import { scratchView, type AnalysisScratch } from './analysis-scratch.js';

const FFT_FROM = 1536;

export function autocovariance(d: ArrayLike<number>, maxLag: number, scratch?: AnalysisScratch): Float64Array {
  const n = d.length;
  const lags = Math.max(0, Math.min(maxLag, n - 1));
  const out = new Float64Array(lags + 1);
  if (n === 0) return out;
  if (n < FFT_FROM) {
    for (let k = 0; k <= lags; k++) {
      let s = 0;
      for (let i = 0; i + k < n; i++) s += d[i] * d[i + k];
      out[k] = s;
    }
    return out;
  }
  let size = 1;
  while (size < 2 * n) size <<= 1;
  const re = scratchView(scratch?.fftReal, size);
  const im = scratchView(scratch?.fftImaginary, size);
  for (let i = 0; i < size; i++) {
    re[i] = i < n ? d[i] : 0;
    im[i] = 0;
  }
  fft(re, im, false);
  for (let i = 0; i < size; i++) {
    re[i] = re[i] * re[i] + im[i] * im[i];
    im[i] = 0;
  }
  fft(re, im, true);
  for (let k = 0; k <= lags; k++) out[k] = re[k] / size;
  return out;
}

/** In-place iterative radix-2 FFT (size a power of two); `inverse` without the 1/size factor. */
function fft(re: Float64Array, im: Float64Array, inverse: boolean): void {
  const n = re.length;
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i]; re[i] = re[j]; re[j] = t;
      t = im[i]; im[i] = im[j]; im[j] = t;
    }
  }
  for (let len = 2; len <= n; len <<= 1) {
    const angle = ((inverse ? 2 : -2) * Math.PI) / len;
    const wr = Math.cos(angle), wi = Math.sin(angle);
    const half = len >> 1;
    for (let i = 0; i < n; i += len) {
      let cr = 1, ci = 0;
      for (let k = 0; k < half; k++) {
        const a = i + k, b = a + half;
        const xr = re[b] * cr - im[b] * ci;
        const xi = re[b] * ci + im[b] * cr;
        re[b] = re[a] - xr; im[b] = im[a] - xi;
        re[a] += xr; im[a] += xi;
        const nr = cr * wr - ci * wi;
        ci = cr * wi + ci * wr;
        cr = nr;
      }
    }
  }
}

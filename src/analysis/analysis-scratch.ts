/**
 * The working arrays of one run judge's evaluations, owned by the judge (createRunJudge) and passed
 * down to the methods it calls, so a scheduled evaluation allocates almost nothing and the pure core
 * keeps no module-level state. One-shot calls (tests, tools) pass no context and get fresh arrays.
 *
 * One buffer per use: a view is valid until the same buffer is asked again (scratch-buffer.ts), and
 * the uses below may be alive at the same time (e.g. the window logs while the Theil–Sen pair slopes
 * are computed), so no two uses share a buffer. Evaluations are synchronous, so one judge never runs
 * two at once.
 * Cost: a dozen 2 KiB arrays at creation; they grow to the largest request and stay.
 */
import { ScratchBuffer } from './scratch-buffer.js';

export interface AnalysisScratch {
  /** Theil–Sen (theil-sen-slope.ts): thinned x, thinned y, pair slopes. */
  readonly slopeX: ScratchBuffer;
  readonly slopeY: ScratchBuffer;
  readonly pairSlopes: ScratchBuffer;
  /** Residual judge (judge-residual.ts): log10 of the last five values, of the window, of the cycle-test region, deviations about the trend line. */
  readonly recentLogs: ScratchBuffer;
  readonly windowLogs: ScratchBuffer;
  readonly cycleLogs: ScratchBuffer;
  readonly deviations: ScratchBuffer;
  /** Cycle test (detect-oscillation.ts): the detrended values. */
  readonly detrended: ScratchBuffer;
  /** Autocovariance by FFT (autocovariance.ts): real and imaginary parts. */
  readonly fftReal: ScratchBuffer;
  readonly fftImaginary: ScratchBuffer;
  /** MSER-5 (mser-truncation.ts): batch means. */
  readonly batchMeans: ScratchBuffer;
}

export function createAnalysisScratch(): AnalysisScratch {
  return {
    slopeX: new ScratchBuffer(), slopeY: new ScratchBuffer(), pairSlopes: new ScratchBuffer(),
    recentLogs: new ScratchBuffer(), windowLogs: new ScratchBuffer(), cycleLogs: new ScratchBuffer(), deviations: new ScratchBuffer(),
    detrended: new ScratchBuffer(), fftReal: new ScratchBuffer(), fftImaginary: new ScratchBuffer(), batchMeans: new ScratchBuffer(),
  };
}

/** A view of `length` elements from `buffer`, or a fresh array when there is no context (one-shot). */
export function scratchView(buffer: ScratchBuffer | undefined, length: number): Float64Array {
  return buffer === undefined ? new Float64Array(length) : buffer.view(length);
}

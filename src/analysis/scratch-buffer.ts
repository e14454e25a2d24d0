/**
 * Reusable scratch arrays, so a scheduled evaluation does not allocate its working arrays afresh.
 *
 * Each use has its own `ScratchBuffer` (owned by a run judge's AnalysisScratch, analysis-scratch.ts,
 * never module-level) and asks it for a Float64Array view of the length it needs; the backing array grows (doubling) and is kept. A view
 * is valid until the same buffer is asked again, so a caller must not keep it across calls, return it
 * or hand it to code that asks the same buffer. The analysis is synchronous and single-threaded, so no
 * two evaluations share a view. Contents of a fresh view are unspecified (not zeroed).
 * Cost: O(1) per request (amortised O(n) growth).
 */
export class ScratchBuffer {
  private buffer = new Float64Array(256);

  /** A view of `length` elements. */
  view(length: number): Float64Array {
    if (this.buffer.length < length) {
      let size = this.buffer.length;
      while (size < length) size *= 2;
      this.buffer = new Float64Array(size);
    }
    return this.buffer.subarray(0, length);
  }
}

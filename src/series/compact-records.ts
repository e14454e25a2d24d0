/**
 * Records in compact, column-major form: what a worker thread hands the main thread (see
 * parallel/record-chunk.ts), and what SeriesStore.addCompactRecords takes without building one
 * object per record.
 *
 * Record r < count has iteration `iterations[r]` and the flags `flags[r]` (RESTART, NO_VALUES).
 * The values are grouped by series: for slot k < seriesCount, series `seriesIds[k]` (an index into
 * the caller's name table; slots in increasing id order, and ids numbered in order of first
 * appearance) has the values `values[seriesStarts[k] .. seriesStarts[k + 1])`, which belong to
 * the records `valueRecords[...]` (increasing). Arrays may be longer than what is used.
 */
export interface CompactRecords {
  readonly count: number;
  readonly iterations: Float64Array;
  readonly flags: Uint8Array;
  /** [record index, text] of the records that carry a crash line. */
  readonly failures: readonly (readonly [number, string])[];
  readonly seriesCount: number;
  readonly seriesIds: Uint32Array;
  readonly seriesStarts: Int32Array;
  readonly valueRecords: Int32Array;
  readonly values: Float64Array;
}

/** The record is the first after a restart. */
export const RESTART = 1;
/** The record holds no values (with a failure text: a crash line, not an iteration). */
export const NO_VALUES = 2;

/**
 * A read-only view of one stored series: the retained points in iteration order.
 * Arrays may be longer than `length`; only the first `length` entries are valid.
 */
import type { SeriesInfo } from '../parse/log-record.js';

export interface SeriesColumn {
  readonly info: SeriesInfo;
  /** Iteration of each retained point (ascending within a restart segment). */
  readonly iterations: Float64Array;
  readonly values: Float64Array;
  readonly length: number;
  /** Points ever added (≥ length once older history has been thinned to bound memory). */
  readonly totalAdded: number;
  /** Index of the first point kept at full resolution: points before it were thinned. */
  readonly fullResolutionFrom: number;
}

/** What the analysis needs of a whole run at one moment. */
export interface RunSnapshot {
  readonly series: readonly SeriesColumn[];
  /** Records seen so far. */
  readonly records: number;
  /** Iteration of the last record (NaN before any). */
  readonly lastIteration: number;
  /** Iterations at which the run restarted. */
  readonly restarts: readonly number[];
  /** Text of a crash line the parser marked, if any. */
  readonly failure?: string;
  /** True when the run is transient (records carry time steps). */
  readonly transient: boolean;
  /** For transient runs: per time step, the index range of its records and its physical time. */
  readonly timeSteps?: readonly { readonly step: number; readonly time?: number; readonly firstRecord: number; readonly lastRecord: number }[];
}

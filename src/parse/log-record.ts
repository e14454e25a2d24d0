/**
 * The record: what one iteration of a solver log turns into.
 *
 * Every stage downstream of parsing (series store, analysis, views) sees only records, never lines.
 */

/** What a series measures. `residual`: an equation's residual norm (judged on a log scale).
 * `quantity`: a monitored quantity of interest (drag, pressure drop, Nusselt number...).
 * `other`: carried and shown, never judged (time step size, CFL number, wall time...). */
export type SeriesKind = 'residual' | 'quantity' | 'other';

export interface SeriesInfo {
  /** Name as printed in the log (e.g. `res_p`, `nu_hot`). Unique within a run. */
  readonly name: string;
  readonly kind: SeriesKind;
  readonly unit?: string;
  /** Display label, when the spec gives a nicer one than the name. */
  readonly label?: string;
}

export interface LogRecord {
  /** Global iteration counter: as printed by the solver, or a running count the parser assigns
   * (for transient runs with inner iterations, a running count over all inner iterations). */
  readonly iteration: number;
  /** Time-step index, for transient runs. Records that share it are inner iterations of one step. */
  readonly timeStep?: number;
  /** Inner iteration within the time step, for transient runs. */
  readonly inner?: number;
  /** Physical time, for transient runs. */
  readonly time?: number;
  /** Values by series name. Non-finite values (NaN, ±Infinity, overflow fields) are kept as such. */
  readonly values: ReadonlyMap<string, number>;
  /** Set on the first record after a restart: the counter went back, the file was truncated or
   * replaced, or the next file of a restart chain began. */
  readonly restart?: boolean;
  /** Set when the parser saw a line marking a crash or fatal error; its text (cut short). */
  readonly failure?: string;
}

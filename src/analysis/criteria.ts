/**
 * Convergence criteria: what "done" means for a run. Defaults are the trade's common practice
 * (see DEVELOPERS.md, decisions log); a criteria file and flags override them.
 *
 * OWNER: analysis. This file fixes the shape other stages rely on; the analysis work extends it
 * (validation, per-series resolution) without renaming these fields.
 */

/** Overrides for the series whose names match `pattern` (a glob: `*` and `?`). */
export interface SeriesCriteria {
  readonly pattern: string;
  /** Decades a residual must fall from its peak. */
  readonly drop?: number;
  /** Absolute residual target. */
  readonly target?: number;
  /** Relative 95 % half-width a quantity must settle to. */
  readonly qoiTol?: number;
  /** Leave these series out of the verdict (still shown). */
  readonly ignore?: boolean;
}

export interface Criteria {
  /** Decades a residual must fall from its peak (common practice: 3). */
  readonly drop: number;
  /** Absolute residual target; when set, reaching it also counts as converged. */
  readonly target?: number;
  /** Relative 95 % confidence half-width a quantity must settle to (common practice: 1e-3). */
  readonly qoiTol: number;
  /** Trailing window, in iterations, over which trends are judged. */
  readonly window: number;
  /** Only series matching one of these globs count towards the verdict (all when empty). */
  readonly series: readonly string[];
  readonly perSeries: readonly SeriesCriteria[];
  /** Iterations at the start of a run (and after a restart) that are not judged. */
  readonly startup: number;
  /** Consecutive scheduled evaluations a stopping verdict must hold before it is final. */
  readonly confirm: number;
}

export const DEFAULT_CRITERIA: Criteria = {
  drop: 3,
  qoiTol: 1e-3,
  window: 200,
  series: [],
  perSeries: [],
  startup: 20,
  confirm: 3,
};

/**
 * The diagnosis: what the analysis says about each series and the run. Every view (dashboard,
 * report, gate, JSON output) reads this; none re-derives it.
 */
import type { SeriesKind } from '../parse/log-record.js';

/** One vocabulary for series and runs. For a quantity, `converged` means settled. */
export type State = 'converged' | 'converging' | 'undecided' | 'stalled' | 'oscillating' | 'diverging' | 'failed';

/** `settle check` exit code per verdict (a contract for scripts, documented in the README). */
export const EXIT_CODES: Readonly<Record<State, number>> = {
  converged: 0,
  converging: 10,
  undecided: 11,
  stalled: 20,
  oscillating: 21,
  diverging: 30,
  failed: 31,
};

/** Worse verdicts rank higher: the worst of several decides a combined exit code. */
export const SEVERITY: Readonly<Record<State, number>> = {
  converged: 0, converging: 1, undecided: 2, stalled: 3, oscillating: 4, diverging: 5, failed: 6,
};

/** A verdict after which following a run further cannot change the answer (the gate stops). */
export const FINAL_STATES: ReadonlySet<State> = new Set<State>(['converged', 'stalled', 'oscillating', 'diverging', 'failed']);

export interface SeriesDiagnosis {
  readonly name: string;
  readonly kind: SeriesKind;
  readonly label?: string;
  readonly unit?: string;
  readonly state: State;
  /** Last value seen (may be non-finite). */
  readonly last: number;
  /** One sentence, plain words: why this state. */
  readonly reason: string;
  // Residuals
  /** Convergence factor per iteration, 10^slope of log10(residual) (Theil–Sen). */
  readonly rho?: number;
  /** Orders of magnitude gained per 1000 iterations (positive when falling). */
  readonly ordersPerKilo?: number;
  /** Estimated iterations left to reach the target at the current rate. */
  readonly eta?: number;
  /** Decades below the series' peak, now. */
  readonly dropDecades?: number;
  /** Absolute residual target in force for this series. */
  readonly target?: number;
  // Oscillation (residuals and quantities)
  /** Period of a persistent cycle, in iterations. */
  readonly period?: number;
  /** Half of peak-to-peak of log10(residual), for residuals. */
  readonly amplitudeDecades?: number;
  /** Half of peak-to-peak relative to the mean, for quantities. */
  readonly amplitudeRelative?: number;
  // Quantities
  /** Settled mean (over whole periods when oscillating). */
  readonly mean?: number;
  /** Half-width of the 95 % confidence interval of the mean. */
  readonly halfWidth?: number;
  /** Iteration from which the quantity counts as settled (MSER-5 truncation point). */
  readonly settledFrom?: number;
  /** Estimated remaining iteration error (Ferziger & Perić §5.7), where convergence is geometric. */
  readonly iterationError?: number;
  /** Extrapolated limit (Aitken), where convergence is geometric. */
  readonly limit?: number;
}

export interface StateChange {
  readonly iteration: number;
  /** Series name, or null for the run's verdict. */
  readonly series: string | null;
  readonly from: State;
  readonly to: State;
  /** e.g. `it 4210: res_p stalled at 2.1e-4`. */
  readonly text: string;
}

export interface CriterionResult {
  /** e.g. `res_p down 3 decades from peak`, `nu_hot settled to 1e-3 relative`. */
  readonly description: string;
  readonly met: boolean;
  /** Where it stands now, e.g. `2.4 of 3 decades`. */
  readonly detail: string;
}

export interface RunDiagnosis {
  readonly verdict: State;
  readonly exitCode: number;
  /** Last iteration seen. */
  readonly iterations: number;
  /** Records seen. */
  readonly records: number;
  /** Stopping advice a person can act on (one sentence). */
  readonly advice: string;
  /** Reasons for the verdict, plain words. */
  readonly reasons: readonly string[];
  readonly series: readonly SeriesDiagnosis[];
  /** State changes so far (series and run), oldest first. */
  readonly timeline: readonly StateChange[];
  readonly criteria: readonly CriterionResult[];
  /** True when the verdict has held for the confirmation window and is in FINAL_STATES. */
  readonly final: boolean;
}

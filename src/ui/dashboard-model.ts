/**
 * The dashboard's view model: everything the screen shows, already decided and formatted, for one
 * terminal size. Built by a pure function (build-view-model.ts); painted by pure painters; put on
 * the terminal by the screen shell. Nothing here is computed by the widgets.
 */
import type { State } from '../analysis/diagnosis.js';
import type { SeriesKind } from '../parse/log-record.js';
import type { DashboardLayout } from './dashboard-layout.js';

/** One drawn line of a chart, in plot coordinates (x: iteration; y: log10 of a residual, or the value
 * of a quantity). Non-finite y leaves a gap. */
export interface ChartLine {
  readonly name: string;
  /** Index into the series styles (colour and marker). */
  readonly style: number;
  readonly x: readonly number[];
  readonly y: readonly number[];
}

/** A horizontal reference line: a residual target, a settled mean, or the edge of its confidence band. */
export interface ChartLevel {
  readonly y: number;
  readonly kind: 'target' | 'mean' | 'band';
  /** The level applies from this x on (the settled mean from the truncation point). */
  readonly fromX?: number;
  readonly label: string;
}

export interface ChartTick {
  readonly at: number;
  readonly label: string;
}

export interface ChartModel {
  readonly title: string;
  readonly xMin: number;
  readonly xMax: number;
  readonly yMin: number;
  readonly yMax: number;
  readonly yTicks: readonly ChartTick[];
  readonly xTicks: readonly ChartTick[];
  readonly lines: readonly ChartLine[];
  readonly levels: readonly ChartLevel[];
  /** Iterations where the run restarted: drawn as dotted vertical lines. */
  readonly restarts?: readonly number[];
  /** Legend entries in drawing order (hidden series are left out and counted in `hiddenCount`). */
  readonly legend: readonly { readonly name: string; readonly style: number }[];
  readonly hiddenCount: number;
  /** Shown instead of a plot when there is nothing to draw yet. */
  readonly empty?: string;
}

export interface SeriesRow {
  readonly name: string;
  readonly kind: SeriesKind;
  readonly style: number;
  readonly hidden: boolean;
  readonly cursor: boolean;
  readonly state: State;
  /** The state as shown: the state's name, or `not judged` for series the analysis only carries. */
  readonly stateText: string;
  readonly last: string;
  /** Rate in decades per 1000 iterations (`-2.1/1k`), or the period of a cycle (`period 48`). */
  readonly trend: string;
  /** Iterations left to the target (`~1 200`), or empty. */
  readonly etaIterations: string;
  /** Wall-clock time left at the observed pace (`3 min`), or empty. */
  readonly etaTime: string;
  /** Settled mean ± 95 % half-width (`1.1180 ±0.0021`), or empty. */
  readonly settled: string;
  /** The analysis' one-sentence reason for the state. */
  readonly reason: string;
}

export interface TimelineEntry {
  readonly text: string;
  readonly state: State;
}

export interface HeaderModel {
  readonly file: string;
  readonly parser: string;
  readonly position: string;
  readonly pace: string;
  readonly growth: string;
  /** The log has not grown for a long while: worth noticing. */
  readonly stale: boolean;
  readonly paused: boolean;
  readonly span: string;
}

export interface VerdictModel {
  /** Null while no record has arrived. */
  readonly state: State | null;
  /** The banner's headline, e.g. `CONVERGING` or `STALLED (confirmed)`. */
  readonly headline: string;
  readonly advice: string;
  /** Reasons and unmet criteria, plain words, most important first. */
  readonly details: string;
}

export interface RunViewModel {
  readonly kind: 'run';
  readonly layout: DashboardLayout;
  readonly header: HeaderModel;
  readonly verdict: VerdictModel;
  readonly residuals: ChartModel;
  readonly quantity: ChartModel;
  readonly rows: readonly SeriesRow[];
  /** Newest first. */
  readonly timeline: readonly TimelineEntry[];
  readonly footer: string;
  readonly help: boolean;
  readonly tooSmall: boolean;
}

export interface OverviewRow {
  readonly runIndex: number;
  readonly label: string;
  readonly verdict: State | null;
  readonly iteration: string;
  readonly worstResidual: string;
  readonly lastGrowth: string;
  readonly stale: boolean;
  readonly cursor: boolean;
}

export interface OverviewModel {
  readonly kind: 'overview';
  readonly layout: DashboardLayout;
  readonly title: string;
  readonly rows: readonly OverviewRow[];
  readonly footer: string;
  readonly help: boolean;
  readonly tooSmall: boolean;
}

export type DashboardModel = RunViewModel | OverviewModel;

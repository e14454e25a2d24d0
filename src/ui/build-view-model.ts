/**
 * Build the dashboard's view model for one run: a pure function of the diagnosis, the stored series,
 * what the person chose to see, the pace of the log, the terminal size and the clock reading.
 *
 * Charts are downsampled here to about two points per braille dot column (LTTB; residuals in log
 * space), so painting costs the same for a hundred iterations or a million. Cost per call:
 * O(points in the charted window) for the downsampling, O(series) for the rest.
 */
import type { RunDiagnosis, SeriesDiagnosis, State } from '../analysis/diagnosis.js';
import type { RunSnapshot, SeriesColumn } from '../series/series-column.js';
import type { MonitorPace } from '../monitor/run-monitor-types.js';
import type { ChartLevel, ChartLine, ChartModel, HeaderModel, RunViewModel, SeriesRow, TimelineEntry, VerdictModel } from './dashboard-model.js';
import { dashboardLayout, layoutFits } from './dashboard-layout.js';
import type { ViewState } from './view-state.js';
import { chartGeometry } from './braille-chart.js';
import { downsampleLttbSorted } from '../series/downsample-lttb.js';
import { decadeTicks, niceTicks } from './axis-ticks.js';
import { formatAge, formatCount, formatCountShort, formatDecade, formatDuration, formatResidual, formatValue } from './format-figures.js';

/** Label columns left of the plot: `1e-12┤` for residuals, `-1.23e5 ┤` for quantities. */
export const RESIDUAL_LABEL_WIDTH = 6;
export const QUANTITY_LABEL_WIDTH = 9;
/** A log that has not grown for this long is flagged in the header (a run that stopped writing). */
export const STALE_AFTER_MS = 30_000;
/** Timeline entries kept in the model (the panel shows what fits, newest first). */
const TIMELINE_KEEP = 200;

/** What the dashboard knows about the run besides its data. */
export interface RunContext {
  /** The log path(s) as given. */
  readonly label: string;
  /** Parser spec id in use, once chosen. */
  readonly parser?: string;
  /** Latest news from the source, e.g. `waiting for case/run.log to appear`. */
  readonly note?: string;
  /** Runs being watched (the overview key is offered when more than one). */
  readonly runCount: number;
}

export interface TerminalSize {
  readonly cols: number;
  readonly rows: number;
}

/** Series in table order: residuals, then monitored quantities, then the rest; log order within each. */
export function tableOrder(snapshot: RunSnapshot): SeriesColumn[] {
  const rank = { residual: 0, quantity: 1, other: 2 } as const;
  return snapshot.series
    .map((column, index) => ({ column, index }))
    .sort((a, b) => rank[a.column.info.kind] - rank[b.column.info.kind] || a.index - b.index)
    .map((entry) => entry.column);
}

/** Series the quantity chart steps through: every series that is not a residual, in table order. */
export function chartedQuantities(snapshot: RunSnapshot): SeriesColumn[] {
  return tableOrder(snapshot).filter((column) => column.info.kind !== 'residual');
}

export function buildViewModel(
  diagnosis: RunDiagnosis,
  snapshot: RunSnapshot,
  view: ViewState,
  pace: MonitorPace,
  size: TerminalSize,
  now: number,
  context: RunContext,
): RunViewModel {
  const layout = dashboardLayout(size.cols, size.rows, snapshot.series.length);
  const bySeries = new Map<string, SeriesDiagnosis>(diagnosis.series.map((d) => [d.name, d]));
  const ordered = tableOrder(snapshot);
  const styleOf = styleNumbers(ordered);
  const window = chartWindow(snapshot, view);

  const residualColumns = ordered.filter((column) => column.info.kind === 'residual');
  const restarts = snapshot.restarts.filter((iteration) => iteration >= window.from && iteration <= window.to);
  const residualsChart = residualChart(residualColumns, bySeries, view, window, styleOf, layout.residuals.width - 2, layout.residuals.height - 2);
  const residuals = restarts.length > 0 && residualsChart.empty === undefined ? { ...residualsChart, restarts } : residualsChart;
  const quantities = chartedQuantities(snapshot);
  const quantity = quantityChart(quantities, bySeries, view, window, styleOf, layout.quantity.width - 2, layout.quantity.height - 2);

  const rows: SeriesRow[] = ordered.map((column, index) => seriesRow(column, bySeries.get(column.info.name), index === view.seriesCursor, view, pace, styleOf));
  const timeline: TimelineEntry[] = diagnosis.timeline
    .slice(-TIMELINE_KEEP)
    .reverse()
    .map((change) => ({ text: change.text, state: change.to }));

  return {
    kind: 'run',
    layout,
    header: buildHeaderModel(snapshot, view, pace, now, context),
    verdict: verdict(diagnosis, snapshot, context),
    residuals,
    quantity,
    rows,
    timeline,
    footer: footer(context.runCount),
    help: view.help,
    tooSmall: !layoutFits(size.cols, size.rows),
  };
}

/** Style numbers: residuals and the other series each count from 0, so the first residual and the
 * first quantity look alike only across different charts. */
function styleNumbers(ordered: readonly SeriesColumn[]): Map<string, number> {
  const styles = new Map<string, number>();
  let residuals = 0;
  let others = 0;
  for (const column of ordered) styles.set(column.info.name, column.info.kind === 'residual' ? residuals++ : others++);
  return styles;
}

interface ChartWindow {
  /** Iterations shown: [from, to]. NaN before any record. */
  readonly from: number;
  readonly to: number;
}

function chartWindow(snapshot: RunSnapshot, view: ViewState): ChartWindow {
  const last = snapshot.lastIteration;
  let first = Number.POSITIVE_INFINITY;
  for (const column of snapshot.series) if (column.length > 0) first = Math.min(first, column.iterations[0]);
  if (!Number.isFinite(first) || Number.isNaN(last)) return { from: Number.NaN, to: Number.NaN };
  const from = view.span === 'recent' ? Math.max(first, last - view.recentIterations) : first;
  return { from: Math.min(from, last), to: Math.max(last, from) };
}

interface Downsampled {
  readonly x: number[];
  readonly y: number[];
}

// Scratch space for the history being downsampled, reused between calls (copied out before return).
let scratchX = new Float64Array(1024);
let scratchY = new Float64Array(1024);

/** The history of a column from iteration `from` on, as it stands now, downsampled to `threshold`
 * points, with y mapped by `toPlot` (non-finite → NaN).
 *
 * After a restart from a checkpoint the counter goes back and the solver computes those iterations
 * again: the points it replaced are left out, so each iteration shows its latest value and x keeps
 * ascending. Method: walk back from the newest point, keeping a point only when its iteration is
 * below every point kept so far. O(points in the window). */
function downsample(column: SeriesColumn, from: number, threshold: number, toPlot: (value: number) => number): Downsampled {
  const n = column.length;
  if (scratchX.length < n) {
    scratchX = new Float64Array(n);
    scratchY = new Float64Array(n);
  }
  let count = 0;
  let lowest = Number.POSITIVE_INFINITY;
  for (let i = n - 1; i >= 0; i--) {
    const iteration = column.iterations[i];
    if (!(iteration < lowest)) continue;
    if (iteration < from) break;
    lowest = iteration;
    // Filled from the end of the scratch arrays, so the kept points come out in ascending order.
    scratchX[n - 1 - count] = iteration;
    const v = toPlot(column.values[i]);
    scratchY[n - 1 - count] = Number.isFinite(v) ? v : Number.NaN;
    count++;
  }
  const x = scratchX.subarray(n - count, n);
  const y = scratchY.subarray(n - count, n);
  const picks = downsampleLttbSorted(x, y, 0, count, Math.max(3, threshold));
  return { x: picks.map((i) => x[i]), y: picks.map((i) => y[i]) };
}

const log10OrNaN = (value: number): number => (value > 0 && Number.isFinite(value) ? Math.log10(value) : Number.NaN);
const finiteOrNaN = (value: number): number => (Number.isFinite(value) ? value : Number.NaN);

function xTicks(window: ChartWindow, plotCols: number): { at: number; label: string }[] {
  return niceTicks(window.from, window.to, Math.max(2, Math.floor(plotCols / 10)))
    .filter((at) => Number.isInteger(at))
    .map((at) => ({ at, label: formatCountShort(at) }));
}

function extent(lines: readonly ChartLine[], extra: readonly number[]): { min: number; max: number } {
  let min = Number.POSITIVE_INFINITY;
  let max = Number.NEGATIVE_INFINITY;
  for (const line of lines) {
    for (const y of line.y) {
      if (!Number.isFinite(y)) continue;
      if (y < min) min = y;
      if (y > max) max = y;
    }
  }
  for (const y of extra) {
    if (!Number.isFinite(y)) continue;
    if (y < min) min = y;
    if (y > max) max = y;
  }
  return { min, max };
}

function residualChart(
  columns: readonly SeriesColumn[],
  bySeries: ReadonlyMap<string, SeriesDiagnosis>,
  view: ViewState,
  window: ChartWindow,
  styleOf: ReadonlyMap<string, number>,
  width: number,
  height: number,
): ChartModel {
  const geometry = chartGeometry(width, height, RESIDUAL_LABEL_WIDTH);
  const shown = columns.filter((column) => !view.hidden.has(column.info.name));
  const base = {
    title: 'residuals',
    legend: shown.map((column) => ({ name: column.info.label ?? column.info.name, style: styleOf.get(column.info.name) ?? 0 })),
    hiddenCount: columns.length - shown.length,
    xMin: window.from,
    xMax: window.to,
  };
  const emptyChart = (text: string): ChartModel => ({ ...base, yMin: 0, yMax: 1, yTicks: [], xTicks: [], lines: [], levels: [], empty: text });
  if (columns.length === 0) return emptyChart(Number.isNaN(window.from) ? 'waiting for data' : 'no residuals in this log');
  if (shown.length === 0) return emptyChart('every residual is hidden (a: show all)');

  const threshold = 2 * geometry.plotCols;
  const lines: ChartLine[] = shown.map((column) => {
    const points = downsample(column, window.from, threshold, log10OrNaN);
    return { name: column.info.name, style: styleOf.get(column.info.name) ?? 0, x: points.x, y: points.y };
  });
  // A series blowing up has no meaningful target: a level derived from its peak only chases it up.
  const targets = [...new Set(shown
    .map((column) => bySeries.get(column.info.name))
    .filter((d) => d !== undefined && d.state !== 'diverging' && d.state !== 'failed')
    .map((d) => d?.target)
    .filter((t): t is number => t !== undefined && t > 0 && Number.isFinite(t)))].slice(0, 3);
  const levels: ChartLevel[] = targets.map((target) => ({ y: Math.log10(target), kind: 'target', label: `target ${formatResidual(target, 2)}` }));
  const { min, max } = extent(lines, levels.map((level) => level.y));
  if (!(max >= min)) return emptyChart('no finite residual values to plot');
  const yMin = Math.floor(min);
  const yMax = Math.max(Math.ceil(max), yMin + 1);
  return {
    ...base,
    yMin,
    yMax,
    // Labels at least two rows apart: 8 braille dots (4 to a row) between neighbours, whatever the rounding.
    yTicks: decadeTicks(yMin, yMax, (8 * (yMax - yMin)) / Math.max(1, 4 * geometry.plotRows - 1)).map((e) => ({ at: e, label: formatDecade(e) })),
    xTicks: xTicks(window, geometry.plotCols),
    lines,
    levels,
  };
}

function quantityChart(
  quantities: readonly SeriesColumn[],
  bySeries: ReadonlyMap<string, SeriesDiagnosis>,
  view: ViewState,
  window: ChartWindow,
  styleOf: ReadonlyMap<string, number>,
  width: number,
  height: number,
): ChartModel {
  const geometry = chartGeometry(width, height, QUANTITY_LABEL_WIDTH);
  const count = quantities.length;
  const column = count === 0 ? undefined : quantities[((view.quantityIndex % count) + count) % count];
  // Which of several quantities this is; the keys that step through them are in the footer.
  const position = count > 1 ? ` · ${(((view.quantityIndex % count) + count) % count) + 1} of ${count}` : '';
  const name = column === undefined ? '' : (column.info.label ?? column.info.name);
  const unit = column?.info.unit ? ` [${column.info.unit}]` : '';
  const base = {
    title: column === undefined ? 'quantity' : `${name}${unit}${position}`,
    legend: column === undefined || view.hidden.has(column.info.name) ? [] : [{ name, style: styleOf.get(column.info.name) ?? 0 }],
    hiddenCount: column !== undefined && view.hidden.has(column.info.name) ? 1 : 0,
    xMin: window.from,
    xMax: window.to,
  };
  const emptyChart = (text: string): ChartModel => ({ ...base, yMin: 0, yMax: 1, yTicks: [], xTicks: [], lines: [], levels: [], empty: text });
  if (column === undefined) return emptyChart(Number.isNaN(window.from) ? 'waiting for data' : 'no quantities in this log');
  if (view.hidden.has(column.info.name)) return emptyChart(`${name} is hidden (h on its row shows it)`);

  const points = downsample(column, window.from, 2 * geometry.plotCols, finiteOrNaN);
  const lines: ChartLine[] = [{ name: column.info.name, style: styleOf.get(column.info.name) ?? 0, x: points.x, y: points.y }];
  const diagnosis = bySeries.get(column.info.name);
  const levels: ChartLevel[] = [];
  if (diagnosis?.mean !== undefined && Number.isFinite(diagnosis.mean)) {
    const fromX = diagnosis.settledFrom;
    levels.push({ y: diagnosis.mean, kind: 'mean', fromX, label: `mean ${formatValue(diagnosis.mean, 5)}` });
    if (diagnosis.halfWidth !== undefined && Number.isFinite(diagnosis.halfWidth) && diagnosis.halfWidth > 0) {
      levels.push({ y: diagnosis.mean - diagnosis.halfWidth, kind: 'band', fromX, label: '95 %' });
      levels.push({ y: diagnosis.mean + diagnosis.halfWidth, kind: 'band', fromX, label: '95 %' });
    }
  }
  const { min, max } = extent(lines, levels.map((level) => level.y));
  if (!(max >= min)) return emptyChart(`no finite values of ${name} to plot`);
  const pad = max > min ? (max - min) * 0.05 : Math.max(Math.abs(max) * 1e-3, 1e-12);
  const yMin = min - pad;
  const yMax = max + pad;
  return {
    ...base,
    yMin,
    yMax,
    yTicks: niceTicks(yMin, yMax, Math.max(2, Math.floor(geometry.plotRows / 2))).map((at) => ({ at, label: formatValue(at, 4) })),
    xTicks: xTicks(window, geometry.plotCols),
    lines,
    levels,
  };
}

function seriesRow(
  column: SeriesColumn,
  d: SeriesDiagnosis | undefined,
  cursor: boolean,
  view: ViewState,
  pace: MonitorPace,
  styleOf: ReadonlyMap<string, number>,
): SeriesRow {
  const residual = column.info.kind === 'residual';
  const lastValue = d?.last ?? (column.length > 0 ? column.values[column.length - 1] : Number.NaN);
  let trend = '';
  if (d?.period !== undefined && Number.isFinite(d.period)) trend = `period ${formatCountShort(d.period)}`;
  else if (d?.ordersPerKilo !== undefined && Number.isFinite(d.ordersPerKilo)) {
    const change = -d.ordersPerKilo;
    trend = `${change > 0 ? '+' : change < 0 ? '-' : ''}${Math.abs(change).toFixed(Math.abs(change) < 10 ? 1 : 0)}/1k`;
  } else if (d?.iterationError !== undefined && Number.isFinite(d.iterationError)) trend = `err ${formatValue(Math.abs(d.iterationError), 2)}`;
  let etaIterations = '';
  let etaTime = '';
  if (d?.eta !== undefined && Number.isFinite(d.eta) && d.eta > 0) {
    etaIterations = `~${formatCountShort(d.eta)}`;
    if (pace.iterationsPerSecond > 0) etaTime = formatDuration(d.eta / pace.iterationsPerSecond);
  } else if (residual && d?.state === 'converged') etaIterations = 'reached';
  const settled = d?.mean !== undefined && Number.isFinite(d.mean)
    ? `${formatValue(d.mean, 5)} ±${d.halfWidth !== undefined ? formatValue(d.halfWidth, 2) : '?'}`
    : '';
  return {
    name: column.info.label ?? column.info.name,
    kind: column.info.kind,
    style: styleOf.get(column.info.name) ?? 0,
    hidden: view.hidden.has(column.info.name),
    cursor,
    state: d?.state ?? 'undecided',
    stateText: d === undefined ? (column.info.kind === 'other' ? 'not judged' : 'waiting') : d.state,
    last: residual ? formatResidual(lastValue, 3) : formatValue(lastValue, 5),
    trend,
    etaIterations,
    etaTime,
    settled,
    reason: d?.reason !== undefined ? withoutLeadingName(d.reason, column.info.name) : column.info.kind === 'other' ? 'shown, not judged' : 'not judged yet',
  };
}

/** A reason as the table shows it, beside its series' name: `res_p falling 2 orders…` → `falling 2 orders…`. */
export function withoutLeadingName(reason: string, name: string): string {
  return reason.startsWith(`${name} `) && reason.length > name.length + 1 ? reason.slice(name.length + 1) : reason;
}

/** The header alone (the clock moves it even when no data arrives). */
export function buildHeaderModel(snapshot: RunSnapshot, view: ViewState, pace: MonitorPace, now: number, context: RunContext): HeaderModel {
  let position = 'no records yet';
  if (!Number.isNaN(snapshot.lastIteration)) {
    position = `iteration ${formatCount(snapshot.lastIteration)}`;
    const step = snapshot.timeSteps?.[snapshot.timeSteps.length - 1];
    if (snapshot.transient && step !== undefined) {
      const time = step.time !== undefined ? ` · t ${formatValue(step.time, 4)}` : '';
      position = `time step ${formatCount(step.step)}${time} · ${position}`;
    }
  }
  const rate = pace.linesPerSecond;
  const stale = !Number.isNaN(pace.lastGrowthAt) && now - pace.lastGrowthAt > STALE_AFTER_MS;
  return {
    file: context.label,
    parser: context.parser ?? 'detecting format',
    position,
    pace: `${rate > 0 && rate < 10 ? rate.toFixed(1) : formatCount(rate)} lines/s`,
    growth: Number.isNaN(pace.lastGrowthAt) ? 'nothing read yet' : `grew ${formatAge(pace.lastGrowthAt, now)}`,
    stale,
    paused: view.paused,
    span: view.span === 'all' ? 'whole history' : `last ${formatCount(view.recentIterations)} it`,
  };
}

function verdict(diagnosis: RunDiagnosis, snapshot: RunSnapshot, context: RunContext): VerdictModel {
  if (snapshot.records === 0) {
    return {
      state: null,
      headline: 'WAITING FOR DATA',
      advice: context.note ?? 'no records yet: the log is empty, or its format is still being detected',
      details: '',
    };
  }
  const state: State = diagnosis.verdict;
  const unmet = diagnosis.criteria.filter((criterion) => !criterion.met).map((criterion) => `${criterion.description}: ${criterion.detail}`);
  const details = [...diagnosis.reasons, ...unmet];
  if (snapshot.failure !== undefined && !details.some((text) => text.includes(snapshot.failure as string))) details.unshift(`crash line: ${snapshot.failure}`);
  if (context.note !== undefined) details.push(context.note);
  return {
    state,
    headline: `${state.toUpperCase()}${diagnosis.final ? ' (confirmed)' : ''}`,
    advice: diagnosis.advice,
    details: details.join('; '),
  };
}

function footer(runCount: number): string {
  return `? keys  space pause  r recent/all  ] [ quantity  j k h hide${runCount > 1 ? '  o overview' : ''}  q quit`;
}

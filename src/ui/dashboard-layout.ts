/**
 * The dashboard's grid, declared in one place: where every panel sits for a terminal of a given size.
 * Pure; the screen shell places its boxes from this, and the view model sizes its charts from it.
 *
 * Run view, top to bottom: one header row (file, parser, position, pace); a two-row verdict banner
 * (verdict and advice: the first thing the eye should land on); the residual chart beside the chart
 * of the selected quantity; the series table beside (wide) or above (narrow) the timeline of state
 * changes; one row of key hints. Overview: header, a table of runs, key hints.
 */

export interface Rect {
  readonly left: number;
  readonly top: number;
  readonly width: number;
  readonly height: number;
}

export interface DashboardLayout {
  readonly cols: number;
  readonly rows: number;
  readonly header: Rect;
  readonly verdict: Rect;
  /** Boxed panels (one border all round): their content is two smaller each way. */
  readonly residuals: Rect;
  readonly quantity: Rect;
  readonly table: Rect;
  readonly timeline: Rect;
  readonly overview: Rect;
  readonly help: Rect;
  readonly footer: Rect;
}

/** The smallest terminal the dashboard lays out; smaller ones get a one-line "too small" notice. */
export const MIN_COLS = 60;
export const MIN_ROWS = 18;
/** From this width on, the table and the timeline sit side by side. */
const WIDE_COLS = 140;

/** The layout for a `cols` × `rows` terminal. `seriesCount`, when given, lets a stacked series table
 * shrink to its rows (header and border included) and hands the rows it does not need to the
 * timeline; the timeline always keeps its minimum. */
export function dashboardLayout(cols: number, rows: number, seriesCount?: number): DashboardLayout {
  const width = Math.max(cols, 1);
  const height = Math.max(rows, 1);
  const header: Rect = { left: 0, top: 0, width, height: 1 };
  const verdict: Rect = { left: 0, top: 1, width, height: 2 };
  const footer: Rect = { left: 0, top: height - 1, width, height: 1 };
  const middleTop = 3;
  const middle = Math.max(0, height - middleTop - 1);

  // Charts take about half the middle; the lower half holds the table (and timeline).
  const chartHeight = Math.max(6, Math.min(Math.round(middle * (height < 30 ? 0.45 : 0.48)), middle - 8));
  const residualWidth = width >= 100 ? Math.round(width * 0.6) : Math.ceil(width / 2);
  const residuals: Rect = { left: 0, top: middleTop, width: residualWidth, height: chartHeight };
  const quantity: Rect = { left: residualWidth, top: middleTop, width: width - residualWidth, height: chartHeight };

  const lowerTop = middleTop + chartHeight;
  const lower = Math.max(0, middle - chartHeight);
  let table: Rect;
  let timeline: Rect;
  if (width >= WIDE_COLS) {
    const tableWidth = width - Math.max(40, Math.round(width * 0.32));
    table = { left: 0, top: lowerTop, width: tableWidth, height: lower };
    timeline = { left: tableWidth, top: lowerTop, width: width - tableWidth, height: lower };
  } else {
    const timelineMin = Math.min(lower, lower >= 14 ? 6 : 4);
    // Border, column titles and at least two series rows, or every series when fewer.
    const tableWanted = seriesCount === undefined ? lower - timelineMin : 3 + Math.max(2, seriesCount);
    const timelineHeight = lower - Math.min(lower - timelineMin, tableWanted);
    table = { left: 0, top: lowerTop, width, height: lower - timelineHeight };
    timeline = { left: 0, top: lowerTop + lower - timelineHeight, width, height: timelineHeight };
  }

  const overview: Rect = { left: 0, top: 1, width, height: Math.max(0, height - 2) };
  // Wide enough for the longest key and its action; tall enough for every key and the legend notes.
  const helpWidth = Math.min(width, 76);
  const helpHeight = Math.min(height, 18);
  const help: Rect = {
    left: Math.floor((width - helpWidth) / 2),
    top: Math.floor((height - helpHeight) / 2),
    width: helpWidth,
    height: helpHeight,
  };
  return { cols: width, rows: height, header, verdict, residuals, quantity, table, timeline, overview, help, footer };
}

/** True when the terminal is big enough for the full layout. */
export function layoutFits(cols: number, rows: number): boolean {
  return cols >= MIN_COLS && rows >= MIN_ROWS;
}

/**
 * Paint a dashboard model into styled text, panel by panel, for the panel sizes in its layout. Pure:
 * the screen shell only copies these lines into its boxes. Every panel comes back as exactly as many
 * lines as its interior has rows, each exactly as wide as the interior.
 */
import type { DashboardModel, HeaderModel, OverviewModel, RunViewModel, SeriesRow, TimelineEntry, VerdictModel } from './dashboard-model.js';
import type { Rect } from './dashboard-layout.js';
import { MIN_COLS, MIN_ROWS } from './dashboard-layout.js';
import { paintChart } from './braille-chart.js';
import { QUANTITY_LABEL_WIDTH, RESIDUAL_LABEL_WIDTH } from './build-view-model.js';
import { bannerStyle, seriesStyle, stateStyle } from './series-styles.js';
import type { Segment, StyledLine, TextStyle } from './styled-text.js';
import { fitLine } from './styled-text.js';
import { fit, fitPath, fitRight } from './format-figures.js';
import { KEY_HELP } from './view-state.js';

export interface PaintedPanel {
  readonly rect: Rect;
  /** Border title, or undefined for a borderless panel. */
  readonly title?: string;
  readonly lines: readonly StyledLine[];
}

export type PanelName = 'header' | 'verdict' | 'residuals' | 'quantity' | 'table' | 'timeline' | 'footer' | 'overview' | 'help' | 'notice';

/** Every visible panel of `model`, painted. Boxed panels' lines fill the interior (rect minus border). */
export function paintDashboard(model: DashboardModel, colour: boolean): Partial<Record<PanelName, PaintedPanel>> {
  const { layout } = model;
  if (model.tooSmall) {
    const rect: Rect = { left: 0, top: 0, width: layout.cols, height: layout.rows };
    const text = `too small: ${layout.cols}×${layout.rows}, needs at least ${MIN_COLS}×${MIN_ROWS}`;
    return { notice: { rect, lines: [fitLine([{ text }], layout.cols), fitLine([{ text: 'enlarge the window (q quits)' }], layout.cols)] } };
  }
  const panels: Partial<Record<PanelName, PaintedPanel>> = model.kind === 'run' ? paintRun(model, colour) : paintOverview(model);
  if (model.help) panels.help = { rect: layout.help, title: ' keys ', lines: paintHelp(layout.help.width - 2, layout.help.height - 2) };
  return panels;
}

const inner = (rect: Rect): { width: number; height: number } => ({ width: Math.max(0, rect.width - 2), height: Math.max(0, rect.height - 2) });

function paintRun(model: RunViewModel, colour: boolean): Partial<Record<PanelName, PaintedPanel>> {
  const { layout } = model;
  const r = inner(layout.residuals);
  const q = inner(layout.quantity);
  const t = inner(layout.table);
  const l = inner(layout.timeline);
  return {
    header: { rect: layout.header, lines: [paintHeader(model.header, layout.header.width)] },
    verdict: { rect: layout.verdict, lines: paintVerdict(model.verdict, layout.verdict.width) },
    residuals: { rect: layout.residuals, title: ' residuals, log scale ', lines: paintChart(model.residuals, r.width, r.height, RESIDUAL_LABEL_WIDTH, colour) },
    quantity: { rect: layout.quantity, title: ` ${model.quantity.title} `, lines: paintChart(model.quantity, q.width, q.height, QUANTITY_LABEL_WIDTH, colour) },
    table: { rect: layout.table, title: tableTitle(model.rows, t.height), lines: paintTable(model.rows, t.width, t.height) },
    timeline: { rect: layout.timeline, title: ' state changes, newest first ', lines: paintTimeline(model.timeline, l.width, l.height) },
    footer: { rect: layout.footer, lines: [fitLine([{ text: model.footer, style: { fg: 'gray' } }], layout.footer.width)] },
  };
}

export function paintHeader(header: HeaderModel, width: number): StyledLine {
  const sep: Segment = { text: width >= 120 ? '  ·  ' : ' · ', style: { fg: 'gray' } };
  // Pieces right of the file name, each with a rank: when the line is too narrow, the highest rank
  // goes first (the reading pace, then the parser), so position and growth always stay.
  const pieces: { segment: Segment; rank: number }[] = [
    { segment: { text: header.parser }, rank: 2 },
    { segment: { text: header.position, style: { bold: true } }, rank: 0 },
    { segment: { text: header.pace }, rank: 3 },
    { segment: header.stale ? { text: `no growth: ${header.growth.replace(/^grew /, 'last grew ')}`, style: { fg: 'yellow', bold: true, inverse: true } } : { text: header.growth }, rank: 0 },
  ];
  if (header.span !== 'whole history') pieces.push({ segment: { text: header.span }, rank: 1 });
  if (header.paused) pieces.push({ segment: { text: 'PAUSED', style: { inverse: true, bold: true } }, rank: 0 });
  const chars = Array.from(header.file);
  const baseLength = Array.from(header.file.replace(/^.*\/(?=.)/, '')).length;
  const rightOf = (kept: typeof pieces): Segment[] => kept.flatMap((piece) => [sep, piece.segment]);
  const widthOf = (segments: readonly Segment[]): number => segments.reduce((sum, segment) => sum + Array.from(segment.text).length, 0);
  let kept = pieces;
  // Room wanted for the file: all of it, or `…/` and its base name, and at least 24 cells (a
  // base name such as `run.log` needs its folder to name the run).
  const wanted = Math.min(chars.length, Math.max(baseLength + 2, 24));
  for (let rank = 3; rank >= 1 && widthOf(rightOf(kept)) + wanted > width; rank--) kept = kept.filter((piece) => piece.rank !== rank);
  const right = rightOf(kept);
  // The file name gives way next, cut from the left at a folder boundary when it can be (its end
  // names the run: `…/case-17/run.log`).
  const room = Math.max(12, width - widthOf(right));
  let file = header.file;
  if (chars.length > room) {
    const tail = chars.slice(chars.length - room + 1).join('');
    const slash = tail.indexOf('/');
    file = slash >= 0 && slash < tail.length - 1 ? `…${tail.slice(slash)}` : `…${tail}`;
  }
  return fitLine([{ text: file, style: { bold: true } }, ...right], width);
}

export function paintVerdict(verdict: VerdictModel, width: number): StyledLine[] {
  const headline: Segment = { text: ` ${verdict.headline} `, style: bannerStyle(verdict.state) };
  // The advice is what to do: it may run on into the second line rather than be cut; the details
  // (reasons, unmet criteria) take whatever room is left after it.
  const room = Math.max(0, width - Array.from(headline.text).length - 2);
  const [first, rest] = splitAtWord(verdict.advice, room);
  const second: Segment[] = [];
  if (rest !== '') second.push({ text: rest, style: { bold: true } });
  if (verdict.details !== '') second.push({ text: rest !== '' ? ` — ${verdict.details}` : verdict.details });
  return [
    fitLine([headline, { text: '  ' }, { text: first, style: { bold: true } }], width),
    fitLine(second, width),
  ];
}

/** `text` split into the longest head of whole words that fits `width` cells, and the rest. A first
 * word longer than the width is cut (the rest starts after it). */
export function splitAtWord(text: string, width: number): [string, string] {
  const chars = Array.from(text);
  if (chars.length <= width) return [text, ''];
  const head = chars.slice(0, width + 1).join('');
  const cut = head.lastIndexOf(' ');
  if (cut <= 0) return [`${chars.slice(0, Math.max(0, width - 1)).join('')}…`, chars.slice(width - 1).join('').trimStart()];
  return [head.slice(0, cut).trimEnd(), Array.from(text).slice(Array.from(head.slice(0, cut)).length).join('').trimStart()];
}

interface Column {
  readonly title: string;
  readonly width: number;
  readonly align: 'left' | 'right';
  readonly cell: (row: SeriesRow) => Segment;
}

const TABLE_COLUMNS: readonly Column[] = [
  { title: 'state', width: 11, align: 'left', cell: (row) => ({ text: row.stateText, style: row.stateText === row.state ? stateStyle(row.state) : { fg: 'gray' } }) },
  { title: 'last', width: 8, align: 'right', cell: (row) => ({ text: row.last }) },
  { title: 'trend', width: 10, align: 'right', cell: (row) => ({ text: row.trend }) },
  { title: 'it left', width: 8, align: 'right', cell: (row) => ({ text: row.etaIterations }) },
  { title: 'time', width: 7, align: 'right', cell: (row) => ({ text: row.etaTime }) },
  { title: 'settled ±95%', width: 16, align: 'right', cell: (row) => ({ text: row.settled }) },
];
const NAME_MIN = 10;
const WHY_MIN = 24;

export function paintTable(rows: readonly SeriesRow[], width: number, height: number): StyledLine[] {
  if (height <= 0) return [];
  // Columns that fit, in priority order (the name keeps at least NAME_MIN cells).
  const columns: Column[] = [];
  let used = 2 + NAME_MIN;
  for (const column of TABLE_COLUMNS) {
    if (used + 1 + column.width > width) break;
    columns.push(column);
    used += 1 + column.width;
  }
  const spare = width - used;
  const why = spare >= WHY_MIN + 8;
  // The name column grows to the longest name (within limits); the reasons get what is left.
  const longest = rows.reduce((most, row) => Math.max(most, Array.from(row.name).length), 0);
  const nameWidth = Math.max(NAME_MIN, Math.min(longest, NAME_MIN + (why ? Math.min(8, spare - WHY_MIN) : Math.min(spare, 12))));
  const whyWidth = why ? width - used - (nameWidth - NAME_MIN) - 1 : 0;
  const pad = (text: string, column: { width: number; align: 'left' | 'right' }): string =>
    column.align === 'right' ? fitRight(text, column.width) : fit(text, column.width, true);

  const head: Segment[] = [{ text: `  ${fit('series', nameWidth, true)}` }];
  for (const column of columns) head.push({ text: ` ${pad(column.title, column)}` });
  if (why) head.push({ text: ` ${fit('why', whyWidth, true)}` });
  const lines: StyledLine[] = [fitLine(head.map((s) => ({ text: s.text, style: { fg: 'gray', underline: true } as TextStyle })), width)];

  const { first, visible } = tableWindow(rows, height);
  for (const row of rows.slice(first, first + visible)) {
    const style = seriesStyle(row.style);
    const cells: Segment[] = [
      { text: `${row.hidden ? '-' : style.marker} `, style: { fg: style.colour, bold: true } },
      { text: fit(row.hidden ? `${row.name} (hidden)` : row.name, nameWidth, true), style: row.hidden ? { fg: 'gray' } : { fg: style.colour } },
    ];
    for (const column of columns) {
      const cell = column.cell(row);
      cells.push({ text: ' ' }, { text: pad(cell.text, column), style: cell.style });
    }
    if (why) cells.push({ text: ' ' }, { text: fit(row.reason, whyWidth, true), style: { fg: 'gray' } });
    // The cursor shows as the name in reverse video: enough to find it, quiet enough to read past.
    if (row.cursor) cells[1] = { text: cells[1].text, style: { ...cells[1].style, inverse: true } };
    lines.push(fitLine(cells, width));
  }
  if (rows.length === 0) lines.push(fitLine([{ text: '  no series yet', style: { fg: 'gray' } }], width));
  while (lines.length < height) lines.push(fitLine([], width));
  return lines.slice(0, height);
}

/** Which rows a table of `height` lines (titles included) shows: scrolled so the cursor row stays
 * in view. `above` and `below` count the rows out of view. */
export function tableWindow(rows: readonly { readonly cursor: boolean }[], height: number): { first: number; visible: number; above: number; below: number } {
  const visible = Math.max(0, height - 1);
  const cursor = Math.max(0, rows.findIndex((row) => row.cursor));
  const first = Math.max(0, Math.min(cursor - visible + 1, rows.length - visible));
  return { first, visible, above: first, below: Math.max(0, rows.length - first - visible) };
}

/** The series panel's title, counting the series scrolled out of view. */
export function tableTitle(rows: readonly { readonly cursor: boolean }[], height: number): string {
  const { above, below } = tableWindow(rows, height);
  if (above + below === 0) return ' series ';
  const more = [above > 0 ? `${above} above` : '', below > 0 ? `${below} below` : ''].filter((text) => text !== '').join(', ');
  return ` series (${rows.length}; ${more}: j k scroll) `;
}

export function paintTimeline(entries: readonly TimelineEntry[], width: number, height: number): StyledLine[] {
  const lines: StyledLine[] = entries.slice(0, height).map((entry) => fitLine([{ text: entry.text, style: stateStyle(entry.state) }], width));
  if (entries.length === 0 && height > 0) lines.push(fitLine([{ text: 'no state changes yet', style: { fg: 'gray' } }], width));
  while (lines.length < height) lines.push(fitLine([], width));
  return lines.slice(0, height);
}

export function paintHelp(width: number, height: number): StyledLine[] {
  const keyWidth = Math.max(...KEY_HELP.map((entry) => entry.keys.length)) + 2;
  const lines: StyledLine[] = KEY_HELP.map((entry) => fitLine([{ text: fit(entry.keys, keyWidth, true), style: { bold: true } }, { text: entry.action }], width));
  lines.push(fitLine([], width));
  lines.push(fitLine([{ text: 'residual axis: powers of ten (1e-3 = 0.001); dotted: target' }], width));
  lines.push(fitLine([{ text: 'quantity: solid = settled mean, faint = its 95 % band' }], width));
  lines.push(fitLine([{ text: 'markers (o + x * ...) name the series in every panel' }], width));
  lines.push(fitLine([{ text: 'any key closes this help', style: { fg: 'gray' } }], width));
  while (lines.length < height) lines.push(fitLine([], width));
  return lines.slice(0, height);
}

function paintOverview(model: OverviewModel): Partial<Record<PanelName, PaintedPanel>> {
  const { layout } = model;
  const { width, height } = inner(layout.overview);
  // `oscillating`, `iteration`, `res_u_max 1.1e-4`, `12 min ago`: the run's name gets the rest.
  const verdictWidth = 11;
  const iterationWidth = 9;
  const residualWidth = 16;
  const growthWidth = 12;
  const labelWidth = Math.max(10, width - 2 - verdictWidth - iterationWidth - residualWidth - growthWidth - 4);
  const lines: StyledLine[] = [fitLine([{
    text: `  ${fit('run', labelWidth, true)} ${fit('verdict', verdictWidth, true)} ${fitRight('iteration', iterationWidth)} ${fit('worst residual', residualWidth, true)} ${fit('last growth', growthWidth, true)}`,
    style: { fg: 'gray', underline: true },
  }], width)];
  const { first, visible, above, below } = tableWindow(model.rows, height);
  for (const row of model.rows.slice(first, first + visible)) {
    const line = fitLine([
      { text: row.cursor ? '> ' : '  ', style: { bold: true } },
      { text: fitPath(row.label, labelWidth, true) },
      { text: ' ' },
      { text: fit(row.verdict ?? 'waiting', verdictWidth, true), style: stateStyle(row.verdict) },
      { text: ` ${fitRight(row.iteration, iterationWidth)} ${fit(row.worstResidual, residualWidth, true)} ` },
      { text: fit(row.lastGrowth, growthWidth, true), style: row.stale ? { fg: 'yellow', bold: true } : undefined },
    ], width);
    lines.push(row.cursor ? line.map((segment) => ({ text: segment.text, style: { ...segment.style, inverse: true } })) : line);
  }
  while (lines.length < height) lines.push(fitLine([], width));
  return {
    header: { rect: layout.header, lines: [fitLine([{ text: model.title, style: { bold: true } }], layout.header.width)] },
    overview: { rect: layout.overview, title: ` runs, worst first${above + below > 0 ? ` (${above + below} out of view)` : ''}; enter opens one `, lines: lines.slice(0, height) },
    footer: { rect: layout.footer, lines: [fitLine([{ text: model.footer, style: { fg: 'gray' } }], layout.footer.width)] },
  };
}

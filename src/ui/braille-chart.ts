/**
 * A line chart painted with braille cells (2 × 4 dots per character), as styled text lines. Pure.
 *
 * Our own painter rather than a charting widget: the dashboard needs logarithmic residual axes with
 * decade labels, reference levels (targets, settled means and bands), gaps for non-finite values,
 * markers that tell series apart without colour, and a cost that does not grow with history (the
 * lines arrive already downsampled to about two points per dot column).
 *
 * Panel interior: row 0 is the legend, rows 1..h−2 the plot (y labels on the left), row h−1 the
 * x labels. Cost: O(points + cells).
 */
import type { ChartModel } from './dashboard-model.js';
import { seriesStyle } from './series-styles.js';
import type { Segment, StyledLine, TextStyle } from './styled-text.js';
import { fitLine, lineWidth } from './styled-text.js';
import { fit, fitRight } from './format-figures.js';

export interface ChartGeometry {
  /** Characters left of the plot: tick labels and the axis. */
  readonly labelWidth: number;
  /** Plot size in character cells. */
  readonly plotCols: number;
  readonly plotRows: number;
}

/** The plot area of a chart drawn in an interior of `width` × `height` cells. */
export function chartGeometry(width: number, height: number, labelWidth: number): ChartGeometry {
  return { labelWidth, plotCols: Math.max(0, width - labelWidth), plotRows: Math.max(0, height - 2) };
}

// Braille dot bits by [column][row] within a cell (Unicode braille patterns, U+2800 block).
const DOT_BITS = [[0x01, 0x02, 0x04, 0x40], [0x08, 0x10, 0x20, 0x80]];
const LEVEL_OWNER = -2;
const NO_OWNER = -1;

const AXIS_STYLE: TextStyle = { fg: 'gray' };
const LEVEL_STYLES: Readonly<Record<string, TextStyle>> = {
  target: { fg: 'red' },
  mean: { fg: 'white', bold: true },
  band: { fg: 'gray' },
};

/** Paint `chart` into an interior of `width` × `height` cells: exactly `height` lines of `width` cells. */
export function paintChart(chart: ChartModel, width: number, height: number, labelWidth: number, colour: boolean): StyledLine[] {
  const { plotCols, plotRows } = chartGeometry(width, height, labelWidth);
  const lines: StyledLine[] = [];
  if (height <= 0 || width <= 0) return lines;

  // Legend: names, then reference levels and notes; when that is too wide, one space between
  // entries and levels by their value alone (`·· 1e-3` for `·· target 1e-3`).
  const legendOf = (compact: boolean): Segment[] => {
    const gap: Segment = { text: compact ? ' ' : '  ' };
    const legend: Segment[] = [];
    for (const entry of chart.legend) {
      const style = seriesStyle(entry.style);
      legend.push({ text: `${style.marker} ${entry.name}`, style: { fg: style.colour } }, gap);
    }
    for (const level of chart.levels) {
      if (level.kind === 'band') continue;
      const label = compact ? level.label.replace(/^[a-z]+ /, '') : level.label;
      legend.push({ text: level.kind === 'target' ? `·· ${label}` : `── ${label}`, style: LEVEL_STYLES[level.kind] }, gap);
    }
    if ((chart.restarts?.length ?? 0) > 0) legend.push({ text: '┊ restart', style: LEVEL_STYLES.band }, gap);
    if (chart.hiddenCount > 0) legend.push({ text: `(${chart.hiddenCount} hidden)`, style: AXIS_STYLE });
    return legend;
  };
  let legend = legendOf(false);
  if (lineWidth(trimEnd(legend)) > width) legend = legendOf(true);
  lines.push(fitLine(legend, width));
  if (height === 1) return lines;

  const dotCols = plotCols * 2;
  const dotRows = plotRows * 4;
  const bits = new Uint8Array(plotCols * plotRows);
  const owner = new Int16Array(plotCols * plotRows).fill(NO_OWNER);
  const levelKind: string[] = new Array<string>(plotCols * plotRows);
  const markers = new Map<number, { char: string; style: number }>();
  const drawable = chart.empty === undefined && plotCols > 0 && plotRows > 0 && chart.xMax >= chart.xMin && chart.yMax > chart.yMin;

  const xSpan = chart.xMax - chart.xMin;
  const toDotX = (x: number): number => (xSpan > 0 ? Math.round(((x - chart.xMin) / xSpan) * (dotCols - 1)) : 0);
  const toDotY = (y: number): number => Math.round(((chart.yMax - y) / (chart.yMax - chart.yMin)) * (dotRows - 1));
  const inside = (dx: number, dy: number): boolean => dx >= 0 && dx < dotCols && dy >= 0 && dy < dotRows;
  const setDot = (dx: number, dy: number, who: number, kind?: string): void => {
    if (!inside(dx, dy)) return;
    const cell = (dy >> 2) * plotCols + (dx >> 1);
    bits[cell] |= DOT_BITS[dx & 1][dy & 3];
    if (who !== LEVEL_OWNER || owner[cell] === NO_OWNER) {
      owner[cell] = who;
      if (kind !== undefined) levelKind[cell] = kind;
    }
  };

  if (drawable) {
    // Reference levels first, so data drawn over them wins the cell's colour.
    for (const level of chart.levels) {
      if (!(level.y >= chart.yMin && level.y <= chart.yMax)) continue;
      const dy = toDotY(level.y);
      const from = level.fromX === undefined ? 0 : Math.max(0, toDotX(level.fromX));
      const every = level.kind === 'mean' ? 1 : level.kind === 'target' ? 2 : 3;
      for (let dx = from; dx < dotCols; dx += every) setDot(dx, dy, LEVEL_OWNER, level.kind);
    }
    // Restarts: dotted vertical lines.
    for (const restart of chart.restarts ?? []) {
      if (!(restart >= chart.xMin && restart <= chart.xMax)) continue;
      const dx = toDotX(restart);
      for (let dy = 0; dy < dotRows; dy += 2) setDot(dx, dy, LEVEL_OWNER, 'band');
    }
    // Data lines: straight segments between consecutive finite points; a non-finite point is a gap.
    for (const line of chart.lines) {
      let px = Number.NaN;
      let py = Number.NaN;
      let lastCell = -1;
      let lastMarkCol = -1000;
      const n = Math.min(line.x.length, line.y.length);
      for (let i = 0; i < n; i++) {
        const y = line.y[i];
        if (!Number.isFinite(y) || !Number.isFinite(line.x[i])) {
          px = Number.NaN;
          continue;
        }
        const dx = toDotX(line.x[i]);
        const dy = Math.max(0, Math.min(dotRows - 1, toDotY(y)));
        if (Number.isNaN(px)) setDot(dx, dy, line.style);
        else drawSegment(px, py, dx, dy, (x, yy) => setDot(x, yy, line.style));
        px = dx;
        py = dy;
        if (inside(dx, dy)) lastCell = (dy >> 2) * plotCols + (dx >> 1);
        // Without colour, markers along the line tell the series apart.
        if (!colour && dx - lastMarkCol >= 24 + 4 * line.style && inside(dx, dy)) {
          markers.set((dy >> 2) * plotCols + (dx >> 1), { char: seriesStyle(line.style).marker, style: line.style });
          lastMarkCol = dx;
        }
      }
      if (lastCell >= 0) markers.set(lastCell, { char: seriesStyle(line.style).marker, style: line.style });
    }
  }

  // Tick rows.
  const tickAt = new Map<number, string>();
  if (drawable) {
    // Top tick first; a tick whose row is taken, or touches a taken row, is left out.
    for (const tick of [...chart.yTicks].sort((a, b) => b.at - a.at)) {
      if (tick.at < chart.yMin || tick.at > chart.yMax) continue;
      const row = Math.min(plotRows - 1, toDotY(tick.at) >> 2);
      if (tickAt.has(row) || (tickAt.has(row - 1) && plotRows > 3)) continue;
      tickAt.set(row, tick.label);
    }
  }
  const emptyRow = Math.floor((plotRows - 1) / 2);
  for (let row = 0; row < plotRows && lines.length < height - 1; row++) {
    const label = tickAt.get(row);
    const segments: Segment[] = [
      { text: fitRight(label ?? '', labelWidth - 1), style: AXIS_STYLE },
      { text: label === undefined ? '│' : '┤', style: AXIS_STYLE },
    ];
    if (!drawable) {
      const text = row === emptyRow ? (chart.empty ?? '') : '';
      segments.push({ text: fit(' '.repeat(Math.max(0, Math.floor((plotCols - text.length) / 2))) + text, plotCols, true) });
      lines.push(fitLine(segments, width));
      continue;
    }
    let runText = '';
    let runStyle: TextStyle | undefined;
    const flush = (): void => {
      if (runText.length > 0) segments.push({ text: runText, style: runStyle });
      runText = '';
    };
    for (let col = 0; col < plotCols; col++) {
      const cell = row * plotCols + col;
      const marker = markers.get(cell);
      let char: string;
      let style: TextStyle | undefined;
      if (marker !== undefined) {
        char = marker.char;
        style = { fg: seriesStyle(marker.style).colour, bold: true };
      } else if (bits[cell] === 0) {
        char = ' ';
        style = undefined;
      } else {
        char = String.fromCharCode(0x2800 + bits[cell]);
        const who = owner[cell];
        style = who === LEVEL_OWNER ? LEVEL_STYLES[levelKind[cell] ?? 'band'] : who >= 0 ? { fg: seriesStyle(who).colour } : undefined;
      }
      if (style !== runStyle) {
        flush();
        runStyle = style;
      }
      runText += char;
    }
    flush();
    lines.push(fitLine(segments, width));
  }

  // X labels.
  const axis = Array.from(' '.repeat(width));
  axis[labelWidth - 1] = '└';
  if (drawable) {
    let freeFrom = labelWidth;
    for (const tick of chart.xTicks) {
      const col = labelWidth + (toDotX(tick.at) >> 1);
      const start = Math.max(freeFrom, col - Math.floor(tick.label.length / 2));
      if (start + tick.label.length > width) continue;
      for (let i = 0; i < tick.label.length; i++) axis[start + i] = tick.label[i];
      freeFrom = start + tick.label.length + 2;
    }
  }
  while (lines.length < height) lines.push(fitLine(lines.length === height - 1 ? [{ text: axis.join(''), style: AXIS_STYLE }] : [], width));
  return lines;
}

/** `line` without its trailing gap segment. */
function trimEnd(line: readonly Segment[]): Segment[] {
  const out = [...line];
  while (out.length > 0 && out[out.length - 1].text.trim() === '' && out[out.length - 1].style === undefined) out.pop();
  return out;
}

/** Bresenham's line algorithm (Bresenham 1965, "Algorithm for computer control of a digital
 * plotter", IBM Systems Journal 4(1)): every dot from (x0, y0) to (x1, y1), endpoints included. */
export function drawSegment(x0: number, y0: number, x1: number, y1: number, plot: (x: number, y: number) => void): void {
  const dx = Math.abs(x1 - x0);
  const dy = -Math.abs(y1 - y0);
  const sx = x0 < x1 ? 1 : -1;
  const sy = y0 < y1 ? 1 : -1;
  let error = dx + dy;
  let x = x0;
  let y = y0;
  for (;;) {
    plot(x, y);
    if (x === x1 && y === y1) return;
    const e2 = 2 * error;
    if (e2 >= dy) {
      error += dy;
      x += sx;
    }
    if (e2 <= dx) {
      error += dx;
      y += sy;
    }
  }
}

/**
 * A small SVG line chart for reports: series against iteration on a linear or logarithmic y axis,
 * with horizontal reference lines (a residual target), vertical markers (restarts) and shaded bands
 * (a quantity's settled mean with its confidence interval). Returns a standalone SVG document as a
 * string; needs no DOM (d3-scale for the axes, d3-shape for the path strings).
 *
 * Readable in monochrome: every series has a dash pattern as well as a colour (colours from the
 * colour-blind-safe set of Okabe & Ito (2008), "Color Universal Design"), and a legend names each one.
 * Long series are cut to about two points per horizontal pixel by Largest-Triangle-Three-Buckets
 * (Steinarsson 2013), in log space on a log axis. Values that cannot be drawn (NaN, ±Infinity, and
 * values ≤ 0 on a log axis) leave a gap in the line; NaN and ±Infinity also get a small mark at the
 * top edge so a blow-up is not silently lost.
 *
 * Cost: O(n) per series for n points, output O(width) per series.
 */
import { scaleLinear, scaleLog } from 'd3-scale';
import { line } from 'd3-shape';
import { downsampleLttbSorted } from '../series/downsample-lttb.js';

export interface ChartSeries {
  readonly name: string;
  readonly x: ArrayLike<number>;
  readonly y: ArrayLike<number>;
  /** Points to use (default: min(x.length, y.length)). */
  readonly length?: number;
}

export interface ChartRule {
  readonly value: number;
  readonly label: string;
}

export interface ChartBand {
  readonly name: string;
  readonly fromX: number;
  readonly toX: number;
  readonly low: number;
  readonly high: number;
  /** Drawn as a dashed line inside the band (a settled mean). */
  readonly centre?: number;
}

export interface LineChartSpec {
  readonly title: string;
  readonly yScale: 'log' | 'linear';
  readonly xLabel: string;
  readonly yLabel?: string;
  readonly series: readonly ChartSeries[];
  /** Horizontal lines (e.g. a residual target). */
  readonly horizontalRules?: readonly ChartRule[];
  /** Vertical lines at these x values (e.g. restarts). */
  readonly verticalRules?: readonly ChartRule[];
  readonly bands?: readonly ChartBand[];
  readonly width?: number;
  readonly height?: number;
  /** Short description for screen readers and for viewers that show alternative text. */
  readonly description?: string;
  /** Prefix for ids inside the SVG (the clip path), unique per chart when several share one HTML
   * page. Default: derived from the title. */
  readonly idPrefix?: string;
}

/** Colour and dash pattern of the i-th series (6 colours × 5 dashes: 30 distinct pairs before a repeat). */
export const SERIES_COLOURS = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9'] as const;
export const SERIES_DASHES = ['', '7 3', '2 2', '9 3 2 3', '4 4'] as const;

export function seriesStyle(index: number): { colour: string; dash: string } {
  return {
    colour: SERIES_COLOURS[index % SERIES_COLOURS.length],
    dash: SERIES_DASHES[index % SERIES_DASHES.length],
  };
}

const FONT = 'font-family="system-ui, -apple-system, Segoe UI, Helvetica, Arial, sans-serif"';
const MARGIN = { top: 34, right: 16, bottom: 40, left: 62 };
const LEGEND_ROW = 16;

export function escapeXml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c] as string);
}

/** Label of a decade tick: 1, 10, 100, then 1e3 …; 0.1, 0.01, then 1e-3 …. */
export function decadeLabel(exponent: number): string {
  if (exponent >= 0 && exponent <= 2) return String(10 ** exponent);
  if (exponent === -1) return '0.1';
  if (exponent === -2) return '0.01';
  return `1e${exponent}`;
}

/** Decade ticks of a log axis over [lo, hi] (both powers of ten), at most ~8 of them. */
export function decadeTicks(lo: number, hi: number): number[] {
  const from = Math.round(Math.log10(lo));
  const to = Math.round(Math.log10(hi));
  const span = to - from;
  const stride = Math.max(1, Math.ceil(span / 8));
  const ticks: number[] = [];
  for (let e = from; e <= to; e++) if ((e - from) % stride === 0) ticks.push(e);
  return ticks;
}

interface Prepared {
  readonly name: string;
  /** Downsampled points in data units (y already on the drawing scale: log10 for a log axis), NaN = gap. */
  readonly points: readonly [number, number][];
  /** x of non-finite values (first of each run), for top-edge marks. */
  readonly blowUps: readonly number[];
}

/** Split at undrawable points, downsample each finite run in proportion to its length, join with gaps. */
function prepare(series: ChartSeries, log: boolean, budget: number): Prepared {
  const n = Math.min(series.length ?? Infinity, series.x.length, series.y.length);
  const runs: { from: number; to: number }[] = [];
  const blowUps: number[] = [];
  let start = -1;
  let finiteCount = 0;
  let previousNonFinite = false;
  const drawY = (v: number): number => (log ? (v > 0 ? Math.log10(v) : Number.NaN) : v);
  for (let i = 0; i <= n; i++) {
    const v = i < n ? series.y[i] : Number.NaN;
    const ok = i < n && Number.isFinite(drawY(v)) && Number.isFinite(series.x[i]);
    if (i < n && !Number.isFinite(v)) {
      if (!previousNonFinite && Number.isFinite(series.x[i])) blowUps.push(series.x[i]);
      previousNonFinite = true;
    } else {
      previousNonFinite = false;
    }
    if (ok && start < 0) start = i;
    if (!ok && start >= 0) {
      runs.push({ from: start, to: i });
      finiteCount += i - start;
      start = -1;
    }
  }
  const points: [number, number][] = [];
  for (const run of runs) {
    const length = run.to - run.from;
    const xs = new Float64Array(length);
    const ys = new Float64Array(length);
    for (let i = 0; i < length; i++) {
      xs[i] = series.x[run.from + i];
      ys[i] = drawY(series.y[run.from + i]);
    }
    const share = Math.max(3, Math.round((budget * length) / Math.max(1, finiteCount)));
    if (points.length > 0) points.push([Number.NaN, Number.NaN]);
    for (const i of downsampleLttbSorted(xs, ys, 0, xs.length, share)) points.push([xs[i], ys[i]]);
  }
  return { name: series.name, points, blowUps };
}

/** FNV-1a hash of a text, base 36 (stable ids, no randomness). */
function hashText(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(36);
}

function num(x: number): string {
  return String(Math.round(x * 10) / 10);
}

/** Render the chart as a standalone SVG document. */
export function renderLineChartSvg(spec: LineChartSpec): string {
  const width = spec.width ?? 720;
  const height = spec.height ?? 300;
  const log = spec.yScale === 'log';
  const legendRows = Math.max(1, Math.ceil((spec.series.length + (spec.bands?.length ?? 0)) / 4));
  const top = MARGIN.top + LEGEND_ROW * legendRows;
  const plotH = Math.max(40, height - top - MARGIN.bottom);
  // About two points per pixel of the plot's width (the left margin is settled below, by the labels).
  const prepared = spec.series.map((s) => prepare(s, log, Math.max(40, width - MARGIN.left - MARGIN.right) * 2));

  // Extents, in drawing units.
  let xMin = Infinity;
  let xMax = -Infinity;
  let yMin = Infinity;
  let yMax = -Infinity;
  const takeY = (v: number): void => {
    const d = log ? (v > 0 ? Math.log10(v) : Number.NaN) : v;
    if (Number.isFinite(d)) {
      yMin = Math.min(yMin, d);
      yMax = Math.max(yMax, d);
    }
  };
  for (const p of prepared) {
    for (const [x, y] of p.points) {
      if (!Number.isFinite(y)) continue;
      xMin = Math.min(xMin, x);
      xMax = Math.max(xMax, x);
      yMin = Math.min(yMin, y);
      yMax = Math.max(yMax, y);
    }
    for (const x of p.blowUps) {
      xMin = Math.min(xMin, x);
      xMax = Math.max(xMax, x);
    }
  }
  for (const rule of spec.horizontalRules ?? []) takeY(rule.value);
  for (const band of spec.bands ?? []) {
    takeY(band.low);
    takeY(band.high);
  }
  const empty = !Number.isFinite(xMin);
  if (empty) {
    xMin = 0;
    xMax = 1;
  }
  if (xMax === xMin) xMax = xMin + 1;
  if (!Number.isFinite(yMin)) {
    yMin = log ? -1 : 0;
    yMax = log ? 0 : 1;
  }

  let yTicks: { at: number; label: string }[];
  let yOf: (drawValue: number) => number;
  if (log) {
    let lo = Math.floor(yMin);
    let hi = Math.ceil(yMax);
    if (hi === lo) hi = lo + 1;
    const scale = scaleLog().domain([10 ** lo, 10 ** hi]).range([top + plotH, top]);
    lo = Math.log10(scale.domain()[0]);
    hi = Math.log10(scale.domain()[1]);
    yOf = (d) => scale(10 ** d);
    yTicks = decadeTicks(10 ** lo, 10 ** hi).map((e) => ({ at: scale(10 ** e), label: decadeLabel(e) }));
  } else {
    // A span too small to label (a constant, or float noise around one value) is widened to a
    // relative 1e-6 around its centre so ticks stay readable.
    const minimumSpan = Math.max(Math.abs(yMin + yMax) * 1e-6, 1e-12);
    if (yMax - yMin < minimumSpan) {
      const centre = (yMin + yMax) / 2;
      yMin = centre - minimumSpan;
      yMax = centre + minimumSpan;
    }
    const scale = scaleLinear().domain([yMin, yMax]).nice(5).range([top + plotH, top]);
    const format = scale.tickFormat(5);
    yOf = (d) => scale(d);
    yTicks = scale.ticks(5).map((t) => ({ at: scale(t), label: format(t) }));
  }
  // Left margin wide enough for the longest y label (about 6.5 px per character at 11 px).
  const left = Math.max(MARGIN.left, Math.ceil(28 + 6.5 * Math.max(0, ...yTicks.map((t) => t.label.length))));
  const plotW = Math.max(40, width - left - MARGIN.right);
  const x = scaleLinear().domain([xMin, xMax]).range([left, left + plotW]);
  const xFormat = x.tickFormat(6);
  const xTicks = x.ticks(6).map((t) => ({ at: x(t), label: xFormat(t) }));
  const clipY = (v: number): number => Math.min(top + plotH, Math.max(top, v));
  const drawOf = (v: number): number => (log ? (v > 0 ? Math.log10(v) : Number.NaN) : v);

  const clipId = `${spec.idPrefix ?? `chart-${hashText(spec.title + spec.series.map((s) => s.name).join(','))}`}-plot`;
  const out: string[] = [];
  const title = escapeXml(spec.title);
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="${title}">`);
  out.push(`<title>${title}</title>`);
  if (spec.description) out.push(`<desc>${escapeXml(spec.description)}</desc>`);
  out.push(`<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`);
  out.push(`<text x="${left}" y="18" ${FONT} font-size="14" font-weight="600" fill="#222">${title}</text>`);
  out.push(`<defs><clipPath id="${clipId}"><rect x="${left}" y="${top}" width="${plotW}" height="${plotH}"/></clipPath></defs>`);

  // Grid and axes.
  out.push(`<g ${FONT} font-size="11" fill="#444">`);
  for (const t of yTicks) {
    out.push(`<line x1="${left}" x2="${left + plotW}" y1="${num(t.at)}" y2="${num(t.at)}" stroke="#e3e3e3" stroke-width="1"/>`);
    out.push(`<text class="tick-y" x="${left - 6}" y="${num(t.at + 4)}" text-anchor="end">${escapeXml(t.label)}</text>`);
  }
  for (const t of xTicks) {
    out.push(`<line x1="${num(t.at)}" x2="${num(t.at)}" y1="${top + plotH}" y2="${top + plotH + 4}" stroke="#444" stroke-width="1"/>`);
    out.push(`<text class="tick-x" x="${num(t.at)}" y="${top + plotH + 17}" text-anchor="middle">${escapeXml(t.label)}</text>`);
  }
  out.push(`<rect x="${left}" y="${top}" width="${plotW}" height="${plotH}" fill="none" stroke="#888" stroke-width="1"/>`);
  out.push(`<text x="${left + plotW / 2}" y="${height - 6}" text-anchor="middle">${escapeXml(spec.xLabel)}</text>`);
  if (spec.yLabel) {
    out.push(`<text transform="translate(14 ${num(top + plotH / 2)}) rotate(-90)" text-anchor="middle">${escapeXml(spec.yLabel)}</text>`);
  }
  out.push('</g>');

  out.push(`<g clip-path="url(#${clipId})">`);
  // Bands under the lines.
  (spec.bands ?? []).forEach((band, i) => {
    const { colour } = seriesStyle(i);
    const x0 = x(band.fromX);
    const x1 = x(band.toX);
    let yHigh = clipY(yOf(drawOf(band.high)));
    let yLow = clipY(yOf(drawOf(band.low)));
    if (yLow - yHigh < 3) {
      // Keep a band narrower than the pen visible: at least 3 px, centred where it is.
      const middle = (yLow + yHigh) / 2;
      yHigh = middle - 1.5;
      yLow = middle + 1.5;
    }
    if (![x0, x1, yHigh, yLow].every(Number.isFinite)) return;
    out.push(`<rect x="${num(x0)}" y="${num(yHigh)}" width="${num(Math.max(1, x1 - x0))}" height="${num(yLow - yHigh)}" fill="${colour}" fill-opacity="0.15" stroke="${colour}" stroke-width="1" stroke-dasharray="3 2"><title>${escapeXml(band.name)}</title></rect>`);
    if (band.centre !== undefined && Number.isFinite(yOf(drawOf(band.centre)))) {
      const yc = num(yOf(drawOf(band.centre)));
      out.push(`<line x1="${num(x0)}" x2="${num(x1)}" y1="${yc}" y2="${yc}" stroke="${colour}" stroke-width="1.5" stroke-dasharray="6 2 1 2"/>`);
    }
  });
  // Series.
  const path = line<[number, number]>()
    .defined((p) => Number.isFinite(p[0]) && Number.isFinite(p[1]))
    .x((p) => x(p[0]))
    .y((p) => yOf(p[1]))
    .digits(1);
  prepared.forEach((p, i) => {
    const { colour, dash } = seriesStyle(i);
    const d = path(p.points);
    if (d) out.push(`<path d="${d}" fill="none" stroke="${colour}" stroke-width="1.6"${dash ? ` stroke-dasharray="${dash}"` : ''} stroke-linejoin="round"><title>${escapeXml(p.name)}</title></path>`);
    for (const bx of p.blowUps) {
      const cx = x(bx);
      out.push(`<path d="M${num(cx - 5)},${top + 1}L${num(cx + 5)},${top + 1}L${num(cx)},${top + 9}Z" fill="${colour}"><title>${escapeXml(`${p.name}: non-finite value at ${bx}`)}</title></path>`);
    }
  });
  out.push('</g>');

  // Rules on top, with labels.
  out.push(`<g ${FONT} font-size="10" fill="#333">`);
  // Labels of close rules are pushed apart (11 px, top to bottom) so they stay readable.
  const placed = (spec.horizontalRules ?? [])
    .map((rule) => ({ rule, at: yOf(drawOf(rule.value)) }))
    .filter((p) => Number.isFinite(p.at))
    .sort((a, b) => a.at - b.at);
  let lastLabel = Number.NEGATIVE_INFINITY;
  const rulesLabels: string[] = [];
  for (const { rule, at } of placed) {
    const labelY = Math.max(at - 4, lastLabel + 12);
    lastLabel = labelY;
    out.push(`<line x1="${left}" x2="${left + plotW}" y1="${num(at)}" y2="${num(at)}" stroke="#222" stroke-width="1.2" stroke-dasharray="10 3 2 3"/>`);
    rulesLabels.push(`<text x="${left + plotW - 4}" y="${num(labelY)}" text-anchor="end" stroke="#fff" stroke-width="3" paint-order="stroke">${escapeXml(rule.label)}</text>`);
  }
  // Labels after all the lines, with a white halo, so no line crosses a label.
  out.push(...rulesLabels);
  for (const rule of spec.verticalRules ?? []) {
    const at = x(rule.value);
    if (!Number.isFinite(at)) continue;
    out.push(`<line x1="${num(at)}" x2="${num(at)}" y1="${top}" y2="${top + plotH}" stroke="#666" stroke-width="1" stroke-dasharray="1 3"/>`);
    out.push(`<text x="${num(at + 3)}" y="${top + 11}">${escapeXml(rule.label)}</text>`);
  }
  if (empty) out.push(`<text x="${left + plotW / 2}" y="${top + plotH / 2}" text-anchor="middle" font-size="12">no drawable values</text>`);
  out.push('</g>');

  // Legend: line samples with the same colour and dash as the series.
  out.push(`<g ${FONT} font-size="11" fill="#222">`);
  const entries = [
    ...prepared.map((p, i) => ({ name: p.name, ...seriesStyle(i), band: false })),
    ...(spec.bands ?? []).map((b, i) => ({ name: b.name, ...seriesStyle(i), band: true })),
  ];
  const columns = Math.max(1, Math.min(4, entries.length));
  const column = plotW / columns;
  entries.forEach((entry, i) => {
    const lx = left + (i % columns) * column;
    const ly = MARGIN.top - 8 + Math.floor(i / columns) * LEGEND_ROW;
    if (entry.band) {
      out.push(`<rect x="${num(lx)}" y="${ly - 5}" width="22" height="9" fill="${entry.colour}" fill-opacity="0.15" stroke="${entry.colour}" stroke-dasharray="3 2"/>`);
    } else {
      out.push(`<line x1="${num(lx)}" x2="${num(lx + 22)}" y1="${ly}" y2="${ly}" stroke="${entry.colour}" stroke-width="2"${entry.dash ? ` stroke-dasharray="${entry.dash}"` : ''}/>`);
    }
    const maxChars = Math.max(4, Math.floor((column - 30) / 6.2));
    const name = entry.name.length > maxChars ? `${entry.name.slice(0, maxChars - 1)}…` : entry.name;
    out.push(`<text x="${num(lx + 27)}" y="${ly + 4}">${escapeXml(name)}</text>`);
  });
  out.push('</g>');
  out.push('</svg>');
  return out.join('\n');
}

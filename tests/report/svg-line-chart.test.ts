import { describe, expect, it } from 'vitest';
import { decadeLabel, decadeTicks, escapeXml, renderLineChartSvg, seriesStyle, type LineChartSpec } from '../../src/report/svg-line-chart.js';
import { xmlProblems } from './xml-well-formed.js';

const iterations = Float64Array.from({ length: 500 }, (_, i) => i + 1);
const residual = Float64Array.from(iterations, (it) => 10 ** (-it / 100)); // 1e-0.01 down to 1e-5

function pathsOf(svg: string): string[] {
  return [...svg.matchAll(/<path d="([^"]+)" fill="none"/g)].map((m) => m[1]);
}

function tickLabels(svg: string): string[] {
  return [...svg.matchAll(/<text class="tick-y" [^>]*>([^<]+)<\/text>/g)].map((m) => m[1]);
}

describe('renderLineChartSvg', () => {
  const spec: LineChartSpec = {
    title: 'Residuals of run <a & b>',
    yScale: 'log',
    xLabel: 'iteration',
    series: [{ name: 'res_p', x: iterations, y: residual }, { name: 'res_"u"', x: iterations, y: residual.map((v) => v * 3) }],
    horizontalRules: [{ value: 1e-6, label: 'target 1e-6' }],
    verticalRules: [{ value: 250, label: 'restart' }],
  };
  const svg = renderLineChartSvg(spec);

  it('writes well-formed XML with the SVG namespace, title escaped', () => {
    expect(xmlProblems(svg)).toEqual([]);
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg).toContain('<title>Residuals of run &lt;a &amp; b&gt;</title>');
    expect(svg).toContain('res_&quot;u&quot;');
  });

  it('puts log-axis ticks at whole decades, covering the data and the target (1e-6 … 1)', () => {
    expect(tickLabels(svg)).toEqual(['1e-6', '1e-5', '1e-4', '1e-3', '0.01', '0.1', '1', '10']);
  });

  it('draws the target line, the restart marker and a legend entry per series', () => {
    expect(svg).toContain('target 1e-6');
    expect(svg).toContain('>restart</text>');
    expect(svg).toMatch(/>res_p<\/text>/);
    expect(pathsOf(svg)).toHaveLength(2);
  });

  it('gives each series a different dash pattern as well as a colour (readable in monochrome)', () => {
    const dashes = new Set(Array.from({ length: 5 }, (_, i) => seriesStyle(i).dash));
    expect(dashes.size).toBe(5);
    expect(svg).toMatch(/stroke="#D55E00" stroke-width="1.6" stroke-dasharray="7 3"/);
  });

  it('skips non-finite points and values ≤ 0 on a log axis: the line breaks into separate pieces', () => {
    const y = Float64Array.from(residual);
    y[100] = Number.NaN;
    y[200] = 0;
    y[300] = Infinity;
    const broken = renderLineChartSvg({ ...spec, series: [{ name: 'res_p', x: iterations, y }] });
    expect(xmlProblems(broken)).toEqual([]);
    const d = pathsOf(broken)[0];
    expect(d).not.toMatch(/NaN|Infinity/);
    expect(d.match(/M/g)).toHaveLength(4); // four finite runs → four "move to" commands
    // NaN and Infinity get a mark at the top edge; a zero is only a gap
    expect(broken).toContain('res_p: non-finite value at 101');
    expect(broken).toContain('res_p: non-finite value at 301');
    expect(broken).not.toContain('non-finite value at 201');
  });

  it('downsamples a long series to about two points per pixel of plot width (LTTB)', () => {
    const n = 200_000;
    const x = Float64Array.from({ length: n }, (_, i) => i);
    const y = Float64Array.from(x, (i) => Math.exp(-i / 20_000) * (1 + 0.3 * Math.sin(i / 50)));
    const long = renderLineChartSvg({ ...spec, width: 600, series: [{ name: 'res_p', x, y }] });
    const points = pathsOf(long)[0].split(/[ML]/).filter(Boolean).length;
    expect(points).toBeLessThanOrEqual(2 * 600);
    expect(points).toBeGreaterThan(500);
  });

  it('draws a band with its centre line on a linear axis, and nice linear ticks', () => {
    const q = Float64Array.from(iterations, (it) => 2 + 0.5 * Math.exp(-it / 50));
    const banded = renderLineChartSvg({
      title: 'nu_hot', yScale: 'linear', xLabel: 'iteration', series: [{ name: 'nu_hot', x: iterations, y: q }],
      bands: [{ name: 'settled mean ± 95 %', fromX: 200, toX: 500, low: 1.99, high: 2.01, centre: 2 }],
    });
    expect(xmlProblems(banded)).toEqual([]);
    expect(banded).toMatch(/<rect [^>]*fill-opacity="0.15"[^>]*><title>settled mean ± 95 %<\/title><\/rect>/);
    expect(banded).toMatch(/stroke-dasharray="6 2 1 2"/);
    const labels = tickLabels(banded).map(Number);
    expect(labels.length).toBeGreaterThanOrEqual(3);
    expect(labels[0]).toBeLessThanOrEqual(1.99);
    expect(labels[labels.length - 1]).toBeGreaterThanOrEqual(2.5);
  });

  it('widens a span too small to label (a constant up to float noise) so the ticks are distinct and short', () => {
    const flat = renderLineChartSvg({ title: 'flat', yScale: 'linear', xLabel: 'iteration', series: [{ name: 'q', x: [1, 2, 3], y: [2.243, 2.2429999999999986, 2.243] }] });
    const labels = tickLabels(flat);
    expect(new Set(labels).size).toBe(labels.length);
    expect(labels.length).toBeGreaterThanOrEqual(3);
    for (const label of labels) expect(label.length).toBeLessThanOrEqual(9);
  });

  it('keeps labels of close target lines at least 12 px apart', () => {
    const close = renderLineChartSvg({ ...spec, horizontalRules: [{ value: 1e-3, label: 'A' }, { value: 1.1e-3, label: 'B' }, { value: 0.9e-3, label: 'C' }] });
    const ys = [...close.matchAll(/<text x="[\d.]+" y="([\d.]+)" text-anchor="end" stroke="#fff"[^>]*>([ABC])<\/text>/g)].map((m) => Number(m[1]));
    expect(ys).toHaveLength(3);
    for (let i = 1; i < ys.length; i++) expect(ys[i] - ys[i - 1]).toBeGreaterThanOrEqual(12 - 0.1);
  });

  it('says so when nothing can be drawn, and still writes valid XML', () => {
    const none = renderLineChartSvg({ title: 'empty', yScale: 'log', xLabel: 'iteration', series: [{ name: 'res_p', x: [1, 2], y: [0, -1] }] });
    expect(xmlProblems(none)).toEqual([]);
    expect(none).toContain('no drawable values');
  });

  it('gives charts with different titles different clip-path ids (several charts on one page)', () => {
    const a = renderLineChartSvg({ ...spec, title: 'a' }).match(/clipPath id="([^"]+)"/)?.[1];
    const b = renderLineChartSvg({ ...spec, title: 'b' }).match(/clipPath id="([^"]+)"/)?.[1];
    expect(a).toBeDefined();
    expect(a).not.toBe(b);
  });
});

describe('log-axis helpers', () => {
  it.each([
    [1e-6, 1, [-6, -5, -4, -3, -2, -1, 0]],
    [1e-20, 1, [-20, -17, -14, -11, -8, -5, -2]],
    [0.1, 10, [-1, 0, 1]],
  ])('decadeTicks(%s, %s) gives exponents %j', (lo, hi, expected) => {
    expect(decadeTicks(lo, hi)).toEqual(expected);
  });

  it.each([[0, '1'], [2, '100'], [3, '1e3'], [-1, '0.1'], [-2, '0.01'], [-3, '1e-3']])('decadeLabel(%i) = %s', (e, label) => {
    expect(decadeLabel(e)).toBe(label);
  });

  it('escapes the five XML special characters', () => {
    expect(escapeXml(`<a href="x">Tom & Jerry's</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;Tom &amp; Jerry&apos;s&lt;/a&gt;');
  });
});

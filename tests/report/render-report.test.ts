import { describe, expect, it } from 'vitest';
import { renderReport } from '../../src/report/render-report.js';
import { escapeMarkdown, svgDataUri } from '../../src/report/render-markdown-report.js';
import { REPORT_CAUTIONS } from '../../src/report/report-cautions.js';
import { REPORT_FORMATS } from '../../src/report/report-input.js';
import { fixtureInput, fixtureRun } from './report-fixture.js';
import { xmlProblems } from './xml-well-formed.js';

const input = fixtureInput();

describe('every report format', () => {
  it.each(REPORT_FORMATS)('%s: ends with the three cautions (verification, validation, codes and licensed practice)', (format) => {
    const text = renderReport(input, format);
    const tail = text.slice(text.toLowerCase().lastIndexOf('caution'));
    expect(tail).toMatch(/one part of verification/);
    expect(tail).toMatch(/converged run is not a validated one/);
    expect(tail).toMatch(/local codes[\s\S]*licensed professional practice/);
    // nothing but the cautions (and closing markup) after them
    expect(text.lastIndexOf('licensed professional practice')).toBeGreaterThan(text.length - 200);
  });

  it.each(REPORT_FORMATS)('%s: names the verdict, advice, reasons, parser, restart, timeline and criteria', (format) => {
    const text = renderReport(input, format);
    for (const expected of ['converged', 'Stop now: every residual and quantity meets the criteria.', 'fell more than 3 decades',
      'settle-kv', '301', 'nu_hot settled at 2.0001', 'run converged', 'down 3 decades from peak', 'settled to 1e-3 relative']) {
      expect(text, `${format} report should contain ${expected}`).toContain(format === 'md' ? escapeMarkdown(expected) : expected);
    }
  });
});

describe('text report', () => {
  const text = renderReport(input, 'text');

  it('tables residual rates and quantity means with intervals, settled point and iteration error', () => {
    expect(text).toMatch(/res_p\s+converged\s+1\.000e-6\s+0\.97724\s+10\s+6\s+1\.000e-5/);
    expect(text).toMatch(/nu_hot \[-\]\s+converged\s+2\s+2\.0001\s+±1\.20e-4\s+0\.006 %\s+310\s+3\.10e-7/);
  });

  it('marks criteria met and not met', () => {
    expect(text).toContain('[met] res_p down 3 decades from peak — 6 of 3 decades');
    expect(text).toContain('[not met] nu_hot settled to 1e-3 relative');
  });

  it('gives several runs one section each, with the worst verdict first', () => {
    const failed = fixtureRun('case/b.log');
    const several = renderReport(fixtureInput([fixtureRun('case/a.log'), { ...failed, diagnosis: { ...failed.diagnosis, verdict: 'diverging', exitCode: 30 } }]), 'text');
    expect(several).toContain('2 runs; worst verdict: diverging');
    expect(several).toContain('== case/a.log ==');
    expect(several).toContain('== case/b.log ==');
  });
});

describe('Markdown report', () => {
  const md = renderReport(input, 'md');

  it('embeds each chart as a data: URI SVG image whose XML is well formed', () => {
    const images = [...md.matchAll(/!\[([^\]]+)\]\(data:image\/svg\+xml;base64,([A-Za-z0-9+/=]+)\)/g)];
    expect(images).toHaveLength(3); // residuals, nu_hot, nu_hot's settled part (its band is thin)
    for (const [, alt, data] of images) {
      const svg = Buffer.from(data, 'base64').toString('utf8');
      expect(xmlProblems(svg)).toEqual([]);
      expect(alt.length).toBeGreaterThan(20);
    }
    const residualSvg = Buffer.from(images[0][2], 'base64').toString('utf8');
    expect(residualSvg).toContain('target 1.0e-5');
    expect(residualSvg).toContain('>restart</text>');
  });

  it('writes tables a Markdown reader accepts: header, separator, rows with equal cell counts', () => {
    const section = md.slice(md.indexOf('### Residuals'));
    const table = section.split('\n').slice(2, 6);
    expect(table[0]).toMatch(/^\| residual \|/);
    expect(table[1]).toMatch(/^\|(---\|)+$/);
    const cells = table.map((l) => l.split(/(?<!\\)\|/).length);
    expect(new Set(cells).size).toBe(1);
  });

  it.each([
    ['a|b', 'a\\|b'],
    ['res_p', 'res_p'],
    ['_x_', '\\_x\\_'],
    ['<b>', '\\<b\\>'],
    ['line\nbreak', 'line break'],
  ])('escapes %j as %j', (raw, escaped) => {
    expect(escapeMarkdown(raw)).toBe(escaped);
  });

  it('encodes a data URI that decodes back to the same text (UTF-8)', () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg"><title>± µ —</title></svg>';
    expect(Buffer.from(svgDataUri(svg).split(',')[1], 'base64').toString('utf8')).toBe(svg);
  });
});

describe('quantity charts', () => {
  it('add a chart of the settled part only when the band is too thin to see against the whole history (< 5 % of its range)', () => {
    const thin = renderReport(input, 'html');
    expect(thin).toContain('nu_hot, settled part — case/run.log');
    const run = fixtureRun();
    // a band of ±0.02 on a history spanning 0.5 is 8 % of the range: visible, no extra chart
    const wide = { ...run, diagnosis: { ...run.diagnosis, series: run.diagnosis.series.map((s) => (s.name === 'nu_hot' ? { ...s, halfWidth: 0.02 } : s)) } };
    const page = renderReport(fixtureInput([wide]), 'html');
    expect(page).not.toContain('settled part');
    expect(page.match(/<svg /g)).toHaveLength(2);
  });

  it('draw no band for a quantity that has not settled', () => {
    const run = fixtureRun();
    const unsettled = { ...run, diagnosis: { ...run.diagnosis, series: run.diagnosis.series.map((s) => (s.name === 'nu_hot' ? { name: s.name, kind: s.kind, state: 'converging' as const, last: s.last, reason: 'still moving' } : s)) } };
    const page = renderReport(fixtureInput([unsettled]), 'html');
    expect(page).toContain('(not settled: no band)');
    expect(page).not.toMatch(/fill-opacity="0.15"[^>]*><title>settled mean/);
  });
});

describe('HTML report', () => {
  const html = renderReport(input, 'html');

  it('is one self-contained page: inline style, inline SVG, no scripts or external fetches', () => {
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html).toContain('<style>');
    expect(html).not.toMatch(/<script|<link |src="http|href="http|@import|url\(http/);
    expect(html.match(/<svg /g)).toHaveLength(3);
  });

  it('escapes text taken from the log', () => {
    const run = fixtureRun('<img src=x onerror=alert(1)>.log');
    const page = renderReport(fixtureInput([run]), 'html');
    expect(page).not.toContain('<img src=x');
    expect(page).toContain('&lt;img src=x onerror=alert(1)&gt;.log');
  });

  it('gives each inline chart its own clip-path id', () => {
    const ids = [...html.matchAll(/clipPath id="([^"]+)"/g)].map((m) => m[1]);
    expect(ids).toHaveLength(3);
    expect(new Set(ids).size).toBe(3);
  });

  it('writes each SVG as well-formed XML', () => {
    for (const [svg] of html.matchAll(/<svg [\s\S]*?<\/svg>/g)) expect(xmlProblems(svg)).toEqual([]);
  });
});

describe('JSON report', () => {
  const doc = JSON.parse(renderReport(input, 'json'));

  it('uses the field names of check --json series entries, plus the settled point and limit', () => {
    const nu = doc.runs[0].series.find((s: { name: string }) => s.name === 'nu_hot');
    expect(nu).toMatchObject({ name: 'nu_hot', kind: 'quantity', state: 'converged', mean: 2.0001, halfWidth: 0.00012, iterationError: 3.1e-7, settledFrom: 310, limit: 2 });
    const p = doc.runs[0].series.find((s: { name: string }) => s.name === 'res_p');
    expect(p).toMatchObject({ rho: 0.977237, ordersPerKilo: 10, dropDecades: 6, target: 1e-5 });
  });

  it('carries the timeline, criteria, restarts, parser and the worst verdict', () => {
    expect(doc).toMatchObject({ report: 'settle', version: 1, verdict: 'converged', exitCode: 0 });
    expect(doc.runs[0]).toMatchObject({ log: 'case/run.log', parser: 'settle-kv', restarts: [301], final: true });
    expect(doc.runs[0].timeline).toHaveLength(3);
    expect(doc.runs[0].criteria.map((c: { met: boolean }) => c.met)).toEqual([true, false]);
    expect(doc.cautions).toEqual(REPORT_CAUTIONS);
  });

  it('writes non-finite numbers as the strings NaN / Infinity (JSON has no such numbers)', () => {
    const run = fixtureRun();
    const blown = { ...run, diagnosis: { ...run.diagnosis, series: [{ ...run.diagnosis.series[0], last: Number.NaN, rho: Infinity }] } };
    const parsed = JSON.parse(renderReport(fixtureInput([blown]), 'json'));
    expect(parsed.runs[0].series[0]).toMatchObject({ last: 'NaN', rho: 'Infinity' });
  });
});

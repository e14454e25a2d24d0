/**
 * The HTML report: one self-contained page (inline CSS, charts as inline SVG, no scripts, no external
 * fetches), readable when printed in black and white. Pure: input in, string out.
 */
import type { ReportInput, ReportRun } from './report-input.js';
import { REPORT_CAUTIONS } from './report-cautions.js';
import { reportCharts } from './report-charts.js';
import { escapeXml } from './svg-line-chart.js';
import {
  criteriaLine, formatCount, othersOf, QUANTITY_HEADERS, quantitiesOf, quantityRow, RESIDUAL_HEADERS, residualRow, residualsOf,
  restartsLine, usedColumns, verdictLine, worstOf, num,
} from './report-figures.js';

const h = escapeXml;

const STYLE = `
body { font-family: system-ui, -apple-system, "Segoe UI", Helvetica, Arial, sans-serif; color: #1d1d1d; background: #fff; max-width: 70rem; margin: 2rem auto; padding: 0 1rem; line-height: 1.45; }
h1 { font-size: 1.6rem; margin-bottom: 0.2rem; } h2 { border-bottom: 2px solid #bbb; padding-bottom: 0.2rem; margin-top: 2.2rem; } h3 { margin-top: 1.6rem; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 0.2rem 1rem; } dl.facts dt { font-weight: 600; } dl.facts dd { margin: 0; }
table { border-collapse: collapse; margin: 0.5rem 0; font-size: 0.9rem; } th, td { border: 1px solid #bbb; padding: 0.25rem 0.55rem; text-align: left; vertical-align: top; }
th { background: #f1f1f1; } td.num { text-align: right; font-variant-numeric: tabular-nums; }
.state { font-weight: 600; } .state-converged::before { content: "\\2714\\00a0"; } .state-failed::before, .state-diverging::before { content: "\\2716\\00a0"; }
.state-stalled::before, .state-oscillating::before { content: "\\25B2\\00a0"; } .met-no { font-weight: 600; }
figure { margin: 1rem 0; } figure svg { max-width: 100%; height: auto; border: 1px solid #ddd; } figcaption { font-size: 0.85rem; color: #444; }
.cautions { border-left: 4px solid #888; padding: 0.4rem 1rem; background: #f7f7f7; }
@media print { figure { break-inside: avoid; } }
`;

function htmlTable(header: readonly string[], rows: readonly (readonly string[])[], numeric: readonly boolean[] = []): string {
  const head = `<tr>${header.map((c) => `<th scope="col">${h(c)}</th>`).join('')}</tr>`;
  const body = rows.map((r) => `<tr>${r.map((c, i) => (i === 1 && /^[a-z]+$/.test(c) && header[1] === 'state'
    ? `<td class="state state-${c}">${h(c)}</td>`
    : `<td${numeric[i] ? ' class="num"' : ''}>${h(c)}</td>`)).join('')}</tr>`).join('\n');
  return `<table>\n<thead>${head}</thead>\n<tbody>\n${body}\n</tbody>\n</table>`;
}

function table<R extends object>(rows: readonly R[], headers: Readonly<Record<keyof R, string>>): string {
  const keys = usedColumns(rows, headers);
  const numeric = keys.map((k) => !['name', 'state', 'oscillation'].includes(String(k)));
  return htmlTable(keys.map((k) => headers[k]), rows.map((row) => keys.map((k) => String(row[k]))), numeric);
}

function runSection(run: ReportRun, index: number, several: boolean): string {
  const d = run.diagnosis;
  const out: string[] = [`<section id="run-${index + 1}">`, `<h2>${several ? h(run.log) : 'Run'}</h2>`, '<dl class="facts">'];
  const fact = (term: string, value: string, cls = ''): void => {
    out.push(`<dt>${h(term)}</dt><dd${cls ? ` class="${cls}"` : ''}>${h(value)}</dd>`);
  };
  fact('Log', run.log);
  fact('Parser', run.parser?.explanation ?? 'none (the log had no lines)');
  fact('Verdict', verdictLine(d), `state state-${d.verdict}`);
  fact('Restarts', restartsLine(run.snapshot));
  if (run.snapshot.failure !== undefined) fact('Crash line', run.snapshot.failure);
  if (run.snapshot.transient) fact('Time steps', `${formatCount(run.snapshot.timeSteps?.length ?? 0)} (transient run)`);
  fact('Advice', d.advice);
  for (const w of run.warnings ?? []) fact('Warning', w);
  out.push('</dl>');
  if (d.reasons.length > 0) out.push('<h3>Reasons</h3>', `<ul>${d.reasons.map((r) => `<li>${h(r)}</li>`).join('')}</ul>`);

  const residuals = residualsOf(d);
  const quantities = quantitiesOf(d);
  const others = othersOf(d);
  if (residuals.length > 0) out.push('<h3>Residuals</h3>', table(residuals.map(residualRow), RESIDUAL_HEADERS));
  if (quantities.length > 0) out.push('<h3>Monitored quantities</h3>', table(quantities.map(quantityRow), QUANTITY_HEADERS));
  if (others.length > 0) out.push(`<p>Other series (shown, not judged): ${h(others.map((s) => `${s.name} = ${num(s.last)}`).join(', '))}</p>`);
  if (d.series.length > 0) out.push('<h3>Why each series is in its state</h3>', `<ul>${d.series.map((s) => `<li><strong>${h(s.name)}</strong>: ${h(s.reason)}</li>`).join('\n')}</ul>`);

  const charts = reportCharts(run, index);
  if (charts.length > 0) {
    out.push('<h3>Charts</h3>');
    for (const chart of charts) out.push(`<figure>\n${chart.svg}\n<figcaption>${h(chart.description)}</figcaption>\n</figure>`);
  }

  out.push('<h3>Timeline of state changes</h3>');
  out.push(d.timeline.length === 0 ? '<p>No state changes.</p>'
    : htmlTable(['iteration', 'what', 'from', 'to', 'note'], d.timeline.map((c) => [formatCount(c.iteration), c.series ?? 'run', c.from, c.to, c.text]), [true]));
  out.push('<h3>Criteria</h3>');
  out.push(d.criteria.length === 0 ? '<p>None evaluated.</p>'
    : htmlTable(['criterion', 'met', 'where it stands'], d.criteria.map((c) => [c.description, c.met ? 'yes' : 'no', c.detail])));
  out.push('</section>');
  return out.join('\n');
}

export function renderHtmlReport(input: ReportInput): string {
  const several = input.runs.length > 1;
  const title = several ? `settle report: ${input.runs.length} runs` : `settle report: ${input.runs[0]?.log ?? 'no run'}`;
  const out: string[] = [
    '<!DOCTYPE html>', '<html lang="en">', '<head>', '<meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>${h(title)}</title>`, `<style>${STYLE}</style>`, '</head>', '<body>',
    `<h1>settle report</h1>`,
  ];
  if (input.version) out.push(`<p>Written by settle ${h(input.version)}.</p>`);
  if (several) {
    out.push(`<p>${input.runs.length} runs; worst verdict: <strong>${h(worstOf(input.runs.map((r) => r.diagnosis)))}</strong>.</p>`);
    out.push(htmlTable(['log', 'verdict', 'iterations'], input.runs.map((r) => [r.log, r.diagnosis.verdict, formatCount(r.diagnosis.iterations)])));
  }
  out.push(`<p><strong>Criteria:</strong> ${h(criteriaLine(input.criteria))}.</p>`);
  input.runs.forEach((run, i) => out.push(runSection(run, i, several)));
  out.push('<h2>Cautions</h2>', `<div class="cautions"><ul>${REPORT_CAUTIONS.map((c) => `<li>${h(c)}</li>`).join('\n')}</ul></div>`);
  out.push('</body>', '</html>');
  return `${out.join('\n')}\n`;
}

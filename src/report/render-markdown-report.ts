/**
 * The Markdown report. Charts are SVG embedded as `data:image/svg+xml;base64,…` images, so the one
 * file is the whole report.
 *
 * Why data-URI images rather than inline `<svg>`: an image with alternative text is plain Markdown;
 * viewers that render local Markdown (editor previews, static-site and document converters) show it,
 * and a viewer that refuses data URIs still shows the alternative text. Inline `<svg>` is raw HTML:
 * sanitising renderers drop it silently, and a blank line inside it ends the HTML block in
 * CommonMark. (Viewer behaviour from memory; see DEVELOPERS.md.)
 *
 * Pure: input in, string out.
 */
import type { ReportInput, ReportRun } from './report-input.js';
import { REPORT_CAUTIONS } from './report-cautions.js';
import { reportCharts } from './report-charts.js';
import {
  criteriaLine, formatCount, othersOf, QUANTITY_HEADERS, quantitiesOf, quantityRow, RESIDUAL_HEADERS, residualRow, residualsOf,
  restartsLine, usedColumns, verdictLine, worstOf, num,
} from './report-figures.js';

/** Escape text for a Markdown paragraph or table cell. */
export function escapeMarkdown(text: string): string {
  return text
    .replace(/[\\`*[\]<>|#]/g, (c) => `\\${c}`)
    // An underscore inside a word never starts emphasis (CommonMark): escape only those at word edges.
    .replace(/(^|[^A-Za-z0-9])_|_(?=[^A-Za-z0-9]|$)/g, (m) => m.replace('_', '\\_'))
    .replace(/\r?\n/g, ' ');
}

export function svgDataUri(svg: string): string {
  return `data:image/svg+xml;base64,${Buffer.from(svg, 'utf8').toString('base64')}`;
}

function mdTable(header: readonly string[], rows: readonly (readonly string[])[]): string[] {
  return [
    `| ${header.map(escapeMarkdown).join(' | ')} |`,
    `|${header.map(() => '---').join('|')}|`,
    ...rows.map((r) => `| ${r.map(escapeMarkdown).join(' | ')} |`),
  ];
}

function table<R extends object>(rows: readonly R[], headers: Readonly<Record<keyof R, string>>): string[] {
  const keys = usedColumns(rows, headers);
  return mdTable(keys.map((k) => headers[k]), rows.map((row) => keys.map((k) => String(row[k]))));
}

function runSection(run: ReportRun, index: number, several: boolean): string[] {
  const d = run.diagnosis;
  const e = escapeMarkdown;
  const out: string[] = [];
  out.push(several ? `## ${e(run.log)}` : `## Run`, '');
  out.push(`- **Log:** ${e(run.log)}`);
  out.push(`- **Parser:** ${e(run.parser?.explanation ?? 'none (the log had no lines)')}`);
  out.push(`- **Verdict:** ${e(verdictLine(d))}`);
  out.push(`- **Restarts:** ${e(restartsLine(run.snapshot))}`);
  if (run.snapshot.failure !== undefined) out.push(`- **Crash line:** ${e(run.snapshot.failure)}`);
  if (run.snapshot.transient) out.push(`- **Time steps:** ${formatCount(run.snapshot.timeSteps?.length ?? 0)} (transient run)`);
  out.push(`- **Advice:** ${e(d.advice)}`);
  for (const w of run.warnings ?? []) out.push(`- **Warning:** ${e(w)}`);
  if (d.reasons.length > 0) out.push('', '**Reasons**', '', ...d.reasons.map((r) => `- ${e(r)}`));

  const charts = reportCharts(run, index);
  const residuals = residualsOf(d);
  const quantities = quantitiesOf(d);
  if (residuals.length > 0) out.push('', '### Residuals', '', ...table(residuals.map(residualRow), RESIDUAL_HEADERS));
  if (quantities.length > 0) out.push('', '### Monitored quantities', '', ...table(quantities.map(quantityRow), QUANTITY_HEADERS));
  const others = othersOf(d);
  if (others.length > 0) out.push('', `Other series (shown, not judged): ${others.map((s) => `${e(s.name)} = ${num(s.last)}`).join(', ')}`);
  if (d.series.length > 0) out.push('', '### Why each series is in its state', '', ...d.series.map((s) => `- **${e(s.name)}**: ${e(s.reason)}`));
  if (charts.length > 0) {
    out.push('', '### Charts', '');
    for (const chart of charts) out.push(`![${e(chart.description)}](${svgDataUri(chart.svg)})`, '');
    out.pop();
  }

  out.push('', '### Timeline of state changes', '');
  if (d.timeline.length === 0) out.push('No state changes.');
  else out.push(...mdTable(['iteration', 'what', 'from', 'to', 'note'], d.timeline.map((c) => [formatCount(c.iteration), c.series ?? 'run', c.from, c.to, c.text])));

  out.push('', '### Criteria', '');
  if (d.criteria.length === 0) out.push('None evaluated.');
  else out.push(...mdTable(['criterion', 'met', 'where it stands'], d.criteria.map((c) => [c.description, c.met ? 'yes' : 'no', c.detail])));
  return out;
}

export function renderMarkdownReport(input: ReportInput): string {
  const out: string[] = ['# settle report', ''];
  if (input.version) out.push(`Written by settle ${escapeMarkdown(input.version)}.`, '');
  if (input.runs.length > 1) {
    out.push(`${input.runs.length} runs; worst verdict: **${worstOf(input.runs.map((r) => r.diagnosis))}**.`, '');
    out.push(...mdTable(['log', 'verdict', 'iterations'], input.runs.map((r) => [r.log, r.diagnosis.verdict, formatCount(r.diagnosis.iterations)])), '');
  }
  out.push(`**Criteria:** ${escapeMarkdown(criteriaLine(input.criteria))}.`, '');
  input.runs.forEach((run, i) => out.push(...runSection(run, i, input.runs.length > 1), ''));
  out.push('## Cautions', '', ...REPORT_CAUTIONS.map((c) => `- ${escapeMarkdown(c)}`));
  return `${out.join('\n')}\n`;
}

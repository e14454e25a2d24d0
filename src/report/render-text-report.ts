/**
 * The plain-text report: what happened in each run and when, for a terminal or a plain file.
 * Pure: input in, string out. O(series + timeline) per run.
 */
import type { ReportInput, ReportRun } from './report-input.js';
import { REPORT_CAUTIONS } from './report-cautions.js';
import {
  criteriaLine, formatCount, othersOf, QUANTITY_HEADERS, quantitiesOf, quantityRow, RESIDUAL_HEADERS, residualRow, residualsOf,
  restartsLine, usedColumns, verdictLine, worstOf, num,
} from './report-figures.js';

/** Columns padded to their widest cell, two spaces apart, indented. */
export function textTable(header: readonly string[], rows: readonly (readonly string[])[], indent = '  '): string[] {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: readonly string[]): string => `${indent}${cells.map((c, i) => c.padEnd(widths[i])).join('  ')}`.trimEnd();
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)];
}

function table<R extends object>(rows: readonly R[], headers: Readonly<Record<keyof R, string>>): string[] {
  const keys = usedColumns(rows, headers);
  return textTable(keys.map((k) => headers[k]), rows.map((row) => keys.map((k) => String(row[k]))));
}

function runSection(run: ReportRun, withHeading: boolean): string[] {
  const d = run.diagnosis;
  const out: string[] = [];
  if (withHeading) out.push(`== ${run.log} ==`, '');
  out.push(`log:        ${run.log}`);
  out.push(`parser:     ${run.parser?.explanation ?? 'none (the log had no lines)'}`);
  out.push(`verdict:    ${verdictLine(d)}`);
  out.push(`restarts:   ${restartsLine(run.snapshot)}`);
  if (run.snapshot.failure !== undefined) out.push(`crash line: ${run.snapshot.failure}`);
  if (run.snapshot.transient) out.push(`time steps: ${formatCount(run.snapshot.timeSteps?.length ?? 0)} (transient run)`);
  out.push(`advice:     ${d.advice}`);
  if (d.reasons.length > 0) out.push('reasons:', ...d.reasons.map((r) => `  - ${r}`));
  for (const w of run.warnings ?? []) out.push(`warning:    ${w}`);

  const residuals = residualsOf(d);
  const quantities = quantitiesOf(d);
  const others = othersOf(d);
  if (residuals.length > 0) out.push('', 'Residuals', ...table(residuals.map(residualRow), RESIDUAL_HEADERS));
  if (quantities.length > 0) out.push('', 'Monitored quantities', ...table(quantities.map(quantityRow), QUANTITY_HEADERS));
  if (others.length > 0) out.push('', `Other series (shown, not judged): ${others.map((s) => `${s.name} = ${num(s.last)}`).join(', ')}`);
  if (d.series.length > 0) out.push('', 'Why each series is in its state', ...d.series.map((s) => `  ${s.name}: ${s.reason}`));

  out.push('', 'Timeline of state changes');
  if (d.timeline.length === 0) out.push('  no state changes');
  else out.push(...textTable(['iteration', 'what', 'from', 'to', 'note'], d.timeline.map((c) => [formatCount(c.iteration), c.series ?? 'run', c.from, c.to, c.text])));

  out.push('', 'Criteria');
  if (d.criteria.length === 0) out.push('  none evaluated');
  for (const c of d.criteria) out.push(`  [${c.met ? 'met' : 'not met'}] ${c.description}${c.detail ? ` — ${c.detail}` : ''}`);
  return out;
}

export function renderTextReport(input: ReportInput): string {
  const out: string[] = [`settle report${input.version ? ` (settle ${input.version})` : ''}`, ''];
  if (input.runs.length > 1) {
    out.push(`${input.runs.length} runs; worst verdict: ${worstOf(input.runs.map((r) => r.diagnosis))}`);
    out.push(...textTable(['log', 'verdict', 'iterations'], input.runs.map((r) => [r.log, r.diagnosis.verdict, formatCount(r.diagnosis.iterations)])), '');
  }
  out.push(`criteria:   ${criteriaLine(input.criteria)}`, '');
  input.runs.forEach((run, i) => {
    out.push(...runSection(run, input.runs.length > 1));
    if (i < input.runs.length - 1) out.push('');
  });
  out.push('', 'Cautions', ...REPORT_CAUTIONS.map((c) => `  - ${c}`));
  return `${out.join('\n')}\n`;
}

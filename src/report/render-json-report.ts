/**
 * The JSON report: per run, the diagnosis with the same field names as `settle check --json` series
 * entries (every SeriesDiagnosis field the analysis gave, so a superset of check's), plus the
 * timeline, the criteria results, the parser and the restarts. Non-finite numbers are the strings
 * "NaN", "Infinity", "-Infinity", as in settle's other JSON output. Pure.
 */
import type { SeriesDiagnosis } from '../analysis/diagnosis.js';
import { EXIT_CODES } from '../analysis/diagnosis.js';
import { jsonNumber } from '../text/format-number.js';
import type { ReportInput, ReportRun } from './report-input.js';
import { REPORT_CAUTIONS } from './report-cautions.js';
import { worstOf } from './report-figures.js';

/** Version of the report's JSON shape; raise it when a field changes meaning or goes away. */
export const REPORT_JSON_VERSION = 1;

const NUMERIC_FIELDS = ['rho', 'ordersPerKilo', 'eta', 'dropDecades', 'target', 'period', 'amplitudeDecades', 'amplitudeRelative',
  'mean', 'halfWidth', 'settledFrom', 'iterationError', 'limit'] as const;

export function seriesReportJson(s: SeriesDiagnosis): Record<string, unknown> {
  const out: Record<string, unknown> = { name: s.name, kind: s.kind, state: s.state, last: jsonNumber(s.last) };
  if (s.label !== undefined) out.label = s.label;
  if (s.unit !== undefined) out.unit = s.unit;
  for (const field of NUMERIC_FIELDS) {
    const value = s[field];
    if (value !== undefined) out[field] = jsonNumber(value);
  }
  out.reason = s.reason;
  return out;
}

export function runReportJson(run: ReportRun): Record<string, unknown> {
  const d = run.diagnosis;
  return {
    log: run.log,
    parser: run.parser?.id ?? null,
    parserExplanation: run.parser?.explanation ?? null,
    verdict: d.verdict,
    exitCode: d.exitCode,
    final: d.final,
    iterations: jsonNumber(d.iterations),
    records: d.records,
    advice: d.advice,
    reasons: [...d.reasons],
    restarts: [...run.snapshot.restarts],
    ...(run.snapshot.failure !== undefined ? { failure: run.snapshot.failure } : {}),
    transient: run.snapshot.transient,
    series: d.series.map(seriesReportJson),
    timeline: d.timeline.map((c) => ({ iteration: c.iteration, series: c.series, from: c.from, to: c.to, text: c.text })),
    criteria: d.criteria.map((c) => ({ description: c.description, met: c.met, detail: c.detail })),
    warnings: [...(run.warnings ?? [])],
  };
}

export function renderJsonReport(input: ReportInput): string {
  const verdict = worstOf(input.runs.map((r) => r.diagnosis));
  const c = input.criteria;
  return `${JSON.stringify({
    report: 'settle',
    version: REPORT_JSON_VERSION,
    verdict,
    exitCode: EXIT_CODES[verdict],
    criteria: { drop: c.drop, ...(c.target !== undefined ? { target: c.target } : {}), qoiTol: c.qoiTol, window: c.window, startup: c.startup, confirm: c.confirm, series: [...c.series], perSeries: c.perSeries },
    runs: input.runs.map(runReportJson),
    cautions: [...REPORT_CAUTIONS],
  }, null, 2)}\n`;
}

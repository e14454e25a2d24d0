/**
 * The `settle check --json` contract (documented in the README; pinned by tests): keep it stable.
 *
 * One log:
 *   {"verdict","exitCode","iterations","advice","reasons":[..],
 *    "series":[{"name","kind","state","last","rho"?,"ordersPerKilo"?,"eta"?,"period"?,
 *               "amplitudeDecades"?,"mean"?,"halfWidth"?,"iterationError"?}]}
 * Several logs (the worst verdict by SEVERITY decides the top level):
 *   {"verdict","exitCode","runs":[{"log", ...the one-log object}]}
 *
 * Optional series fields appear only when the analysis gave them; non-finite numbers are the
 * strings "NaN", "Infinity", "-Infinity" (JSON has no such numbers). Pure; O(series).
 */
import { EXIT_CODES, type RunDiagnosis, type SeriesDiagnosis, type State } from '../analysis/diagnosis.js';
import { jsonNumber } from '../text/format-number.js';
import { worstVerdict } from './worst-verdict.js';

export type JsonNumber = number | string;

export interface CheckSeriesJson {
  name: string;
  kind: string;
  state: State;
  last: JsonNumber;
  rho?: JsonNumber;
  ordersPerKilo?: JsonNumber;
  eta?: JsonNumber;
  period?: JsonNumber;
  amplitudeDecades?: JsonNumber;
  mean?: JsonNumber;
  halfWidth?: JsonNumber;
  iterationError?: JsonNumber;
}

export interface CheckRunJson {
  verdict: State;
  exitCode: number;
  iterations: JsonNumber;
  advice: string;
  reasons: string[];
  series: CheckSeriesJson[];
}

export interface CheckRunsJson {
  verdict: State;
  exitCode: number;
  runs: ({ log: string } & CheckRunJson)[];
}

/** The optional per-series figures, in contract order. */
export const OPTIONAL_SERIES_FIELDS = ['rho', 'ordersPerKilo', 'eta', 'period', 'amplitudeDecades', 'mean', 'halfWidth', 'iterationError'] as const;

export function seriesJson(series: SeriesDiagnosis): CheckSeriesJson {
  const out: CheckSeriesJson = { name: series.name, kind: series.kind, state: series.state, last: jsonNumber(series.last) };
  for (const field of OPTIONAL_SERIES_FIELDS) {
    const value = series[field];
    if (value !== undefined) out[field] = jsonNumber(value);
  }
  return out;
}

export function runJson(diagnosis: RunDiagnosis): CheckRunJson {
  return {
    verdict: diagnosis.verdict,
    exitCode: diagnosis.exitCode,
    iterations: jsonNumber(diagnosis.iterations),
    advice: diagnosis.advice,
    reasons: [...diagnosis.reasons],
    series: diagnosis.series.map(seriesJson),
  };
}

/** The whole `--json` document: the one-log object for one log, the `runs` form for several. */
export function checkJson(runs: readonly { log: string; diagnosis: RunDiagnosis }[]): CheckRunJson | CheckRunsJson {
  if (runs.length === 1) return runJson(runs[0].diagnosis);
  const verdict = worstVerdict(runs.map((run) => run.diagnosis.verdict));
  return {
    verdict,
    exitCode: EXIT_CODES[verdict],
    runs: runs.map((run) => ({ log: run.log, ...runJson(run.diagnosis) })),
  };
}

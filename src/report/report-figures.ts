/**
 * Figures of a report as short strings, one style across text, Markdown and HTML. A view helper:
 * formats what the analysis decided, derives nothing.
 */
import type { Criteria } from '../analysis/criteria.js';
import { SEVERITY, type RunDiagnosis, type SeriesDiagnosis, type State } from '../analysis/diagnosis.js';
import type { RunSnapshot } from '../series/series-column.js';
import { formatNumber } from '../text/format-number.js';
import { formatCount, formatEstimate } from '../text/format-count.js';

/** Counts print as in every text settle writes (src/text/format-count.ts): "2 880". */
export { formatCount };

export const num = (value: number | undefined, digits = 4): string => (value === undefined ? '' : formatNumber(value, digits));

/** The worst verdict of several runs (by SEVERITY); `undecided` when there are none. */
export function worstOf(diagnoses: readonly RunDiagnosis[]): State {
  let worst: State = 'undecided';
  diagnoses.forEach((d, i) => {
    if (i === 0 || SEVERITY[d.verdict] > SEVERITY[worst]) worst = d.verdict;
  });
  return worst;
}

export function verdictLine(d: RunDiagnosis): string {
  return `${d.verdict}${d.final ? ' (final)' : ' (not final)'} after ${formatCount(d.iterations)} iterations (${formatCount(d.records)} records)`;
}

export function restartsLine(snapshot: RunSnapshot): string {
  const r = snapshot.restarts;
  if (r.length === 0) return 'none';
  const shown = r.slice(0, 12).map((it) => formatCount(it)).join(', ');
  return `${r.length} (at iteration${r.length === 1 ? '' : 's'} ${shown}${r.length > 12 ? ', …' : ''})`;
}

export function criteriaLine(c: Criteria): string {
  const parts = [`residuals down ${c.drop} decades from their peak`];
  if (c.target !== undefined) parts.push(`or below ${formatNumber(c.target)}`);
  parts.push(`quantities settled to ${formatNumber(c.qoiTol * 100)} % (95 % half-width)`);
  parts.push(`trend window ${formatCount(c.window)} iterations`);
  parts.push(`first ${formatCount(c.startup)} iterations not judged`);
  if (c.series.length > 0) parts.push(`judged series: ${c.series.join(', ')}`);
  if (c.perSeries.length > 0) parts.push(`${c.perSeries.length} per-series override${c.perSeries.length === 1 ? '' : 's'}`);
  return parts.join('; ');
}

export interface ResidualRow { name: string; state: string; last: string; rho: string; ordersPerKilo: string; drop: string; target: string; eta: string; oscillation: string }
export interface QuantityRow { name: string; state: string; last: string; mean: string; interval: string; relative: string; settledFrom: string; iterationError: string; limit: string; oscillation: string }

function oscillationOf(s: SeriesDiagnosis): string {
  if (s.period === undefined) return '';
  const amplitude = s.amplitudeDecades !== undefined ? `, ±${num(s.amplitudeDecades, 2)} decades`
    : s.amplitudeRelative !== undefined ? `, ±${num(s.amplitudeRelative * 100, 2)} %` : '';
  return `period ${num(s.period, 3)} it${amplitude}`;
}

const displayName = (s: SeriesDiagnosis): string => `${s.label ?? s.name}${s.unit ? ` [${s.unit}]` : ''}`;

export function residualRow(s: SeriesDiagnosis): ResidualRow {
  return {
    name: displayName(s), state: s.state, last: num(s.last), rho: s.rho === undefined ? '' : s.rho.toFixed(5),
    ordersPerKilo: num(s.ordersPerKilo, 3), drop: num(s.dropDecades, 3), target: num(s.target),
    eta: s.eta === undefined ? '' : Number.isFinite(s.eta) ? formatEstimate(s.eta) : '—', oscillation: oscillationOf(s),
  };
}

export function quantityRow(s: SeriesDiagnosis): QuantityRow {
  const relative = s.mean !== undefined && s.halfWidth !== undefined && s.mean !== 0 ? `${num(Math.abs(s.halfWidth / s.mean) * 100, 3)} %` : '';
  return {
    name: displayName(s), state: s.state, last: num(s.last), mean: num(s.mean, 6), interval: s.halfWidth === undefined ? '' : `±${num(s.halfWidth, 3)}`,
    relative, settledFrom: s.settledFrom === undefined ? '' : formatCount(s.settledFrom),
    iterationError: num(s.iterationError, 3), limit: num(s.limit, 6), oscillation: oscillationOf(s),
  };
}

export const RESIDUAL_HEADERS: Readonly<Record<keyof ResidualRow, string>> = {
  name: 'residual', state: 'state', last: 'last', rho: 'rho/it', ordersPerKilo: 'decades/1000 it', drop: 'drop (decades)', target: 'target', eta: 'iterations to target', oscillation: 'oscillation',
};
export const QUANTITY_HEADERS: Readonly<Record<keyof QuantityRow, string>> = {
  name: 'quantity', state: 'state', last: 'last', mean: 'settled mean', interval: '95 % interval', relative: 'relative', settledFrom: 'settled from it', iterationError: 'iteration error', limit: 'extrapolated limit', oscillation: 'oscillation',
};

/** Keep only the columns that have something in at least one row (name and state always stay). */
export function usedColumns<R extends object>(rows: readonly R[], headers: Readonly<Record<keyof R, string>>): (keyof R)[] {
  return (Object.keys(headers) as (keyof R)[]).filter((key, i) => i < 2 || rows.some((row) => String(row[key]) !== ''));
}

export const residualsOf = (d: RunDiagnosis): SeriesDiagnosis[] => d.series.filter((s) => s.kind === 'residual');
export const quantitiesOf = (d: RunDiagnosis): SeriesDiagnosis[] => d.series.filter((s) => s.kind === 'quantity');
export const othersOf = (d: RunDiagnosis): SeriesDiagnosis[] => d.series.filter((s) => s.kind === 'other');

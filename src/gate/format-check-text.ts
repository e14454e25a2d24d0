/**
 * The text `settle check` prints for one run: verdict and exit code, advice, reasons, and one line
 * per series with its state and key figures. Several runs: one block each, then the worst verdict.
 * Pure; O(series).
 *
 * @example
 * solver.log: converged (exit 0) at iteration 1 840
 *   advice: stop: all residuals 3 orders down
 *   why:    res_p down 3.1 decades from its peak
 *
 *   series   kind      state       last      figures
 *   res_p    residual  converged   9.1e-4    3.1 decades down, falling 2.4 decades/1000 it, rho 0.9945
 *   nu_hot   quantity  converged   2.243     mean 2.243 ± 0.0011
 */
import { EXIT_CODES, type RunDiagnosis, type SeriesDiagnosis } from '../analysis/diagnosis.js';
import { formatNumber } from '../text/format-number.js';
import { formatCount, formatEstimate } from '../text/format-count.js';
import { worstVerdict } from './worst-verdict.js';

/** Key figures of one series, comma-separated (empty when the analysis gave none). */
export function seriesFigures(series: SeriesDiagnosis): string {
  const parts: string[] = [];
  if (series.dropDecades !== undefined) parts.push(`${formatNumber(series.dropDecades, 2)} decades down`);
  if (series.ordersPerKilo !== undefined) {
    const rate = series.ordersPerKilo;
    parts.push(rate === 0 ? 'flat' : `${rate > 0 ? 'falling' : 'rising'} ${formatNumber(Math.abs(rate), 2)} decades/1000 it`);
  }
  if (series.rho !== undefined) parts.push(`rho ${formatNumber(series.rho, 6)}`);
  if (series.eta !== undefined && series.eta > 0) parts.push(Number.isFinite(series.eta) ? `about ${formatEstimate(series.eta)} it to target` : 'target out of reach at this rate');
  if (series.period !== undefined) parts.push(`period ${formatNumber(series.period, 3)} it`);
  if (series.amplitudeDecades !== undefined) parts.push(`amplitude ${formatNumber(series.amplitudeDecades, 2)} decades`);
  if (series.amplitudeRelative !== undefined) parts.push(`amplitude ${formatNumber(series.amplitudeRelative * 100, 2)} %`);
  if (series.mean !== undefined) {
    parts.push(series.halfWidth !== undefined ? `mean ${formatNumber(series.mean, 6)} ± ${formatNumber(series.halfWidth, 2)}` : `mean ${formatNumber(series.mean, 6)}`);
  }
  if (series.iterationError !== undefined) parts.push(`iteration error ${formatNumber(series.iterationError, 2)}`);
  return parts.join(', ');
}

export function formatRunText(log: string, diagnosis: RunDiagnosis): string {
  const at = diagnosis.records > 0 && Number.isFinite(diagnosis.iterations) ? `at iteration ${formatCount(diagnosis.iterations)}` : 'with no iterations read';
  const lines = [`${log}: ${diagnosis.verdict} (exit ${diagnosis.exitCode}) ${at}`, `  advice: ${diagnosis.advice}`];
  diagnosis.reasons.forEach((reason, index) => lines.push(`  ${index === 0 ? 'why:   ' : '       '} ${reason}`));
  if (diagnosis.series.length > 0) {
    const rows = diagnosis.series.map((s) => [s.name, s.kind, s.state, formatNumber(s.last), seriesFigures(s)]);
    const header = ['series', 'kind', 'state', 'last', 'figures'];
    const widths = header.map((title, column) => Math.max(title.length, ...rows.map((row) => row[column].length)));
    const render = (row: readonly string[]): string => `  ${row.map((cell, column) => (column === row.length - 1 ? cell : cell.padEnd(widths[column]))).join('  ')}`.trimEnd();
    lines.push('', render(header), ...rows.map(render));
  }
  return `${lines.join('\n')}\n`;
}

/** All runs, blank-line separated; with several, a last line names the worst verdict. */
export function formatCheckText(runs: readonly { log: string; diagnosis: RunDiagnosis }[]): string {
  const blocks = runs.map((run) => formatRunText(run.log, run.diagnosis));
  if (runs.length > 1) {
    const worst = worstVerdict(runs.map((run) => run.diagnosis.verdict));
    blocks.push(`worst of ${runs.length} logs: ${worst} (exit ${EXIT_CODES[worst]})\n`);
  }
  return blocks.join('\n');
}

/**
 * Kind of a series that no spec classifies, from its name and its values in the first lines of a
 * log: a residual when the name says so (`res_p`, `p_res`, `Residual`, `resid_u`) and the values
 * are positive, or when positive values fall over several decades; otherwise a monitored quantity.
 *
 * The behaviour rule: at least 5 finite values, all positive, spanning at least 2 decades, and the
 * median of the last third at least 1 decade below the median of the first third. Residual norms
 * of a converging solver fall like this; monitored quantities (forces, fluxes, temperatures) settle
 * instead. Cost: O(n log n) for n sample values (sorting thirds for their medians).
 */
import type { SeriesKind } from './log-record.js';

const RESIDUAL_NAME = /(?:^|[^a-z])res(?:id(?:ual)?s?)?(?:[^a-z]|$)|resid/i;

export function looksLikeResidualName(name: string): boolean {
  return RESIDUAL_NAME.test(name);
}

export function inferKind(name: string, values: readonly number[]): SeriesKind {
  const finite = values.filter((v) => Number.isFinite(v));
  const positive = finite.every((v) => v > 0);
  if (looksLikeResidualName(name) && positive) return 'residual';
  if (finite.length < 5 || !positive) return 'quantity';
  let min = Infinity;
  let max = -Infinity;
  for (const v of finite) { if (v < min) min = v; if (v > max) max = v; }
  if (Math.log10(max / min) < 2) return 'quantity';
  const third = Math.max(1, Math.floor(finite.length / 3));
  const head = median(finite.slice(0, third));
  const tail = median(finite.slice(finite.length - third));
  return Math.log10(head / tail) >= 1 ? 'residual' : 'quantity';
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

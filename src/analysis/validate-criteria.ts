/**
 * Checks a Criteria object's values and returns every problem as `path: message` (empty when valid).
 * The CLI reports these through UsageError/SpecError; the judge refuses invalid criteria.
 * Cost O(perSeries entries).
 */
import type { Criteria } from './criteria.js';

/** Smallest trailing window, in iterations: the residual judge fits a trend only to 5 points or more. */
export const MIN_WINDOW = 5;

export function validateCriteria(criteria: Criteria): string[] {
  const problems: string[] = [];
  const positive = (path: string, value: unknown, integer = false): void => {
    if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0 || (integer && !Number.isInteger(value))) {
      problems.push(`${path}: must be a positive ${integer ? 'whole ' : ''}number, got ${String(value)}`);
    }
  };
  positive('drop', criteria.drop);
  if (criteria.target !== undefined) positive('target', criteria.target);
  positive('qoiTol', criteria.qoiTol);
  if (typeof criteria.window !== 'number' || !Number.isInteger(criteria.window) || criteria.window < MIN_WINDOW) {
    problems.push(`window: must be a whole number ≥ ${MIN_WINDOW} (iterations; a trend needs at least ${MIN_WINDOW} points), got ${String(criteria.window)}`);
  }
  positive('confirm', criteria.confirm, true);
  if (typeof criteria.startup !== 'number' || !Number.isInteger(criteria.startup) || criteria.startup < 0) {
    problems.push(`startup: must be a whole number ≥ 0, got ${String(criteria.startup)}`);
  }
  if (!Array.isArray(criteria.series)) problems.push('series: must be a list of globs');
  if (!Array.isArray(criteria.perSeries)) problems.push('perSeries: must be a list');
  else criteria.perSeries.forEach((entry, i) => {
    if (typeof entry.pattern !== 'string' || entry.pattern === '') problems.push(`perSeries.${i}.pattern: must be a non-empty glob`);
    if (entry.drop !== undefined) positive(`perSeries.${i}.drop`, entry.drop);
    if (entry.target !== undefined) positive(`perSeries.${i}.target`, entry.target);
    if (entry.qoiTol !== undefined) positive(`perSeries.${i}.qoiTol`, entry.qoiTol);
  });
  return problems;
}

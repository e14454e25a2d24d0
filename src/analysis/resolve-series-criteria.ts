/**
 * The criteria in force for one series: the run-wide criteria with every matching `perSeries` entry
 * applied in order (a later entry overrides an earlier one), and whether the series counts towards
 * the verdict (matches `criteria.series` when that is not empty, and is not ignored).
 * Globs: `*` any run of characters, `?` one character; the whole name must match. Cost O(entries).
 */
import type { Criteria } from './criteria.js';

export interface SeriesRule {
  readonly drop: number;
  readonly target?: number;
  readonly qoiTol: number;
  /** Counts towards the run verdict. */
  readonly counted: boolean;
}

const compiled = new Map<string, RegExp>();

/** True when `name` matches the glob `pattern` (`*`, `?`; everything else literal). */
export function matchesGlob(pattern: string, name: string): boolean {
  let regex = compiled.get(pattern);
  if (regex === undefined) {
    const body = pattern.replace(/[.+^${}()|[\]\\]/g, '\\$&').replace(/\*/g, '.*').replace(/\?/g, '.');
    regex = new RegExp(`^${body}$`, 's');
    if (compiled.size > 1000) compiled.clear();
    compiled.set(pattern, regex);
  }
  return regex.test(name);
}

export function resolveSeriesCriteria(criteria: Criteria, name: string): SeriesRule {
  let drop = criteria.drop;
  let target = criteria.target;
  let qoiTol = criteria.qoiTol;
  let ignore = false;
  for (const entry of criteria.perSeries) {
    if (!matchesGlob(entry.pattern, name)) continue;
    if (entry.drop !== undefined) drop = entry.drop;
    if (entry.target !== undefined) target = entry.target;
    if (entry.qoiTol !== undefined) qoiTol = entry.qoiTol;
    if (entry.ignore !== undefined) ignore = entry.ignore;
  }
  const selected = criteria.series.length === 0 || criteria.series.some((pattern) => matchesGlob(pattern, name));
  return { drop, target, qoiTol, counted: selected && !ignore };
}

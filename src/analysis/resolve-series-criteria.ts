/**
 * The criteria in force for one series: the run-wide criteria with every matching `perSeries` entry
 * applied in order (a later entry overrides an earlier one), and whether the series counts towards
 * the verdict (matches `criteria.series` when that is not empty, and is not ignored).
 * Globs (src/text/glob.ts): `*` any run of characters, `?` one character; the whole name must match.
 * `compileSeriesCriteria` compiles the globs once (the run judge does this when it is created);
 * each lookup then costs O(entries).
 */
import type { Criteria } from './criteria.js';
import { compileGlob, globMatcher } from '../text/glob.js';

export interface SeriesRule {
  readonly drop: number;
  readonly target?: number;
  readonly qoiTol: number;
  /** Counts towards the run verdict. */
  readonly counted: boolean;
}

/** The rule for a series name under criteria whose globs were compiled once. */
export type SeriesRuleResolver = (name: string) => SeriesRule;

export function compileSeriesCriteria(criteria: Criteria): SeriesRuleResolver {
  const entries = criteria.perSeries.map((entry) => ({ entry, matches: compileGlob(entry.pattern) }));
  const selected = criteria.series.length === 0 ? () => true : globMatcher(criteria.series);
  return (name) => {
    let drop = criteria.drop;
    let target = criteria.target;
    let qoiTol = criteria.qoiTol;
    let ignore = false;
    for (const { entry, matches } of entries) {
      if (!matches(name)) continue;
      if (entry.drop !== undefined) drop = entry.drop;
      if (entry.target !== undefined) target = entry.target;
      if (entry.qoiTol !== undefined) qoiTol = entry.qoiTol;
      if (entry.ignore !== undefined) ignore = entry.ignore;
    }
    return { drop, target, qoiTol, counted: selected(name) && !ignore };
  };
}

/** One-shot lookup (compiles the globs on every call; prefer `compileSeriesCriteria` in loops). */
export function resolveSeriesCriteria(criteria: Criteria, name: string): SeriesRule {
  return compileSeriesCriteria(criteria)(name);
}

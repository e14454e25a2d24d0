/**
 * The state of one residual in a transient run (time steps with inner iterations): inner convergence
 * judged per time step, not over the whole history (the residual rises at every new step by design).
 *
 * Method: for each of the last 20 complete time steps after start-up, the inner drop is the step's
 * highest log10 residual minus its last one; the step met the criterion when the drop reaches `drop`
 * decades or the last value is at or below the target (common practice for inner iterations).
 * converged: every recent step met it; stalled: none of at least 3 did; converging: some did;
 * diverging: the step-final residual rose 3 decades above its recent minimum, or rose a decade across
 * the recent steps while most steps missed the criterion; failed: a non-finite value.
 * rho and orders per 1000 iterations describe the inner iterations of the last complete step
 * (Theil–Sen, see theil-sen-slope.ts). Cost: O(points in the last 20 steps).
 */
import type { SeriesColumn } from '../series/series-column.js';
import type { SeriesDiagnosis, State } from './diagnosis.js';
import type { SeriesRule } from './resolve-series-criteria.js';
import type { SegmentMemo } from './segment-tracker.js';
import { safeLog10 } from './safe-log10.js';
import { theilSenSlope } from './theil-sen-slope.js';
import type { AnalysisScratch } from './analysis-scratch.js';
import { formatCount, formatDecades, formatResidual } from './format-figures.js';
import { GROWTH_DECADES, JUMP_DECADES } from './judge-residual.js';

export const RECENT_STEPS = 20;

/** Column index range [first, last] of one complete time step. */
export interface StepRange {
  readonly step: number;
  readonly first: number;
  readonly last: number;
}

/** `scratch`: the judge's working arrays (analysis-scratch.ts); without it, fresh arrays are used. */
export function judgeTransientResidual(column: SeriesColumn, memo: SegmentMemo, rule: SeriesRule, steps: readonly StepRange[], startup: number,
  scratch?: AnalysisScratch): SeriesDiagnosis {
  const { info } = column;
  const last = column.length > 0 ? column.values[column.length - 1] : Number.NaN;
  const base = { name: info.name, kind: info.kind, label: info.label, unit: info.unit, last };
  const with_ = (state: State, reason: string, extra: Partial<SeriesDiagnosis> = {}): SeriesDiagnosis => ({ ...base, state, reason, ...extra });
  if (!Number.isNaN(memo.firstNonFinite)) {
    return with_('failed', `${info.name} became ${formatResidual(memo.nonFiniteValue)} at it ${formatCount(memo.firstNonFinite)}`);
  }
  const judged = steps.filter((s) => column.iterations[s.first] >= memo.start + startup && s.last > s.first);
  const recent = judged.slice(-RECENT_STEPS);
  if (recent.length < 2) return with_('undecided', `start-up: fewer than 2 complete time steps to judge`);
  const targetLog = rule.target !== undefined ? safeLog10(rule.target) : Number.POSITIVE_INFINITY;
  const finals: number[] = [];
  let met = 0;
  let bestDrop = Number.NEGATIVE_INFINITY;
  let lastDrop = 0;
  for (const s of recent) {
    let peak = Number.NEGATIVE_INFINITY;
    for (let i = s.first; i <= s.last; i++) peak = Math.max(peak, safeLog10(column.values[i]));
    const final = safeLog10(column.values[s.last]);
    const drop = peak - final;
    finals.push(final);
    bestDrop = Math.max(bestDrop, drop);
    lastDrop = drop;
    if (drop >= rule.drop || final <= targetLog) met++;
  }
  const lastStep = recent[recent.length - 1];
  const innerLogs = new Float64Array(lastStep.last - lastStep.first + 1);
  for (let i = 0; i < innerLogs.length; i++) innerLogs[i] = safeLog10(column.values[lastStep.first + i]);
  const slope = theilSenSlope(column.iterations.subarray(lastStep.first, lastStep.last + 1), innerLogs, 0, innerLogs.length, undefined, scratch);
  const extra = { rho: 10 ** slope, ordersPerKilo: -1000 * slope, dropDecades: lastDrop, target: rule.target };

  const minFinal = Math.min(...finals);
  const rise = finals[finals.length - 1] - minFinal;
  const trend = finals.length >= 5 ? theilSenSlope(finals.map((_, i) => i), finals, 0, finals.length, undefined, scratch) * (finals.length - 1) : 0;
  if (rise >= JUMP_DECADES || (trend >= GROWTH_DECADES && met < recent.length / 2)) {
    return with_('diverging', `${info.name} at the end of each time step grew ${formatDecades(Math.max(rise, trend))} decades over the last ${recent.length} steps`, extra);
  }
  const goal = rule.target !== undefined ? `${formatDecades(rule.drop)} decades or ${formatResidual(rule.target)}` : `${formatDecades(rule.drop)} decades`;
  if (met === recent.length) return with_('converged', `${info.name} inner iterations reached ${goal} in each of the last ${recent.length} time steps`, extra);
  if (met === 0 && recent.length >= 3) {
    return with_('stalled', `${info.name} inner iterations fell short of ${goal} in each of the last ${recent.length} time steps (best ${formatDecades(bestDrop)})`, extra);
  }
  return with_('converging', `${info.name} inner iterations reached ${goal} in ${met} of the last ${recent.length} time steps`, extra);
}

/**
 * The state of one residual series (steady iterations): trend, rate, time to target, drop from peak,
 * and one of converged / converging / stalled / oscillating / diverging / failed / undecided.
 *
 * Method: the trend is the Theil–Sen slope of log10(residual) against iteration over the trailing
 * window (see theil-sen-slope.ts); rho = 10^slope, orders per 1000 iterations = −1000·slope, iterations
 * to the target = (log10 level − log10 r_now) / slope. "Now" is the median of the last five values, so a
 * single spike moves neither the converged test nor the jump test. The level to reach is the peak of
 * the segment minus `drop` decades, or the absolute target when one is set and is reached first.
 * Rules, in order (thresholds are common practice, logged in DEVELOPERS.md):
 * - failed: a non-finite value since the last restart;
 * - undecided: inside the start-up iterations, or fewer than 5 points to judge;
 * - converged: at or below the level, the peak lying before the last five values (a residual whose
 *   newest values set the peak is blowing up, however far the median of five lies below it);
 * - diverging: now ≥ 3 decades above the window's lowest value (a jump), or the window's trend rises by
 *   ≥ 1 decade (sustained growth);
 * - oscillating: once a whole window has been seen and the window's fall is less than twice the
 *   wiggle about the trend line, a cycle in the ACF of log10 r (detect-oscillation.ts) whose net fall
 *   over the tested region (up to 1 024 points) is less than its amplitude; reported with its period
 *   and amplitude in decades;
 * - converging: falling at a useful rate: the window's fall exceeds half the wiggle about its trend
 *   line (not flat) and the target is reached within 100 × the iterations judged so far (at least
 *   100 windows);
 * - stalled: a whole window seen, flat or crawling, no cycle; before that converging or undecided.
 * Cost: O(log n + m² log m) with m ≤ 48 Theil–Sen points, plus O(1024²/3) for the cycle test,
 * which runs only when the trend does not clearly dominate the wiggle, and not again while a recent
 * test found no cycle and little new data has arrived (cycle-test-memo.ts).
 */
import type { SeriesColumn } from '../series/series-column.js';
import type { SeriesDiagnosis, State } from './diagnosis.js';
import type { SeriesRule } from './resolve-series-criteria.js';
import type { SegmentMemo } from './segment-tracker.js';
import { firstIndexAtOrAfter, segmentStartIndex } from './segment-tracker.js';
import { safeLog10 } from './safe-log10.js';
import { theilSenSlope } from './theil-sen-slope.js';
import { detectOscillation } from './detect-oscillation.js';
import { noCycleStillHolds, recordCycleTest, type CycleTestClock } from './cycle-test-memo.js';
import { formatCount, formatDecades, formatEstimate, formatResidual } from './format-figures.js';
import type { ScratchBuffer } from './scratch-buffer.js';
import { createAnalysisScratch, type AnalysisScratch } from './analysis-scratch.js';

/** A rise of this many decades above the window's minimum is a divergence jump (common practice). */
export const JUMP_DECADES = 3;
/** A window trend rising by this many decades is sustained growth. */
export const GROWTH_DECADES = 1;
/** A fall counts as useful while the target is within this many times the iterations judged so far. */
export const USEFUL_FACTOR = 100;
/** Most points given to the cycle test. */
export const OSCILLATION_POINTS = 1024;
/** Fewest points a trend is fitted to; the window is stretched back to hold them (sparse logs). */
export const MIN_TREND_POINTS = 5;

export interface ResidualJudgeOptions {
  readonly window: number;
  readonly startup: number;
}

/** `cycleClock`: where the judge keeps the last no-cycle result of this series (cycle-test-memo.ts);
 * without it the cycle test runs whenever its guard lets it. `scratch`: the judge's working arrays
 * (analysis-scratch.ts); without it, this call makes its own. */
export function judgeResidual(column: SeriesColumn, memo: SegmentMemo, rule: SeriesRule, options: ResidualJudgeOptions,
  cycleClock?: CycleTestClock, scratch: AnalysisScratch = createAnalysisScratch()): SeriesDiagnosis {
  const { info } = column;
  const last = column.length > 0 ? column.values[column.length - 1] : Number.NaN;
  const base = { name: info.name, kind: info.kind, label: info.label, unit: info.unit, last };
  const with_ = (state: State, reason: string, extra: Partial<SeriesDiagnosis> = {}): SeriesDiagnosis => ({ ...base, state, reason, ...extra });

  if (column.length === 0) return with_('undecided', 'no values yet');
  if (!Number.isNaN(memo.firstNonFinite)) {
    return with_('failed', `${info.name} became ${formatResidual(memo.nonFiniteValue)} at it ${formatCount(memo.firstNonFinite)}`);
  }
  const segmentStart = segmentStartIndex(memo, column);
  const end = column.length;
  const lastIteration = column.iterations[end - 1];
  const judgedFromIteration = memo.start + options.startup;
  const judgedFrom = firstIndexAtOrAfter(column, segmentStart, end, judgedFromIteration);

  const logs = (from: number, to: number, scratch: ScratchBuffer): Float64Array => {
    const out = scratch.view(to - from);
    for (let i = from; i < to; i++) out[i - from] = safeLog10(column.values[i]);
    return out;
  };
  const recent = logs(Math.max(segmentStart, end - 5), end, scratch.recentLogs).sort();
  const nowLog = recent[recent.length >> 1];
  const peakLog = memo.peakLog;
  const dropDecades = peakLog - nowLog;
  let levelLog = peakLog - rule.drop;
  if (rule.target !== undefined) levelLog = Math.max(levelLog, safeLog10(rule.target));
  const target = 10 ** levelLog;
  const common = { dropDecades, target };

  if (end - judgedFrom < 5) {
    return with_('undecided', `start-up: not judged before it ${formatCount(judgedFromIteration)}`, common);
  }
  // The drop is measured from a peak that lies before the recent points: when the peak is among the
  // last five values (the residual is blowing up right now), falling "below the peak" means nothing.
  const peakIsRecent = !(memo.peakIteration < column.iterations[Math.max(segmentStart, end - 5)]);
  // The window spans criteria.window iterations, stretched back to hold at least MIN_TREND_POINTS
  // points for a solver that prints only every so many iterations.
  const windowFrom = Math.max(judgedFrom, Math.min(
    firstIndexAtOrAfter(column, judgedFrom, end, lastIteration - options.window + 1), end - MIN_TREND_POINTS));
  const windowLogs = logs(windowFrom, end, scratch.windowLogs);
  if (nowLog <= levelLog && !peakIsRecent) {
    const why = rule.target !== undefined && nowLog <= safeLog10(rule.target) && dropDecades < rule.drop
      ? `below the target ${formatResidual(rule.target)}`
      : `${formatDecades(dropDecades)} decades below its peak`;
    // With fewer than two points in the window there is no trend: the rates are left out, not NaN.
    const reached = trendFields(column, windowFrom, end, windowLogs, levelLog, nowLog, true, scratch)?.fields ?? { eta: 0 };
    return with_('converged', `${info.name} ${why}`, { ...common, ...reached });
  }

  const trend = end - windowFrom < MIN_TREND_POINTS ? null : trendFields(column, windowFrom, end, windowLogs, levelLog, nowLog, false, scratch);
  if (trend === null) return with_('undecided', `too few points after start-up to judge a trend (${end - windowFrom} of ${MIN_TREND_POINTS})`, common);
  const slope = trend.slope;
  let minLog = Number.POSITIVE_INFINITY;
  let minAt = windowFrom;
  for (let i = 0; i < windowLogs.length; i++) {
    if (windowLogs[i] < minLog) {
      minLog = windowLogs[i];
      minAt = windowFrom + i;
    }
  }
  const rise = nowLog - minLog;
  if (rise >= JUMP_DECADES) {
    const span = lastIteration - column.iterations[minAt];
    return with_('diverging', `${info.name} grew ${formatDecades(rise)} decades in ${formatCount(span)} iterations`, { ...common, ...trend.fields });
  }
  const windowSpan = lastIteration - column.iterations[windowFrom];
  const trendRise = slope * windowSpan;
  if (trendRise >= GROWTH_DECADES && end - windowFrom >= 10) {
    return with_('diverging', `${info.name} rising steadily: ${formatDecades(trendRise)} decades in ${formatCount(windowSpan)} iterations`, { ...common, ...trend.fields });
  }

  const judgedSpan = lastIteration - column.iterations[judgedFrom];
  const windowSeen = judgedSpan >= options.window;
  // A cycle test only when the trend is not clearly larger than the wiggle around it (cheap guard:
  // a clean decay skips it, which keeps the cost of healthy runs low).
  const fall = -slope * windowSpan;
  const spread = spreadAroundLine(column.iterations, windowLogs, windowFrom, slope, scratch.deviations);
  if (windowSeen && fall < 2 * spread) {
    const cycleFrom = Math.max(judgedFrom, end - Math.min(OSCILLATION_POINTS, Math.max(4 * (end - windowFrom), 256)));
    const cycleLogs = noCycleStillHolds(cycleClock, end - cycleFrom) ? null : logs(cycleFrom, end, scratch.cycleLogs);
    const cycle = cycleLogs === null ? null : detectOscillation(cycleLogs, 0, cycleLogs.length, undefined, scratch);
    if (cycleLogs !== null) recordCycleTest(cycleClock, cycle !== null);
    if (cycle !== null && cycleLogs !== null) {
      const regionSlope = theilSenSlope(column.iterations.subarray(cycleFrom, end), cycleLogs, 0, cycleLogs.length, undefined, scratch);
      const netFall = -regionSlope * (lastIteration - column.iterations[cycleFrom]);
      if (netFall < cycle.amplitude) {
        const spacing = (lastIteration - column.iterations[cycleFrom]) / Math.max(1, end - 1 - cycleFrom);
        const period = cycle.period * spacing;
        return with_('oscillating', `${info.name} cycles every ${formatCount(period)} iterations by ±${formatDecades(cycle.amplitude)} decades without falling`,
          { ...common, ...trend.fields, period, amplitudeDecades: cycle.amplitude });
      }
    }
  }
  const flat = fall < 0.5 * spread;
  const useful = !flat && slope < 0 && trend.fields.eta !== undefined && trend.fields.eta <= USEFUL_FACTOR * Math.max(judgedSpan, options.window);
  if (useful) {
    return with_('converging', `${info.name} falling ${formatDecades(trend.fields.ordersPerKilo)} decades per 1000 iterations, about ${formatEstimate(trend.fields.eta ?? Number.NaN)} to go`, { ...common, ...trend.fields });
  }
  if (!windowSeen) {
    return with_(slope < 0 ? 'converging' : 'undecided', `${info.name} ${slope < 0 ? 'falling slowly' : 'not falling yet'}; judged after ${formatCount(options.window)} iterations`, { ...common, ...trend.fields });
  }
  const flatFor = lastIteration - column.iterations[windowFrom];
  const reason = slope < 0
    ? `${info.name} falling too slowly: about ${formatEstimate(trend.fields.eta ?? Number.NaN)} iterations to go at ${formatResidual(10 ** nowLog)}`
    : `${info.name} flat at ${formatResidual(10 ** nowLog)} for ${formatCount(flatFor)} iterations`;
  return with_('stalled', reason, { ...common, ...trend.fields });
}

interface TrendFields {
  readonly rho: number;
  readonly ordersPerKilo: number;
  readonly eta?: number;
}

/** Trend over [from, to) of the column, given log10 of its values there (`logs`, to − from long):
 * the slope and the diagnosis fields; null when there is no trend to give (fewer than two points, or
 * no finite slope), so no NaN rate is ever reported. */
function trendFields(column: SeriesColumn, from: number, to: number, logs: Float64Array, levelLog: number, nowLog: number, reached: boolean,
  scratch: AnalysisScratch): { readonly slope: number; readonly fields: TrendFields } | null {
  const n = to - from;
  if (n < 2) return null;
  const slope = theilSenSlope(column.iterations.subarray(from, to), logs, 0, n, undefined, scratch);
  if (!Number.isFinite(slope)) return null;
  const base = { rho: 10 ** slope, ordersPerKilo: -1000 * slope };
  const fields: TrendFields = reached ? { ...base, eta: 0 } : slope < 0 ? { ...base, eta: (levelLog - nowLog) / slope } : base;
  return { slope, fields };
}

/** Robust wiggle about the line of the given slope: the 10 %–90 % inter-quantile range of the
 * deviations (about the peak-to-peak of a sine, 2.6 σ of Gaussian noise; isolated spikes do not count),
 * from at most 512 points spread evenly over the window. */
function spreadAroundLine(iterations: Float64Array, logs: Float64Array, from: number, slope: number, scratch: ScratchBuffer): number {
  const m = Math.min(logs.length, 512);
  if (m < 2) return 0;
  const deviations = scratch.view(m);
  for (let k = 0; k < m; k++) {
    const i = Math.round((k * (logs.length - 1)) / (m - 1));
    deviations[k] = logs[i] - slope * iterations[from + i];
  }
  deviations.sort();
  return deviations[Math.floor(0.9 * (m - 1))] - deviations[Math.floor(0.1 * (m - 1))];
}

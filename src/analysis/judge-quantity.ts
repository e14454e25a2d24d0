/**
 * The state of one monitored quantity: settled (state `converged`) with its mean and 95 % interval,
 * still converging, oscillating (steady runs), failed or undecided.
 *
 * Method, on the samples after start-up (at most the newest 16 384, so the cost stays bounded):
 * 0. A quantity whose magnitude grew by 3 decades or more above the level it held is `diverging`
 *    (quantity-blow-up.ts); start-up and exact zeros do not set that level.
 * 0b. Transient runs: a quantity cycling over physical time is judged by the stability of its cycle
 *    (judgePeriodicTransient below, cycle-stability.ts); the rest applies when it does not cycle.
 * 1. MSER-5 truncation (mser-truncation.ts) removes the initial transient; a minimum in the second
 *    half means no steady part yet.
 * 2. Batch means with a t interval (batch-means-interval.ts) give the mean and its half-width.
 * 3. Drift check: the means of the first and second halves of the batches are compared with a t test
 *    at 99 % (the idea of Geweke 1992, "Evaluating the accuracy of sampling-based approaches to the
 *    calculation of posterior moments", Bayesian Statistics 4); a difference larger than the test
 *    allows and larger than the tolerance means the retained part still drifts.
 * 4. Monotone geometric convergence (geometric-iteration-error.ts, Ferziger & Perić 2002 §5.7): when
 *    it applies, the estimated remaining error must also be within the tolerance.
 * 5. When the quantity visibly varies (standard deviation above the tolerance), a cycle test
 *    (detect-oscillation.ts): in a steady run a persistent cycle larger than the tolerance is
 *    `oscillating`; in a transient run a periodic state is the goal, judged by the mean over whole
 *    periods with an interval from whole-period batches.
 * 6. A quantity the rules above leave `converging` (no cycle) still counts as settled when its remaining
 *    change is negligible: monotone over the trailing window, moved by at most qoiTol of its value
 *    there (common practice, DEVELOPERS.md "Methods and sources"), and a geometric tail (Ferziger & Perić 2002 §5.7; see
 *    remaining-change.ts) within qoiTol; reported with the extrapolated limit ± that tail.
 * Settled means: relative half-width ≤ qoiTol, no drift, no significant iteration error left.
 * Tolerances are relative to |mean| (or to 1 when the mean is exactly 0).
 * Cost: O(n) for n ≤ 16 384 samples, plus the cycle test O(2048 log 2048) only when the quantity
 * varies, and not again while a recent test found no cycle and little new data arrived
 * (cycle-test-memo.ts).
 */
import type { SeriesDiagnosis, State } from './diagnosis.js';
import type { SeriesInfo } from '../parse/log-record.js';
import { mserTruncation } from './mser-truncation.js';
import type { AnalysisScratch } from './analysis-scratch.js';
import { batchMeansInterval, intervalOfMeans, studentTQuantile } from './batch-means-interval.js';
import { geometricIterationError } from './geometric-iteration-error.js';
import { detectOscillation } from './detect-oscillation.js';
import { remainingChange } from './remaining-change.js';
import { cycleStability, refinePeriod } from './cycle-stability.js';
import { quantityBlowUp } from './quantity-blow-up.js';
import { noCycleStillHolds, recordCycleTest, type CycleTestClock } from './cycle-test-memo.js';
import { formatCount, formatEstimate, formatMeanInterval, formatPercent, formatResidual, formatValue } from './format-figures.js';

export const QUANTITY_SPAN = 16384;
/** Fewest samples after start-up before a quantity is judged. */
export const QUANTITY_MIN_SAMPLES = 50;
const GEOMETRIC_POINTS = 32;
const CYCLE_POINTS = 2048;

export interface QuantitySamples {
  readonly info: SeriesInfo;
  /** Iteration of each sample (for a transient run: of the last inner iteration of each step). */
  readonly iterations: Float64Array;
  readonly values: Float64Array;
  /** Last raw value of the series. */
  readonly last: number;
  /** First non-finite sample since the last restart: its iteration and value (NaN when none). */
  readonly firstNonFinite: number;
  readonly nonFiniteValue: number;
  /** Iteration from which samples are judged (after start-up). */
  readonly judgedFromIteration: number;
  readonly transient: boolean;
  /** Physical time of each sample (transient runs), when known. */
  readonly times?: Float64Array;
}

/** Default trailing window (iterations) for the remaining-change rule: DEFAULT_CRITERIA.window. */
export const DEFAULT_QUANTITY_WINDOW = 200;

/** `cycleClock`: where the judge keeps the last no-cycle result of this series (cycle-test-memo.ts);
 * without it the steady-state cycle test (step 5) runs whenever the quantity visibly varies.
 * `scratch`: the judge's working arrays (analysis-scratch.ts); without it, fresh arrays are used. */
export function judgeQuantity(samples: QuantitySamples, qoiTol: number, window = DEFAULT_QUANTITY_WINDOW,
  cycleClock?: CycleTestClock, scratch?: AnalysisScratch): SeriesDiagnosis {
  const judged = judgeByStatistics(samples, qoiTol, cycleClock, scratch);
  if (judged.state !== 'converging' || judged.period !== undefined) return judged;
  return settledByRemainingChange(samples, qoiTol, window) ?? judged;
}

/**
 * Step 6: a quantity still approaching its limit monotonically, whose remaining change is negligible.
 * MSER-5 finds no steady part in a geometric approach to a limit (every batch is a little closer than
 * the one before), so the statistical rules alone would call it converging for ever. It counts as
 * settled when, over the trailing window (criteria.window iterations), it moved monotonically, by no
 * more than qoiTol of its value (the common-practice rule: change over the last few hundred
 * iterations below about 0.1 % of the value, DEVELOPERS.md "Methods and sources"), and the geometric tail still to come
 * (Ferziger & Perić 2002, §5.7: per iteration where that applies, else over blocks of the window,
 * remaining-change.ts) is within qoiTol too. Mean = the extrapolated limit; half-width = the
 * estimated remaining iteration error (at least half the print resolution seen).
 */
function settledByRemainingChange(samples: QuantitySamples, qoiTol: number, window: number): SeriesDiagnosis | null {
  const { info, values, iterations } = samples;
  const n = values.length;
  const from = Math.max(0, n - QUANTITY_SPAN);
  const change = remainingChange(values, iterations, from, n, window);
  if (change === null) return null;
  const perIteration = geometricIterationError(values, Math.max(from, n - GEOMETRIC_POINTS), n);
  const error = perIteration?.error ?? change.error;
  const limit = values[n - 1] + error;
  const scale = limit !== 0 ? Math.abs(limit) : 1;
  if (Math.abs(error) > qoiTol * scale || Math.abs(change.windowChange) > qoiTol * scale) return null;
  const halfWidth = Math.max(Math.abs(error), change.resolution / 2);
  return {
    name: info.name, kind: info.kind, label: info.label, unit: info.unit, last: samples.last,
    state: 'converged',
    reason: change.windowChange === 0
      ? `${info.name} settled at ${formatMeanInterval(limit, halfWidth)}, unchanged for ${formatCount(change.windowSpan)} iterations`
      : `${info.name} settled at ${formatMeanInterval(limit, halfWidth)} (moved ${formatPercent(Math.abs(change.windowChange) / scale)} in ${formatCount(change.windowSpan)} iterations; geometric tail ${formatPercent(Math.abs(error) / scale)}, Ferziger & Perić)`,
    mean: limit, halfWidth, iterationError: error, limit, settledFrom: iterations[n - 1] - change.windowSpan,
  };
}

function judgeByStatistics(samples: QuantitySamples, qoiTol: number, cycleClock: CycleTestClock | undefined,
  scratch: AnalysisScratch | undefined): SeriesDiagnosis {
  const { info } = samples;
  const base = { name: info.name, kind: info.kind, label: info.label, unit: info.unit, last: samples.last };
  const with_ = (state: State, reason: string, extra: Partial<SeriesDiagnosis> = {}): SeriesDiagnosis => ({ ...base, state, reason, ...extra });
  if (!Number.isNaN(samples.firstNonFinite)) {
    return with_('failed', `${info.name} became ${formatResidual(samples.nonFiniteValue)} at it ${formatCount(samples.firstNonFinite)}`);
  }
  const n = samples.values.length;
  const blowUp = quantityBlowUp(samples.values, samples.iterations, Math.max(0, n - QUANTITY_SPAN), n);
  if (blowUp !== null) {
    const span = blowUp.toIteration - blowUp.fromIteration;
    return with_('diverging', `${info.name} grew from ${formatValue(blowUp.fromValue)} to ${formatValue(blowUp.toValue)} in ${formatCount(span)} iterations, `
      + `${Math.floor(blowUp.decades)} decades above its level of ${formatValue(blowUp.scale)}`);
  }
  if (n < QUANTITY_MIN_SAMPLES) {
    return with_('undecided', n === 0
      ? `start-up: not judged before it ${formatCount(samples.judgedFromIteration)}`
      : `too few ${samples.transient ? 'time steps' : 'iterations'} after start-up (${n} of ${QUANTITY_MIN_SAMPLES})`);
  }
  const from = Math.max(0, n - QUANTITY_SPAN);
  const values = samples.values;
  const iterations = samples.iterations;
  const lastIteration = iterations[n - 1];
  const unitWord = samples.transient ? 'time steps' : 'iterations';

  if (samples.transient) {
    const periodic = judgePeriodicTransient(samples, from, qoiTol, scratch);
    if (periodic !== null) return periodic;
  }

  const mser = mserTruncation(values, from, n, undefined, scratch);
  if (mser === null || !mser.settled) {
    return with_('converging', `${info.name} still moving: no steady part yet`, geometricFields(values, n, qoiTol));
  }
  const keptFrom = from + mser.truncatePoints;
  const settledFrom = iterations[keptFrom];
  const interval = batchMeansInterval(values, keptFrom, n);
  if (interval === null) return with_('undecided', `${info.name}: too few samples after the start-up transient`);
  const scale = interval.mean !== 0 ? Math.abs(interval.mean) : 1;
  const allowed = qoiTol * scale;
  let sd = 0;
  for (let i = keptFrom; i < n; i++) sd += (values[i] - interval.mean) ** 2;
  sd = Math.sqrt(sd / Math.max(1, n - keptFrom - 1));

  // A visible cycle: in a steady run a fault; in a transient run the state to average over.
  if (sd > allowed && n - keptFrom >= 48) {
    const cycleFrom = Math.max(keptFrom, n - CYCLE_POINTS);
    const skip = noCycleStillHolds(cycleClock, n - cycleFrom);
    const cycle = skip ? null : detectOscillation(values, cycleFrom, n, undefined, scratch);
    if (!skip) recordCycleTest(cycleClock, cycle !== null);
    if (cycle !== null) {
      const spacing = (lastIteration - iterations[cycleFrom]) / Math.max(1, n - 1 - cycleFrom);
      const period = cycle.period * spacing;
      const amplitudeRelative = cycle.amplitude / scale;
      const whole = wholePeriodInterval(values, cycleFrom, n, cycle.period);
      const mean = whole?.mean ?? cycle.meanOverPeriods;
      const halfWidth = whole?.halfWidth;
      const periodic = { period, amplitudeRelative, mean, halfWidth, settledFrom };
      if (!samples.transient && amplitudeRelative > qoiTol) {
        return with_('oscillating', `${info.name} cycles every ${formatCount(period)} iterations by ±${formatPercent(amplitudeRelative)} around ${formatValue(mean)}`, periodic);
      }
      if (samples.transient && halfWidth !== undefined) {
        if (halfWidth <= qoiTol * (mean !== 0 ? Math.abs(mean) : 1)) {
          return with_('converged', `${info.name} periodic (every ${formatCount(period)} iterations), mean ${formatMeanInterval(mean, halfWidth)} over whole periods`, periodic);
        }
        return with_('converging', `${info.name} periodic; the mean over whole periods is ${formatMeanInterval(mean, halfWidth)}, not yet within ${formatPercent(qoiTol)}`, periodic);
      }
    }
  }

  const fields = { mean: interval.mean, halfWidth: interval.halfWidth, settledFrom };
  const relative = interval.halfWidth / scale;
  const geometric = geometricFields(values, n, qoiTol);
  if (geometric.iterationError !== undefined && Math.abs(geometric.iterationError) > allowed) {
    return with_('converging', `${info.name} still approaching ${formatValue(geometric.limit ?? Number.NaN)} geometrically; about ${formatValue(Math.abs(geometric.iterationError))} to go`, { ...fields, ...geometric });
  }
  const drift = driftOf(values, keptFrom, n);
  if (drift !== null && Math.abs(drift.difference) > drift.allowed && Math.abs(drift.difference) > allowed) {
    return with_('converging', `${info.name} still drifting by ${formatPercent(Math.abs(drift.difference) / scale)} across the last ${formatCount(lastIteration - settledFrom)} ${unitWord}`, { ...fields, ...geometric });
  }
  if (relative > qoiTol) {
    const more = (n - keptFrom) * ((relative / qoiTol) ** 2 - 1);
    return with_('converging', `${info.name} mean ${formatMeanInterval(interval.mean, interval.halfWidth)}: ±${formatPercent(relative)}, not yet within ${formatPercent(qoiTol)}; about ${formatEstimate(more)} more ${unitWord}`, { ...fields, ...geometric });
  }
  return with_('converged', `${info.name} settled at ${formatMeanInterval(interval.mean, interval.halfWidth)} for ${formatCount(lastIteration - settledFrom)} ${unitWord}`, { ...fields, ...geometric });
}

/**
 * Step 0 for transient runs: a quantity that cycles over physical time (a periodic state is the goal,
 * DEVELOPERS.md "Methods and sources") is judged by the stability of its cycle (cycle-stability.ts) over all judged samples,
 * start-up transient included (detect-oscillation.ts removes the trend, retried without the first
 * quarter and half; the period is refined on the newest cycles, cycle-stability.ts; the last whole
 * periods are what is compared). Tolerances are relative to the larger of the cycle's amplitude and |mean|: a
 * relative tolerance on a mean near zero is meaningless, and a small ripple on a large value need not
 * repeat to ripple precision. Settled (`converged`) when the mean and the amplitude of the last period
 * agree with the period before within qoiTol of that scale, and either the pair before agrees too or
 * the period-to-period changes fall geometrically with a tail within qoiTol; or, for a noisy cycle,
 * when the 95 % interval of the mean over whole-period batches is that narrow and the amplitude does
 * not change by more than that from period to period. Returns null when no
 * cycle larger than the tolerance shows (the steady-state rules then apply).
 */
function judgePeriodicTransient(samples: QuantitySamples, from: number, qoiTol: number, scratch: AnalysisScratch | undefined): SeriesDiagnosis | null {
  const { info, values, iterations } = samples;
  const n = values.length;
  // The start-up transient can hide the cycle from the autocorrelation: also try without the first
  // quarter and the first half of the samples.
  const first = Math.max(from, n - CYCLE_POINTS);
  let cycle = null;
  let cycleFrom = first;
  for (const skip of [0, 0.25, 0.5]) {
    cycleFrom = first + Math.floor(skip * (n - first));
    cycle = detectOscillation(values, cycleFrom, n, undefined, scratch);
    if (cycle !== null) break;
  }
  if (cycle === null) return null;
  const period = refinePeriod(values, first, n, cycle.period);
  const stability = cycleStability(values, first, n, period);
  const whole = wholePeriodInterval(values, cycleFrom, n, Math.round(period));
  const mean = stability?.mean ?? whole?.mean ?? cycle.meanOverPeriods;
  const amplitude = stability?.amplitude ?? cycle.amplitude;
  const scale = Math.max(amplitude, Math.abs(mean)) || 1;
  if (!(amplitude > qoiTol * scale)) return null;
  const spacing = (iterations[n - 1] - iterations[cycleFrom]) / Math.max(1, n - 1 - cycleFrom);
  const steps = formatCount(period);
  const base = {
    name: info.name, kind: info.kind, label: info.label, unit: info.unit, last: samples.last,
    period: period * spacing, amplitudeRelative: amplitude / (mean !== 0 ? Math.abs(mean) : 1), mean,
  };
  const allowed = qoiTol * scale;
  const repeats = stability !== null && stability.lastChange <= allowed
    && ((stability.meanChange <= allowed && stability.amplitudeChange <= allowed) || stability.toCome <= allowed);
  if (stability !== null && repeats) {
    return {
      ...base, state: 'converged', halfWidth: stability.lastChange,
      reason: `${info.name} periodic every ${steps} time steps around ${formatValue(mean)} ± ${formatValue(amplitude)}; the last two periods agree within ${formatPercent(stability.lastChange / scale)}`,
    };
  }
  if (whole !== null && whole.halfWidth <= allowed && (stability === null || stability.amplitudeChange <= allowed)) {
    return {
      ...base, state: 'converged', mean: whole.mean, halfWidth: whole.halfWidth,
      reason: `${info.name} periodic every ${steps} time steps, mean ${formatMeanInterval(whole.mean, whole.halfWidth)} over whole periods`,
    };
  }
  const change = stability !== null ? stability.lastChange : Number.NaN;
  return {
    ...base, state: 'converging', halfWidth: whole?.halfWidth,
    reason: stability !== null
      ? `${info.name} periodic every ${steps} time steps around ${formatValue(mean)} ± ${formatValue(amplitude)}; the cycle still changes by ${formatPercent(change / scale)} from period to period, not yet within ${formatPercent(qoiTol)}`
      : `${info.name} periodic every ${steps} time steps; fewer than 3 whole periods to compare yet`,
  };
}

function geometricFields(values: Float64Array, n: number, _qoiTol: number): { iterationError?: number; limit?: number } {
  const estimate = geometricIterationError(values, Math.max(0, n - GEOMETRIC_POINTS), n);
  return estimate === null ? {} : { iterationError: estimate.error, limit: estimate.limit };
}

/** Mean and interval from batches of whole periods (at least 4 periods; at most 30 batches). */
function wholePeriodInterval(values: Float64Array, from: number, to: number, period: number): { mean: number; halfWidth: number } | null {
  const periods = Math.floor((to - from) / period);
  if (periods < 4) return null;
  const batches = Math.min(30, periods);
  const perBatch = Math.floor(periods / batches);
  const means = new Float64Array(batches);
  for (let b = 0; b < batches; b++) {
    const start = Math.round(to - (batches - b) * perBatch * period);
    const end = Math.round(to - (batches - b - 1) * perBatch * period);
    let sum = 0;
    for (let i = start; i < end; i++) sum += values[i];
    means[b] = sum / (end - start);
  }
  const interval = intervalOfMeans(means, perBatch);
  return interval === null ? null : { mean: interval.mean, halfWidth: interval.halfWidth };
}

/** Difference of the mean of the second half of the retained samples from the first, and what a
 * two-sample t test at 99 % allows (10 batches per half). */
function driftOf(values: Float64Array, from: number, to: number): { difference: number; allowed: number } | null {
  const first = batchMeansInterval(values, from, from + ((to - from) >> 1), 10, 0.99);
  const second = batchMeansInterval(values, to - ((to - from) >> 1), to, 10, 0.99);
  if (first === null || second === null) return null;
  const se = Math.sqrt((first.batchSd ** 2 + second.batchSd ** 2) / 10);
  return { difference: second.mean - first.mean, allowed: studentTQuantile(0.995, 18) * se };
}

/**
 * Incremental bookkeeping of a series' current segment (the part since its last restart): where it
 * starts, its peak (in log10), how many points it holds and the first non-finite value in it.
 *
 * Method: each evaluation feeds only the points added since the previous one (the store appends at
 * the end and thins only older history), so the cost per evaluation is O(new points), and a full scan
 * happens once (or again if more points arrived than the store keeps at full resolution).
 * A new segment begins at a point whose iteration does not exceed the previous one (the counter went
 * back) or that reaches an announced restart iteration the series had not yet passed.
 * Peak across a restart: a segment resumed from a checkpoint (its first iteration lies after the old
 * segment's peak) keeps the old peak as its reference, since residuals carried
 * on from the checkpoint's level are still measured against the run's start (common practice: the
 * drop criterion refers to the run, not to the restart); a fresh start begins a new peak.
 * Returns new memo objects; never mutates its inputs.
 */
import type { SeriesColumn } from '../series/series-column.js';
import { safeLog10 } from './safe-log10.js';

export interface SegmentMemo {
  /** column.totalAdded when last advanced. */
  readonly added: number;
  readonly lastIteration: number;
  /** Restarts of the run already accounted for. */
  readonly restartsUsed: number;
  /** Iteration of the segment's first point. */
  readonly start: number;
  /** Segments seen so far (1 while the series never restarted). */
  readonly segments: number;
  /** Points added in the segment. */
  readonly points: number;
  /** Highest log10 |value| in the segment, or before the checkpoint it resumed from (−Infinity when none finite). */
  readonly peakLog: number;
  readonly peakIteration: number;
  /** Iteration of the first non-finite value in the segment (NaN when none). */
  readonly firstNonFinite: number;
  /** Which value was non-finite first (NaN, Infinity, -Infinity). */
  readonly nonFiniteValue: number;
}

const EMPTY: SegmentMemo = {
  added: 0, lastIteration: Number.NaN, restartsUsed: 0, start: Number.NaN, segments: 0, points: 0,
  peakLog: Number.NEGATIVE_INFINITY, peakIteration: Number.NaN, firstNonFinite: Number.NaN, nonFiniteValue: Number.NaN,
};

export function advanceSegment(memo: SegmentMemo | undefined, column: SeriesColumn, restarts: readonly number[]): SegmentMemo {
  let fresh = memo === undefined;
  let newPoints = fresh ? column.length : column.totalAdded - memo!.added;
  if (!fresh && newPoints > column.length - column.fullResolutionFrom) {
    fresh = true;
    newPoints = column.length;
  }
  if (!fresh && newPoints === 0) return memo!;
  const from = fresh ? EMPTY : memo!;
  // Locals in the loop (it visits every point once): object fields are written back at the end.
  let { lastIteration, restartsUsed, start, segments, points, peakLog, peakIteration, firstNonFinite, nonFiniteValue } = from;
  // |value| at the peak (a lower bound of it, so no candidate is missed): 10^peakLog rounded down.
  let peakAbs = Number.isFinite(peakLog) ? 10 ** peakLog * (1 - 1e-12) : -1;
  const iterations = column.iterations;
  const values = column.values;
  const end = column.length;
  const restartCount = restarts.length;
  let nextRestart = restartsUsed < restartCount ? restarts[restartsUsed] : Number.POSITIVE_INFINITY;
  for (let index = end - newPoints; index < end; index++) {
    const iteration = iterations[index];
    const value = values[index];
    const descent = points > 0 && iteration <= lastIteration;
    let begins = descent || points === 0;
    while (nextRestart <= iteration) {
      if (points > 0 && (descent || nextRestart > lastIteration)) begins = true;
      restartsUsed++;
      nextRestart = restartsUsed < restartCount ? restarts[restartsUsed] : Number.POSITIVE_INFINITY;
    }
    if (begins) {
      // Resumed from a checkpoint: the counter carries on from past the old peak, so the state before
      // the checkpoint is the same run and its peak stays the reference for the drop. A fresh start
      // (counter back to or below the old peak's iteration) or a peak after the checkpoint (e.g. an
      // attempt that blew up) starts the peak afresh.
      const resumed = points > 0 && peakIteration < iteration;
      start = iteration;
      segments++;
      points = 0;
      if (!resumed) {
        peakLog = Number.NEGATIVE_INFINITY;
        peakIteration = Number.NaN;
        peakAbs = -1;
      }
      firstNonFinite = Number.NaN;
      nonFiniteValue = Number.NaN;
    }
    points++;
    const magnitude = Math.abs(value);
    if (magnitude > peakAbs) {
      // A log only when the peak may move (log10 is monotone): most points cost one comparison.
      // (Infinity passes this test and is handled below; NaN fails every comparison.)
      if (magnitude === Number.POSITIVE_INFINITY) {
        if (firstNonFinite !== firstNonFinite) {
          firstNonFinite = iteration;
          nonFiniteValue = value;
        }
      } else {
        const log = safeLog10(value);
        if (log > peakLog) {
          peakLog = log;
          peakIteration = iteration;
          peakAbs = magnitude;
        }
      }
    } else if (value !== value && firstNonFinite !== firstNonFinite) {
      firstNonFinite = iteration;
      nonFiniteValue = value;
    }
    lastIteration = iteration;
  }
  return {
    added: column.totalAdded, lastIteration, restartsUsed, start, segments, points, peakLog, peakIteration, firstNonFinite, nonFiniteValue,
  };
}

/** Index in the column of the segment's first retained point. */
export function segmentStartIndex(memo: SegmentMemo, column: SeriesColumn): number {
  const tail = column.length - column.fullResolutionFrom;
  // Points counted in the segment that all lie in the unthinned tail are the column's last ones.
  if (memo.points <= tail) return column.length - memo.points;
  // Otherwise the segment began in thinned history: walk back over its ascending run (rare: a long
  // run restarted long ago, or no restart at all, when this walks to 0).
  if (memo.segments <= 1) return 0;
  let index = Math.min(column.fullResolutionFrom, column.length - 1);
  while (index > 0 && column.iterations[index - 1] < column.iterations[index] && column.iterations[index - 1] >= memo.start) index--;
  return index;
}

/** First index in [from, to) whose iteration is ≥ `iteration` (iterations ascend within a segment). */
export function firstIndexAtOrAfter(column: SeriesColumn, from: number, to: number, iteration: number): number {
  let lo = from, hi = to;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (column.iterations[mid] < iteration) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

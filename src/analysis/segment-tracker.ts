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
  const m = fresh ? { ...EMPTY } : { ...memo! };
  // |value| at the peak (a lower bound of it, so no candidate is missed): 10^peakLog rounded down.
  let peakAbs = Number.isFinite(m.peakLog) ? 10 ** m.peakLog * (1 - 1e-12) : -1;
  for (let index = column.length - newPoints; index < column.length; index++) {
    const iteration = column.iterations[index];
    const value = column.values[index];
    const descent = m.points > 0 && iteration <= m.lastIteration;
    let begins = descent || m.points === 0;
    while (m.restartsUsed < restarts.length && restarts[m.restartsUsed] <= iteration) {
      if (m.points > 0 && (descent || restarts[m.restartsUsed] > m.lastIteration)) begins = true;
      m.restartsUsed++;
    }
    if (begins) {
      // Resumed from a checkpoint: the counter carries on from past the old peak, so the state before
      // the checkpoint is the same run and its peak stays the reference for the drop. A fresh start
      // (counter back to or below the old peak's iteration) or a peak after the checkpoint (e.g. an
      // attempt that blew up) starts the peak afresh.
      const resumed = m.points > 0 && m.peakIteration < iteration;
      m.start = iteration;
      m.segments++;
      m.points = 0;
      if (!resumed) {
        m.peakLog = Number.NEGATIVE_INFINITY;
        m.peakIteration = Number.NaN;
        peakAbs = -1;
      }
      m.firstNonFinite = Number.NaN;
      m.nonFiniteValue = Number.NaN;
    }
    m.points++;
    if (!Number.isFinite(value)) {
      if (Number.isNaN(m.firstNonFinite)) {
        m.firstNonFinite = iteration;
        m.nonFiniteValue = value;
      }
    } else if (Math.abs(value) > peakAbs) {
      // A log only when the peak may move (log10 is monotone): most points cost one comparison.
      const log = safeLog10(value);
      if (log > m.peakLog) {
        m.peakLog = log;
        m.peakIteration = iteration;
        peakAbs = Math.abs(value);
      }
    }
    m.lastIteration = iteration;
  }
  m.added = column.totalAdded;
  return m;
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

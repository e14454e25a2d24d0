/**
 * When a series' cycle test (detect-oscillation.ts, the largest single cost of an evaluation) may be
 * skipped: it found no cycle recently, and little new data has arrived since.
 *
 * Rule (settle's own, for cost): a test that found NO cycle is reused while the points added to the
 * series since that test are fewer than a quarter of the tested region or fewer than RETEST_FRACTION
 * of all the points seen, whichever is more, within the same segment (a restart re-tests). A test
 * that found a cycle is never reused: an alarm is always raised or dropped on fresh data; only the
 * first sight of a new cycle can come late, by at most that much data (plus the usual confirmation).
 * The memo depends only on point counts, never on timing, so the same records evaluated at the same
 * record counts give the same verdicts whatever the chunking. A judge keeps one memo per series and
 * passes a slot the judging functions fill; `peek` discards what they wrote.
 * Cost O(1).
 */
export interface NoCycleMemo {
  /** Points the series had received (column.totalAdded) when the test found no cycle. */
  readonly points: number;
  /** Segment (restart count) of that test. */
  readonly segment: number;
}

/** Where the judging functions read the previous memo and leave the next one. */
export interface CycleTestSlot {
  memo: NoCycleMemo | undefined;
}

/** Points counted by the memo: the series' total points and its segment number. */
export interface CycleTestClock {
  readonly slot: CycleTestSlot;
  readonly points: number;
  readonly segment: number;
}

/** Fraction of all points seen that may arrive before a no-cycle result is tested again (1/32). */
export const RETEST_FRACTION = 1 / 32;

/** True when the slot holds a no-cycle result that still counts for a region of `region` points. */
export function noCycleStillHolds(clock: CycleTestClock | undefined, region: number): boolean {
  const memo = clock?.slot.memo;
  if (clock === undefined || memo === undefined || memo.segment !== clock.segment) return false;
  const fresh = clock.points - memo.points;
  return fresh >= 0 && fresh < Math.max(region / 4, RETEST_FRACTION * clock.points);
}

/** Record the outcome of a test just run: remembered when no cycle was found, forgotten otherwise. */
export function recordCycleTest(clock: CycleTestClock | undefined, found: boolean): void {
  if (clock === undefined) return;
  clock.slot.memo = found ? undefined : { points: clock.points, segment: clock.segment };
}

/**
 * Parsing one byte range of a finished log apart from the rest (in a worker thread), and joining
 * the pieces so that the result is exactly that of one sequential parse.
 *
 * A parser's state at a line is, in general, everything before it. For logs without time steps it
 * reduces, at a line that opens a record (or at any line, when every line is a record of its own),
 * to: the counts, the series met so far, and the last iteration
 * number (which the next record's restart check compares with). So a range is parsed from such a "boundary line" by a fresh parser
 * that records three things for the join:
 * - the series it registered, in order (`SeriesRegistration`), replayed into the joined parser with
 *   the same rules, so kinds and units come out as if registered there;
 * - its counts and last iteration (`RangeTotals`);
 * - whether any record depended on what came before the range (an iteration numbered from the
 *   count of earlier records, a crash line with no record of its own, a time step carried
 *   forward): then the rest of the log is parsed sequentially from the range's start. A first
 *   range that read time steps sends the whole log to a sequential read.
 * The first record of a range gets the restart check against the previous range's last
 * iteration when the pieces are joined.
 */
import type { LineBatch } from '../ingest/line-batch.js';
import type { SeriesKind } from './log-record.js';

/** A series registration, as the parser made it: replayed in order when ranges are joined. */
export interface SeriesRegistration {
  /** Records (crash records included) the range had emitted before this registration. */
  readonly atRecord: number;
  readonly name: string;
  readonly ruleKind?: SeriesKind;
  readonly unit?: string;
  readonly label?: string;
  /** Made by a name/value pair (may replace an earlier registration to add a unit) rather than by
   * a fixed capture group (first registration wins). */
  readonly fromPair: boolean;
}

/** What a range adds to the parse statistics, and where it left the iteration counter. */
export interface RangeTotals {
  readonly lines: number;
  readonly unmatched: number;
  readonly unmatchedSample: readonly string[];
  readonly records: number;
  readonly restarts: number;
  readonly lastIteration?: number;
  /** The range read time steps (a log with time steps is read in one piece). */
  readonly timeSteps?: boolean;
}

export interface RangeParsing {
  /** `record`: a range must begin at a line that opens a record; `line`: at any line. */
  readonly boundary: 'record' | 'line';
  /** Is line i of the batch a boundary line? */
  isBoundaryLine(batch: LineBatch, i: number): boolean;
  /** Start recording series registrations (the worker side); returns the live list. */
  recordRegistrations(): SeriesRegistration[];
  /** Did any record so far depend on lines before the range? */
  dependsOnEarlierRecords(): boolean;
  /** Totals so far (the worker side). */
  totals(): RangeTotals;
  /** The joining side: replay registrations of a range, in the order they were made, into this
   * parser (with the same rules, so kinds and units come out as a sequential parse gives them). */
  replayRegistrations(registrations: readonly SeriesRegistration[]): void;
  /** The joining side: take over the totals of ranges parsed elsewhere, to go on sequentially. */
  resumeAfter(totals: RangeTotals): void;
}

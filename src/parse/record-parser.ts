/**
 * The contract between parse and the rest: a parser turns complete lines into records.
 * Implementations are compiled from declarative specs (parsers/*.json) or inferred from a log.
 */
import type { LogRecord, SeriesInfo } from './log-record.js';
import type { LineBatch } from '../ingest/line-batch.js';
import type { RangeParsing } from './range-parsing.js';
import type { ParserSpec } from './parser-spec.js';

export type RecordSink = (record: LogRecord) => void;

export interface RecordSinkOptions {
  /** The sink copies what it needs from each record before it returns and keeps nothing of it,
   * so the parser may reuse the record's values object for the next record (no allocation per
   * record on the read path). Default false: records are the sink's to keep. */
  readonly copies?: boolean;
}

export interface ParseStats {
  /** Lines fed so far. */
  readonly lines: number;
  /** Lines that no rule matched and that were not explicitly ignored. */
  readonly unmatched: number;
  /** A few unmatched lines (cut short), for `settle parsers test`. */
  readonly unmatchedSample: readonly string[];
  /** Records emitted so far. */
  readonly records: number;
  /** Restarts seen so far (counter went back, or noteRestart()). */
  readonly restarts: number;
}

export interface RecordParser {
  /** Spec id (e.g. `settle-kv`) or `inferred`. */
  readonly id: string;
  /** Feed one complete line (no terminator). Completed records go to the sink given at creation. */
  pushLine(line: string): void;
  /** Feed a batch of complete lines (the read path), or its lines from..to-1: the same records as
   * `pushLine` on each line's text, but ASCII lines may be matched on their bytes without building
   * strings. */
  pushBatch(batch: LineBatch, from?: number, to?: number): void;
  /** The source ended: emit any record still open (e.g. the last block of a block format). */
  finish(): void;
  /** The source restarted (file truncated or replaced, next file of a chain): the next record is
   * marked `restart`, and table headers must be seen again. */
  noteRestart(): void;
  /** Series seen so far, with their kind (after user overrides), unit and label. */
  seriesInfo(): ReadonlyMap<string, SeriesInfo>;
  stats(): ParseStats;
  /** How this parser can parse a finished log in ranges (worker threads), or undefined when it
   * should not (specs on the text path; logs with time steps are found out while reading). */
  rangeParsing(): RangeParsing | undefined;
}

/** What parser was chosen for a log, and why (said to the user). */
export interface ParserChoice {
  /** Spec id or `inferred`. */
  readonly id: string;
  /** One line, e.g. `spec settle-csv (built-in): header row matched` or
   * `inferred: whitespace table with 7 numeric columns`. */
  readonly explanation: string;
  create(onRecord: RecordSink, options?: RecordSinkOptions): RecordParser;
  /** The spec behind the parser (built-in, user or inferred), for rebuilding it in a worker. */
  readonly spec: ParserSpec;
  readonly overrides: KindOverrides;
}

/** User overrides of series kinds, as globs on series names (`--residual`, `--quantity`). */
export interface KindOverrides {
  readonly residual: readonly string[];
  readonly quantity: readonly string[];
}

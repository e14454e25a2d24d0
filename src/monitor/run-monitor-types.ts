/**
 * A run monitor ties one source (one log, or a restart chain of logs) to its parser, series store
 * and incremental analysis, and tells listeners what happened. The dashboard, the gate and the report
 * all sit on it, so live and post-mortem analysis give the same answer for the same bytes.
 */
import type { SourceEvent } from '../ingest/line-source.js';
import type { KindOverrides, ParserChoice, ParseStats } from '../parse/record-parser.js';
import type { SeriesStore } from '../series/series-store.js';
import type { Criteria } from '../analysis/criteria.js';
import type { RunDiagnosis, StateChange } from '../analysis/diagnosis.js';
import type { RangeWorker } from '../parallel/read-in-parallel.js';

export interface RunMonitorOptions {
  /** Files of one run in order (a restart chain), or ['-'] for standard input. */
  readonly paths: readonly string[];
  /** Follow the last file as it grows (live) rather than read to the end and stop. */
  readonly follow: boolean;
  readonly pollMs?: number;
  /** Parser spec files the user added (--parser), tried before the built-in ones. */
  readonly parserFiles: readonly string[];
  /** Force this spec id (built-in or from parserFiles) instead of detecting. */
  readonly parserId?: string;
  readonly kindOverrides: KindOverrides;
  readonly criteria: Criteria;
  /** Judge the run (default true). `settle inspect` turns it off: it only reads. */
  readonly analyse?: boolean;
  /** Standard input for the path '-' (tests inject one). Default process.stdin. */
  readonly stdin?: NodeJS.ReadableStream;
  /** Retained points per series before older history is thinned (bounded memory). */
  readonly storeCapacity?: number;
  /** Clock for pace figures (lines/s, last growth). Injected so tests can control it. Default Date.now. */
  readonly now?: () => number;
  /** Reading one big finished file with worker threads (see parallel/read-in-parallel.ts): `false`
   * turns it off; the fields override its defaults (tests use small ranges). */
  readonly parallel?: false | { readonly workers?: number; readonly rangeBytes?: number; readonly minBytes?: number; readonly oneLineRecords?: boolean; readonly spawn?: () => RangeWorker };
}

export interface MonitorPace {
  /** Lines received so far. */
  readonly lines: number;
  /** Lines per second over the last few seconds (0 when quiet). */
  readonly linesPerSecond: number;
  /** Clock time (ms) when the log last grew; NaN before anything arrived. */
  readonly lastGrowthAt: number;
  /** Records per second over the last minute, for wall-clock time-to-target estimates. */
  readonly iterationsPerSecond: number;
}

export interface RunMonitorEvents {
  /** The parser was chosen (after the first lines arrived). */
  parser: (choice: ParserChoice) => void;
  /** New records were added to the store (count added in this batch). */
  records: (added: number) => void;
  /** A scheduled evaluation produced a diagnosis. */
  diagnosis: (diagnosis: RunDiagnosis) => void;
  /** Live only: the followed log went quiet with records not yet judged; this is how they would be
   * judged now. For views. It advances nothing, and the gate does not act on it (only scheduled
   * evaluations decide, so the same bytes give the same decisions however they arrive). */
  preview: (diagnosis: RunDiagnosis) => void;
  /** A series or the run changed state (also in diagnosis.timeline). */
  'state-change': (change: StateChange) => void;
  /** Something happened to the source (waiting, truncated, replaced, warning, progress, end). */
  source: (event: SourceEvent) => void;
  /** The source ended and the final diagnosis was made. */
  end: (diagnosis: RunDiagnosis) => void;
}

export interface RunMonitor {
  /** The log path(s) as the user gave them. */
  readonly label: string;
  readonly store: SeriesStore;
  /** Start reading. Resolves with the final diagnosis when the source ends (end of a finished file,
   * or after stop() when following). Rejects with an InputError when the input cannot be read. */
  run(): Promise<RunDiagnosis>;
  /** Read to the end like run(), without the final diagnosis (and without the 'end' event): for
   * callers that want only the store and the parse (`settle inspect`; judging a big run at the end
   * costs about 0.15 s). */
  read(): Promise<void>;
  /** Stop following; run() then resolves. Idempotent. */
  stop(): Promise<void>;
  /** The chosen parser, once lines have arrived. */
  parserChoice(): ParserChoice | undefined;
  parseStats(): ParseStats | undefined;
  /** The latest diagnosis, re-evaluated (without advancing confirmation state) if records arrived
   * since the last scheduled evaluation. */
  diagnosis(): RunDiagnosis;
  pace(): MonitorPace;
  on<E extends keyof RunMonitorEvents>(event: E, listener: RunMonitorEvents[E]): () => void;
}

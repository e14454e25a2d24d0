/**
 * Reading a big finished log with every core: the file is cut into byte ranges, worker threads
 * parse them (parseRange), and the main thread joins their records in order, so that the run holds
 * exactly what one sequential read gives (same records, series, statistics and warnings).
 *
 * Steps:
 * 1. Detection, as the sequential read does it: the first 1 MiB chunks are split into lines until
 *    DETECTION_LINES are collected; `target.choose` picks the parser (it is not fed those lines:
 *    the first range starts at the top of the file).
 * 2. When the parser cannot parse ranges apart (RecordParser.rangeParsing: table headers, time
 *    steps) or the file is small, the whole file is read sequentially through `target.onLines`.
 * 3. Otherwise ranges of about `rangeBytes` go to a pool of workers, each taking the next range
 *    when idle. Range k is joined once it has ended: its series registrations are replayed into
 *    the parser in record order, its records go to `target.addRecords`, the first record gets the
 *    restart check against the previous range's last iteration, and its totals pass to the
 *    parser. A range whose records depend on earlier ones (`handover`) and every range after it are
 *    dropped, and the log is read sequentially from that range's start.
 *
 * Why it is exact: see parse/range-parsing.ts (a range starts at a boundary line, where the parser
 * state reduces to counts, series and the last iteration) and parse-range.ts (ranges meet without
 * gap or overlap). Tested record for record against the sequential read.
 *
 * Memory: the compact records of the ranges finished but not yet joined (about 10 bytes a value).
 */
import { closeSync, openSync, readSync, statSync } from 'node:fs';
import { open } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { LineBatch } from '../ingest/line-batch.js';
import type { SourceEvent } from '../ingest/line-source.js';
import { DEFAULT_MAX_LINE_BYTES, LineSplitter, type SplitterWarning } from '../ingest/line-splitter.js';
import { CHUNK_BYTES, ChunkBuffers, readFileChunks } from '../ingest/read-file-chunks.js';
import { ProgressReporter } from '../ingest/progress-reporter.js';
import { warningText } from '../ingest/open-line-source.js';
import { readFailure } from '../ingest/read-failure.js';
import type { ParserChoice, RecordParser } from '../parse/record-parser.js';
import type { RangeParsing, SeriesRegistration } from '../parse/range-parsing.js';
import { InputError } from '../errors.js';
import type { RangeEnd, RangeJob } from './parse-range.js';
import type { RecordChunk } from './record-chunk.js';
import { NO_VALUES, RESTART, type CompactRecords } from '../series/compact-records.js';


export interface ParallelReadTarget {
  /** Choose the parser from the first lines and create it; throws as detection does. Spec
   * fitting reads `lines` (the first DETECTION_LINES); inference, when no spec fits, reads
   * `inferenceLines()` (what the sequential read would have collected). */
  choose(lines: readonly string[], inferenceLines: () => readonly string[]): { readonly choice: ParserChoice; readonly parser: RecordParser };
  /** Lines for the chosen parser (sequential reading). */
  onLines(batch: LineBatch): void;
  /** Records from..to-1 of a chunk (see SeriesStore.addCompactRecords; `columns` and `cursors`
   * are kept per range and per chunk). */
  addRecords(records: CompactRecords, from: number, to: number, names: readonly string[], columns: unknown[], cursors: Int32Array): void;
  /** How many more iterations the target takes before it wants a pause (an evaluation point). */
  recordsUntilPause(): number;
  /** A range was joined: this many lines were read. */
  rangeJoined(lines: number): void;
  onEvent(event: SourceEvent): void;
}

export interface ParallelReadOptions {
  readonly path: string;
  /** Lines collected for detection (the monitor's DETECTION_LINES). */
  readonly detectionLines: number;
  readonly maxLineBytes?: number;
  /** Worker threads (default: the machine's cores, at most 4). */
  readonly workers?: number;
  /** Bytes per range (default: an eighth of the file per worker, at least 4 MiB: measured on the
   * 787 MB bench log with two workers, 16 ranges 2.55 s, 8 ranges 2.64 s, 4 ranges 2.73 s, 32
   * ranges 2.63 s; smaller ranges join sooner and leave less of a tail, each costs a little). */
  readonly rangeBytes?: number;
  readonly progressEveryMs?: number;
  /** Also read formats of one record per line in ranges (default false: with two cores the main
   * thread's joining, which costs per value, ate the gain: a 190 MB name=value log took 2.2–2.3 s
   * with workers against 2.0 s in one piece; block formats carry several times more bytes per
   * value and gain). Tests turn it on to check the mechanism. */
  readonly oneLineRecords?: boolean;
  /** Start a worker (tests run parseRange in the calling thread instead). Default: a worker
   * thread running range-worker.js. */
  readonly spawn?: () => RangeWorker;
}

/** What the join needs of a worker thread (node:worker_threads' Worker has it). */
export interface RangeWorker {
  postMessage(message: unknown): void;
  on(event: 'message', listener: (message: WorkerMessage) => void): unknown;
  on(event: 'error', listener: (error: Error) => void): unknown;
  terminate(): Promise<number>;
}

export type WorkerMessage =
  | { readonly type: 'chunk'; readonly id: number; readonly chunk: RecordChunk }
  | { readonly type: 'end'; readonly id: number; readonly end: RangeEnd }
  | { readonly type: 'error'; readonly id: number; readonly message: string };

function spawnThread(): RangeWorker {
  // A small young generation: the workers' garbage is short-lived; measured a few MB less peak memory.
  return new Worker(new URL('./range-worker.js', import.meta.url), { resourceLimits: { maxYoungGenerationSizeMb: 4 } }) as unknown as RangeWorker;
}

interface RangeState {
  readonly chunks: RecordChunk[];
  end?: RangeEnd;
}

/** Read a finished, uncompressed log into `target`; resolves after the `end` event. */
export async function readInParallel(options: ParallelReadOptions, target: ParallelReadTarget): Promise<void> {
  const { path } = options;
  const maxLineBytes = options.maxLineBytes ?? DEFAULT_MAX_LINE_BYTES;
  let size: number;
  try {
    size = statSync(path).size;
  } catch (error) {
    throw readFailure(path, error);
  }
  target.onEvent({ type: 'opened', path, index: 0 });
  const progress = new ProgressReporter(size, options.progressEveryMs ?? 100, (event) => target.onEvent(event));
  const warned = new Set<SplitterWarning['kind']>();
  const warn = (kind: SplitterWarning['kind']): void => {
    if (warned.has(kind)) return;
    warned.add(kind);
    target.onEvent({ type: 'warning', message: warningText(path, { kind, maxLineBytes } as SplitterWarning) });
  };

  const workerCount = Math.max(1, Math.min(options.workers ?? availableParallelism(), 4));
  const rangeBytes = options.rangeBytes ?? Math.max(4 * 1024 * 1024, Math.ceil(size / (workerCount * 8)));
  const rangeCount = Math.max(1, Math.ceil(size / rangeBytes));
  // Workers start while the parser is chosen (their start-up overlaps detection).
  const workers = Array.from({ length: Math.min(workerCount, rangeCount) }, () => {
    const worker = (options.spawn ?? spawnThread)();
    // Until the join listens (it reports a worker's failure), an early one must not go unheard.
    worker.on('error', () => undefined);
    return worker;
  });
  try {
    const sampled = (all: boolean): string[] => {
      try {
        return firstLines(path, options.detectionLines, maxLineBytes, all);
      } catch (error) {
        throw readFailure(path, error);
      }
    };
    // Decoding every line of the first 1 MiB (what the sequential read collects) took about 60 ms
    // at start-up; specs are fitted on the first DETECTION_LINES, and only inference needs more.
    const { choice, parser } = target.choose(sampled(false), () => sampled(true));
    const offered = parser.rangeParsing();
    const ranges = offered?.boundary === 'line' && options.oneLineRecords !== true ? undefined : offered;
    if (ranges === undefined) {
      await stopAll(workers);
      await readSequentially(path, 0, maxLineBytes, target, progress, warn);
    } else {
      const handoverAt = await joinRanges(options, size, rangeCount, workers, choice, ranges, target, progress, warn);
      if (handoverAt !== undefined) await readSequentially(path, handoverAt, maxLineBytes, target, progress, warn);
    }
  } finally {
    await stopAll(workers);
  }
  progress.finish();
  target.onEvent({ type: 'end' });
}

/** The lines the sequential read collects before choosing a parser: whole batches of 1 MiB
 * chunks from the top, until there are `wanted` lines or the file ends (read synchronously: one
 * or two reads at start-up); with `all` false, only the first `wanted` of them. */
function firstLines(path: string, wanted: number, maxLineBytes: number, all: boolean): string[] {
  const lines: string[] = [];
  const splitter = new LineSplitter({ maxLineBytes });
  const buffer = Buffer.allocUnsafe(CHUNK_BYTES);
  const fd = openSync(path, 'r');
  try {
    for (let position = 0; lines.length < wanted;) {
      const bytesRead = readSync(fd, buffer, 0, CHUNK_BYTES, position);
      if (bytesRead === 0) {
        splitter.endBatches((batch) => { for (const line of batch) lines.push(line); });
        break;
      }
      position += bytesRead;
      splitter.pushBatches(buffer.subarray(0, bytesRead), (batch) => {
        if (lines.length >= wanted) return;
        const take = all ? batch.count : Math.min(batch.count, wanted - lines.length);
        for (let i = 0; i < take; i++) lines.push(batch.text(i));
      });
    }
  } finally {
    closeSync(fd);
  }
  return lines;
}

/** The file from `from` to its end, line by line into the target (warnings once per kind). */
async function readSequentially(path: string, from: number, maxLineBytes: number, target: ParallelReadTarget,
  progress: ProgressReporter, warn: (kind: SplitterWarning['kind']) => void): Promise<void> {
  const splitter = new LineSplitter({ maxLineBytes, onWarning: (w) => warn(w.kind) });
  const handle = await open(path, 'r');
  try {
    await readFileChunks(handle, from, new ChunkBuffers(), (chunk) => {
      splitter.pushBatches(chunk, (batch) => target.onLines(batch));
      progress.add(chunk.length);
    });
    splitter.endBatches((batch) => target.onLines(batch));
  } catch (error) {
    throw readFailure(path, error);
  } finally {
    await handle.close();
  }
}

/** Parse the ranges in workers and join them in order. Returns the offset to go on from
 * sequentially after a handover, or undefined when every range was joined. */
async function joinRanges(options: ParallelReadOptions, size: number, count: number, workers: readonly RangeWorker[],
  choice: ParserChoice, ranges: RangeParsing, target: ParallelReadTarget, progress: ProgressReporter,
  warn: (kind: SplitterWarning['kind']) => void): Promise<number | undefined> {
  const bounds = Array.from({ length: count + 1 }, (_, k) => (k === count ? size : Math.floor((k * size) / count)));
  const states: RangeState[] = bounds.slice(0, count).map(() => ({ chunks: [] }));
  let next = 0;
  let failure: Error | undefined;
  let wake: (() => void) | undefined;
  const notify = (): void => { wake?.(); wake = undefined; };

  const assign = (worker: RangeWorker): void => {
    if (next >= count) return;
    const id = next++;
    const job: RangeJob = {
      path: options.path, spec: choice.spec, overrides: choice.overrides, maxLineBytes: options.maxLineBytes,
      from: bounds[id], to: id + 1 === count ? Number.MAX_SAFE_INTEGER : bounds[id + 1],
    };
    worker.postMessage({ id, job });
  };
  for (const worker of workers) {
    worker.on('message', (message: WorkerMessage) => {
      if (message.type === 'chunk') states[message.id].chunks.push(message.chunk);
      else if (message.type === 'end') { states[message.id].end = message.end; assign(worker); }
      else failure = new InputError(`cannot read ${options.path}: ${message.message}`, 'check the file; SETTLE_READ_WORKERS=0 reads it without worker threads');
      notify();
    });
    worker.on('error', (error) => { failure = error; notify(); });
    assign(worker);
  }

  let lastIteration: number | undefined;
  let records = 0;
  try {
    for (let k = 0; k < count; k++) {
      const state = states[k];
      while (state.end === undefined && failure === undefined) await new Promise<void>((resolve) => { wake = resolve; });
      if (failure !== undefined) throw failure;
      const end = state.end as RangeEnd;
      for (const kind of end.warnings) warn(kind);
      if (end.handover) return end.start;
      // Time steps carry from record to record: a log that has them is read in one piece (the
      // first range ends before anything was joined).
      if (k === 0 && end.totals.timeSteps === true) return 0;
      if (end.start < 0) continue;
      let boundaryRestart = 0;
      let emitted = 0;
      let firstRecord = k > 0;
      let offset = k > 0 ? end.start : 0;
      const names: string[] = [];
      const columns: unknown[] = [];
      for (const chunk of state.chunks) {
        for (const name of chunk.newNames) names.push(name);
        const { registrations, flags, count } = chunk;
        const cursors = chunk.seriesStarts.slice(0, chunk.seriesCount);
        let reg = 0;
        let r = 0;
        while (r < count) {
          while (reg < registrations.length && registrations[reg].atRecord <= emitted + r) replay(ranges, registrations[reg++]);
          if (firstRecord && (flags[r] & NO_VALUES) === 0) {
            // The first record of a range is checked against the last iteration before it, as the
            // sequential parser would (a counter going back is a restart).
            firstRecord = false;
            if (records > 0 && lastIteration !== undefined && chunk.iterations[r] < lastIteration && (flags[r] & RESTART) === 0) {
              flags[r] |= RESTART;
              boundaryRestart = 1;
            }
          }
          // A span ends before the next registration and where the target wants to pause.
          let limit = reg < registrations.length ? Math.min(count, registrations[reg].atRecord - emitted) : count;
          let wanted = target.recordsUntilPause();
          for (let q = r; q < limit; q++) {
            if ((flags[q] & NO_VALUES) === 0 && --wanted === 0) { limit = q + 1; break; }
          }
          target.addRecords(chunk, r, limit, names, columns, cursors);
          r = limit;
        }
        emitted += count;
        while (reg < registrations.length) replay(ranges, registrations[reg++]);
        progress.add(Math.max(0, chunk.endOffset - offset));
        offset = Math.max(offset, chunk.endOffset);
      }
      state.chunks.length = 0;
      ranges.resumeAfter({ ...end.totals, restarts: end.totals.restarts + boundaryRestart });
      target.rangeJoined(end.totals.lines);
      records += end.totals.records;
      if (end.totals.lastIteration !== undefined) lastIteration = end.totals.lastIteration;
      progress.add(Math.max(0, end.end - offset));
    }
    return undefined;
  } finally {
    await stopAll(workers);
  }
}

const stopped = new WeakSet<RangeWorker>();

/** Terminate workers (once each). */
async function stopAll(workers: readonly RangeWorker[]): Promise<void> {
  await Promise.all(workers.filter((worker) => !stopped.has(worker)).map((worker) => {
    stopped.add(worker);
    return worker.terminate();
  }));
}

function replay(ranges: RangeParsing, registration: SeriesRegistration): void {
  ranges.replayRegistrations([registration]);
}


/**
 * The run monitor: one source → parser → series store → incremental analysis, with events.
 *
 * Determinism: records are judged at evaluation points fixed by the record count
 * (isEvaluationPoint), never by how bytes happened to arrive, so a log read at once and the same
 * log followed live in any chunking reach the same verdicts at the same iterations.
 */
import { openLineSource } from '../ingest/open-line-source.js';
import type { LineSource, SourceEvent } from '../ingest/line-source.js';
import { LineBatch } from '../ingest/line-batch.js';
import { loadParserSpecs } from '../parse/load-parser-specs.js';
import { chooseParser } from '../parse/choose-parser.js';
import type { ParserChoice, ParseStats, RecordParser } from '../parse/record-parser.js';
import type { LogRecord, SeriesInfo } from '../parse/log-record.js';
import { SeriesStore } from '../series/series-store.js';
import { createRunJudge } from '../analysis/run-judge.js';
import { isEvaluationPoint } from '../analysis/evaluation-schedule.js';
import type { RunDiagnosis } from '../analysis/diagnosis.js';
import { PaceMeter } from './pace-meter.js';
import { TypedEmitter } from './typed-emitter.js';
import { InputError } from '../errors.js';
import type { SeriesColumn } from '../series/series-column.js';
import type { CompactRecords } from '../series/compact-records.js';
import { PARALLEL_MIN_BYTES, worthReadingInParallel } from '../parallel/worth-reading-in-parallel.js';
import type { MonitorPace, RunMonitor, RunMonitorEvents, RunMonitorOptions } from './run-monitor-types.js';

/** Lines collected before the parser is chosen (fewer when the log is shorter or goes quiet). */
export const DETECTION_LINES = 200;
/** When following a log that has fewer lines than DETECTION_LINES, choose after this quiet time. */
const DETECTION_QUIET_MS = 400;
/** When a followed log goes quiet with records not yet judged (between evaluation points), judge
 * them this long after the last line, so a view never shows a stale verdict for a stopped run. */
const QUIET_JUDGE_MS = 250;

export function createRunMonitor(options: RunMonitorOptions): RunMonitor {
  // Spec files are loaded up front so a broken spec is reported before any reading starts.
  const specs = loadParserSpecs({ files: options.parserFiles });
  const now = options.now ?? Date.now;
  const analyse = options.analyse ?? true;
  const store = new SeriesStore(options.storeCapacity);
  const judge = createRunJudge(options.criteria);
  const events = new TypedEmitter<RunMonitorEvents>();
  const pace = new PaceMeter(now);
  const label = options.paths.join(' + ');

  let source: LineSource | undefined;
  let choice: ParserChoice | undefined;
  let parser: RecordParser | undefined;
  let pending: string[] = [];
  let restartBeforeParser = false;
  let detectionTimer: NodeJS.Timeout | undefined;
  let quietTimer: NodeJS.Timeout | undefined;
  let latest: RunDiagnosis | undefined;
  /** Bumped on every record (and crash line): what a cached diagnosis is keyed by. */
  let revision = 0;
  let latestRevision = -1;
  let changedSinceEvaluation = true;
  let addedInBatch = 0;
  let timelineSeen = 0;
  let finished: RunDiagnosis | undefined;

  const infoOf = (name: string): SeriesInfo => parser?.seriesInfo().get(name) ?? { name, kind: 'quantity' };

  function onRecord(record: LogRecord): void {
    const before = store.records;
    store.add(record, infoOf);
    changedSinceEvaluation = true;
    revision++;
    if (store.records === before) return; // a crash line outside any iteration: judged at the next evaluation
    addedInBatch++;
    if (analyse && isEvaluationPoint(store.records)) evaluate();
  }

  /** Records joined from a worker's range (parallel read): as onRecord on each. The join ends
   * each span at an evaluation point (recordsUntilEvaluation), so the judge sees the same runs. */
  function onJoinedRecords(records: CompactRecords, from: number, to: number, names: readonly string[], columns: unknown[], cursors: Int32Array): void {
    const added = store.addCompactRecords(records, from, to, names, columns as (SeriesColumn | undefined)[], cursors, infoOf);
    changedSinceEvaluation = true;
    revision += to - from;
    addedInBatch += added;
    if (analyse && added > 0 && isEvaluationPoint(store.records)) evaluate();
  }

  function recordsUntilEvaluation(): number {
    if (!analyse) return Number.POSITIVE_INFINITY;
    let n = 1;
    while (!isEvaluationPoint(store.records + n)) n++;
    return n;
  }

  /** Read the one finished file with worker threads when it is big enough (see readInParallel). */
  async function readFileInParallel(): Promise<boolean> {
    const path = options.paths[0];
    const settings = options.parallel ?? parallelFromEnvironment();
    if (options.follow || settings === false || options.paths.length !== 1 || path === '-') return false;
    if (!worthReadingInParallel(path, settings.minBytes ?? PARALLEL_MIN_BYTES)) return false;
    const { readInParallel } = await import('../parallel/read-in-parallel.js');
    addedInBatch = 0;
    await readInParallel({ path, detectionLines: DETECTION_LINES, ...settings }, {
      choose: chooseFrom,
      onLines: (batch) => onLines(batch),
      addRecords: onJoinedRecords,
      recordsUntilPause: recordsUntilEvaluation,
      rangeJoined: (lines) => {
        pace.addLines(lines);
        pace.setRecords(store.records);
        if (addedInBatch > 0) events.emit('records', addedInBatch);
        addedInBatch = 0;
      },
      onEvent,
    });
    return true;
  }

  function syncSeriesInfo(): void {
    if (parser === undefined) return;
    for (const info of parser.seriesInfo().values()) {
      const column = store.column(info.name);
      if (column !== undefined && (column.info.kind !== info.kind || column.info.unit !== info.unit || column.info.label !== info.label)) {
        store.describe(info);
      }
    }
  }

  function evaluate(): RunDiagnosis {
    syncSeriesInfo();
    const diagnosis = judge.update(store.snapshot());
    latest = diagnosis;
    latestRevision = revision;
    changedSinceEvaluation = false;
    for (const change of diagnosis.timeline.slice(timelineSeen)) events.emit('state-change', change);
    timelineSeen = diagnosis.timeline.length;
    events.emit('diagnosis', diagnosis);
    return diagnosis;
  }

  /** Choose and create the parser from the first lines (without feeding them). */
  function chooseFrom(lines: readonly string[], inferenceLines?: () => readonly string[]): { choice: ParserChoice; parser: RecordParser } {
    const chosen = chooseParser(lines, {
      specs,
      forcedId: options.parserId,
      overrides: options.kindOverrides,
      source: label,
    }, inferenceLines);
    // The store copies each record's values (SeriesStore.add), so the parser may reuse them.
    const created = chosen.create(onRecord, { copies: true });
    choice = chosen;
    parser = created;
    events.emit('parser', chosen);
    return { choice: chosen, parser: created };
  }

  function startParser(): void {
    if (detectionTimer !== undefined) clearTimeout(detectionTimer);
    detectionTimer = undefined;
    const { parser: created } = chooseFrom(pending);
    if (restartBeforeParser) created.noteRestart();
    const lines = pending;
    pending = [];
    feed(LineBatch.of(lines));
    judgeWhenQuiet();
  }

  /** Early choice on a quiet live log: a log that so far holds only a banner is not an error yet;
   * try again when more lines arrive (or at DETECTION_LINES, or at the end, where it is final). */
  function startParserIfRecognised(): void {
    try {
      startParser();
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
    }
  }

  function feed(lines: LineBatch): void {
    addedInBatch = 0;
    (parser as RecordParser).pushBatch(lines);
    if (addedInBatch > 0) events.emit('records', addedInBatch);
  }

  /** Live only: a diagnosis of the records since the last evaluation point, without advancing the
   * judge (confirmation counts and timeline move only at evaluation points, so verdicts stay the
   * same for the same bytes however they arrive). */
  function judgeWhenQuiet(): void {
    if (!options.follow || !analyse) return;
    if (quietTimer !== undefined) clearTimeout(quietTimer);
    quietTimer = setTimeout(() => {
      quietTimer = undefined;
      if (changedSinceEvaluation && finished === undefined) guarded(() => events.emit('preview', peek()));
    }, QUIET_JUDGE_MS);
  }

  function onLines(lines: LineBatch): void {
    pace.addLines(lines.length);
    if (parser !== undefined) {
      feed(lines);
      pace.setRecords(store.records);
      judgeWhenQuiet();
      return;
    }
    for (const line of lines) pending.push(line);
    if (pending.length >= DETECTION_LINES) {
      startParser();
    } else if (options.follow) {
      if (detectionTimer !== undefined) clearTimeout(detectionTimer);
      detectionTimer = setTimeout(() => {
        detectionTimer = undefined;
        if (parser === undefined && pending.length > 0) guarded(startParserIfRecognised);
      }, DETECTION_QUIET_MS);
    }
    pace.setRecords(store.records);
  }

  let ran = false;
  let failure: unknown;
  /** Errors thrown inside a timer cannot reach run()'s caller directly: keep them and stop. */
  function guarded(action: () => void): void {
    try {
      action();
    } catch (error) {
      failure = error;
      void source?.close();
    }
  }

  function onEvent(event: SourceEvent): void {
    if (event.type === 'truncated' || event.type === 'replaced' || (event.type === 'opened' && event.index > 0)) {
      if (parser !== undefined) parser.noteRestart();
      else restartBeforeParser = true;
    }
    if (event.type === 'end') {
      if (parser === undefined && pending.length > 0) startParser();
      addedInBatch = 0;
      parser?.finish();
      if (addedInBatch > 0) events.emit('records', addedInBatch);
      pace.setRecords(store.records);
    }
    events.emit('source', event);
  }

  function finalDiagnosis(): RunDiagnosis {
    if (!analyse) return peek();
    return !changedSinceEvaluation && latest !== undefined ? latest : evaluate();
  }

  function peek(): RunDiagnosis {
    if (latest === undefined || latestRevision !== revision) {
      syncSeriesInfo();
      latest = judge.peek(store.snapshot());
      latestRevision = revision;
    }
    return latest;
  }

  async function readToEnd(): Promise<void> {
    if (source !== undefined || ran) throw new Error('run() or read() called twice on one monitor');
    ran = true;
    if (!(await readFileInParallel())) {
      source = openLineSource({ paths: options.paths, follow: options.follow, pollMs: options.pollMs, stdin: options.stdin });
      await source.run({
        onLines: (lines) => guarded(() => onLines(lines)),
        onEvent: (event) => guarded(() => onEvent(event)),
      });
    }
    if (detectionTimer !== undefined) clearTimeout(detectionTimer);
    if (quietTimer !== undefined) clearTimeout(quietTimer);
    if (failure !== undefined) throw failure;
  }

  const monitor: RunMonitor = {
    label,
    store,
    async run(): Promise<RunDiagnosis> {
      await readToEnd();
      finished = finalDiagnosis();
      events.emit('end', finished);
      return finished;
    },
    read: readToEnd,
    async stop(): Promise<void> {
      await source?.close();
    },
    parserChoice: () => choice,
    parseStats: (): ParseStats | undefined => parser?.stats(),
    diagnosis: () => finished ?? peek(),
    pace: (): MonitorPace => pace.read(),
    on: (event, listener) => events.on(event, listener),
  };
  return monitor;
}

/** Developer knobs (benchmarks and end-to-end tests): SETTLE_READ_WORKERS=n sets the number of
 * worker threads of a parallel read, 0 or 1 turns it off; SETTLE_READ_MIN_BYTES sets the smallest
 * file read in parallel, SETTLE_READ_RANGE_BYTES the size of a range. */
function parallelFromEnvironment(): false | { workers?: number; minBytes?: number; rangeBytes?: number } {
  const count = (name: string): number | undefined => {
    const raw = process.env[name];
    const value = raw === undefined || raw === '' ? Number.NaN : Number(raw);
    return Number.isInteger(value) && value >= 0 ? value : undefined;
  };
  const workers = count('SETTLE_READ_WORKERS');
  if (workers !== undefined && workers < 2) return false;
  return { workers, minBytes: count('SETTLE_READ_MIN_BYTES'), rangeBytes: count('SETTLE_READ_RANGE_BYTES') || undefined };
}

/**
 * Turns extracted values and counters into records: opens and closes records, fills in the
 * iteration counter when the log has none, carries time step and physical time forward, detects
 * restarts (a counter going back), and keeps the parse statistics. Shared by every compiled parser.
 */
import type { LogRecord } from './log-record.js';
import { RecordValues } from './record-values.js';
import type { ParseStats, RecordSink } from './record-parser.js';

const SAMPLE_SIZE = 10;
const SAMPLE_LINE_LENGTH = 160;
const FAILURE_TEXT_LENGTH = 200;

export class RecordAssembler {
  private values: RecordValues | null = null;
  private iteration: number | undefined;
  private step: number | undefined;
  private time: number | undefined;
  private inner: number | undefined;
  private failureText: string | undefined;
  private counterCaptured = false;

  private stickyStep: number | undefined;
  private stickyTime: number | undefined;
  /** When the spec gives time but no step index: steps are counted as time changes. */
  private countedStep = 0;
  private countedStepTime: number | undefined;

  private lastIteration: number | undefined;
  private lastStep: number | undefined;
  private lastInner: number | undefined;
  private lastTime: number | undefined;
  private restartPending = false;

  lines = 0;
  unmatched = 0;
  records = 0;
  /** Everything handed to the sink: records, and crash records that are not iterations. */
  emitted = 0;
  restarts = 0;
  readonly unmatchedSample: string[] = [];
  /** Set when a record came out differently because of what came before it in the log: an
   * iteration number counted from the records before (the log gave none), or a crash record with
   * no iteration of its own. A parse of a range that starts mid-log is exact only while this is
   * false (see parse/range-parsing.ts). */
  dependsOnEarlierRecords = false;
  /** Set once a step, time or inner counter was read: records then carry time steps forward
   * (sticky step and time, inner counts), which a range parsed apart cannot know. */
  usesTimeSteps = false;

  /** `reuseValues`: the sink copies each record (see RecordSinkOptions.copies), so one values
   * object serves every record. */
  constructor(private readonly sink: RecordSink, private readonly stepFromTime: boolean, private readonly reuseValues = false) {}

  /** A values object emptied for reuse once the sink has copied it. */
  private spare: RecordValues | null = null;

  /** The record being built (opened on demand). */
  current(): RecordValues {
    if (this.values === null) {
      this.values = this.spare ?? new RecordValues();
      this.spare = null;
    }
    return this.values;
  }

  isOpen(): boolean {
    return this.values !== null;
  }

  setCounter(name: 'iteration' | 'step' | 'time' | 'inner', value: number): void {
    this.current();
    this.counterCaptured = true;
    if (name !== 'iteration') this.usesTimeSteps = true;
    switch (name) {
      case 'iteration': this.iteration = value; break;
      case 'step': this.step = value; this.stickyStep = value; break;
      case 'time': this.time = value; this.stickyTime = value; break;
      case 'inner': this.inner = value; break;
    }
  }

  /** Close the open record: emit it when it holds values or a failure, else keep only its counters
   * (a line that sets the time step for the lines after it). */
  close(): void {
    const values = this.values;
    if (values === null) return;
    this.values = null;
    if (values.size === 0 && this.failureText === undefined) {
      this.clearCounters();
      this.spare = values;
      return;
    }
    if (values.size === 0) {
      // Only a failure line: a record that carries the failure and no values. It is not an
      // iteration: it repeats the last iteration number and is not counted in `records`.
      if (this.lastIteration === undefined) this.dependsOnEarlierRecords = true;
      const failure: LogRecord = { iteration: this.lastIteration ?? 0, values, failure: this.failureText };
      this.clearCounters();
      this.emitted++;
      this.sink(failure);
      return;
    }
    let step = this.step ?? this.stickyStep;
    const time = this.time ?? this.stickyTime;
    if (step === undefined && time !== undefined && this.stepFromTime) {
      if (this.countedStepTime !== time) { this.countedStep++; this.countedStepTime = time; }
      step = this.countedStep;
    }
    let inner = this.inner;
    if (inner === undefined && step !== undefined) {
      inner = step === this.lastStep && this.lastInner !== undefined ? this.lastInner + 1 : 1;
    }
    let restart = this.restartPending;
    if (this.records > 0) {
      if (this.iteration !== undefined && this.lastIteration !== undefined) {
        if (this.iteration < this.lastIteration) restart = true;
      } else if (step !== undefined && this.lastStep !== undefined) {
        if (step < this.lastStep || (step === this.lastStep && this.inner !== undefined && this.lastInner !== undefined && this.inner < this.lastInner)) restart = true;
      } else if (time !== undefined && this.lastTime !== undefined && time < this.lastTime) {
        restart = true;
      }
    }
    let iteration = this.iteration;
    if (iteration === undefined) {
      iteration = this.records + 1;
      this.dependsOnEarlierRecords = true;
    }
    const record: { -readonly [K in keyof LogRecord]: LogRecord[K] } = { iteration, values };
    if (step !== undefined) record.timeStep = step;
    if (inner !== undefined) record.inner = inner;
    if (time !== undefined) record.time = time;
    if (restart) {
      record.restart = true;
      this.restarts++;
      this.restartPending = false;
    }
    if (this.failureText !== undefined) record.failure = this.failureText;
    this.lastIteration = iteration;
    this.lastStep = step;
    this.lastInner = inner;
    this.lastTime = time;
    this.clearCounters();
    this.records++;
    this.emitted++;
    this.sink(record);
    if (this.reuseValues) {
      values.clear();
      this.spare = values;
    }
  }

  private clearCounters(): void {
    this.iteration = undefined;
    this.step = undefined;
    this.time = undefined;
    this.inner = undefined;
    this.failureText = undefined;
    this.counterCaptured = false;
  }

  /** A line marking a crash: attach its text to the open record and emit it; with no record open
   * (one record per line), emit a record with no values that carries only the failure. */
  fail(line: string): void {
    this.current();
    this.failureText = line.length > FAILURE_TEXT_LENGTH ? `${line.slice(0, FAILURE_TEXT_LENGTH - 1)}…` : line;
    this.close();
  }

  noteRestart(): void {
    this.restartPending = true;
    this.stickyStep = undefined;
    this.stickyTime = undefined;
  }

  noteUnmatched(line: string): void {
    if (line.trim().length === 0) return;
    this.unmatched++;
    if (this.unmatchedSample.length < SAMPLE_SIZE) {
      this.unmatchedSample.push(line.length > SAMPLE_LINE_LENGTH ? `${line.slice(0, SAMPLE_LINE_LENGTH - 1)}…` : line);
    }
  }

  /** Take over where a parse of the log's earlier ranges ended (elsewhere, e.g. in a worker), at a
   * line that opens a record: the counts, the unmatched sample and the last iteration (what the
   * next record's restart check compares with). Valid only for logs without time steps (see
   * range-parsing.ts), where nothing else carries over from one record to the next. */
  resumeAfter(range: { lines: number; unmatched: number; unmatchedSample: readonly string[]; records: number; restarts: number; lastIteration?: number }): void {
    this.lines += range.lines;
    this.unmatched += range.unmatched;
    for (const line of range.unmatchedSample) if (this.unmatchedSample.length < SAMPLE_SIZE) this.unmatchedSample.push(line);
    this.records += range.records;
    this.restarts += range.restarts;
    if (range.lastIteration !== undefined) this.lastIteration = range.lastIteration;
  }

  /** The last record's iteration (undefined before the first record). */
  get lastIterationNumber(): number | undefined {
    return this.lastIteration;
  }

  hasCounters(): boolean {
    return this.counterCaptured;
  }

  stats(): ParseStats {
    return {
      lines: this.lines,
      unmatched: this.unmatched,
      unmatchedSample: [...this.unmatchedSample],
      records: this.records,
      restarts: this.restarts,
    };
  }
}

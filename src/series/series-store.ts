/**
 * Columnar store of a run's series: one pair of Float64Arrays (iteration, value) per series.
 *
 * Memory is bounded: each series keeps at most `capacity` points. When a series is full, its older
 * half is thinned by two (every second point kept), so recent history stays at full resolution
 * (what the analysis windows read) while the whole run remains drawable. Cost: amortised O(1) per
 * value; a thinning pass is O(capacity) and happens once per capacity/4 values added.
 */
import type { LogRecord, SeriesInfo } from '../parse/log-record.js';
import { RecordValues } from '../parse/record-values.js';
import { NO_VALUES, RESTART, type CompactRecords } from './compact-records.js';
import type { RunSnapshot, SeriesColumn } from './series-column.js';

export const DEFAULT_CAPACITY = 1 << 18;

class Column implements SeriesColumn {
  iterations: Float64Array;
  values: Float64Array;
  length = 0;
  totalAdded = 0;
  fullResolutionFrom = 0;

  constructor(public info: SeriesInfo, private readonly capacity: number) {
    const initial = Math.min(capacity, 1024);
    this.iterations = new Float64Array(initial);
    this.values = new Float64Array(initial);
  }

  push(iteration: number, value: number): void {
    if (this.length === this.values.length) this.makeRoom();
    this.iterations[this.length] = iteration;
    this.values[this.length] = value;
    this.length++;
    this.totalAdded++;
  }

  /** `push` of (iterations[valueRecords[j]], values[j]) for j in [from, to): the parallel read's
   * values of one series, copied run by run between thinning passes (no per-value room check). */
  pushIndexed(iterations: Float64Array, valueRecords: Int32Array, values: Float64Array, from: number, to: number): void {
    let j = from;
    while (j < to) {
      if (this.length === this.values.length) this.makeRoom();
      const run = Math.min(to - j, this.values.length - this.length);
      const at = this.length;
      const first = valueRecords[j];
      if (valueRecords[j + run - 1] - first === run - 1) {
        // The series has a value in every record of the run (records are increasing): two block copies.
        this.iterations.set(iterations.subarray(first, first + run), at);
        this.values.set(values.subarray(j, j + run), at);
      } else {
        const columnIterations = this.iterations;
        const columnValues = this.values;
        for (let k = 0; k < run; k++) {
          columnIterations[at + k] = iterations[valueRecords[j + k]];
          columnValues[at + k] = values[j + k];
        }
      }
      j += run;
      this.length = at + run;
      this.totalAdded += run;
    }
  }

  private makeRoom(): void {
    if (this.values.length < this.capacity) {
      const size = Math.min(this.capacity, this.values.length * 2);
      const iterations = new Float64Array(size);
      const values = new Float64Array(size);
      iterations.set(this.iterations);
      values.set(this.values);
      this.iterations = iterations;
      this.values = values;
      return;
    }
    // Thin the older half: keep every second point of [0, half), then shift the newer half down.
    const half = this.length >> 1;
    let write = 0;
    for (let read = 0; read < half; read += 2) {
      this.iterations[write] = this.iterations[read];
      this.values[write] = this.values[read];
      write++;
    }
    this.iterations.copyWithin(write, half, this.length);
    this.values.copyWithin(write, half, this.length);
    this.length = write + (this.length - half);
    this.fullResolutionFrom = write;
  }
}

export class SeriesStore {
  private readonly columns = new Map<string, Column>();
  private readonly ordered: Column[] = [];
  private readonly restartIterations: number[] = [];
  private readonly steps: { step: number; time?: number; firstRecord: number; lastRecord: number }[] = [];
  private recordCount = 0;
  private lastIterationSeen = Number.NaN;
  private failureText: string | undefined;

  constructor(private readonly capacity = DEFAULT_CAPACITY) {
    if (!(capacity >= 16)) throw new RangeError(`series capacity must be at least 16, got ${capacity}`);
  }

  /** Add one record. `infoOf` gives the kind/unit/label of a series the first time it appears. */
  add(record: LogRecord, infoOf: (name: string) => SeriesInfo): void {
    if (record.restart && this.recordCount > 0) this.restartIterations.push(record.iteration);
    if (record.failure !== undefined && this.failureText === undefined) this.failureText = record.failure;
    // A crash line outside any iteration carries no values: it marks the run, it is not an iteration.
    if (record.values.size === 0 && record.failure !== undefined) return;
    const iteration = record.iteration;
    const values = record.values;
    if (values instanceof RecordValues) {
      // The parsers' records: two arrays, walked without a callback.
      const { names, numbers } = values;
      for (let k = 0, size = values.size; k < size; k++) this.columnOf(names[k], infoOf).push(iteration, numbers[k]);
    } else {
      values.forEach((value, name) => this.columnOf(name, infoOf).push(iteration, value));
    }
    if (record.timeStep !== undefined) {
      const current = this.steps[this.steps.length - 1];
      if (current !== undefined && current.step === record.timeStep && !record.restart) {
        current.lastRecord = this.recordCount;
        if (record.time !== undefined) current.time = record.time;
      } else {
        this.steps.push({ step: record.timeStep, time: record.time, firstRecord: this.recordCount, lastRecord: this.recordCount });
      }
    }
    this.recordCount++;
    this.lastIterationSeen = record.iteration;
  }

  /**
   * Add records `from..to-1` of compact records (the parallel read): the same as `add` on each, in
   * order, for records without time steps. `names` maps the records' series ids to names;
   * `columns` caches the column of each id and `cursors` (one per series slot, starting at
   * `seriesStarts[k]`) where each slot's values go on: keep both for the next span of the same
   * records. Returns how many records were iterations (crash lines with no values are not).
   */
  addCompactRecords(records: CompactRecords, from: number, to: number, names: readonly string[],
    columns: (SeriesColumn | undefined)[], cursors: Int32Array, infoOf: (name: string) => SeriesInfo): number {
    const { iterations, flags, failures } = records;
    let added = 0;
    let last = Number.NaN;
    let failure = 0;
    while (failure < failures.length && failures[failure][0] < from) failure++;
    for (let r = from; r < to; r++) {
      const flag = flags[r];
      if ((flag & RESTART) !== 0 && this.recordCount + added > 0) this.restartIterations.push(iterations[r]);
      let failed = false;
      if (failure < failures.length && failures[failure][0] === r) {
        failed = true;
        if (this.failureText === undefined) this.failureText = failures[failure][1];
        failure++;
      }
      if ((flag & NO_VALUES) !== 0 && failed) continue;
      added++;
      last = iterations[r];
    }
    const { seriesIds, seriesStarts, valueRecords, values } = records;
    for (let k = 0; k < records.seriesCount; k++) {
      const j = cursors[k];
      const end = seriesStarts[k + 1];
      if (j >= end || valueRecords[j] >= to) continue;
      const id = seriesIds[k];
      const column = (columns[id] ??= this.columnOf(names[id], infoOf)) as Column;
      // The slot's values up to record `to`: records are increasing, so a binary search.
      const stop = valueRecords[end - 1] < to ? end : firstAtLeast(valueRecords, j, end, to);
      column.pushIndexed(iterations, valueRecords, values, j, stop);
      cursors[k] = stop;
    }
    this.recordCount += added;
    if (added > 0) this.lastIterationSeen = last;
    return added;
  }

  private columnOf(name: string, infoOf: (name: string) => SeriesInfo): Column {
    let column = this.columns.get(name);
    if (column === undefined) {
      column = new Column(infoOf(name), this.capacity);
      this.columns.set(name, column);
      this.ordered.push(column);
    }
    return column;
  }

  /** Update a series' kind/unit/label (the parser may learn more as it reads). */
  describe(info: SeriesInfo): void {
    const column = this.columns.get(info.name);
    if (column !== undefined) column.info = info;
  }

  get records(): number {
    return this.recordCount;
  }

  get lastIteration(): number {
    return this.lastIterationSeen;
  }

  names(): string[] {
    return this.ordered.map((column) => column.info.name);
  }

  column(name: string): SeriesColumn | undefined {
    return this.columns.get(name);
  }

  /** A view of the whole run now. Arrays are shared, not copied: read it before adding more. */
  snapshot(): RunSnapshot {
    return {
      series: this.ordered,
      records: this.recordCount,
      lastIteration: this.lastIterationSeen,
      restarts: this.restartIterations,
      failure: this.failureText,
      transient: this.steps.length > 0,
      timeSteps: this.steps.length > 0 ? this.steps : undefined,
    };
  }
}

/** The first index in [from, to) whose entry is >= value (entries increasing), or `to`. */
function firstAtLeast(sorted: Int32Array, from: number, to: number, value: number): number {
  let low = from;
  let high = to;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if (sorted[middle] < value) low = middle + 1;
    else high = middle;
  }
  return low;
}

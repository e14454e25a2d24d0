/**
 * Columnar store of a run's series: one pair of Float64Arrays (iteration, value) per series.
 *
 * Memory is bounded: each series keeps at most `capacity` points. When a series is full, its older
 * half is thinned by two (every second point kept), so recent history stays at full resolution
 * (what the analysis windows read) while the whole run remains drawable. Cost: amortised O(1) per
 * value; a thinning pass is O(capacity) and happens once per capacity/4 values added.
 */
import type { LogRecord, SeriesInfo } from '../parse/log-record.js';
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
    // forEach, not for...of: no entry array per value (measured: a third of the cost of adding).
    record.values.forEach((value, name) => {
      let column = this.columns.get(name);
      if (column === undefined) {
        column = new Column(infoOf(name), this.capacity);
        this.columns.set(name, column);
        this.ordered.push(column);
      }
      column.push(iteration, value);
    });
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
   * Add one record given in compact form (the parallel read): the same as `add` for a record of a
   * log without time steps whose values are `values[from..to)` of the series named
   * `names[series[k]]`. `columns` caches the column of each name index (filled here; keep one per
   * name table). Returns false for a crash record that is not an iteration (nothing added).
   */
  addCompact(
    iteration: number, restart: boolean, failure: string | undefined,
    names: readonly string[], columns: (SeriesColumn | undefined)[], series: Uint32Array, values: Float64Array, from: number, to: number,
    infoOf: (name: string) => SeriesInfo,
  ): boolean {
    if (restart && this.recordCount > 0) this.restartIterations.push(iteration);
    if (failure !== undefined && this.failureText === undefined) this.failureText = failure;
    if (from === to && failure !== undefined) return false;
    for (let k = from; k < to; k++) {
      const id = series[k];
      let column = columns[id] as Column | undefined;
      if (column === undefined) {
        const name = names[id];
        column = this.columns.get(name);
        if (column === undefined) {
          column = new Column(infoOf(name), this.capacity);
          this.columns.set(name, column);
          this.ordered.push(column);
        }
        columns[id] = column;
      }
      column.push(iteration, values[k]);
    }
    this.recordCount++;
    this.lastIterationSeen = iteration;
    return true;
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

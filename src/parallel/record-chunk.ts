/**
 * Records in compact form, for sending from a worker thread to the main thread: typed arrays
 * grouped by series (see series/compact-records.ts)
 * instead of one object per record. The builder collects records row by row and groups them by
 * series when a chunk is taken (a counting sort, O(values)).
 */
import type { LogRecord } from '../parse/log-record.js';
import { RecordValues } from '../parse/record-values.js';
import type { SeriesRegistration } from '../parse/range-parsing.js';
import { NO_VALUES, RESTART, type CompactRecords } from '../series/compact-records.js';

export interface RecordChunk extends CompactRecords {
  /** Names of the range met since the previous chunk (the table grows in order). */
  readonly newNames: readonly string[];
  /** Series registrations of this chunk, `atRecord` counted from the range's start. */
  readonly registrations: readonly SeriesRegistration[];
  /** Byte offset in the log just after the last line these records came from (for progress). */
  readonly endOffset: number;
}

/** Collects records into chunks. */
export class RecordChunkBuilder {
  private iterations = new Float64Array(1024);
  private restarts = new Uint8Array(1024);
  private valueEnds = new Int32Array(1024);
  private series = new Uint32Array(8192);
  private values = new Float64Array(8192);
  private failures: [number, string][] = [];
  private count = 0;
  private valueCount = 0;
  private readonly ids = new Map<string, number>();
  private readonly lastNames: string[] = [];
  private readonly lastIds: number[] = [];
  private newNames: string[] = [];

  get records(): number {
    return this.count;
  }

  add(record: LogRecord): void {
    if (this.count === this.iterations.length) this.growRecords();
    const r = this.count++;
    this.iterations[r] = record.iteration;
    this.restarts[r] = record.restart === true ? RESTART : 0;
    if (record.failure !== undefined) this.failures.push([r, record.failure]);
    const values = record.values;
    if (values instanceof RecordValues) {
      const { names, numbers } = values;
      for (let k = 0, size = values.size; k < size; k++) {
        // The k-th name of a record is usually the k-th name of the record before (the same string).
        const name = names[k];
        if (this.lastNames[k] === name) this.addId(this.lastIds[k], numbers[k]);
        else this.lastIds[k] = this.addValue(name, numbers[k]);
        this.lastNames[k] = name;
      }
    } else {
      values.forEach((value, name) => this.addValue(name, value));
    }
    this.valueEnds[r] = this.valueCount;
  }

  private addValue(name: string, value: number): number {
    let id = this.ids.get(name);
    if (id === undefined) {
      id = this.ids.size;
      this.ids.set(name, id);
      this.newNames.push(name);
    }
    this.addId(id, value);
    return id;
  }

  private addId(id: number, value: number): void {
    if (this.valueCount === this.values.length) this.growValues();
    this.series[this.valueCount] = id;
    this.values[this.valueCount++] = value;
  }

  /** The chunk of the records so far, grouped by series; the builder starts again empty. The
   * chunk's arrays are views of the builder's scratch arrays: valid until the next `take` (post
   * it, which copies, or copy it, before taking again). */
  take(registrations: readonly SeriesRegistration[], endOffset: number): RecordChunk {
    const count = this.count;
    const total = this.valueCount;
    const seriesCount = this.ids.size;
    const scratch = this.scratchFor(count, total, seriesCount);
    const { seriesIds, seriesStarts, slotStart, valueRecords, values, flags } = scratch;
    // Counting sort of the values by series id (ids are 0..seriesCount-1). The loops are
    // functions of their own: see LineSplitter.findLines for why.
    const seen = scratch.seen;
    seen.fill(0, 0, seriesCount + 1);
    const series = this.series;
    countIds(series, total, seen);
    let slots = 0;
    let at = 0;
    for (let id = 0; id < seriesCount; id++) {
      const n = seen[id + 1];
      if (n === 0) continue;
      seriesIds[slots] = id;
      seriesStarts[slots] = at;
      slotStart[id] = at;
      at += n;
      slots++;
    }
    seriesStarts[slots] = at;
    const valueEnds = this.valueEnds;
    scatterBySeries(series, this.values, valueEnds, total, slotStart, valueRecords, values);
    flagRecords(this.restarts, valueEnds, count, flags);
    const chunk: RecordChunk = {
      count,
      iterations: this.iterations.subarray(0, count),
      flags: flags.subarray(0, count),
      failures: this.failures,
      seriesCount: slots,
      seriesIds: seriesIds.subarray(0, slots),
      seriesStarts: seriesStarts.subarray(0, slots + 1),
      valueRecords: valueRecords.subarray(0, total),
      values: values.subarray(0, total),
      newNames: this.newNames,
      registrations,
      endOffset,
    };
    this.count = 0;
    this.valueCount = 0;
    this.failures = [];
    this.newNames = [];
    return chunk;
  }

  private scratch: Scratch | undefined;

  /** Column-major scratch arrays big enough for this chunk (grown, never shrunk). */
  private scratchFor(records: number, values: number, series: number): Scratch {
    const old = this.scratch;
    if (old !== undefined && old.flags.length >= records && old.values.length >= values && old.seen.length > series) return old;
    const r = Math.max(records, old?.flags.length ?? 0);
    const v = Math.max(values, old?.values.length ?? 0);
    const s = Math.max(series + 1, old?.seen.length ?? 0) * 2;
    this.scratch = {
      flags: new Uint8Array(r), valueRecords: new Int32Array(v), values: new Float64Array(v),
      seriesIds: new Uint32Array(s), seriesStarts: new Int32Array(s + 1), slotStart: new Int32Array(s), seen: new Int32Array(s + 1),
    };
    return this.scratch;
  }

  private growRecords(): void {
    const size = this.iterations.length * 2;
    this.iterations = grown(this.iterations, new Float64Array(size));
    this.restarts = grown(this.restarts, new Uint8Array(size));
    this.valueEnds = grown(this.valueEnds, new Int32Array(size));
  }

  private growValues(): void {
    const size = this.values.length * 2;
    this.series = grown(this.series, new Uint32Array(size));
    this.values = grown(this.values, new Float64Array(size));
  }
}

function countIds(series: Uint32Array, total: number, seen: Int32Array): void {
  for (let v = 0; v < total; v++) seen[series[v] + 1]++;
}

/** Value v (of record r: valueEnds[r - 1] <= v < valueEnds[r]) goes to slot `slotStart[its id]++`. */
function scatterBySeries(series: Uint32Array, rowValues: Float64Array, valueEnds: Int32Array, total: number,
  slotStart: Int32Array, valueRecords: Int32Array, values: Float64Array): void {
  let record = 0;
  for (let v = 0; v < total; v++) {
    while (valueEnds[record] <= v) record++;
    const to = slotStart[series[v]]++;
    valueRecords[to] = record;
    values[to] = rowValues[v];
  }
}

function flagRecords(restarts: Uint8Array, valueEnds: Int32Array, count: number, flags: Uint8Array): void {
  let previousEnd = 0;
  for (let r = 0; r < count; r++) {
    flags[r] = restarts[r] | (valueEnds[r] === previousEnd ? NO_VALUES : 0);
    previousEnd = valueEnds[r];
  }
}

function grown<T extends Float64Array | Uint8Array | Int32Array | Uint32Array>(from: T, to: T): T {
  to.set(from);
  return to;
}

interface Scratch {
  readonly flags: Uint8Array;
  readonly valueRecords: Int32Array;
  readonly values: Float64Array;
  readonly seriesIds: Uint32Array;
  readonly seriesStarts: Int32Array;
  readonly slotStart: Int32Array;
  readonly seen: Int32Array;
}

/**
 * Records in compact form, for sending from a worker thread to the main thread: columns of typed
 * arrays (whose buffers are transferred, not copied) instead of one object and one Map per record.
 *
 * Record r has iteration `iterations[r]`, the restart mark `restarts[r]`, and the values
 * `values[valueEnds[r - 1] .. valueEnds[r])` of the series `series[...]` (indices into the range's
 * name table, in the order the record held them). Crash records carry their text in `failures`.
 */
import type { LogRecord } from '../parse/log-record.js';
import type { SeriesRegistration } from '../parse/range-parsing.js';

export interface RecordChunk {
  readonly count: number;
  readonly iterations: Float64Array;
  readonly restarts: Uint8Array;
  readonly valueEnds: Int32Array;
  readonly series: Uint32Array;
  readonly values: Float64Array;
  /** [record index, failure text] of the records that carry one. */
  readonly failures: readonly (readonly [number, string])[];
  /** Names of the range met since the previous chunk (the table grows in order). */
  readonly newNames: readonly string[];
  /** Series registrations of this chunk, `atRecord` counted from the range's start. */
  readonly registrations: readonly SeriesRegistration[];
  /** Byte offset in the log just after the last line these records came from (for progress). */
  readonly endOffset: number;
}

/** Collects records into a chunk; `cut(n)` drops everything after the n-th record (a range's
 * parse going back to its last safe line). */
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
  private newNames: string[] = [];

  get records(): number {
    return this.count;
  }

  add(record: LogRecord): void {
    if (this.count === this.iterations.length) this.growRecords();
    const r = this.count++;
    this.iterations[r] = record.iteration;
    this.restarts[r] = record.restart === true ? 1 : 0;
    if (record.failure !== undefined) this.failures.push([r, record.failure]);
    record.values.forEach((value, name) => {
      let id = this.ids.get(name);
      if (id === undefined) {
        id = this.ids.size;
        this.ids.set(name, id);
        this.newNames.push(name);
      }
      if (this.valueCount === this.values.length) this.growValues();
      this.series[this.valueCount] = id;
      this.values[this.valueCount++] = value;
    });
    this.valueEnds[r] = this.valueCount;
  }

  /** Keep only the first `records` records (names stay known: a name is only a table entry). */
  cut(records: number): void {
    if (records >= this.count) return;
    this.count = records;
    this.valueCount = records > 0 ? this.valueEnds[records - 1] : 0;
    this.failures = this.failures.filter(([r]) => r < records);
  }

  /** The chunk of the records so far (copied out); the builder starts again empty. */
  take(registrations: readonly SeriesRegistration[], endOffset: number): RecordChunk {
    const chunk: RecordChunk = {
      count: this.count,
      iterations: this.iterations.slice(0, this.count),
      restarts: this.restarts.slice(0, this.count),
      valueEnds: this.valueEnds.slice(0, this.count),
      series: this.series.slice(0, this.valueCount),
      values: this.values.slice(0, this.valueCount),
      failures: this.failures,
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

function grown<T extends Float64Array | Uint8Array | Int32Array | Uint32Array>(from: T, to: T): T {
  to.set(from);
  return to;
}

/** The buffers of a chunk, for a transfer list. */
export function transferablesOf(chunk: RecordChunk): ArrayBuffer[] {
  return [chunk.iterations, chunk.restarts, chunk.valueEnds, chunk.series, chunk.values].map((array) => array.buffer as ArrayBuffer);
}

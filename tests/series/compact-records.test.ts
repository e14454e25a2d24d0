import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { SeriesStore } from '../../src/series/series-store.js';
import { NO_VALUES, RESTART, type CompactRecords } from '../../src/series/compact-records.js';
import type { SeriesColumn } from '../../src/series/series-column.js';
import type { LogRecord, SeriesInfo } from '../../src/parse/log-record.js';
import { RecordValues } from '../../src/parse/record-values.js';

// Reference: SeriesStore.add, the sequential path. addCompactRecords promises to leave the store
// exactly as `add` on the same records, in order, would (its doc comment). Every comparison below
// is exact (toEqual: NaN equals NaN, -0 differs from 0); no float tolerance is involved because
// both paths only copy numbers.

const POOL = ['res_p', 'res_u', 'res_v', 'res_k', 'cd', 'cl', 'nu_hot', 'dt'];
const FAILURES = ['floating point exception', 'solver aborted: NaN in res_p', 'out of memory in the linear solver'];

/** What a series is, decided from its name alone so both stores are told the same. */
function infoOf(name: string): SeriesInfo {
  if (name.startsWith('res_')) return { name, kind: 'residual' };
  if (name === 'dt') return { name, kind: 'other', unit: 's' };
  return { name, kind: 'quantity', label: name.toUpperCase() };
}

/** A store whose calls to infoOf are logged (both paths must ask about the same names in the same order). */
function watchedStore(capacity: number | undefined): { store: SeriesStore; asked: string[]; info: (name: string) => SeriesInfo } {
  const asked: string[] = [];
  return { store: new SeriesStore(capacity), asked, info: (name) => { asked.push(name); return infoOf(name); } };
}

/**
 * The layout of series/compact-records.ts, built here from LogRecords independently of the
 * worker-side builder: column-major, series ids from `ids` (the range's name table, extended in
 * order of first appearance), slots in increasing id order, `valueRecords` increasing. Arrays are
 * padded with junk past what is used, as the contract allows.
 */
function toCompact(records: readonly LogRecord[], ids: Map<string, number>, names: string[]): CompactRecords {
  const count = records.length;
  const pad = 3;
  const iterations = new Float64Array(count + pad).fill(-777);
  const flags = new Uint8Array(count + pad).fill(0xff);
  const failures: [number, string][] = [];
  const bySeries = new Map<number, [number, number][]>();
  records.forEach((record, r) => {
    iterations[r] = record.iteration;
    flags[r] = (record.restart === true ? RESTART : 0) | (record.values.size === 0 ? NO_VALUES : 0);
    if (record.failure !== undefined) failures.push([r, record.failure]);
    for (const [name, value] of record.values) {
      let id = ids.get(name);
      if (id === undefined) {
        id = ids.size;
        ids.set(name, id);
        names.push(name);
      }
      let list = bySeries.get(id);
      if (list === undefined) bySeries.set(id, (list = []));
      list.push([r, value]);
    }
  });
  const slots = [...bySeries.keys()].sort((a, b) => a - b);
  const total = slots.reduce((sum, id) => sum + (bySeries.get(id) as unknown[]).length, 0);
  const seriesIds = new Uint32Array(slots.length + pad).fill(999);
  const seriesStarts = new Int32Array(slots.length + 1 + pad).fill(-5);
  const valueRecords = new Int32Array(total + pad).fill(-1);
  const values = new Float64Array(total + pad).fill(Number.NaN);
  let at = 0;
  slots.forEach((id, k) => {
    seriesIds[k] = id;
    seriesStarts[k] = at;
    for (const [r, value] of bySeries.get(id) as [number, number][]) {
      valueRecords[at] = r;
      values[at++] = value;
    }
  });
  seriesStarts[slots.length] = at;
  return { count, iterations, flags, failures, seriesCount: slots.length, seriesIds, seriesStarts, valueRecords, values };
}

/** Everything a store shows, copied out (its arrays are shared views). */
function snapshotOf(store: SeriesStore): unknown {
  const snapshot = store.snapshot();
  return {
    names: store.names(),
    series: snapshot.series.map((column: SeriesColumn) => ({
      info: column.info,
      length: column.length,
      totalAdded: column.totalAdded,
      fullResolutionFrom: column.fullResolutionFrom,
      iterations: Array.from(column.iterations.subarray(0, column.length)),
      values: Array.from(column.values.subarray(0, column.length)),
    })),
    records: snapshot.records,
    lastIteration: snapshot.lastIteration,
    restarts: [...snapshot.restarts],
    failure: snapshot.failure,
    transient: snapshot.transient,
  };
}

/** Where a record begins a new piece of the join: 0 none, 1 a span, 2 a chunk, 3 a range. */
type Break = 0 | 1 | 2 | 3;

interface Planned {
  readonly records: LogRecord[];
  readonly breaks: Break[];
  /** Before a span, also add an empty span (from = to). */
  readonly emptySpans: boolean[];
}

const value = fc.oneof(
  { weight: 12, arbitrary: fc.double({ min: 1e-12, max: 10, noNaN: true }) },
  { weight: 1, arbitrary: fc.constantFrom(Number.NaN, Infinity, -Infinity, -0, 0) },
);
const plannedRecord = fc.record({
  // The counter mostly goes up by one; sometimes it jumps, stands still or goes back.
  delta: fc.oneof({ weight: 12, arbitrary: fc.constant(1) }, { weight: 1, arbitrary: fc.integer({ min: -40, max: 0 }) }, { weight: 1, arbitrary: fc.integer({ min: 2, max: 25 }) }),
  restart: fc.integer({ min: 0, max: 11 }).map((n) => n === 0),
  // 0..1: a crash line with no values; 2: failure text on an iteration that has values;
  // 3: an iteration with no values and no failure; otherwise a plain iteration.
  kind: fc.integer({ min: 0, max: 40 }),
  failure: fc.constantFrom(...FAILURES),
  // Values for 1..6 series of the pool, in random order (unique names).
  values: fc.uniqueArray(fc.tuple(fc.nat(POOL.length - 1), value), { minLength: 1, maxLength: 6, selector: (pair) => pair[0] }),
  asRecordValues: fc.boolean(),
  brk: fc.oneof({ weight: 10, arbitrary: fc.constant<Break>(0) }, { weight: 3, arbitrary: fc.constant<Break>(1) }, { weight: 1, arbitrary: fc.constant<Break>(2) }, { weight: 1, arbitrary: fc.constant<Break>(3) }),
  emptySpan: fc.integer({ min: 0, max: 5 }).map((n) => n === 0),
});

const plannedRun = (minRecords: number, maxRecords: number): fc.Arbitrary<Planned> => fc.array(plannedRecord, { minLength: minRecords, maxLength: maxRecords, size: 'max' }).map((planned) => {
  let iteration = 1;
  const records = planned.map((p, r): LogRecord => {
    if (r > 0) iteration = Math.max(0, iteration + p.delta);
    const pairs: [string, number][] = p.kind <= 1 || p.kind === 3 ? [] : p.values.map(([k, v]) => [POOL[k], v]);
    const values = p.asRecordValues ? pairs.reduce((map, [name, v]) => map.set(name, v), new RecordValues()) : new Map(pairs);
    const record: LogRecord = { iteration, values };
    return {
      ...record,
      ...(p.restart ? { restart: true } : {}),
      ...(p.kind <= 2 ? { failure: p.failure } : {}),
    };
  });
  return { records, breaks: planned.map((p) => p.brk), emptySpans: planned.map((p) => p.emptySpan) };
});

/** Store A: `add`, record by record. */
function sequential(records: readonly LogRecord[], capacity: number | undefined): { store: SeriesStore; asked: string[] } {
  const { store, asked, info } = watchedStore(capacity);
  for (const record of records) store.add(record, info);
  return { store, asked };
}

/** Store B: the records cut into ranges (each its own name table and column cache), chunks (each
 * its own cursors) and spans, joined with addCompactRecords as the parallel read does. */
function compact(plan: Planned, capacity: number | undefined): { store: SeriesStore; asked: string[]; returned: number } {
  const { store, asked, info } = watchedStore(capacity);
  const { records, breaks, emptySpans } = plan;
  let returned = 0;
  let r = 0;
  while (r < records.length) {
    // One range: records r .. rangeEnd - 1.
    let rangeEnd = r + 1;
    while (rangeEnd < records.length && breaks[rangeEnd] < 3) rangeEnd++;
    const ids = new Map<string, number>();
    const names: string[] = [];
    const columns: (SeriesColumn | undefined)[] = [];
    let c = r;
    while (c < rangeEnd) {
      let chunkEnd = c + 1;
      while (chunkEnd < rangeEnd && breaks[chunkEnd] < 2) chunkEnd++;
      const chunk = toCompact(records.slice(c, chunkEnd), ids, names);
      const cursors = chunk.seriesStarts.slice(0, chunk.seriesCount);
      let s = 0;
      while (s < chunk.count) {
        let spanEnd = s + 1;
        while (spanEnd < chunk.count && breaks[c + spanEnd] < 1) spanEnd++;
        if (emptySpans[c + s]) expect(store.addCompactRecords(chunk, s, s, names, columns, cursors, info)).toBe(0);
        returned += store.addCompactRecords(chunk, s, spanEnd, names, columns, cursors, info);
        s = spanEnd;
      }
      c = chunkEnd;
    }
    r = rangeEnd;
  }
  return { store, asked, returned };
}

function expectSameStore(plan: Planned, capacity: number | undefined): void {
  const a = sequential(plan.records, capacity);
  const b = compact(plan, capacity);
  expect(snapshotOf(b.store)).toEqual(snapshotOf(a.store));
  expect(b.asked).toEqual(a.asked);
  // The return value counts the records that were iterations: the store's own count.
  expect(b.returned).toBe(a.store.records);
}

describe('SeriesStore.addCompactRecords leaves the store as SeriesStore.add on the same records (the sequential reference)', () => {
  it('random runs cut into random ranges, chunks and spans, default capacity (property)', () => {
    fc.assert(fc.property(plannedRun(1, 120), (plan) => expectSameStore(plan, undefined)), { numRuns: 200, seed: 6_012_026 });
  });

  it('the same with a capacity of 16 and 32, so that columns are thinned mid-span (property)', () => {
    fc.assert(fc.property(plannedRun(60, 300), fc.constantFrom(16, 32), (plan, capacity) => expectSameStore(plan, capacity)), { numRuns: 100, seed: 6_022_026 });
  });

  it('a hand case: a crash line with no values, a failure on an iteration, a restart, a name first seen late, three spans', () => {
    const records: LogRecord[] = [
      { iteration: 1, values: new Map([['res_p', 1], ['cd', 0.5]]) },
      { iteration: 2, values: new Map([['cd', 0.4], ['res_p', 0.5]]) },
      { iteration: 2, values: new Map(), failure: 'floating point exception' },
      { iteration: 1, values: new Map([['res_u', 0.9], ['res_p', 0.8]]), restart: true },
      { iteration: 2, values: new Map([['res_p', Number.NaN]]), failure: 'solver aborted: NaN in res_p' },
    ];
    const plan: Planned = { records, breaks: [0, 0, 1, 0, 1], emptySpans: [false, false, true, false, false] };
    expectSameStore(plan, undefined);
    // And what that store is, read from the records (the add path's documented rules): the crash
    // line is not an iteration, the first failure text wins, the restart is recorded at its iteration.
    const { store } = compact(plan, undefined);
    expect(store.names()).toEqual(['res_p', 'cd', 'res_u']);
    expect(store.records).toBe(4);
    expect(store.lastIteration).toBe(2);
    expect(store.snapshot().restarts).toEqual([1]);
    expect(store.snapshot().failure).toBe('floating point exception');
    const p = store.column('res_p') as SeriesColumn;
    expect(Array.from(p.iterations.subarray(0, p.length))).toEqual([1, 2, 1, 2]);
    expect(Array.from(p.values.subarray(0, p.length))).toEqual([1, 0.5, 0.8, Number.NaN]);
  });

  it('a run that is only a crash line: no records, no last iteration (NaN), the failure kept', () => {
    const plan: Planned = { records: [{ iteration: 0, values: new Map(), failure: 'out of memory', restart: true }], breaks: [0], emptySpans: [true] };
    expectSameStore(plan, undefined);
    const { store } = compact(plan, undefined);
    expect(store.records).toBe(0);
    expect(store.lastIteration).toBeNaN();
    expect(store.snapshot().restarts).toEqual([]);
    expect(store.snapshot().failure).toBe('out of memory');
  });
});

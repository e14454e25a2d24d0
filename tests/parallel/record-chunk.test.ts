import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { RecordChunkBuilder, type RecordChunk } from '../../src/parallel/record-chunk.js';
import { NO_VALUES, RESTART } from '../../src/series/compact-records.js';
import type { LogRecord } from '../../src/parse/log-record.js';
import type { SeriesRegistration } from '../../src/parse/range-parsing.js';
import { RecordValues } from '../../src/parse/record-values.js';

// Reference: the LogRecords themselves. A chunk is only a re-arrangement of the records added
// since the previous take (series/compact-records.ts states the layout), so rebuilding records
// from it must give them back exactly: iteration, restart, failure, and each value under its name
// (compared exactly with toEqual: NaN equals NaN, -0 differs from 0; no tolerance, numbers are copied).

interface Row {
  readonly iteration: number;
  readonly restart: boolean;
  readonly noValues: boolean;
  readonly failure: string | undefined;
  readonly values: [string, number][];
}

const byName = (a: [string, number], b: [string, number]): number => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0);

/** What a chunk must reproduce of a record. A record's values come back grouped by series, so
 * their order within the record is not kept: compared sorted by name. */
function rowOf(record: LogRecord): Row {
  return {
    iteration: record.iteration,
    restart: record.restart === true,
    noValues: record.values.size === 0,
    failure: record.failure,
    values: [...record.values].sort(byName),
  };
}

/** Records rebuilt from a chunk; `names` is the range's name table (all newNames so far, in order). */
function rebuild(chunk: RecordChunk, names: readonly string[]): Row[] {
  const rows = Array.from({ length: chunk.count }, (_, r) => ({
    iteration: chunk.iterations[r],
    restart: (chunk.flags[r] & RESTART) !== 0,
    noValues: (chunk.flags[r] & NO_VALUES) !== 0,
    failure: undefined as string | undefined,
    values: [] as [string, number][],
  }));
  for (const [r, text] of chunk.failures) rows[r].failure = text;
  for (let k = 0; k < chunk.seriesCount; k++) {
    for (let j = chunk.seriesStarts[k]; j < chunk.seriesStarts[k + 1]; j++) rows[chunk.valueRecords[j]].values.push([names[chunk.seriesIds[k]], chunk.values[j]]);
  }
  for (const row of rows) row.values.sort(byName);
  return rows;
}

/** The layout rules of series/compact-records.ts that hold whatever was added (problems listed,
 * so a failure says which rule broke). */
function expectWellFormed(chunk: RecordChunk, tableSize: number): void {
  const problems: string[] = [];
  if (chunk.seriesCount > 0 && chunk.seriesStarts[0] !== 0) problems.push('first slot does not start at 0');
  for (let k = 0; k < chunk.seriesCount; k++) {
    // Slots in increasing id order, each id a name of the table, no empty slot.
    if (k > 0 && !(chunk.seriesIds[k] > chunk.seriesIds[k - 1])) problems.push(`slot ${k}: id not increasing`);
    if (!(chunk.seriesIds[k] < tableSize)) problems.push(`slot ${k}: id past the name table`);
    if (!(chunk.seriesStarts[k + 1] > chunk.seriesStarts[k])) problems.push(`slot ${k}: empty`);
    // The records of a slot increase (a record holds a series once), and are records of the chunk.
    for (let j = chunk.seriesStarts[k]; j < chunk.seriesStarts[k + 1]; j++) {
      if (j > chunk.seriesStarts[k] && !(chunk.valueRecords[j] > chunk.valueRecords[j - 1])) problems.push(`value ${j}: record not increasing`);
      if (!(chunk.valueRecords[j] >= 0 && chunk.valueRecords[j] < chunk.count)) problems.push(`value ${j}: record out of the chunk`);
    }
  }
  // Failures in record order, one per record at most.
  for (let f = 1; f < chunk.failures.length; f++) if (!(chunk.failures[f][0] > chunk.failures[f - 1][0])) problems.push(`failure ${f}: out of order`);
  expect(problems).toEqual([]);
}

const POOL = ['res_p', 'res_u', 'res_v', 'res_k', 'cd', 'cl', 'nu_hot', 'dt', 'T_max'];

const value = fc.oneof({ weight: 12, arbitrary: fc.double() }, { weight: 1, arbitrary: fc.constantFrom(Number.NaN, -0, Infinity) });
const recordArb: fc.Arbitrary<LogRecord> = fc.record({
  iteration: fc.integer({ min: 0, max: 100_000 }),
  restart: fc.integer({ min: 0, max: 9 }).map((n) => n === 0),
  // 0: a crash line (no values, a failure); 1: failure on an iteration; 2: no values, no failure.
  kind: fc.integer({ min: 0, max: 25 }),
  failure: fc.constantFrom('floating point exception', 'solver aborted: NaN in res_p'),
  pairs: fc.uniqueArray(fc.tuple(fc.constantFrom(...POOL), value), { minLength: 1, maxLength: 6, selector: (pair) => pair[0] }),
  // The parsers' RecordValues, or a plain Map (the builder has a path for each).
  asRecordValues: fc.integer({ min: 0, max: 3 }).map((n) => n > 0),
}).map(({ iteration, restart, kind, failure, pairs, asRecordValues }) => {
  const used = kind === 0 || kind === 2 ? [] : pairs;
  const values = asRecordValues ? used.reduce((map, [name, v]) => map.set(name, v), new RecordValues()) : new Map(used);
  return { iteration, values, ...(restart ? { restart: true } : {}), ...(kind <= 1 ? { failure } : {}) };
});

const registration = (atRecord: number, name: string): SeriesRegistration => ({ atRecord, name, ruleKind: 'residual', fromPair: true });

type Op = { readonly op: 'add'; readonly record: LogRecord } | { readonly op: 'take'; readonly registrations: number };

const opArb: fc.Arbitrary<Op> = fc.oneof(
  { weight: 20, arbitrary: recordArb.map((record): Op => ({ op: 'add', record })) },
  { weight: 2, arbitrary: fc.nat(2).map((registrations): Op => ({ op: 'take', registrations })) },
);

/** Runs operations on a builder and on a model (the records kept, the names met), checking every
 * chunk against the model when taken and again, from a structuredClone, after all later takes. */
function runOps(ops: readonly Op[]): void {
  const builder = new RecordChunkBuilder();
  let pending: LogRecord[] = [];
  const table: string[] = [];
  let tableSent = 0;
  const kept: { copy: RecordChunk; rows: Row[]; names: string[] }[] = [];
  const take = (registrationCount: number, endOffset: number): void => {
    const registrations = Array.from({ length: registrationCount }, (_, i) => registration(i, POOL[i]));
    const chunk = builder.take(registrations, endOffset);
    expect(chunk.count).toBe(pending.length);
    expect(builder.records).toBe(0);
    // Only the names met since the previous take, in order of first sight.
    expect(chunk.newNames).toEqual(table.slice(tableSent));
    tableSent = table.length;
    expect(chunk.registrations).toBe(registrations);
    expect(chunk.endOffset).toBe(endOffset);
    expectWellFormed(chunk, table.length);
    const rows = pending.map(rowOf);
    expect(rebuild(chunk, table)).toEqual(rows);
    expectIdsInOrderOfFirstAppearance(chunk, table, pending);
    kept.push({ copy: structuredClone(chunk), rows, names: [...table] });
    pending = [];
  };
  ops.forEach((op, step) => {
    if (op.op === 'add') {
      builder.add(op.record);
      pending.push(op.record);
      for (const name of op.record.values.keys()) if (!table.includes(name)) table.push(name);
      expect(builder.records).toBe(pending.length);
    } else {
      take(op.registrations, 1000 * step);
    }
  });
  take(0, 1000 * ops.length);
  // Copies taken with structuredClone stay right after later takes reused the builder's arrays.
  for (const { copy, rows, names } of kept) expect(rebuild(copy, names)).toEqual(rows);
}

/** Series ids numbered in order of first appearance (series/compact-records.ts): walking the
 * records row by row, a slot's id first met is the next name of the table not yet met. */
function expectIdsInOrderOfFirstAppearance(chunk: RecordChunk, table: readonly string[], records: readonly LogRecord[]): void {
  const seenBefore = new Set(table.slice(0, table.length - chunk.newNames.length));
  const firstSeen: string[] = [];
  for (const record of records) for (const name of record.values.keys()) if (!seenBefore.has(name) && !firstSeen.includes(name)) firstSeen.push(name);
  expect(firstSeen).toEqual(chunk.newNames);
}

describe('RecordChunkBuilder: a chunk gives back the records added since the last take (the records are the reference)', () => {
  it('random records (RecordValues and plain Maps, crash lines, failures, restarts) over several takes in a row (property)', () => {
    fc.assert(fc.property(fc.array(opArb, { maxLength: 80, size: 'max' }), (ops) => runOps(ops)), { numRuns: 200, seed: 7_012_026 });
  });

  it('flags: RESTART on a restart record, NO_VALUES exactly on records with no values; failures by record index', () => {
    const builder = new RecordChunkBuilder();
    builder.add({ iteration: 5, values: new RecordValues().set('res_p', 1e-3) });
    builder.add({ iteration: 6, values: new Map(), failure: 'floating point exception' });
    builder.add({ iteration: 1, values: new Map([['res_p', 0.5]]), restart: true, failure: 'solver aborted' });
    builder.add({ iteration: 2, values: new RecordValues() });
    const chunk = builder.take([], 42);
    expect(Array.from(chunk.flags)).toEqual([0, NO_VALUES, RESTART, NO_VALUES]);
    expect(chunk.failures).toEqual([[1, 'floating point exception'], [2, 'solver aborted']]);
    expect(Array.from(chunk.iterations)).toEqual([5, 6, 1, 2]);
    expect(chunk.newNames).toEqual(['res_p']);
    expect(chunk.seriesCount).toBe(1);
    expect(Array.from(chunk.valueRecords)).toEqual([0, 2]);
    expect(Array.from(chunk.values)).toEqual([1e-3, 0.5]);
  });

  it('groups by series: slots in id order, ids in order of first appearance, a record\'s values in any order', () => {
    const builder = new RecordChunkBuilder();
    builder.add({ iteration: 1, values: new RecordValues().set('res_u', 1).set('res_p', 2) });
    builder.add({ iteration: 2, values: new RecordValues().set('res_p', 3).set('cd', 4).set('res_u', 5) });
    const first = structuredClone(builder.take([], 0));
    expect(first.newNames).toEqual(['res_u', 'res_p', 'cd']);
    expect(Array.from(first.seriesIds)).toEqual([0, 1, 2]);
    expect(Array.from(first.seriesStarts)).toEqual([0, 2, 4, 5]);
    expect(Array.from(first.valueRecords)).toEqual([0, 1, 0, 1, 1]);
    expect(Array.from(first.values)).toEqual([1, 5, 2, 3, 4]);
    // Next chunk: only cd and a new name have values; the table goes on (res_u is id 0, cd id 2).
    builder.add({ iteration: 3, values: new Map([['nu_hot', 7], ['cd', 6]]) });
    const second = builder.take([registration(0, 'nu_hot')], 10);
    expect(second.newNames).toEqual(['nu_hot']);
    expect(Array.from(second.seriesIds)).toEqual([2, 3]);
    expect(Array.from(second.seriesStarts)).toEqual([0, 1, 2]);
    expect(Array.from(second.values)).toEqual([6, 7]);
    expect(second.registrations).toEqual([registration(0, 'nu_hot')]);
    // The copy of the first chunk is untouched by the second take.
    expect(Array.from(first.values)).toEqual([1, 5, 2, 3, 4]);
  });

  it('grows past its first room (1 024 records, 8 192 values) and back: 3 000 records of 4 values, then a small chunk', () => {
    const builder = new RecordChunkBuilder();
    const big: LogRecord[] = Array.from({ length: 3000 }, (_, i) => ({
      iteration: i + 1,
      values: new RecordValues().set('res_p', 1 / (i + 1)).set('res_u', -i).set(i % 2 === 0 ? 'cd' : 'cl', i * 0.5).set('dt', 1e-3),
    }));
    for (const record of big) builder.add(record);
    const bigChunk = builder.take([], 1);
    expect(rebuild(bigChunk, bigChunk.newNames)).toEqual(big.map(rowOf));
    const small: LogRecord[] = [{ iteration: 3001, values: new Map([['cl', 9]]) }];
    builder.add(small[0]);
    const smallChunk = builder.take([], 2);
    expect(rebuild(smallChunk, bigChunk.newNames)).toEqual(small.map(rowOf));
  });
});

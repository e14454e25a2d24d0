import { describe, expect, it } from 'vitest';
import { SeriesStore } from '../../src/series/series-store.js';
import type { LogRecord, SeriesInfo } from '../../src/parse/log-record.js';

const residual = (name: string): SeriesInfo => ({ name, kind: 'residual' });
const record = (iteration: number, values: Record<string, number>, extra: Partial<LogRecord> = {}): LogRecord =>
  ({ iteration, values: new Map(Object.entries(values)), ...extra });

describe('SeriesStore', () => {
  it('stores each series column by column, in the order series first appear', () => {
    const store = new SeriesStore();
    store.add(record(1, { res_p: 1, drag: 0.5 }), residual);
    store.add(record(2, { res_p: 0.1, drag: 0.4, res_u: 0.2 }), residual);
    expect(store.names()).toEqual(['res_p', 'drag', 'res_u']);
    const p = store.column('res_p')!;
    expect(Array.from(p.iterations.subarray(0, p.length))).toEqual([1, 2]);
    expect(Array.from(p.values.subarray(0, p.length))).toEqual([1, 0.1]);
    const u = store.column('res_u')!;
    expect(u.length).toBe(1);
    expect(u.iterations[0]).toBe(2);
    expect(store.records).toBe(2);
    expect(store.lastIteration).toBe(2);
  });

  it('keeps non-finite values as they are', () => {
    const store = new SeriesStore();
    store.add(record(1, { r: Number.NaN }), residual);
    store.add(record(2, { r: Infinity }), residual);
    const r = store.column('r')!;
    expect(Number.isNaN(r.values[0])).toBe(true);
    expect(r.values[1]).toBe(Infinity);
  });

  it('bounds memory: past capacity the older half is thinned and the newest points stay at full resolution', () => {
    const capacity = 64;
    const store = new SeriesStore(capacity);
    const n = 10_000;
    for (let i = 1; i <= n; i++) store.add(record(i, { r: 1 / i }), residual);
    const r = store.column('r')!;
    expect(r.length).toBeLessThanOrEqual(capacity);
    expect(r.totalAdded).toBe(n);
    // Iterations stay strictly increasing and the first and last points survive.
    const its = Array.from(r.iterations.subarray(0, r.length));
    expect(its[0]).toBe(1);
    expect(its[its.length - 1]).toBe(n);
    for (let k = 1; k < its.length; k++) expect(its[k]).toBeGreaterThan(its[k - 1]);
    // From fullResolutionFrom on, consecutive iterations are consecutive integers.
    for (let k = r.fullResolutionFrom + 1; k < r.length; k++) expect(r.iterations[k] - r.iterations[k - 1]).toBe(1);
    expect(r.length - r.fullResolutionFrom).toBeGreaterThanOrEqual(capacity / 4);
    // Values stay paired with their iterations.
    for (let k = 0; k < r.length; k++) expect(r.values[k]).toBe(1 / r.iterations[k]);
  });

  it('records restarts, the first failure and transient time steps in the snapshot', () => {
    const store = new SeriesStore();
    store.add(record(1, { r: 1 }, { timeStep: 1, inner: 1, time: 0.1 }), residual);
    store.add(record(2, { r: 0.1 }, { timeStep: 1, inner: 2, time: 0.1 }), residual);
    store.add(record(3, { r: 1 }, { timeStep: 2, inner: 1, time: 0.2 }), residual);
    store.add(record(1, { r: 1 }, { restart: true, timeStep: 1, inner: 1, time: 0.1 }), residual);
    store.add(record(2, { r: Number.NaN }, { failure: 'FATAL: solver blew up' }), residual);
    store.add(record(3, { r: Number.NaN }, { failure: 'FATAL: again' }), residual);
    const snapshot = store.snapshot();
    expect(snapshot.restarts).toEqual([1]);
    expect(snapshot.failure).toBe('FATAL: solver blew up');
    expect(snapshot.transient).toBe(true);
    expect(snapshot.timeSteps?.map((s) => [s.step, s.firstRecord, s.lastRecord, s.time])).toEqual([
      [1, 0, 1, 0.1], [2, 2, 2, 0.2], [1, 3, 3, 0.1],
    ]);
  });

  it('lets the parser correct a series kind after the fact', () => {
    const store = new SeriesStore();
    store.add(record(1, { x: 1 }), (name) => ({ name, kind: 'quantity' }));
    store.describe({ name: 'x', kind: 'residual', unit: '-' });
    expect(store.column('x')!.info).toEqual({ name: 'x', kind: 'residual', unit: '-' });
  });

  it.each([0, 8, Number.NaN])('refuses a capacity of %s', (capacity) => {
    expect(() => new SeriesStore(capacity)).toThrow(RangeError);
  });
});

describe('SeriesStore and crash lines', () => {
  it('keeps the failure of a crash line that carries no values without counting it as an iteration', () => {
    const store = new SeriesStore();
    store.add(record(1, { r: 1 }), residual);
    store.add(record(1, {}, { failure: 'FATAL: out of memory' }), residual);
    expect(store.records).toBe(1);
    expect(store.snapshot().failure).toBe('FATAL: out of memory');
  });
});

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { RecordValues } from '../../src/parse/record-values.js';

// Reference throughout: the built-in Map, whose semantics RecordValues promises (ECMA-262,
// 24.1 Map Objects: Map.prototype.set on an existing key replaces its value and keeps its place in
// insertion order; iteration, keys, values, entries and forEach follow insertion order; forEach
// calls back with (value, key, map)). Values are compared with Object.is (exact: -0 and NaN kept).

type Step = readonly [name: string, value: number];

/** Everything a ReadonlyMap shows about itself, read through each way of reading it. */
function observe(map: ReadonlyMap<string, number>, probes: readonly string[]): unknown {
  const calls: [number, string, boolean, boolean][] = [];
  const self = { tag: 'thisArg' };
  map.forEach(function (this: unknown, value, name, whole) {
    calls.push([value, name, whole === map, this === self]);
  }, self);
  return {
    size: map.size,
    get: probes.map((name) => map.get(name)),
    has: probes.map((name) => map.has(name)),
    entries: [...map.entries()],
    keys: [...map.keys()],
    values: [...map.values()],
    iterable: [...map],
    forEach: calls,
  };
}

// A small alphabet so that names repeat; `hasOwnProperty` and `__proto__` would trip a plain-object
// index, the empty name is a legal key.
const alphabet = ['res_p', 'res_u', 'res_v', 'res_k', 'cd', 'cl', 'nu', 'dt', '', '__proto__', 'hasOwnProperty', 'Res_p'];
// A wide alphabet so records grow past the 24 entries from which RecordValues keeps an index.
const wide = [...alphabet, ...Array.from({ length: 36 }, (_, i) => `col_${i}`)];
const value = fc.oneof(fc.double(), fc.constantFrom(0, -0, Number.NaN, Infinity, -Infinity, 1e-300));
const steps = (names: readonly string[]): fc.Arbitrary<Step[]> =>
  fc.array(fc.tuple(fc.constantFrom(...names), value), { maxLength: 60 });

function checkAgainstMap(values: RecordValues, sequence: readonly Step[], probes: readonly string[]): void {
  const reference = new Map<string, number>();
  for (const [name, number] of sequence) {
    // set returns the object itself, as Map.prototype.set does (ECMA-262 24.1.3.9).
    expect(values.set(name, number)).toBe(values);
    reference.set(name, number);
    expect(observe(values, probes)).toEqual(observe(reference, probes));
    // The two public arrays, up to `size`, agree with entries() (the parsers' fast path reads them
    // directly; entries past `size` are left over from before a clear()).
    expect(values.names.slice(0, values.size)).toEqual([...reference.keys()]);
    expect(values.numbers.slice(0, values.size)).toEqual([...reference.values()]);
  }
}

describe('RecordValues behaves as the built-in Map (ECMA-262 Map semantics)', () => {
  it('after every set of a random sequence over few names: size, get, has, iteration and forEach equal the Map (property)', () => {
    fc.assert(fc.property(steps(alphabet), (sequence) => {
      checkAgainstMap(new RecordValues(), sequence, [...alphabet, 'absent']);
    }), { numRuns: 300, seed: 4_012_026 });
  });

  it('the same past 24 distinct names, where it switches to an index (property)', () => {
    // Long sequences over many names: most runs cross the 24-entry threshold, then keep setting
    // both old names (found through the index) and new ones (added to it).
    const long = fc.array(fc.tuple(fc.constantFrom(...wide), value), { minLength: 30, maxLength: 60 });
    fc.assert(fc.property(long, (sequence) => {
      checkAgainstMap(new RecordValues(), sequence, [...wide, 'absent']);
    }), { numRuns: 80, seed: 4_022_026 });
  });

  it('a hand case across the threshold: 30 names, then the first, the 24th and the 30th set again keep their places', () => {
    const values = new RecordValues();
    const reference = new Map<string, number>();
    for (let i = 0; i < 30; i++) { values.set(`n${i}`, i); reference.set(`n${i}`, i); }
    for (const i of [0, 23, 29]) { values.set(`n${i}`, -i); reference.set(`n${i}`, -i); }
    expect(values.size).toBe(30);
    expect([...values]).toEqual([...reference]);
    expect(Object.is(values.get('n0'), -0)).toBe(true);
    expect(values.get('n23')).toBe(-23);
    expect(values.get('n30')).toBeUndefined();
    expect(values.has('n30')).toBe(false);
  });

  it('clear() empties it, and it can be filled again from scratch, below and above the index threshold (property)', () => {
    fc.assert(fc.property(steps(wide), steps(wide), (first, second) => {
      const values = new RecordValues();
      for (const [name, number] of first) values.set(name, number);
      values.clear();
      // An emptied Map: size 0, nothing found, nothing iterated (Map.prototype.clear, ECMA-262 24.1.3.1).
      expect(observe(values, wide)).toEqual(observe(new Map(), wide));
      expect(values.size).toBe(0);
      expect(values.names.slice(0, values.size)).toEqual([]);
      // Names of the first fill must not linger in a stale index.
      checkAgainstMap(values, second, [...wide, 'absent']);
    }), { numRuns: 150, seed: 4_032_026 });
  });

  it('clear() keeps the same arrays (the parser reuses one values object per record)', () => {
    const values = new RecordValues();
    const { names, numbers } = values;
    values.set('a', 1).set('b', 2);
    values.clear();
    values.set('c', 3);
    expect(values.names).toBe(names);
    expect(values.numbers).toBe(numbers);
    expect([...values]).toEqual([['c', 3]]);
  });

  it('is a fresh iterator each time, and the iterator of entries() is the default iterator', () => {
    const values = new RecordValues().set('x', 1).set('y', 2);
    const reference = new Map([['x', 1], ['y', 2]]);
    const iterator = values.entries();
    expect(iterator.next()).toEqual({ value: ['x', 1], done: false });
    // A second walk starts over, independent of the first (as two Map iterators do).
    expect([...values.entries()]).toEqual([...reference.entries()]);
    expect(iterator.next()).toEqual({ value: ['y', 2], done: false });
    expect(iterator.next().done).toBe(true);
    expect(Array.from(values)).toEqual(Array.from(reference));
    // Usable wherever a Map's entries are: building a Map from it gives an equal Map.
    expect(new Map(values)).toEqual(reference);
  });
});

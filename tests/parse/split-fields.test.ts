import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { splitFieldBounds, splitFields } from '../../src/parse/split-fields.js';
import type { TableSeparator } from '../../src/parse/parser-spec.js';

const cases: [TableSeparator, string, string[]][] = [
  ['whitespace', '   iter   res_p\t nu  ', ['iter', 'res_p', 'nu']],
  ['whitespace', '', []],
  [',', 'iter,res_p,,nu', ['iter', 'res_p', '', 'nu']],
  [',', ' "iter" , "res p" ,3', ['iter', 'res p', '3']],
  [';', '1;2,5;3', ['1', '2,5', '3']],
  ['\t', 'a\t b \tc', ['a', 'b', 'c']],
  ['|', '| iter | res_p |', ['iter', 'res_p']],
  ['|', 'iter|res_p', ['iter', 'res_p']],
];

describe('splitFields and splitFieldBounds', () => {
  it.each(cases)('%j splits %j', (separator, line, expected) => {
    const out: string[] = [];
    expect(splitFields(line, separator, out)).toBe(expected.length);
    expect(out).toEqual(expected);
    const starts = new Int32Array(16);
    const ends = new Int32Array(16);
    const n = splitFieldBounds(line, separator, starts, ends);
    expect(Array.from({ length: n }, (_, k) => line.slice(starts[k], ends[k]))).toEqual(expected);
  });

  it('bounds report -1 when a row has more fields than the arrays hold', () => {
    expect(splitFieldBounds('a b c', 'whitespace', new Int32Array(2), new Int32Array(2))).toBe(-1);
    expect(splitFieldBounds('a,b,c', ',', new Int32Array(2), new Int32Array(2))).toBe(-1);
  });

  it('both forms agree on any line (property)', () => {
    const separators: TableSeparator[] = ['whitespace', ',', ';', '\t', '|'];
    fc.assert(fc.property(fc.constantFrom(...separators), fc.string({ unit: fc.constantFrom('a', '1', ' ', ',', ';', '\t', '|', '"', '.') , maxLength: 40 }), (separator, line) => {
      const out: string[] = [];
      const n = splitFields(line, separator, out);
      const starts = new Int32Array(64);
      const ends = new Int32Array(64);
      const m = splitFieldBounds(line, separator, starts, ends);
      return n === m && out.every((field, k) => field === line.slice(starts[k], ends[k]));
    }), { numRuns: 2000 });
  });
});

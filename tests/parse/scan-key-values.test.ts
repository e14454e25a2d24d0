import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { scanKeyValues, scanKeyValuesBytes } from '../../src/parse/scan-key-values.js';
import { lexNumber } from '../../src/parse/lex-number.js';

function pairs(line: string, assign = '=', names: string[] = []): [string, string][] {
  const found: [string, string][] = [];
  scanKeyValues(line, assign, (name, text, start, end) => {
    if (lexNumber(text.slice(start, end)) === undefined) return false;
    found.push([name, text.slice(start, end)]);
    return true;
  }, names);
  return found;
}

describe('scanKeyValues', () => {
  const cases: [string, string, [string, string][]][] = [
    ['=', 'iter=1 res_p=1.0e-3 nu=0.5', [['iter', '1'], ['res_p', '1.0e-3'], ['nu', '0.5']]],
    ['=', 'a = 1, b =2;c= 3', [['a', '1'], ['b', '2'], ['c', '3']]],
    ['=', 'a=1,b=2\tc=3', [['a', '1'], ['b', '2'], ['c', '3']]],
    ['=', 'label=hello x=2 =5 y=', [['x', '2']]],
    [':', 'at 12:30:05, mass: 1.5  energy :2e3; note: n/a', [['mass', '1.5'], ['energy', '2e3']]],
    ['=>', 'p => 1e-3 u=>2', [['p', '1e-3'], ['u', '2']]],
  ];
  it.each(cases)('with %j finds the pairs of %j', (assign, line, expected) => {
    expect(pairs(line, assign)).toEqual(expected);
  });

  it('reuses the previous line\'s name strings by position, and notices when a name changes', () => {
    const names: string[] = [];
    const first = pairs('alpha=1 beta=2', '=', names);
    const second = pairs('alpha=3 beta=4', '=', names);
    expect(second[0][0]).toBe(first[0][0]);
    expect(pairs('xalpha=5 beta=6', '=', names)).toEqual([['xalpha', '5'], ['beta', '6']]);
    expect(pairs('a,alpha=5', '=', names)).toEqual([['alpha', '5']]);
    expect(pairs('lpha=7', '=', names)).toEqual([['lpha', '7']]);
  });

  it('finds every pair of a generated line, with or without the name cache (property)', () => {
    const name = fc.stringMatching(/^[a-z_][a-z0-9_]{0,6}$/);
    const value = fc.double({ noNaN: true, noDefaultInfinity: true }).map((x) => x.toExponential(3));
    const sep = fc.constantFrom(' ', '  ', ', ', ';', '\t');
    const around = fc.constantFrom('', ' ');
    fc.assert(fc.property(fc.array(fc.tuple(name, value, sep, around), { minLength: 1, maxLength: 8 }), (list) => {
      const line = list.map(([n, v, s, a], k) => `${k === 0 ? '' : s}${n}${a}=${a}${v}`).join('');
      const expected = list.map(([n, v]) => [n, v]);
      const cache: string[] = [];
      return JSON.stringify(pairs(line)) === JSON.stringify(expected)
        && JSON.stringify(pairs(line, '=', cache)) === JSON.stringify(expected)
        && JSON.stringify(pairs(line, '=', cache)) === JSON.stringify(expected);
    }), { numRuns: 1500 });
  });
});

// The byte scanner must offer exactly what the string scanner offers (the reference), with the
// same accept/reject answers from the visitor, on ASCII lines inside a longer buffer.
describe('scanKeyValuesBytes = scanKeyValues on ASCII lines (property)', () => {
  const piece = fc.constantFrom('iter', 'res_p', 'a', 'x1', '=', '=>', ':', ' ', '  ', '\t', ',', ';', '\r', '1', '2.5e-3', '-7', 'nan', '**', '12:30', 'b=', '=9', 'k =', '= 4');
  const line = fc.array(piece, { maxLength: 12 }).map((parts) => parts.join(''));
  it.each(['=', ':', '=>'])('sign %j', (assign) => {
    fc.assert(fc.property(line, fc.integer({ min: 0, max: 3 }), (text, reject) => {
      const byText: string[] = [];
      scanKeyValues(text, assign, (name, whole, start, end, index) => {
        const value = whole.slice(start, end);
        const ok = lexNumber(value) !== undefined && (reject === 0 || index % reject !== 1);
        byText.push(`${index}:${name}=${value}:${ok}`);
        return ok;
      });
      const bytes = Buffer.from(`#${text}#`, 'latin1');
      const byBytes: string[] = [];
      scanKeyValuesBytes(bytes, 1, 1 + text.length, Buffer.from(assign, 'latin1'), (ns, ne, vs, ve, index) => {
        const value = bytes.toString('latin1', vs, ve);
        const ok = lexNumber(value) !== undefined && (reject === 0 || index % reject !== 1);
        byBytes.push(`${index}:${bytes.toString('latin1', ns, ne)}=${value}:${ok}`);
        return ok;
      });
      expect(byBytes).toEqual(byText);
    }), { numRuns: 3000, seed: 20261201 });
  });
});

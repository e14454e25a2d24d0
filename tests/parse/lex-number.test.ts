import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { lexNumber, lexNumberBytes, lexNumberIn } from '../../src/parse/lex-number.js';

// Expected values are exact: each text is a decimal (or special) spelling whose value is fixed by
// the notation itself (123456789012345678 reads as the nearest double, 123456789012345680);
// compared with Object.is, which tells -0 from 0.
describe('lexNumber reads every form solvers print', () => {
  const plain: [string, number][] = [
    ['0', 0], ['7', 7], ['-0', -0], ['+3', 3], ['12345', 12345], ['-1.5', -1.5], ['.5', 0.5], ['-.25', -0.25], ['1.', 1],
    ['1.5e-3', 0.0015], ['1.5E-03', 0.0015], ['1.000e+00', 1], ['-2.5E+3', -2500], ['6.02214076e23', 6.02214076e23],
    ['1e-300', 1e-300], ['1e400', Infinity], ['0.1', 0.1], ['123456789012345678', 123456789012345680],
    ['0.000000000000000000000001', 1e-24],
  ];
  it.each(plain)('plain decimal %s', (text, expected) => {
    expect(Object.is(lexNumber(text), expected)).toBe(true);
  });

  // Fortran D exponent (ISO/IEC 1539-1, D editing; from memory).
  const fortranD: [string, number][] = [['1.5D-03', 0.0015], ['2.0d+2', 200], ['-3.25D0', -3.25], ['1D5', 1e5]];
  it.each(fortranD)('Fortran D exponent %s', (text, expected) => {
    expect(lexNumber(text)).toBe(expected);
  });

  // Fortran E editing drops the exponent letter when the exponent needs three digits
  // (ISO/IEC 1539-1, table for Ew.d editing; from memory): 0.1234-105 means 0.1234e-105.
  const fortranDropped: [string, number][] = [['1.234-105', 1.234e-105], ['-2.5+003', -2500], ['0.1234+100', 0.1234e100], ['.5-3', 0.5e-3]];
  it.each(fortranDropped)('Fortran dropped exponent letter %s', (text, expected) => {
    expect(lexNumber(text)).toBe(expected);
  });

  // Spellings of C runtimes (glibc printf "nan", "inf"; the Microsoft C runtime's "1.#INF",
  // "1.#QNAN", "-1.#IND"; from memory) and of JSON writers ("NaN", "Infinity").
  const notANumber = ['nan', 'NaN', 'NAN', '-nan', '+nan', 'nan(ind)', '-nan(ind)', 'nan(0x7ff8)', '1.#QNAN', '1.#SNAN', '-1.#IND', '1.#IND00', '1.#QNAN0'];
  it.each(notANumber)('not-a-number %s', (text) => {
    expect(lexNumber(text)).toBeNaN();
  });
  const infinities: [string, number][] = [
    ['inf', Infinity], ['-inf', -Infinity], ['Inf', Infinity], ['-Inf', -Infinity], ['INF', Infinity], ['+INF', Infinity],
    ['Infinity', Infinity], ['-Infinity', -Infinity], ['+infinity', Infinity], ['1.#INF', Infinity], ['-1.#INF', -Infinity], ['1.#INF00', Infinity],
  ];
  it.each(infinities)('infinity %s', (text, expected) => {
    expect(lexNumber(text)).toBe(expected);
  });

  // Fortran prints a field of asterisks when a value does not fit its width (ISO/IEC 1539-1,
  // from memory): read as +Infinity, a non-finite value rather than an error.
  it.each(['**', '*****', '*********************'])('overflow field %s is +Infinity', (text) => {
    expect(lexNumber(text)).toBe(Infinity);
  });

  it.each([[' 1.5 ', 1.5], ['\t-2e3', -2000], ['7\r', 7], ['  nan ', NaN]])('surrounding blanks are ignored: %j', (text, expected) => {
    expect(Object.is(lexNumber(text as string), expected)).toBe(true);
  });

  const notNumbers = ['', ' ', '+', '-', '.', 'e5', '1e', '1e+', '1.5e-3x', '0x1F', '0b11', '0o7', '1_000', '1,5', '2024-01', '5-3', 'abc',
    '*', 'infinit', 'nanx', '1.2.3', '--1', '1e5.5', 'res_p', '12:30:05', '#INFx'];
  it.each(notNumbers)('not a number: %j gives undefined', (text) => {
    expect(lexNumber(text)).toBeUndefined();
  });

  it('reads a range of a line in place, with the same results', () => {
    const line = 'a=1.5D-03 b=-2.5+003 c=nan d=**** e=x';
    expect(lexNumberIn(line, 2, 9)).toBe(0.0015);
    expect(lexNumberIn(line, 12, 20)).toBe(-2500);
    expect(lexNumberIn(line, 23, 26)).toBeNaN();
    expect(lexNumberIn(line, 29, 33)).toBe(Infinity);
    expect(lexNumberIn(line, 36, 37)).toBeUndefined();
    expect(lexNumberIn(line, 5, 5)).toBeUndefined();
  });

  // ECMAScript's Number::toString prints the shortest text that reads back to the same double
  // (ECMA-262, Number::toString), so every double must survive the round trip exactly (=== here: String(-0) is "0").
  it('round-trips every double printed by JavaScript (property)', () => {
    fc.assert(fc.property(fc.double({ noNaN: true }), (x) => lexNumber(String(x)) === x), { numRuns: 3000 });
  });

  it('agrees with Number() on exponent and fixed forms of random doubles (property)', () => {
    fc.assert(fc.property(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e300, max: 1e300 }), fc.integer({ min: 0, max: 16 }), (x, digits) => {
      const exp = x.toExponential(digits);
      const fixed = Math.abs(x) < 1e15 ? x.toFixed(Math.min(digits, 20)) : exp;
      return Object.is(lexNumber(exp), Number(exp)) && Object.is(lexNumber(fixed), Number(fixed))
        && Object.is(lexNumber(exp.replace('e', 'D')), Number(exp));
    }), { numRuns: 3000 });
  });

  // The byte path must read exactly what the string path reads: checked on every form above and
  // on random tokens built from the characters numbers are made of, inside a longer buffer so that
  // reading past `end` would show.
  it('reads the same from the bytes of an ASCII line as from its text (property)', () => {
    const forms = ['1.5D-03', '-2.5+003', 'nan', '-1.#IND', '****', '*', '1.', '.5', '1e', '1e+', '12345678901234567890', '1e400', '2024-01', ' 7 ', '',
      '9007199254740991', '9007199254740992', '9007199254740993', '90071992547409.93e-7', '9007199254740993e22', '1234567890123456e-22',
      '1E-0005', '-.5e3', '5.e2', '1e2x', '1.5e+', 'e5', '-', '-.', '.e1', '1e-400', '4.9e-324', '1e23'];
    const token = fc.oneof(
      fc.constantFrom(...forms),
      // Mantissas around 2^53 = 9007199254740992, where the byte lexer's exact fast path ends.
      fc.tuple(fc.bigInt({ min: 0n, max: 10n ** 18n }), fc.integer({ min: 0, max: 18 }), fc.integer({ min: -30, max: 30 }))
        .map(([digits, point, exponent]) => {
          const text = digits.toString().padStart(point + 1, '0');
          return `${text.slice(0, text.length - point)}${point > 0 ? `.${text.slice(text.length - point)}` : ''}e${exponent}`;
        }),
      fc.array(fc.constantFrom('0', '1', '9', '.', 'e', 'E', 'd', 'D', '+', '-', '*', '#', 'n', 'a', 'i', 'f', ' '), { maxLength: 14 }).map((chars) => chars.join('')),
      fc.double().map((x) => x.toExponential(6)),
    );
    fc.assert(fc.property(token, fc.constantFrom('', '9', 'e', '-', '5e'), (text, after) => {
      const bytes = Buffer.from(`x${text}${after}`, 'latin1');
      return Object.is(lexNumberBytes(bytes, 1, 1 + text.length), lexNumber(text));
    }), { numRuns: 4000, seed: 20261201 });
  });
});

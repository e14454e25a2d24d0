/**
 * Number lexing for solver logs: every form solvers print, in one function on the hot path.
 *
 * Accepted forms (surrounding blanks are ignored):
 * - plain decimals with optional sign and exponent: `12`, `-1.5`, `.5`, `1.`, `1.5e-3`, `1.5E+03`;
 * - the Fortran `D` exponent: `1.5D-03`, `2.0d+2`;
 * - the Fortran E-format with the exponent letter dropped (printed when the exponent needs three
 *   digits): `1.234-105` = 1.234e-105, `-2.5+003` = -2.5e3. The mantissa must contain a decimal
 *   point, so that text such as `2024-01` is not read as a number;
 * - not-a-number in the usual spellings: `nan`, `NaN`, `NAN`, `-nan`, `nan(ind)`, `nan(0x7ff8)`,
 *   `1.#QNAN`, `1.#SNAN`, `-1.#IND`, `1.#IND00`;
 * - infinities: `inf`, `-Inf`, `INF`, `Infinity`, `+infinity`, `1.#INF`, `-1.#INF00`;
 * - overflow fields: two or more asterisks (`*********`, Fortran's output for a value too wide for
 *   its field) read as +Infinity: a non-finite value, not an error. A single `*` is not a number
 *   (logs use it as a marker).
 *
 * Anything else (hexadecimal, binary, words, empty text) gives `undefined`.
 *
 * Cost: O(length). The common case (a plain decimal with no blanks) costs one character check at
 * each end and one `Number()` conversion, with no allocation; the other forms take a slower path
 * that allocates a lower-cased copy.
 *
 * @example lexNumber('1.5D-03') // 0.0015
 * @example lexNumber('-2.5+003') // -2500
 * @example lexNumber('*****') // Infinity
 */
export function lexNumber(text: string): number | undefined {
  const length = text.length;
  if (length === 0) return undefined;
  const first = text.charCodeAt(0);
  const last = text.charCodeAt(length - 1);
  // Fast path: starts with a digit, sign or point and ends with a digit or point; rule out the
  // prefixes Number() accepts but logs never mean (0x, 0b, 0o).
  if (isDigit(last) || last === DOT) {
    if (isDigit(first)) {
      if (length === 1) return first - ZERO;
      const second = text.charCodeAt(1) | 0x20;
      if (second !== LOWER_X && second !== LOWER_B && second !== LOWER_O) {
        const value = Number(text);
        if (value === value) return value;
      }
    } else if (first === MINUS || first === PLUS || first === DOT) {
      const value = Number(text);
      if (value === value && length > 1) return value;
    }
  }
  return lexSlow(text);
}

const ZERO = 48;
const NINE = 57;
const DOT = 46;
const MINUS = 45;
const PLUS = 43;
const LOWER_X = 120;
const LOWER_B = 98;
const LOWER_O = 111;

function isDigit(code: number): boolean {
  return code >= ZERO && code <= NINE;
}

/** Decimal with an exponent written with e/E/d/D, or with the letter dropped (Fortran). */
const DECIMAL = /^([+-]?(?:\d+\.?\d*|\.\d+))(?:[eEdD]([+-]?\d+))?$/;
const FORTRAN_DROPPED_LETTER = /^([+-]?(?:\d+\.\d*|\.\d+))([+-]\d{1,4})$/;
const NOT_A_NUMBER = /^[+-]?(?:nan(?:\([0-9a-z_]*\))?|\d*\.?\d*#(?:qnan|snan|ind|nan)\d*)$/;
const INFINITE = /^([+-]?)(?:inf|infinity|\d*\.?\d*#inf\d*)$/;
const ASTERISKS = /^\*{2,}$/;

function lexSlow(raw: string): number | undefined {
  const text = raw.trim();
  if (text.length === 0) return undefined;
  if (text !== raw) return lexNumber(text);
  let match = DECIMAL.exec(text);
  if (match !== null) {
    return match[2] === undefined ? Number(match[1]) : Number(`${match[1]}e${match[2]}`);
  }
  match = FORTRAN_DROPPED_LETTER.exec(text);
  if (match !== null) return Number(`${match[1]}e${match[2]}`);
  if (ASTERISKS.test(text)) return Number.POSITIVE_INFINITY;
  const lower = text.toLowerCase();
  if (NOT_A_NUMBER.test(lower)) return Number.NaN;
  match = INFINITE.exec(lower);
  if (match !== null) return match[1] === '-' ? Number.NEGATIVE_INFINITY : Number.POSITIVE_INFINITY;
  return undefined;
}

/**
 * Splitting a table row into fields, reusing one output array (the hot path of table formats).
 *
 * `whitespace`: runs of blanks separate fields; leading and trailing blanks are dropped.
 * A character separator (`,` `;` tab `|`): fields are trimmed and one pair of surrounding double
 * quotes is removed; with `|`, empty fields at both ends (`| a | b |`) are dropped.
 * Cost: O(line length); allocates only the field strings.
 */
import type { TableSeparator } from './parser-spec.js';

/** Fills `out` with the fields of `line` and returns how many there are. */
export function splitFields(line: string, separator: TableSeparator, out: string[]): number {
  return separator === 'whitespace' ? splitOnBlanks(line, out) : splitOnChar(line, separator.charCodeAt(0), separator === '|', out);
}

/**
 * The same split, as positions: field k is `line.slice(starts[k], ends[k])`. Allocates nothing
 * (the arrays grow once to the widest row), for the hot path of table rows. Returns the count, or
 * -1 when there are more than `starts.length` fields.
 */
export function splitFieldBounds(line: string, separator: TableSeparator, starts: Int32Array, ends: Int32Array): number {
  const capacity = starts.length;
  const length = line.length;
  let count = 0;
  if (separator === 'whitespace') {
    let i = 0;
    while (i < length) {
      while (i < length && isBlank(line.charCodeAt(i))) i++;
      if (i >= length) break;
      if (count === capacity) return -1;
      starts[count] = i;
      while (i < length && !isBlank(line.charCodeAt(i))) i++;
      ends[count++] = i;
    }
    return count;
  }
  const code = separator.charCodeAt(0);
  let start = 0;
  for (let i = 0; i <= length; i++) {
    if (i === length || line.charCodeAt(i) === code) {
      if (count === capacity) return -1;
      let s = start;
      let e = i;
      while (s < e && isBlank(line.charCodeAt(s))) s++;
      while (e > s && isBlank(line.charCodeAt(e - 1))) e--;
      if (e - s >= 2 && line.charCodeAt(s) === 34 && line.charCodeAt(e - 1) === 34) { s++; e--; }
      starts[count] = s;
      ends[count++] = e;
      start = i + 1;
    }
  }
  if (separator === '|') {
    if (count > 0 && ends[count - 1] === starts[count - 1]) count--;
    if (count > 0 && ends[0] === starts[0]) {
      starts.copyWithin(0, 1, count);
      ends.copyWithin(0, 1, count);
      count--;
    }
  }
  return count;
}

function isBlank(code: number): boolean {
  return code === 32 || code === 9 || code === 13 || code === 11 || code === 12;
}

function splitOnBlanks(line: string, out: string[]): number {
  let count = 0;
  const length = line.length;
  let i = 0;
  while (i < length) {
    while (i < length && isBlank(line.charCodeAt(i))) i++;
    if (i >= length) break;
    const start = i;
    while (i < length && !isBlank(line.charCodeAt(i))) i++;
    out[count++] = line.slice(start, i);
  }
  out.length = count;
  return count;
}

function splitOnChar(line: string, separator: number, dropEmptyEnds: boolean, out: string[]): number {
  let count = 0;
  let start = 0;
  const length = line.length;
  for (let i = 0; i <= length; i++) {
    if (i === length || line.charCodeAt(i) === separator) {
      let s = start;
      let e = i;
      while (s < e && isBlank(line.charCodeAt(s))) s++;
      while (e > s && isBlank(line.charCodeAt(e - 1))) e--;
      if (e - s >= 2 && line.charCodeAt(s) === 34 && line.charCodeAt(e - 1) === 34) { s++; e--; }
      out[count++] = line.slice(s, e);
      start = i + 1;
    }
  }
  if (dropEmptyEnds) {
    if (count > 0 && out[count - 1] === '') count--;
    if (count > 0 && out[0] === '') { out.copyWithin(0, 1, count); count--; }
  }
  out.length = count;
  return count;
}

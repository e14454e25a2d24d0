/**
 * The fast name/value scanner: finds `name=value` tokens anywhere in a line, also written with
 * blanks around the sign (`name = value`) or another sign (`name: value`). Names run back from the
 * sign to the previous blank, comma or semicolon and must not start with a digit (so times such as
 * `12:30:05` are not pairs); values run forward to the next blank, comma or semicolon.
 *
 * Method: the sign and the next space are found with `indexOf` (native search); the visitor first
 * sees the value up to the next space, which is the whole value on well-formed lines. Only when it
 * rejects that text and the text holds another delimiter (`a=1,b=2`, tabs) is the value cut again
 * character by character and offered once more.
 * Names are remembered by their position among the pairs of a line (`names`, kept by the caller):
 * when the name at that position is the same as on the line before (the usual case in a log), it
 * is recognised with one comparison and the same string is handed over again, without a new
 * allocation; the caller can then recognise it by identity.
 * Cost: O(line length); allocates only names that differ from the previous line's.
 */

/** Called for each candidate pair, with its name, the value at [valueStart, valueEnd) of `line`,
 * and the index of the pair on the line (0, 1, ...). Returns whether it took the pair (a value it
 * could read). */
import { indexOfBytes } from './byte-text.js';

export type PairVisitor = (name: string, line: string, valueStart: number, valueEnd: number, index: number) => boolean;

function isDelimiter(code: number): boolean {
  return code === 32 || code === 9 || code === 44 || code === 59 || code === 13;
}

function isBlank(code: number): boolean {
  return code === 32 || code === 9;
}

/** Visits every `name<assign>value` pair of the line; returns how many the visitor took. */
export function scanKeyValues(line: string, assign: string, visit: PairVisitor, names: string[] = []): number {
  const length = line.length;
  const step = assign.length;
  let pos = 0;
  let taken = 0;
  while (pos < length) {
    const at = line.indexOf(assign, pos);
    if (at < 0) break;
    let nameEnd = at;
    while (nameEnd > pos && isBlank(line.charCodeAt(nameEnd - 1))) nameEnd--;
    let name: string | undefined = names[taken];
    let nameStart = name === undefined ? -1 : nameEnd - name.length;
    if (nameStart < pos || !line.startsWith(name, nameStart) || (nameStart > pos && !isDelimiter(line.charCodeAt(nameStart - 1)))) {
      nameStart = nameEnd;
      while (nameStart > pos && !isDelimiter(line.charCodeAt(nameStart - 1))) nameStart--;
      name = undefined;
    }
    let valueStart = at + step;
    while (valueStart < length && isBlank(line.charCodeAt(valueStart))) valueStart++;
    const space = line.indexOf(' ', valueStart);
    let valueEnd = space < 0 ? length : space;
    const first = line.charCodeAt(nameStart);
    if (nameEnd > nameStart && valueEnd > valueStart && !(first >= 48 && first <= 57)) {
      if (name === undefined) names[taken] = name = line.slice(nameStart, nameEnd);
      if (visit(name, line, valueStart, valueEnd, taken)) {
        taken++;
      } else {
        let end = valueStart;
        while (end < valueEnd && !isDelimiter(line.charCodeAt(end))) end++;
        if (end < valueEnd) {
          valueEnd = end;
          if (end > valueStart && visit(name, line, valueStart, valueEnd, taken)) taken++;
        }
      }
    } else if (valueEnd > valueStart) {
      let end = valueStart;
      while (end < valueEnd && !isDelimiter(line.charCodeAt(end))) end++;
      valueEnd = end;
    }
    pos = valueEnd > at + step ? valueEnd : at + step;
  }
  return taken;
}

/** Called for each candidate pair found on bytes: name at [nameStart, nameEnd), value at
 * [valueStart, valueEnd), index of the pair on the line. Returns whether it took the pair. */
export type BytePairVisitor = (nameStart: number, nameEnd: number, valueStart: number, valueEnd: number, index: number) => boolean;

/**
 * `scanKeyValues` on the bytes of an ASCII line (bytes[start, end)): the same pairs, at the same
 * places, offered in the same order (property-tested against the string scanner). `assign` is the
 * sign as bytes. Names are not cached here (the caller reads them from the bytes).
 */
export function scanKeyValuesBytes(bytes: Uint8Array, start: number, end: number, assign: Uint8Array, visit: BytePairVisitor): number {
  const step = assign.length;
  let pos = start;
  let taken = 0;
  while (pos < end) {
    const at = indexOfBytes(bytes, assign, pos, end);
    if (at < 0) break;
    let nameEnd = at;
    while (nameEnd > pos && isBlank(bytes[nameEnd - 1])) nameEnd--;
    let nameStart = nameEnd;
    while (nameStart > pos && !isDelimiter(bytes[nameStart - 1])) nameStart--;
    let valueStart = at + step;
    while (valueStart < end && isBlank(bytes[valueStart])) valueStart++;
    let valueEnd = valueStart;
    while (valueEnd < end && bytes[valueEnd] !== 32) valueEnd++;
    const first = bytes[nameStart];
    if (nameEnd > nameStart && valueEnd > valueStart && !(first >= 48 && first <= 57)) {
      if (visit(nameStart, nameEnd, valueStart, valueEnd, taken)) {
        taken++;
      } else {
        let cut = valueStart;
        while (cut < valueEnd && !isDelimiter(bytes[cut])) cut++;
        if (cut < valueEnd) {
          valueEnd = cut;
          if (cut > valueStart && visit(nameStart, nameEnd, valueStart, valueEnd, taken)) taken++;
        }
      }
    } else if (valueEnd > valueStart) {
      let cut = valueStart;
      while (cut < valueEnd && !isDelimiter(bytes[cut])) cut++;
      valueEnd = cut;
    }
    pos = valueEnd > at + step ? valueEnd : at + step;
  }
  return taken;
}

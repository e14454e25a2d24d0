/**
 * The fast name/value scanner: finds `name=value` tokens anywhere in a line, also written with
 * blanks around the sign (`name = value`) or another sign (`name: value`). Names run back from the
 * sign to the previous blank, comma or semicolon and must not start with a digit (so times such as
 * `12:30:05` are not pairs); values run forward to the next one.
 * Cost: O(line length); allocates nothing itself: the visitor gets positions, so the caller can
 * lex the value in place and reuse the name string it saw on the line before.
 */

/** Called for each pair found, with the name at [nameStart, nameEnd) and the value at
 * [valueStart, valueEnd) of `line`, and the pair's index on the line (0, 1, ...). */
export type PairVisitor = (line: string, nameStart: number, nameEnd: number, valueStart: number, valueEnd: number, index: number) => void;

function isDelimiter(code: number): boolean {
  return code === 32 || code === 9 || code === 44 || code === 59 || code === 13;
}

function isBlank(code: number): boolean {
  return code === 32 || code === 9;
}

/** Visits every `name<assign>value` pair of the line; returns how many were visited. */
export function scanKeyValues(line: string, assign: string, visit: PairVisitor): number {
  const length = line.length;
  const step = assign.length;
  let pos = 0;
  let found = 0;
  while (pos < length) {
    const at = line.indexOf(assign, pos);
    if (at < 0) break;
    let nameEnd = at;
    while (nameEnd > pos && isBlank(line.charCodeAt(nameEnd - 1))) nameEnd--;
    let nameStart = nameEnd;
    while (nameStart > pos && !isDelimiter(line.charCodeAt(nameStart - 1))) nameStart--;
    let valueStart = at + step;
    while (valueStart < length && isBlank(line.charCodeAt(valueStart))) valueStart++;
    let valueEnd = valueStart;
    while (valueEnd < length && !isDelimiter(line.charCodeAt(valueEnd))) valueEnd++;
    if (nameEnd > nameStart && valueEnd > valueStart) {
      const first = line.charCodeAt(nameStart);
      if (!(first >= 48 && first <= 57)) {
        visit(line, nameStart, nameEnd, valueStart, valueEnd, found);
        found++;
      }
    }
    pos = valueEnd > at + step ? valueEnd : at + step;
  }
  return found;
}

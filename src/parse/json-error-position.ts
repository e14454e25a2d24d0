/**
 * Where a JSON text stops being valid, as a 1-based line and column, for error messages.
 * Node 20's JSON.parse messages do not always give a position, so this walks the text with a small
 * recursive-descent checker. Only used on the error path. Cost: O(text length).
 */
export interface TextPosition { readonly line: number; readonly column: number }

export function jsonErrorPosition(text: string): TextPosition | undefined {
  const offset = firstErrorOffset(text);
  if (offset === undefined) return undefined;
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text.charCodeAt(i) === 10) { line++; lineStart = i + 1; }
  }
  return { line, column: offset - lineStart + 1 };
}

class Stop { constructor(readonly offset: number) {} }

function firstErrorOffset(text: string): number | undefined {
  let i = 0;
  const fail = (): never => { throw new Stop(i); };
  const blanks = (): void => { while (i < text.length && ' \t\r\n'.includes(text[i])) i++; };
  const literal = (word: string): void => {
    for (const c of word) { if (text[i] !== c) fail(); i++; }
  };
  const string = (): void => {
    i++;
    while (i < text.length && text[i] !== '"') {
      if (text.charCodeAt(i) < 32) fail();
      if (text[i] === '\\') {
        i++;
        if (text[i] === 'u') { i++; for (let k = 0; k < 4; k++) { if (!/[0-9a-fA-F]/.test(text[i] ?? '')) fail(); i++; } continue; }
        if (!'"\\/bfnrt'.includes(text[i] ?? 'x')) fail();
      }
      i++;
    }
    if (i >= text.length) fail();
    i++;
  };
  const number = (): void => {
    const m = /^-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/.exec(text.slice(i, i + 400));
    if (m === null || m[0].length === 0) fail();
    i += (m as RegExpExecArray)[0].length;
  };
  const value = (): void => {
    blanks();
    const c = text[i];
    if (c === '{') {
      i++; blanks();
      if (text[i] === '}') { i++; return; }
      for (;;) {
        blanks();
        if (text[i] !== '"') fail();
        string(); blanks();
        if (text[i] !== ':') fail();
        i++; value(); blanks();
        if (text[i] === ',') { i++; continue; }
        if (text[i] === '}') { i++; return; }
        fail();
      }
    } else if (c === '[') {
      i++; blanks();
      if (text[i] === ']') { i++; return; }
      for (;;) {
        value(); blanks();
        if (text[i] === ',') { i++; continue; }
        if (text[i] === ']') { i++; return; }
        fail();
      }
    } else if (c === '"') string();
    else if (c === 't') literal('true');
    else if (c === 'f') literal('false');
    else if (c === 'n') literal('null');
    else number();
  };
  try {
    value(); blanks();
    if (i < text.length) fail();
    return undefined;
  } catch (error) {
    if (error instanceof Stop) return error.offset;
    throw error;
  }
}

/**
 * Byte pattern: a spec regular expression compiled into a matcher that runs over the ASCII bytes of
 * a line (a [start, end) range of a Buffer) and gives exactly the result V8's `RegExp#exec` gives on
 * the same text, or is refused (`compileBytePattern` returns undefined) so the caller falls back to
 * V8 on the decoded string. Refusing is always safe; a different answer would be a defect.
 *
 * Purpose: the read path of `settle inspect` spends most of its time in per-line regular
 * expressions; a straight scan over the bytes avoids decoding the line and V8's per-exec overhead.
 *
 * Subset: `^` first, `$` last (top level only); literals (printable ASCII, escaped punctuation,
 * `\t \n \r \f \v`); `.`, `\d \D \s \S \w \W`, bracket classes with ranges; `\b`; greedy
 * quantifiers `* + ? {n} {n,} {n,m}` on one-character atoms; groups `(?<name>…)`, `(?:…)`, `(…)`
 * (only named groups are reported), a group may carry only `?`; a group whose whole body is an
 * alternation of plain literal words none of which is a prefix of another (`(?:iter|step)`).
 * Everything else is refused.
 *
 * Method: match greedily and never give back (possessive matching), and accept a pattern only when
 * a static check proves that this equals ECMAScript's backtracking (ECMA-262, §22.2.2, "Pattern
 * Semantics": alternatives are tried in priority order, a greedy quantifier tries the most
 * repetitions first, an optional group first tries its body, rejecting an empty pass, then skips it).
 * For the continuation K of an element (everything after it up to the end of the pattern, crossing
 * group ends) we compute FIRST(K) (bytes K can begin with), whether K can succeed without
 * consuming a byte at a position that is not the line end ("nullable"; `$` makes K non-nullable,
 * `\b` is ignored as zero width), and whether K is trivial (every element skippable, no top-level
 * assertion, so K succeeds everywhere).
 * - X{min,max} with min < max is accepted when K is trivial, or when K is not nullable and
 *   FIRST(K) ∩ X = ∅. Argument: if K is trivial, the greedy count already lets K succeed, and it is
 *   the first choice backtracking tries. Otherwise, every smaller count leaves K at a position whose
 *   next byte was taken by X, so lies in X and not in FIRST(K); K must consume a byte there (or meet
 *   `$` before the end), so it fails: only the greedy count can succeed, as backtracking would find.
 *   Also accepted: min >= 1, K begins with `\b` on every path, and X holds only word bytes (or only
 *   non-word bytes): a smaller count puts `\b` between two bytes of X, where it fails.
 * - (G)? followed by K is accepted when K is trivial, or K is not nullable and FIRST(G) ∩ FIRST(K)
 *   = ∅. Argument: when G matches (non-empty) and K is trivial, K succeeds and that is backtracking's
 *   first choice. When G matches but K then fails, backtracking would retry K at G's start, whose
 *   byte lies in FIRST(G) and so cannot begin K: it fails too. When G fails, or matches only the
 *   empty string (which ECMAScript rejects for a quantified group, and which then leaves every
 *   choice inside G at its last alternative), G is skipped: position restored and every capture
 *   inside G reset to undefined (-1).
 * - Fixed counts, literal runs and word alternations leave no choice (two words matching at one
 *   place would make one a prefix of the other), so they need no check.
 * By induction from the end of the pattern, the possessive match from each start position equals
 * the first match backtracking finds there; start positions are tried in the same order.
 *
 * Cost: compile O(pattern length × 256); exec O(line length × pattern length) at worst, typically
 * one pass over the line; no allocation per exec. The matcher is generated code (`new Function`)
 * built only from byte numbers and fixed identifiers: no pattern text reaches the generated source.
 */

/** Named-group capture bounds, filled by a successful match: for group k (order of
 *  `groupNames`), caps[2k] = start, caps[2k+1] = end (absolute buffer offsets), or -1/-1 when the
 *  group did not take part in the match (V8: undefined). */
export interface BytePattern {
  readonly source: string;
  /** Named groups in the order they appear in the source. */
  readonly groupNames: readonly string[];
  /** Index of a named group in groupNames, or -1. */
  groupIndex(name: string): number;
  /** Search like RegExp.prototype.exec with lastIndex = from, on the ASCII bytes buf[lineStart,
   *  lineEnd): tries start positions from..lineEnd in order; `^` matches only at lineStart, `$`
   *  only at lineEnd. Returns the END offset of the whole match (>= its start) or -1 when there is
   *  no match. On success `caps` holds the named groups and `matchStart` the start offset.
   *  `view`, when given, is a DataView of the same bytes (same offsets): runs of blanks are then
   *  skipped eight bytes at a time (measured about 20 % less matching time on space-padded
   *  columns); the result is the same either way. */
  exec(buf: Uint8Array, lineStart: number, lineEnd: number, from: number, caps: Int32Array, view?: DataView): number;
  /** Start offset of the last successful match (like match.index + lineStart). */
  readonly matchStart: number;
  /** caps must have at least this many entries (2 × groupNames.length). */
  readonly capsLength: number;
  /** For a pattern anchored at `^` that must consume a byte to match: the bytes a match can begin
   * with. A search from lineStart on a non-empty line whose first byte is not in it fails, so a
   * caller may skip the call (undefined: no such shortcut). */
  readonly startBytes?: Uint8Array;
  /** For a pattern `^\s*K` where K must consume a byte (at a position that is not the line end):
   * the bytes K can begin with. A search from lineStart on a line whose first byte that is not
   * `\s` is outside this set fails (a line of blanks only may still match). */
  readonly startBytesAfterBlanks?: Uint8Array;
}

type ExecFunction = (buf: Uint8Array, lineStart: number, lineEnd: number, from: number, caps: Int32Array, view?: DataView) => number;

/** One element of a parsed pattern. */
type PatternNode =
  /** A one-byte atom repeated min..max times (max = Infinity when unbounded). */
  | { readonly kind: 'atom'; readonly set: Uint8Array; readonly min: number; readonly max: number }
  /** A group: `capture` is the named-group index or -1; `optional` for `(…)?`. */
  | { readonly kind: 'group'; readonly capture: number; readonly optional: boolean; readonly body: PatternNode[] }
  /** Plain literal words, none a prefix of another: at most one matches at any place. */
  | { readonly kind: 'words'; readonly words: number[][] }
  | { readonly kind: 'wordBoundary' }
  | { readonly kind: 'lineEnd' };

/** Thrown inside the compiler when the pattern is outside the subset; never escapes this module. */
class Refused extends Error {}

function refuse(): never {
  throw new Refused();
}

// ---------------------------------------------------------------------------------------------
// Byte sets

function emptySet(): Uint8Array {
  return new Uint8Array(256);
}

function setOf(...bytes: number[]): Uint8Array {
  const set = emptySet();
  for (const b of bytes) set[b] = 1;
  return set;
}

function rangeInto(set: Uint8Array, lo: number, hi: number): void {
  for (let b = lo; b <= hi; b++) set[b] = 1;
}

function unionInto(target: Uint8Array, source: Uint8Array): void {
  for (let b = 0; b < 256; b++) if (source[b] !== 0) target[b] = 1;
}

function complement(set: Uint8Array): Uint8Array {
  const result = emptySet();
  for (let b = 0; b < 256; b++) result[b] = set[b] === 0 ? 1 : 0;
  return result;
}

function disjoint(a: Uint8Array, b: Uint8Array): boolean {
  for (let k = 0; k < 256; k++) if (a[k] !== 0 && b[k] !== 0) return false;
  return true;
}

function sameSet(a: Uint8Array, b: Uint8Array): boolean {
  for (let k = 0; k < 256; k++) if ((a[k] === 0) !== (b[k] === 0)) return false;
  return true;
}

/** JS `\s` on ASCII: tab, line feed, vertical tab, form feed, carriage return, space. */
const SPACE_SET = (() => { const s = emptySet(); rangeInto(s, 9, 13); s[32] = 1; return s; })();
const DIGIT_SET = (() => { const s = emptySet(); rangeInto(s, 48, 57); return s; })();
const WORD_SET = (() => {
  const s = emptySet();
  rangeInto(s, 48, 57); rangeInto(s, 65, 90); rangeInto(s, 97, 122); s[95] = 1;
  return s;
})();
/** `.` without the s flag: every character but the line terminators (on ASCII: \n and \r). */
const DOT_SET = complement(setOf(10, 13));

const CONTROL_ESCAPES: Record<string, number> = { t: 9, n: 10, v: 11, f: 12, r: 13 };
const CLASS_ESCAPES: Record<string, Uint8Array> = {
  d: DIGIT_SET, D: complement(DIGIT_SET), s: SPACE_SET, S: complement(SPACE_SET), w: WORD_SET, W: complement(WORD_SET),
};

function isAlphanumeric(code: number): boolean {
  return (code >= 48 && code <= 57) || (code >= 65 && code <= 90) || (code >= 97 && code <= 122);
}

/** A character the subset takes as itself: tab or printable ASCII. */
function isPlainByte(code: number): boolean {
  return code === 9 || (code >= 32 && code <= 126);
}

// ---------------------------------------------------------------------------------------------
// Parser (recursive descent over the subset; V8 has already checked the syntax)

class SubsetParser {
  private i = 0;
  readonly groupNames: string[] = [];
  anchoredAtStart = false;

  constructor(private readonly src: string) {}

  parse(): PatternNode[] {
    if (this.src[0] === '^') { this.anchoredAtStart = true; this.i = 1; }
    const body = this.sequence(0);
    if (this.i !== this.src.length) refuse();
    return body;
  }

  private code(offset = 0): number {
    return this.i + offset < this.src.length ? this.src.charCodeAt(this.i + offset) : -1;
  }

  /** Elements up to `)` or the end; an alternation of literal words when `|` appears in a group. */
  private sequence(depth: number): PatternNode[] {
    const nodes: PatternNode[] = [];
    while (this.i < this.src.length) {
      const c = this.src[this.i];
      if (c === ')') break;
      if (c === '|') {
        if (depth === 0) refuse();
        return [this.words(nodes)];
      }
      nodes.push(this.element(depth));
    }
    return nodes;
  }

  /** `a|bc|d` inside a group: every alternative a non-empty run of single literal bytes. */
  private words(firstAlternative: PatternNode[]): PatternNode {
    const words: number[][] = [literalWord(firstAlternative)];
    while (this.src[this.i] === '|') {
      this.i++;
      const alternative: PatternNode[] = [];
      while (this.i < this.src.length && this.src[this.i] !== '|' && this.src[this.i] !== ')') alternative.push(this.element(1));
      words.push(literalWord(alternative));
    }
    for (let a = 0; a < words.length; a++) {
      for (let b = 0; b < words.length; b++) {
        if (a !== b && isPrefix(words[a], words[b])) refuse();
      }
    }
    return { kind: 'words', words };
  }

  private element(depth: number): PatternNode {
    const c = this.src[this.i];
    if (c === '(') return this.group(depth);
    if (c === '$') {
      if (depth !== 0 || this.i !== this.src.length - 1) refuse();
      this.i++;
      return { kind: 'lineEnd' };
    }
    if (c === '\\' && this.src[this.i + 1] === 'b') {
      this.i += 2;
      if (this.isQuantifierNext()) refuse();
      return { kind: 'wordBoundary' };
    }
    const set = this.atomSet();
    return this.quantified(set);
  }

  private isQuantifierNext(): boolean {
    const c = this.src[this.i];
    return c === '*' || c === '+' || c === '?' || c === '{';
  }

  /** The byte set of a one-character atom at the cursor; advances past it. */
  private atomSet(): Uint8Array {
    const c = this.src[this.i];
    const code = this.code();
    if (c === '.') { this.i++; return DOT_SET; }
    if (c === '[') return this.bracketClass();
    if (c === '\\') {
      const next = this.src[this.i + 1] ?? '';
      const nextCode = this.code(1);
      this.i += 2;
      if (CLASS_ESCAPES[next] !== undefined) return CLASS_ESCAPES[next];
      if (CONTROL_ESCAPES[next] !== undefined) return setOf(CONTROL_ESCAPES[next]);
      if (nextCode > 32 && nextCode < 127 && !isAlphanumeric(nextCode)) return setOf(nextCode);
      return refuse();
    }
    // Quantifier without an atom, `^` inside, `{` (a literal brace only by Annex B's leniency).
    if (c === '*' || c === '+' || c === '?' || c === '{' || c === '^' || c === '$' || c === '|' || c === ')') refuse();
    if (!isPlainByte(code)) refuse();
    this.i++;
    return setOf(code);
  }

  private quantified(set: Uint8Array): PatternNode {
    let min = 1;
    let max = 1;
    const c = this.src[this.i];
    if (c === '*') { min = 0; max = Infinity; this.i++; }
    else if (c === '+') { min = 1; max = Infinity; this.i++; }
    else if (c === '?') { min = 0; max = 1; this.i++; }
    else if (c === '{') {
      const braces = /^\{(\d+)(,(\d*))?\}/.exec(this.src.slice(this.i));
      if (braces === null) refuse();
      min = Number(braces[1]);
      max = braces[2] === undefined ? min : braces[3] === '' ? Infinity : Number(braces[3]);
      if (min > 1_000_000 || (max !== Infinity && max > 1_000_000) || max < min) refuse();
      this.i += braces[0].length;
    } else {
      return { kind: 'atom', set, min, max };
    }
    if (this.src[this.i] === '?') refuse(); // lazy
    return { kind: 'atom', set, min, max };
  }

  private group(depth: number): PatternNode {
    this.i++; // (
    let capture = -1;
    if (this.src[this.i] === '?') {
      if (this.src[this.i + 1] === ':') {
        this.i += 2;
      } else if (this.src[this.i + 1] === '<' && /[A-Za-z_$]/.test(this.src[this.i + 2] ?? '')) {
        const close = this.src.indexOf('>', this.i + 2);
        if (close < 0) refuse();
        const name = this.src.slice(this.i + 2, close);
        if (!/^[A-Za-z_$][A-Za-z0-9_$]*$/.test(name)) refuse();
        capture = this.groupNames.length;
        this.groupNames.push(name);
        this.i = close + 1;
      } else {
        refuse(); // lookaround or anything else
      }
    }
    const body = this.sequence(depth + 1);
    if (this.src[this.i] !== ')') refuse();
    this.i++;
    let optional = false;
    if (this.src[this.i] === '?') {
      optional = true;
      this.i++;
      if (this.src[this.i] === '?') refuse(); // lazy
    }
    if (this.isQuantifierNext()) refuse(); // * + {} on a group
    return { kind: 'group', capture, optional, body };
  }

  /** `[...]` or `[^...]`: ranges and escapes; a class escape as a range end is refused. */
  private bracketClass(): Uint8Array {
    this.i++; // [
    let negate = false;
    if (this.src[this.i] === '^') { negate = true; this.i++; }
    const set = emptySet();
    for (;;) {
      if (this.i >= this.src.length) refuse();
      if (this.src[this.i] === ']') { this.i++; break; }
      const low = this.classAtom();
      if (this.src[this.i] === '-' && this.i + 1 < this.src.length && this.src[this.i + 1] !== ']') {
        this.i++;
        const high = this.classAtom();
        if (typeof low !== 'number' || typeof high !== 'number' || low > high) refuse();
        rangeInto(set, low, high);
      } else if (typeof low === 'number') {
        set[low] = 1;
      } else {
        unionInto(set, low);
      }
    }
    return negate ? complement(set) : set;
  }

  /** One member of a bracket class: a byte, or the set of a class escape. */
  private classAtom(): number | Uint8Array {
    const c = this.src[this.i];
    if (c === '\\') {
      const next = this.src[this.i + 1] ?? '';
      const nextCode = this.code(1);
      this.i += 2;
      if (CLASS_ESCAPES[next] !== undefined) return CLASS_ESCAPES[next];
      if (CONTROL_ESCAPES[next] !== undefined) return CONTROL_ESCAPES[next];
      if (nextCode > 32 && nextCode < 127 && !isAlphanumeric(nextCode)) return nextCode;
      return refuse(); // \b (backspace here), \0, \x, \u, \c, letters
    }
    const code = this.code();
    if (!isPlainByte(code)) refuse();
    this.i++;
    return code;
  }
}

function literalWord(alternative: PatternNode[]): number[] {
  if (alternative.length === 0) refuse();
  return alternative.map((node) => {
    if (node.kind !== 'atom' || node.min !== 1 || node.max !== 1) return refuse();
    const member = singleMember(node.set);
    return member < 0 ? refuse() : member;
  });
}

function isPrefix(short: number[], long: number[]): boolean {
  if (short.length > long.length) return false;
  for (let k = 0; k < short.length; k++) if (short[k] !== long[k]) return false;
  return true;
}

/** The only byte of a one-member set, or -1. */
function singleMember(set: Uint8Array): number {
  let member = -1;
  for (let b = 0; b < 256; b++) {
    if (set[b] !== 0) {
      if (member >= 0) return -1;
      member = b;
    }
  }
  return member;
}

// ---------------------------------------------------------------------------------------------
// Safety check: FIRST sets of continuations, as the module comment describes

/** What can follow a point of the pattern. */
interface Continuation {
  /** Bytes the continuation can begin with. */
  readonly first: Uint8Array;
  /** It can succeed without consuming a byte at a position that is not the line end. */
  readonly nullable: boolean;
  /** Every element skippable and no assertion outside optional groups: it succeeds anywhere. */
  readonly trivial: boolean;
  /** Its first element, on every path, is `\b`. */
  readonly boundaryFirst: boolean;
}

const PATTERN_END: Continuation = { first: emptySet(), nullable: true, trivial: true, boundaryFirst: false };

/** Continuation before `nodes` given `after` follows them; throws Refused when a choice point in
 *  `nodes` is not provably equal to backtracking. */
function checkSequence(nodes: readonly PatternNode[], after: Continuation): Continuation {
  let k = after;
  for (let index = nodes.length - 1; index >= 0; index--) k = checkNode(nodes[index], k);
  return k;
}

function checkNode(node: PatternNode, k: Continuation): Continuation {
  switch (node.kind) {
    case 'lineEnd':
      return { first: emptySet(), nullable: false, trivial: false, boundaryFirst: false };
    case 'wordBoundary':
      return { first: k.first, nullable: k.nullable, trivial: false, boundaryFirst: true };
    case 'words': {
      const first = emptySet();
      for (const word of node.words) first[word[0]] = 1;
      return { first, nullable: false, trivial: false, boundaryFirst: false };
    }
    case 'atom': {
      if (node.min < node.max && !k.trivial && (k.nullable || !disjoint(k.first, node.set)) && !boundaryStops(node.set, node.min, k)) refuse();
      if (node.min > 0) return { first: node.set, nullable: false, trivial: false, boundaryFirst: false };
      const first = emptySet();
      unionInto(first, node.set);
      unionInto(first, k.first);
      return { first, nullable: k.nullable, trivial: k.trivial, boundaryFirst: false };
    }
    case 'group': {
      const inner = checkSequence(node.body, k);
      if (!node.optional) return inner;
      const own = checkSequence(node.body, PATTERN_END).first;
      if (!k.trivial && (k.nullable || !disjoint(own, k.first))) refuse();
      const first = emptySet();
      unionInto(first, inner.first);
      unionInto(first, k.first);
      return { first, nullable: k.nullable, trivial: k.trivial, boundaryFirst: false };
    }
  }
}

/** X{min,max} (min >= 1) followed by `\b`, X all word bytes or all non-word bytes: every smaller
 *  count leaves two bytes of X around the boundary test, so `\b` fails there. */
function boundaryStops(set: Uint8Array, min: number, k: Continuation): boolean {
  if (min < 1 || !k.boundaryFirst) return false;
  let word = false;
  let other = false;
  for (let b = 0; b < 256; b++) {
    if (set[b] === 0) continue;
    if (WORD_SET[b] !== 0) word = true; else other = true;
  }
  return !(word && other);
}

// ---------------------------------------------------------------------------------------------
// Code generation: only numbers and fixed identifiers reach the generated source

class CodeWriter {
  readonly tables: Uint8Array[] = [];
  private labels = 0;

  /** Name of the lookup table for a byte set (shared between equal sets). */
  table(set: Uint8Array): string {
    let index = this.tables.findIndex((t) => sameSet(t, set));
    if (index < 0) { index = this.tables.length; this.tables.push(set); }
    return `T${index}`;
  }

  label(): number {
    return this.labels++;
  }

  sequence(nodes: readonly PatternNode[], fail: string): string {
    let code = '';
    let run: number[] = [];
    const flush = () => { if (run.length > 0) { code += literalRun(run, fail); run = []; } };
    for (const node of nodes) {
      const single = node.kind === 'atom' && node.min === 1 && node.max === 1 ? singleMember(node.set) : -1;
      if (single >= 0) { run.push(single); continue; }
      flush();
      code += this.node(node, fail);
    }
    flush();
    return code;
  }

  private node(node: PatternNode, fail: string): string {
    switch (node.kind) {
      case 'lineEnd':
        return `if (p !== le) ${fail}\n`;
      case 'wordBoundary':
        return `if ((p > ls && W[buf[p - 1]] !== 0) === (p < le && W[buf[p]] !== 0)) ${fail}\n`;
      case 'words': {
        const n = this.label();
        let code = `w${n}: {\n`;
        for (const word of node.words) code += `if (${wordTest(word)}) { p += ${word.length}; break w${n}; }\n`;
        return `${code}${fail}\n}\n`;
      }
      case 'atom':
        return this.atom(node.set, node.min, node.max, fail);
      case 'group': {
        const capture = node.capture;
        const open = capture >= 0 ? `caps[${2 * capture}] = p;\n` : '';
        const close = capture >= 0 ? `caps[${2 * capture + 1}] = p;\n` : '';
        if (!node.optional) return `${open}${this.sequence(node.body, fail)}${close}`;
        const n = this.label();
        let reset = '';
        for (const index of capturesIn(node)) reset += `caps[${2 * index}] = -1; caps[${2 * index + 1}] = -1;\n`;
        return `{ const s${n} = p;\n done${n}: {\n skip${n}: {\n${open}${this.sequence(node.body, `break skip${n};`)}`
          + `if (p === s${n}) break skip${n};\n${close}break done${n};\n}\np = s${n};\n${reset}}\n}\n`;
      }
    }
  }

  /** A test that the byte in variable `c` is in the set: a few comparisons when the set is a few
   * ranges (measured about 15 % faster than a table lookup on blank and non-blank runs), else the
   * set's lookup table. */
  private member(set: Uint8Array, c: string): string {
    const ranges = rangesOf(set);
    if (ranges.length <= MAX_COMPARED_RANGES) return rangeTest(ranges, c);
    return `${this.table(set)}[${c}] !== 0`;
  }

  private atom(set: Uint8Array, min: number, max: number, fail: string): string {
    const test = this.member(set, 'c');
    if (min === max) {
      if (min === 0) return '';
      if (min === 1) return `if (p >= le) ${fail}\n{ const c = buf[p]; if (!(${test})) ${fail} }\np++;\n`;
      return `if (p + ${min} > le) ${fail}\nfor (let e = p + ${min}; p < e; p++) { const c = buf[p]; if (!(${test})) ${fail} }\n`;
    }
    const limit = max === Infinity ? 'le' : `(p + ${max} < le ? p + ${max} : le)`;
    // A class holding the blank: runs of eight blanks go at once (all members, so the same match).
    const blanks = set[32] !== 0 ? 'if (view !== undefined) while (q + 8 <= lim && view.getUint32(q, true) === 0x20202020 && view.getUint32(q + 4, true) === 0x20202020) q += 8;\n' : '';
    // A class holding every printable byte (\\S, [^\\s]): four bytes at once while all four are
    // printable, 0x21..0x7f (x - 0x21212121 sets a byte's top bit when that byte, or one below it,
    // is under 0x21; x itself when it is 0x80 or more: a sure test, stricter than needed).
    const printable = set.subarray(0x21, 0x80).every((member) => member !== 0)
      ? 'if (view !== undefined) for (; q + 4 <= lim; q += 4) { const x = view.getUint32(q, true); if ((((x - 0x21212121) | x) & 0x80808080) !== 0) break; }\n' : '';
    let code = `{ const lim = ${limit}; let q = p;\n${blanks}${printable}for (; q < lim; q++) { const c = buf[q]; if (!(${test})) break; }\n`;
    if (min > 0) code += `if (q - p < ${min}) ${fail}\n`;
    return `${code}p = q; }\n`;
  }
}

/** Sets of at most this many byte ranges are tested by comparisons (\\s is three, \\S four). */
const MAX_COMPARED_RANGES = 4;

/** The set's members as inclusive ranges [low, high] of bytes, in increasing order. */
function rangesOf(set: Uint8Array): [number, number][] {
  const ranges: [number, number][] = [];
  for (let b = 0; b < 256; b++) {
    if (set[b] === 0) continue;
    const low = b;
    while (b + 1 < 256 && set[b + 1] !== 0) b++;
    ranges.push([low, b]);
  }
  return ranges;
}

/** `c` in one of the ranges, the likeliest first: the one holding the blank, then the widest. */
function rangeTest(ranges: readonly [number, number][], c: string): string {
  if (ranges.length === 0) return 'false';
  const score = ([low, high]: readonly [number, number]): number => (low <= 32 && 32 <= high ? 1000 : 0) + high - low;
  const ordered = [...ranges].sort((a, b) => score(b) - score(a) || a[0] - b[0]);
  return ordered.map(([low, high]) => {
    if (low === high) return `${c} === ${low}`;
    if (low === 0) return `${c} <= ${high}`;
    if (high === 255) return `${c} >= ${low}`;
    return `(${c} >= ${low} && ${c} <= ${high})`;
  }).join(' || ');
}

function literalRun(bytes: number[], fail: string): string {
  return `if (${wordTest(bytes)}) {} else ${fail}\np += ${bytes.length};\n`;
}

function wordTest(bytes: number[]): string {
  const tests = [`p + ${bytes.length} <= le`];
  bytes.forEach((b, k) => tests.push(`buf[p${k === 0 ? '' : ` + ${k}`}] === ${b}`));
  return tests.join(' && ');
}

function capturesIn(node: PatternNode): number[] {
  if (node.kind !== 'group') return [];
  const found = node.capture >= 0 ? [node.capture] : [];
  for (const child of node.body) found.push(...capturesIn(child));
  return found;
}

// ---------------------------------------------------------------------------------------------

/** The compiled matcher; `matchStart` is written by the generated exec. */
class CompiledBytePattern implements BytePattern {
  matchStart = -1;
  readonly capsLength: number;
  readonly exec: ExecFunction;

  constructor(readonly source: string, readonly groupNames: readonly string[], build: (self: CompiledBytePattern) => ExecFunction,
    readonly startBytes?: Uint8Array, readonly startBytesAfterBlanks?: Uint8Array) {
    this.capsLength = 2 * groupNames.length;
    this.exec = build(this);
  }

  groupIndex(name: string): number {
    return this.groupNames.indexOf(name);
  }
}

/** Compile, or undefined when the pattern is outside the subset or greedy-possessive
 *  equivalence cannot be proven. Never throws for a valid JS regex source. */
export function compileBytePattern(source: string): BytePattern | undefined {
  try {
    new RegExp(source);
  } catch {
    return undefined;
  }
  try {
    const parser = new SubsetParser(source);
    const nodes = parser.parse();
    const whole = checkSequence(nodes, PATTERN_END);
    const writer = new CodeWriter();
    const body = writer.sequence(nodes, parser.anchoredAtStart ? 'return -1;' : 'continue attempt;');
    let exec = 'if (from < ls) from = ls;\nif (from > le) return -1;\n';
    if (parser.anchoredAtStart) {
      exec += `if (from !== ls) return -1;\nlet p = ls;\n${body}self.matchStart = ls;\nreturn p;\n`;
    } else {
      // Skip start positions whose byte cannot begin a match: sound only when the pattern must
      // consume a byte (or meet `$`, which fails before the line end) to succeed.
      const skip = whole.nullable ? '' : `while (st < le && ${writer.table(whole.first)}[buf[st]] === 0) st++;\n`;
      exec += `attempt: for (let st = from; st <= le; st++) {\n${skip}let p = st;\n${body}self.matchStart = st;\nreturn p;\n}\nreturn -1;\n`;
    }
    const tableNames = writer.tables.map((_, index) => `T${index}`);
    const factorySource = `"use strict";\nreturn function exec(buf, ls, le, from, caps, view) {\n${exec}};`;
    const factory = new Function(...tableNames, 'W', 'self', factorySource) as (...args: unknown[]) => ExecFunction;
    const startBytes = parser.anchoredAtStart && !whole.nullable ? whole.first : undefined;
    // `^\s*` then K: \s* takes every leading blank (possessive), so K starts at the first other byte.
    const first = nodes[0];
    let afterBlanks: Uint8Array | undefined;
    if (parser.anchoredAtStart && first !== undefined && first.kind === 'atom' && first.min === 0 && first.max === Infinity && sameSet(first.set, SPACE_SET)) {
      const rest = checkSequence(nodes.slice(1), PATTERN_END);
      if (!rest.nullable && disjoint(rest.first, SPACE_SET)) afterBlanks = rest.first;
    }
    return new CompiledBytePattern(source, parser.groupNames, (self) => factory(...writer.tables, WORD_SET, self), startBytes, afterBlanks);
  } catch (error) {
    if (error instanceof Refused) return undefined;
    // Anything else is a defect in this compiler; refusing keeps settle correct (V8 runs the pattern).
    return undefined;
  }
}

/**
 * Regular expressions written in parser specs: safety checks at load, a literal pre-filter, and a
 * cap on how much of a line a pattern sees.
 *
 * Backtracking defence, in three layers:
 * 1. The CLI entry point sets V8's `--enable-experimental-regexp-engine-on-excessive-backtracks`,
 *    so a pattern that backtracks too much is re-run on V8's linear-time engine.
 * 2. That engine cannot run backreferences or lookaround, so such patterns could still backtrack
 *    without bound: they are rejected when the spec is loaded (see `patternProblems`).
 * 3. Patterns only see the first `PATTERN_LINE_LIMIT` characters of a line (64 Ki), so the cost of
 *    one match is bounded even for a 10 MB line.
 */

/** Characters of a line that spec patterns see; the rest is cut off before matching. */
export const PATTERN_LINE_LIMIT = 65_536;

/** What is wrong with a pattern (empty when nothing is): syntax errors, and constructs the
 * linear-time engine cannot run (backreferences, lookahead, lookbehind). Cost: O(pattern length). */
export function patternProblems(pattern: string): string[] {
  const problems: string[] = [];
  try {
    new RegExp(pattern);
  } catch (error) {
    problems.push(`not a valid regular expression: ${(error as Error).message.replace(/^Invalid regular expression: /, '')}`);
    return problems;
  }
  let inClass = false;
  for (let i = 0; i < pattern.length; i++) {
    const c = pattern[i];
    if (c === '\\') {
      const next = pattern[i + 1] ?? '';
      if (!inClass && /[1-9]/.test(next)) problems.push(`backreference \\${next} at ${i}: not allowed (it can backtrack without bound); rewrite without it`);
      if (!inClass && next === 'k' && pattern[i + 2] === '<') problems.push(`named backreference at ${i}: not allowed (it can backtrack without bound); rewrite without it`);
      i++;
    } else if (inClass) {
      if (c === ']') inClass = false;
    } else if (c === '[') {
      inClass = true;
    } else if (c === '(' && pattern[i + 1] === '?') {
      const rest = pattern.slice(i + 2, i + 4);
      if (rest.startsWith('=') || rest.startsWith('!') || rest === '<=' || rest === '<!') {
        problems.push(`lookaround (?${rest.startsWith('<') ? rest : rest[0]} at ${i}: not allowed (it can backtrack without bound); match the text itself instead`);
      }
    }
  }
  return problems;
}

/** Names of the named capture groups of a (valid) pattern, in order. */
export function groupNames(pattern: string): string[] {
  const names: string[] = [];
  let inClass = false;
  for (let i = 0; i < pattern.length; i++) {
    const c = pattern[i];
    if (c === '\\') { i++; continue; }
    if (inClass) { if (c === ']') inClass = false; continue; }
    if (c === '[') { inClass = true; continue; }
    if (c === '(' && pattern[i + 1] === '?' && pattern[i + 2] === '<' && pattern[i + 3] !== '=' && pattern[i + 3] !== '!') {
      const end = pattern.indexOf('>', i + 3);
      if (end > 0) names.push(pattern.slice(i + 3, end));
    }
  }
  return names;
}

/** A cheap test a line must pass before the pattern runs. */
export interface LiteralFilter {
  readonly text: string;
  /** The line must start with `text` (pattern anchored at ^ and no leading blanks allowed). */
  readonly atStart: boolean;
}

const META = new Set(['\\', '^', '$', '.', '|', '?', '*', '+', '(', ')', '[', ']', '{', '}']);
const QUANTIFIERS = new Set(['?', '*', '+', '{']);

/**
 * The literal text every match must contain, read from the pattern's start: `^iter=` gives
 * "iter=" at the start of the line; `^\s*residual\s` gives "residual" anywhere. Returns undefined
 * when the pattern starts with something that is not literal. Cost: O(pattern length).
 */
export function leadingLiteral(pattern: string): LiteralFilter | undefined {
  let i = 0;
  let anchored = false;
  if (pattern[0] === '^') { anchored = true; i = 1; }
  // Skip leading optional blanks: the literal then may appear anywhere.
  const blanks = /^(?:\\s[*+]|[ ][*+]|\\s\{\d*,?\d*\}|\[ \\t\][*+])/.exec(pattern.slice(i));
  if (blanks !== null) { i += blanks[0].length; anchored = false; }
  let text = '';
  while (i < pattern.length) {
    const c = pattern[i];
    if (c === '\\') {
      const next = pattern[i + 1];
      if (next === undefined || /[0-9A-Za-z]/.test(next)) break;
      if (QUANTIFIERS.has(pattern[i + 2] ?? '')) break;
      text += next;
      i += 2;
      continue;
    }
    if (META.has(c)) break;
    if (QUANTIFIERS.has(pattern[i + 1] ?? '')) break;
    text += c;
    i++;
  }
  // A top-level alternation means the literal is not required.
  if (text.length === 0 || hasTopLevelBar(pattern)) return undefined;
  return { text, atStart: anchored };
}

function hasTopLevelBar(pattern: string): boolean {
  let depth = 0;
  let inClass = false;
  for (let i = 0; i < pattern.length; i++) {
    const c = pattern[i];
    if (c === '\\') { i++; continue; }
    if (inClass) { if (c === ']') inClass = false; continue; }
    if (c === '[') inClass = true;
    else if (c === '(') depth++;
    else if (c === ')') depth--;
    else if (c === '|' && depth === 0) return true;
  }
  return false;
}

/** A compiled spec pattern with its pre-filter: `test`/`exec` see at most PATTERN_LINE_LIMIT characters. */
export class UserPattern {
  readonly regex: RegExp;
  private readonly filterText: string;
  private readonly filterAtStart: boolean;
  private readonly filterFirst: number;

  constructor(readonly source: string, contains?: string, global = false) {
    this.regex = new RegExp(source, global ? 'g' : '');
    const literal = contains !== undefined ? { text: contains, atStart: false } : leadingLiteral(source);
    this.filterText = literal?.text ?? '';
    this.filterAtStart = literal?.atStart ?? false;
    this.filterFirst = this.filterText.charCodeAt(0);
  }

  /** Cheap check: can this line match at all? */
  mayMatch(line: string): boolean {
    if (this.filterText.length === 0) return true;
    if (this.filterAtStart) return line.charCodeAt(0) === this.filterFirst && line.startsWith(this.filterText);
    return line.includes(this.filterText);
  }

  exec(line: string): RegExpExecArray | null {
    if (!this.mayMatch(line)) return null;
    // Only a global pattern reads lastIndex; leaving it alone keeps V8 on its fastest exec path.
    if (this.regex.global) this.regex.lastIndex = 0;
    return this.regex.exec(capLine(line));
  }

  test(line: string): boolean {
    if (!this.mayMatch(line)) return false;
    if (this.regex.global) this.regex.lastIndex = 0;
    return this.regex.test(capLine(line));
  }
}

export function capLine(line: string): string {
  return line.length > PATTERN_LINE_LIMIT ? line.slice(0, PATTERN_LINE_LIMIT) : line;
}

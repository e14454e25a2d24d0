// The V8 flag settle's entry point sets (src/cli/main.ts), set here too before any pattern is
// compiled: a pattern that backtracks too much is re-run on V8's linear-time engine.
import v8 from 'node:v8';
v8.setFlagsFromString('--enable-experimental-regexp-engine-on-excessive-backtracks');

import { describe, expect, it } from 'vitest';
import { groupNames, leadingLiteral, patternProblems, PATTERN_LINE_LIMIT, UserPattern } from '../../src/parse/user-pattern.js';
import { compileSpec } from '../../src/parse/compile-spec.js';
import type { LogRecord } from '../../src/parse/log-record.js';

describe('user patterns cannot hang settle', () => {
  // ^(a+)+$ on a run of a's followed by '!' is the textbook catastrophic-backtracking case
  // (nested quantifiers; exponential in the run length for a backtracking engine).
  it('^(a+)+$ on 40 a\'s and "!" returns quickly (linear-time fallback)', () => {
    const pattern = new UserPattern('^(a+)+$');
    const started = performance.now();
    expect(pattern.test(`${'a'.repeat(40)}!`)).toBe(false);
    expect(performance.now() - started).toBeLessThan(2000);
  });

  it('a spec rule with that pattern parses long lines of a\'s and "!" quickly, and they count as unmatched', () => {
    const records: LogRecord[] = [];
    const parser = compileSpec({
      id: 'evil', description: 'x', detect: { patterns: ['.'] },
      lines: { rules: [{ match: '^(?<v>a+)+$' }] },
    }, { residual: [], quantity: [] })((r) => records.push(r));
    const started = performance.now();
    parser.pushLine(`${'a'.repeat(60_000)}!`);
    parser.pushLine(`${'a'.repeat(45)}!`);
    // A 1 MB line: the pattern sees only its first 64 KiB (so here it matches the cut line).
    parser.pushLine(`${'a'.repeat(1_000_000)}!`);
    expect(performance.now() - started).toBeLessThan(5000);
    expect(records).toHaveLength(0);
    expect(parser.stats().unmatched).toBe(2);
  });

  it('patterns see at most the first 64 KiB of a line', () => {
    expect(PATTERN_LINE_LIMIT).toBe(65_536);
    const pattern = new UserPattern('x$');
    expect(pattern.test(`${'-'.repeat(PATTERN_LINE_LIMIT - 1)}x`)).toBe(true);
    expect(pattern.test(`${'-'.repeat(PATTERN_LINE_LIMIT)}x`)).toBe(false);
  });

  const rejected: [string, RegExp][] = [
    ['(a)\\1', /backreference \\1/],
    ['(?<w>a)\\k<w>', /named backreference/],
    ['a(?=b)', /lookaround \(\?=/],
    ['a(?!b)', /lookaround \(\?!/],
    ['(?<=a)b', /lookaround \(\?<=/],
    ['(?<!a)b', /lookaround \(\?<!/],
    ['(unclosed', /not a valid regular expression/],
    ['a{2,1}', /not a valid regular expression/],
  ];
  it.each(rejected)('rejects %s at load', (pattern, message) => {
    expect(patternProblems(pattern).join('; ')).toMatch(message);
  });

  it.each(['^iter=(?<it>\\d+)', '[\\1(?=]x', '\\(?=literal\\)', '(?<name>\\w+)=(?<value>\\S+)', '^(a+)+$'])('accepts %s (no backreference or lookaround outside a class)', (pattern) => {
    expect(patternProblems(pattern)).toEqual([]);
  });
});

describe('groupNames', () => {
  it('lists named groups in order, skipping escapes, classes and lookbehind', () => {
    expect(groupNames('^(?<iteration>\\d+) (?<p>\\S+)[(?<no>] \\(?<no2>x (?:a)(?<unit>[^\\]]*)')).toEqual(['iteration', 'p', 'unit']);
  });
});

describe('leadingLiteral (pre-filter before a pattern runs)', () => {
  const cases: [string, ReturnType<typeof leadingLiteral>][] = [
    ['^iter=(?<i>\\d+)', { text: 'iter=', atStart: true }],
    ['^=== iteration (?<iteration>[0-9]+) ===', { text: '=== iteration ', atStart: true }],
    ['^\\s*residual\\s+(?<name>\\S+)', { text: 'residual', atStart: false }],
    ['drag = (?<d>\\S+)', { text: 'drag = ', atStart: false }],
    ['^Time\\.step (?<s>\\d+)', { text: 'Time.step ', atStart: true }],
    ['^abc?d', { text: 'ab', atStart: true }],
    ['^\\d+', undefined],
    ['^FATAL|^ERROR', undefined],
    ['(?<x>a)', undefined],
  ];
  it.each(cases)('%s', (pattern, expected) => {
    expect(leadingLiteral(pattern)).toEqual(expected);
  });

  it('the pre-filter never changes the outcome of a match (checked on sample lines)', () => {
    const lines = ['iter=5 x', ' iter=5', 'Time.step 3', 'TimeXstep 3', 'abd', 'abcd', 'xxabd', '  residual r 1', 'residual', 'drag = 1'];
    for (const [pattern] of cases) {
      const plain = new RegExp(pattern);
      const filtered = new UserPattern(pattern);
      for (const line of lines) expect(filtered.test(line), `${pattern} on ${line}`).toBe(plain.test(line));
    }
  });
});

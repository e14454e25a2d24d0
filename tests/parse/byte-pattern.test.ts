// The outside reference for every expected value here is V8's own RegExp (ECMA-262 §22.2 semantics,
// run with the `d` flag for capture offsets): the byte matcher must give exactly its answer on the
// same ASCII text, or refuse to compile.
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compileBytePattern, type BytePattern } from '../../src/parse/byte-pattern.js';

const parsersDir = join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'parsers');

interface SpecPatterns { mustCompile: string[]; detect: string[] }

/** lines.rules[].match, ignore, failure and table.header of every built-in spec (must compile), and
 *  detect.patterns (compared when they compile). */
function builtInPatterns(): SpecPatterns {
  const mustCompile: string[] = [];
  const detect: string[] = [];
  for (const file of readdirSync(parsersDir).filter((name) => name.endsWith('.json') && !name.includes('schema'))) {
    const spec = JSON.parse(readFileSync(join(parsersDir, file), 'utf8'));
    for (const rule of spec.lines?.rules ?? []) if (typeof rule.match === 'string') mustCompile.push(rule.match);
    mustCompile.push(...(spec.ignore ?? []), ...(spec.failure ?? []));
    if (typeof spec.table?.header === 'string') mustCompile.push(spec.table.header);
    detect.push(...(spec.detect?.patterns ?? []));
  }
  return { mustCompile: [...new Set(mustCompile)], detect: [...new Set(detect)] };
}

/** Patterns a user might write in a spec; each compiles (checked below) and is compared with V8. */
const USER_PATTERNS = [
  'iter(?:ation)?\\s*[:=]\\s*(?<iteration>\\d+)',
  '^\\s*(?<name>[A-Za-z_]\\w*)\\s*=\\s*(?<value>\\S+)$',
  'Step\\s+(?<step>\\d+)\\s+t\\s*=\\s*(?<time>\\S+)',
  '\\bres\\b',
  '^\\s*Iter(?:ation)?\\s+(?<iteration>\\d+)\\b',
  'residual\\s*\\(\\s*(?<name>\\w+)\\s*\\)\\s*[:=]\\s*(?<value>[-+0-9.eEdD]+)',
  '^(?<iteration>\\d+)\\s+(?<res_p>\\S+)\\s+(?<res_u>\\S+)\\s+(?<res_v>\\S+)\\s*$',
  'time\\s*=\\s*(?<time>[-+]?\\d+(?:\\.\\d*)?(?:[eE][-+]?\\d+)?)',
  '^Time = (?<time>\\S+)$',
  '^\\s*(?<name>\\w+):\\s+Solving for \\w+, Initial residual = (?<value>[^,]+), Final',
  'Courant Number mean: (?<co_mean>\\S+) max: (?<co_max>\\S+)',
  '^\\s*#',
  '^WARNING\\b',
  '^\\s*$',
  '\\s+$',
  'cont(?:inuity)?\\s*[:=]\\s*(?<cont>\\S+)',
  '^\\s*(?<iteration>[0-9]+)\\s+(?<value>-?[0-9]\\.[0-9]+[eE][-+][0-9]{2,3})',
  'dt\\s*=\\s*(?<dt>\\S+)(?:\\s+\\((?<reason>[^)]*)\\))?',
  '^(?<date>\\d{4}-\\d{2}-\\d{2})[T ](?<clock>\\d{2}:\\d{2}:\\d{2})',
  'mass\\s+imbalance\\s*=\\s*(?<imbalance>\\S+)\\s*(?:%)?',
  '^\\[(?<level>[A-Z]+)\\]\\s+(?<message>\\S.*)$',
  'lift\\s*=\\s*(?<lift>\\S+)\\s+drag\\s*=\\s*(?<drag>\\S+)',
  '^\\s*(?<name>res_\\w+)\\s+(?<value>\\S+)',
  '(?<name>[A-Za-z_][A-Za-z0-9_]*)=(?<value>[^ \\t,;]+)',
  '^\\s*step\\s+(?<step>\\d+)\\s*,\\s*inner\\s+(?<inner>\\d+)',
  'norm\\s*\\|r\\|\\s*=\\s*(?<norm>\\S+)',
  '(?<pct>\\d+(?:\\.\\d+)?)%',
  'CFL(?:_max)?\\s*[:=]\\s*(?<cfl>\\S+)',
  '^\\s*\\d+\\s+\\S+\\s+(?<value>\\S+)',
  '^(?:iter|step)=(?<n>\\d+)',
  '^\\s+(?:residual|monitor)\\s+(?<name>\\S+)\\s+\\S+',
  '\\b(?<word>[a-z]+)\\b',
  '^.{3}(?<rest>.*)$',
  'x\\s?y',
  '(?<a>a?)(?<b>b)?c',
  '(?<o>(?<i>ab)?c)?d',
  '[\\]\\[]+',
  '[--z]+',
  '[^]',
  'x[]?y',
  '}',
  '\\$(?<amount>\\d+)',
  '(?<t>\\t+)',
  '(?<cr>\\r)',
  '',
];

const ASCII_PUNCTUATION = ['=', ':', ',', ';', '.', '-', '+', '(', ')', '[', ']', '%', '#', '|', '/', '_', '"', '{', '}', '$'];

/** Pieces for generated lines: literal words and characters of the pattern, numbers, blanks. */
function alphabetOf(source: string): string[] {
  const text = source.replace(/\\[dDsSwWbB]/g, ' ').replace(/\\(.)/g, '$1').replace(/\(\?<[^>]*>/g, ' ');
  const words = text.match(/[A-Za-z_]+/g) ?? [];
  const chars = [...new Set(text.split(''))].filter((c) => c.charCodeAt(0) >= 32 && c.charCodeAt(0) < 127);
  return [...new Set([...words, ...chars, ...ASCII_PUNCTUATION,
    '0', '7', '42', '2024', '1.5e-3', '-7.210E+01', 'a', 'Z', ' ', ' ', '  ', '\t', '\r', 'x_1', '        ', '           '])];
}

interface Outcome { start: number; end: number; groups: [number, number][] }

/** V8's answer: `new RegExp(source, 'dg')` with lastIndex = from. */
function reference(regex: RegExp, names: readonly string[], line: string, from: number): Outcome | null {
  regex.lastIndex = from;
  const match = regex.exec(line);
  if (match === null) return null;
  const indices = match.indices;
  const groups = names.map((name): [number, number] => {
    const bounds = indices?.groups?.[name];
    return bounds === undefined ? [-1, -1] : [bounds[0], bounds[1]];
  });
  return { start: match.index, end: match.index + match[0].length, groups };
}

/** The byte matcher's answer on the line placed between two pads, converted back to line offsets. */
function byteAnswer(pattern: BytePattern, line: string, from: number, before: string, after: string, withView = false): Outcome | null {
  const buf = Buffer.from(before + line + after, 'latin1');
  const start = before.length;
  const caps = new Int32Array(pattern.capsLength).fill(-7);
  // With a view, blank runs are skipped eight bytes at a time: the answer must not change (and
  // blanks in the pad after the line must not be taken).
  const view = withView ? new DataView(buf.buffer, buf.byteOffset, buf.byteLength) : undefined;
  const end = pattern.exec(buf, start, start + line.length, start + from, caps, view);
  if (end < 0) return null;
  const groups = pattern.groupNames.map((_, k): [number, number] =>
    caps[2 * k] < 0 ? [caps[2 * k], caps[2 * k + 1]] : [caps[2 * k] - start, caps[2 * k + 1] - start]);
  return { start: pattern.matchStart - start, end: end - start, groups };
}

const PADS = ['', 'w', 'ab1 ', '  ', '         '];

function compareOn(source: string, pattern: BytePattern, regex: RegExp, line: string, from: number, pad: number): void {
  const expected = reference(regex, pattern.groupNames, line, from);
  for (const withView of [false, true]) {
    const actual = byteAnswer(pattern, line, from, PADS[pad % PADS.length], PADS[(pad >> 2) % PADS.length], withView);
    if (JSON.stringify(actual) !== JSON.stringify(expected)) {
      throw new Error(`${JSON.stringify(source)} on ${JSON.stringify(line)} from ${from}${withView ? ' (with a view)' : ''}: byte matcher ${JSON.stringify(actual)}, V8 ${JSON.stringify(expected)}`);
    }
  }
  // The start-byte shortcuts may only skip lines V8 does not match.
  const firstNonBlank = line.search(/[^\t\n\v\f\r ]/);
  if (from === 0 && firstNonBlank >= 0 && pattern.startBytesAfterBlanks !== undefined && pattern.startBytesAfterBlanks[line.charCodeAt(firstNonBlank)] === 0 && expected !== null) {
    throw new Error(`${JSON.stringify(source)} on ${JSON.stringify(line)}: startBytesAfterBlanks excludes its first non-blank byte, but V8 matches`);
  }
  if (from === 0 && line.length > 0 && pattern.startBytes !== undefined && pattern.startBytes[line.charCodeAt(0)] === 0 && expected !== null) {
    throw new Error(`${JSON.stringify(source)} on ${JSON.stringify(line)}: startBytes excludes its first byte, but V8 matches`);
  }
}

function differential(source: string, numRuns: number, seed: number): void {
  const pattern = compileBytePattern(source);
  if (pattern === undefined) throw new Error(`${JSON.stringify(source)} was refused`);
  const regex = new RegExp(source, 'dg');
  const line = fc.array(fc.constantFrom(...alphabetOf(source)), { maxLength: 14 }).map((pieces) => pieces.join(''));
  fc.assert(fc.property(line, fc.nat(), fc.nat(24), (text, fromSeed, pad) => {
    // Mostly from 0; sometimes anywhere on the line, or one past its end (V8 then finds nothing).
    const from = fromSeed % 3 === 0 ? fromSeed % (text.length + 2) : 0;
    compareOn(source, pattern, regex, text, from, pad);
  }), { numRuns, seed });
}

describe('compileBytePattern: same answers as V8 (differential, fast-check)', () => {
  const { mustCompile, detect } = builtInPatterns();

  it('finds the built-in specs\' patterns (the list below is not empty)', () => {
    expect(mustCompile.length).toBeGreaterThanOrEqual(8);
  });

  it.each(mustCompile)('built-in pattern %j compiles and matches like V8', (source) => {
    differential(source, 2000, 0x5e771e);
  });

  it.each(detect)('built-in detect pattern %j matches like V8 when it compiles', (source) => {
    if (compileBytePattern(source) !== undefined) differential(source, 1000, 0xde7ec7);
  });

  it.each(USER_PATTERNS)('user-like pattern %j compiles and matches like V8', (source) => {
    differential(source, 1500, 0xc0ffee);
  });
});

/** Random patterns from the subset's grammar (and a little beyond): whatever compiles must agree
 *  with V8 everywhere, and nothing throws. */
describe('random patterns: compiled ones agree with V8, the rest are refused, none throws', () => {
  const atom = fc.constantFrom('a', 'b', ':', ' ', '=', '1', '\\s', '\\S', '\\d', '\\D', '\\w', '\\W', '.', '\\.',
    '[ab]', '[^a ]', '[0-9.]', '[a-c:]', '[^\\s]', '\\t', '\\r');
  const quantifier = fc.constantFrom('', '', '', '*', '+', '?', '{2}', '{1,3}', '{0,}', '{2,}', '{0,1}', '*?');
  const element: fc.Arbitrary<string> = fc.letrec<{ element: string; sequence: string }>((tie) => ({
    element: fc.oneof(
      { weight: 6, arbitrary: fc.tuple(atom, quantifier).map(([a, q]) => a + q) },
      { weight: 1, arbitrary: fc.constant('\\b') },
      { weight: 1, arbitrary: fc.constantFrom('(?:ab|b:)', '(?:a|ab)', '(?<G>a1|b)') },
      { weight: 2, arbitrary: fc.tuple(fc.constantFrom('(?:', '(?<G>', '('), tie('sequence'), fc.constantFrom(')', ')?', ')?', ')+'))
        .map(([open, body, close]) => open + body + close) },
    ),
    sequence: fc.array(tie('element'), { maxLength: 4 }).map((parts) => parts.join('')),
  })).element;
  const pattern = fc.tuple(fc.boolean(), fc.array(element, { minLength: 1, maxLength: 5 }), fc.boolean())
    .map(([start, parts, end]) => {
      let count = 0;
      return `${start ? '^' : ''}${parts.join('')}${end ? '$' : ''}`.replace(/\(\?<G>/g, () => `(?<g${count++}>`);
    });
  const line = fc.array(fc.constantFrom('a', 'b', 'ab', ':', ' ', '  ', '=', '1', '23', '.', '\t', '\r', 'x_', '-'), { maxLength: 12 })
    .map((pieces) => pieces.join(''));

  it('agrees on 30 random lines for each of 3000 random patterns (seeded)', () => {
    let compiled = 0;
    fc.assert(fc.property(pattern, fc.array(fc.tuple(line, fc.nat(), fc.nat(15)), { minLength: 30, maxLength: 30 }), (source, cases) => {
      const byte = compileBytePattern(source);
      if (byte === undefined) return;
      compiled++;
      const regex = new RegExp(source, 'dg');
      for (const [text, fromSeed, pad] of cases) compareOn(source, byte, regex, text, fromSeed % 4 === 0 ? fromSeed % (text.length + 2) : 0, pad);
    }), { numRuns: 3000, seed: 0xb17e5 });
    // The check above is only meaningful if a good share of the random patterns compiles.
    expect(compiled).toBeGreaterThan(600);
  });
});

describe('arbitrary strings of regular-expression characters', () => {
  const character = fc.constantFrom('a', 'b', '1', ' ', ':', '(', ')', '?', '<', '>', '=', '!', '*', '+', '{', '}', '[', ']',
    '^', '$', '|', '\\', '.', '-', ',', 's', 'S', 'd', 'w', 'b', 'B', 'k', 't', '0', '2', 'x', 'u', 'c');
  const source = fc.array(character, { maxLength: 12 }).map((chars) => chars.join(''));
  const line = fc.array(fc.constantFrom('a', 'b', '1', ' ', ':', '<', '=', '{', '}', ']', '[', '-', 'x', '\\', '.', '\t'), { maxLength: 10 })
    .map((pieces) => pieces.join(''));

  it('never make the compiler throw; what compiles agrees with V8 (seeded)', () => {
    fc.assert(fc.property(source, fc.array(fc.tuple(line, fc.nat(), fc.nat(15)), { minLength: 10, maxLength: 10 }), (text, cases) => {
      const byte = compileBytePattern(text);
      if (byte === undefined) return;
      const regex = new RegExp(text, 'dg');
      for (const [subject, fromSeed, pad] of cases) compareOn(text, byte, regex, subject, fromSeed % 4 === 0 ? fromSeed % (subject.length + 2) : 0, pad);
    }), { numRuns: 5000, seed: 0xfa11 });
  });
});

describe('compileBytePattern refuses what it cannot prove equal to V8', () => {
  const refused: [string, string][] = [
    ['^FATAL|ERROR', 'alternation at the top level'],
    ['(?:ab|abc)', 'a word that is a prefix of another'],
    ['(?:a|)', 'an empty alternative'],
    ['(?:a+|b)', 'an alternative that is not a plain word'],
    ['a*?', 'lazy quantifier'],
    ['\\s+?x', 'lazy quantifier'],
    ['(?:ab)??', 'lazy optional group'],
    ['(a|b)*', 'star on a group'],
    ['(?:x)+', 'plus on a group'],
    ['(\\s*)*', 'star on a group'],
    ['(?:x){2}', 'a counted group'],
    ['(a)\\1', 'backreference'],
    ['(?<w>a)\\k<w>', 'named backreference'],
    ['a(?=b)', 'lookahead'],
    ['a(?!b)', 'negative lookahead'],
    ['(?<=a)b', 'lookbehind'],
    ['\\s*\\s*x', 'the continuation \\s*x can begin with \\s, which the first \\s* also takes'],
    ['\\S+\\S+', 'the continuation begins with \\S'],
    ['.*foo', 'the continuation begins with f, which . also takes'],
    ['a*a', 'the continuation begins with a'],
    ['(?:ab)?a', 'FIRST of the optional group meets its continuation'],
    ['(?:a)?\\b', 'the continuation \\b is not trivial and can be empty'],
    ['x\\s*\\b', 'the continuation \\b can succeed without a byte'],
    ['mass\\s*:?\\s*(?<v>\\S+)', 'equal to V8 in fact, but \\s* is followed by :?\\s*, which can begin with a blank: not provable by the rule'],
    ['\\]\\s+(?<message>.*)$', 'likewise: .* can begin with a blank'],
    ['(?<w>[a-z]*)\\b', 'a word class that may be empty before \\b'],
    ['(?<w>[a-z:]+)\\b', 'a class of word and non-word bytes before \\b'],
    ['\\Bx', '\\B'],
    ['\\x41', 'hex escape'],
    ['\\u0041', 'unicode escape'],
    ['\\p{L}', 'property escape (without u: a letter escape)'],
    ['\\0', 'NUL escape'],
    ['\\cA', 'control escape'],
    ['\\a', 'identity escape of a letter'],
    ['[\\b]', 'backspace in a class'],
    ['[\\d-z]', 'class escape as a range end'],
    ['é', 'non-ASCII character'],
    ['a{', 'a literal brace'],
    ['x^', '^ not first'],
    ['(?:x$)', '$ inside a group'],
    ['$x', '$ not last'],
    ['\\b+', 'quantified assertion (invalid in V8 too)'],
    ['(', 'invalid regular expression'],
    ['[z-a]', 'invalid range'],
  ];
  it.each(refused)('%j (%s)', (source) => {
    expect(compileBytePattern(source)).toBeUndefined();
  });

  it('accepts the safe neighbours of refused patterns (the rule, not a blanket refusal)', () => {
    for (const source of ['\\s*x', '\\S+\\s+\\S+', '[^f]*foo', '\\d+(?:\\.\\d*)?', '(?:ab)?c', 'x\\s*', '\\d+\\.?\\d*', '\\s*\\bx', '(?:iter|step)', '\\d+\\b', '[ :]+\\b']) {
      expect(compileBytePattern(source), source).toBeDefined();
    }
  });
});

describe('BytePattern by hand (expected values checked against V8 in the same test)', () => {
  function run(source: string, line: string, from = 0): Outcome | null {
    const pattern = compileBytePattern(source);
    if (pattern === undefined) throw new Error(`${source} refused`);
    const answer = byteAnswer(pattern, line, from, 'pre', 'post');
    expect(answer).toEqual(reference(new RegExp(source, 'dg'), pattern.groupNames, line, from));
    return answer;
  }
  const block = '^\\s*monitor\\s+(?<name>\\S+)\\s+(?<value>\\S+)(?:\\s+\\[(?<unit>[^\\]]*)\\])?';

  it('an optional unit present, absent, and partial (no closing bracket: the group is skipped)', () => {
    expect(run(block, '  monitor   dp   1.2040e+02  [Pa]')?.groups).toEqual([[12, 14], [17, 27], [30, 32]]);
    expect(run(block, 'monitor x 1')?.groups).toEqual([[8, 9], [10, 11], [-1, -1]]);
    expect(run(block, 'monitor x 1 [Pa')).toEqual({ start: 0, end: 11, groups: [[8, 9], [10, 11], [-1, -1]] });
  });

  it('an empty line and a line of blanks', () => {
    expect(run('^\\s*$', '')).toEqual({ start: 0, end: 0, groups: [] });
    expect(run('^\\s*$', ' \t  ')).toEqual({ start: 0, end: 4, groups: [] });
    expect(run('\\S', '')).toBeNull();
    expect(run('\\S', '    ')).toBeNull();
    expect(run('x*', '')).toEqual({ start: 0, end: 0, groups: [] });
  });

  it('a \\r mid-line: . stops at it, \\s takes it', () => {
    expect(run('a.*', 'ab\rcd')).toEqual({ start: 0, end: 2, groups: [] });
    expect(run('b\\s+c', 'ab\r c')).toEqual({ start: 1, end: 5, groups: [] });
  });

  it('a match at the last byte, and $ with trailing blanks', () => {
    expect(run('(?<v>\\d)$', 'value 7')).toEqual({ start: 6, end: 7, groups: [[6, 7]] });
    expect(run('(?<v>\\d)$', 'value 7  ')).toBeNull();
    expect(run('(?<v>\\d)\\s*$', 'value 7  ')).toEqual({ start: 6, end: 9, groups: [[6, 7]] });
  });

  it('searches from `from`, and ^ only matches at the line start', () => {
    expect(run('\\d+', 'a 12 b 345', 3)).toEqual({ start: 3, end: 4, groups: [] });
    expect(run('\\d+', 'a 12 b 345', 5)).toEqual({ start: 7, end: 10, groups: [] });
    expect(run('^a', 'aaa', 1)).toBeNull();
    expect(run('x*', 'abc', 3)).toEqual({ start: 3, end: 3, groups: [] });
    expect(run('x*', 'abc', 4)).toBeNull();
  });

  it('\\b sees the line bounds, not the bytes around the line in the buffer', () => {
    expect(run('\\bres\\b', 'res')).toEqual({ start: 0, end: 3, groups: [] });
    expect(run('\\bres\\b', 'xres res_p res')).toEqual({ start: 11, end: 14, groups: [] });
  });

  it('an optional group that can only match empty does not take part (V8: undefined)', () => {
    expect(run('(?<x>a*)?b', 'b')).toEqual({ start: 0, end: 1, groups: [[-1, -1]] });
    expect(run('(?<x>a*)?b', 'aab')).toEqual({ start: 0, end: 3, groups: [[0, 2]] });
  });

  it('gives start bytes for anchored patterns that must consume a byte, and none otherwise', () => {
    expect(compileBytePattern('^#')?.startBytes?.[35]).toBe(1);
    expect(compileBytePattern('^#')?.startBytes?.[32]).toBe(0);
    const residual = compileBytePattern('^\\s*residual\\s+(?<name>\\S+)')?.startBytes;
    expect([residual?.[32], residual?.[9], residual?.[114], residual?.[109]]).toEqual([1, 1, 1, 0]);
    expect(compileBytePattern('residual')?.startBytes).toBeUndefined();
    expect(compileBytePattern('^\\s*')?.startBytes).toBeUndefined();
    const afterBlanks = compileBytePattern('^\\s*residual\\s+(?<name>\\S+)')?.startBytesAfterBlanks;
    expect([afterBlanks?.[114], afterBlanks?.[109], afterBlanks?.[32]]).toEqual([1, 0, 0]);
    // ^\s*$ matches only lines of blanks: no byte may follow the blanks.
    expect(compileBytePattern('^\\s*$')?.startBytesAfterBlanks?.some((b) => b !== 0)).toBe(false);
    expect(compileBytePattern('^ *x')?.startBytesAfterBlanks).toBeUndefined();
  });

  it('reports its groups, their indices and the caps size', () => {
    const pattern = compileBytePattern('^\\s*residual\\s+(?<name>\\S+)\\s+(?<value>\\S+)');
    expect(pattern?.groupNames).toEqual(['name', 'value']);
    expect(pattern?.groupIndex('value')).toBe(1);
    expect(pattern?.groupIndex('unit')).toBe(-1);
    expect(pattern?.capsLength).toBe(4);
    expect(pattern?.source).toBe('^\\s*residual\\s+(?<name>\\S+)\\s+(?<value>\\S+)');
  });
});

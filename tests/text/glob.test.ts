import { describe, expect, it } from 'vitest';
import { compileGlob, globMatcher } from '../../src/text/glob.js';

// Expected values follow the glob rules as the project documents them (src/text/glob.ts: `*` any run,
// `?` one character, everything else literal, whole name) — the same rules as POSIX shell pattern
// matching (IEEE Std 1003.1-2017, XCU 2.13.1) without bracket expressions.
describe('compileGlob', () => {
  it.each([
    ['res_*', 'res_p', true],
    ['res_*', 'res_', true], // `*` may match nothing
    ['res_*', 'xres_p', false], // whole name: anchored at the start
    ['*_p', 'res_p_old', false], // anchored at the end
    ['res_?', 'res_T', true],
    ['res_?', 'res_Ux', false], // `?` is exactly one
    ['res_?', 'res_', false],
    ['a.b', 'a.b', true],
    ['a.b', 'axb', false], // `.` is literal
    ['c+(d)', 'c+(d)', true], // metacharacters literal
    ['[x]', '[x]', true],
    ['[x]', 'x', false], // no bracket expressions
    ['a*', 'a\nb', true], // `*` crosses line breaks
    ['?', 'é', true],
    ['?', '😀', true], // one code point, though two UTF-16 units
    ['?', '', false],
    ['', '', true],
    ['', 'a', false],
  ])('%j against %j → %s', (glob, name, expected) => {
    expect(compileGlob(glob)(name)).toBe(expected);
  });

  it('keeps no state between calls: the same test answers the same way repeatedly (no lastIndex drift)', () => {
    const test = compileGlob('res_*');
    expect([test('res_p'), test('res_p'), test('res_p')]).toEqual([true, true, true]);
  });
});

describe('globMatcher (parser kinds, --residual/--quantity, log-path globs)', () => {
  it('is true when any glob matches', () => {
    const test = globMatcher(['res_*', 'drag']);
    expect(['res_p', 'drag', 'lift', 'dragx'].map(test)).toEqual([true, true, false, false]);
  });
  it('matches nothing for an empty list', () => {
    expect(globMatcher([])('')).toBe(false);
    expect(globMatcher([])('res_p')).toBe(false);
  });
  it('keeps each glob whole inside the alternation (no leaking `|`)', () => {
    expect(globMatcher(['a|b'])('a')).toBe(false);
    expect(globMatcher(['a|b'])('a|b')).toBe(true);
    expect(globMatcher(['ab', 'c'])('abc')).toBe(false);
  });
  it('does not mutate the list it is given', () => {
    const globs = Object.freeze(['res_*']);
    globMatcher(globs);
    expect(globs).toEqual(['res_*']);
  });
});

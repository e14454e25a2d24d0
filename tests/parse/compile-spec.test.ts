import { describe, expect, it } from 'vitest';
import { compileSpec } from '../../src/parse/compile-spec.js';
import type { ParserSpec } from '../../src/parse/parser-spec.js';
import type { KindOverrides } from '../../src/parse/record-parser.js';
import { linesOf, NO_OVERRIDES, plain, runChoice } from './parse-helpers.js';

function run(spec: Omit<ParserSpec, 'id' | 'description' | 'detect'>, text: string, overrides: KindOverrides = NO_OVERRIDES) {
  const full: ParserSpec = { id: 'test', description: 'test spec', detect: { patterns: ['.'] }, ...spec };
  return runChoice({ id: 'test', explanation: '', create: compileSpec(full, overrides), spec: full, overrides }, linesOf(text));
}

describe('compiled parsers: counters and restarts', () => {
  const kv: Omit<ParserSpec, 'id' | 'description' | 'detect'> = { counters: { iteration: 'it' }, lines: { rules: [{ keyValues: {} }] } };

  it('a counter going back marks the record as a restart and counts it; it is not an error', () => {
    const { records, stats } = run(kv, 'it=1 r=1\nit=2 r=0.5\nit=3 r=0.25\nit=2 r=0.6\nit=3 r=0.3\nit=3 r=0.2\n');
    expect(records.map((r) => [r.iteration, r.restart ?? false])).toEqual([[1, false], [2, false], [3, false], [2, true], [3, false], [3, false]]);
    expect(stats).toMatchObject({ records: 6, restarts: 1, unmatched: 0 });
  });

  it('noteRestart() marks the next record even when its counter goes on', () => {
    const { parser, records } = run(kv, 'it=1 r=1\n');
    parser.noteRestart();
    parser.pushLine('it=2 r=0.5');
    parser.pushLine('it=3 r=0.4');
    expect(records.map((r) => r.restart ?? false)).toEqual([false, true, false]);
    expect(parser.stats().restarts).toBe(1);
  });

  it('transient: a time step going back is a restart; inner iterations are counted when not printed', () => {
    const spec = { counters: { step: 'step' }, lines: { rules: [{ keyValues: {} }] } };
    const { records } = run(spec, 'step=1 r=1\nstep=1 r=0.1\nstep=2 r=1\nstep=1 r=0.9\n');
    expect(records.map((r) => [r.iteration, r.timeStep, r.inner, r.restart ?? false])).toEqual(
      [[1, 1, 1, false], [2, 1, 2, false], [3, 2, 1, false], [4, 1, 1, true]]);
  });

  it('transient with time only: each new time is a new step; time and step carry over from a header line', () => {
    const spec = { lines: { rules: [
      { match: '^Time = (?<time>\\S+)' },
      { match: '^\\s+p residual (?<res_p>\\S+)' },
    ] } };
    const { records } = run(spec, 'Time = 0.1\n  p residual 1e-1\n  p residual 1e-3\nTime = 0.2\n  p residual 1e-2\n');
    expect(records.map(plain)).toEqual([
      { iteration: 1, timeStep: 1, inner: 1, time: 0.1, values: { res_p: 0.1 } },
      { iteration: 2, timeStep: 1, inner: 2, time: 0.1, values: { res_p: 1e-3 } },
      { iteration: 3, timeStep: 2, inner: 1, time: 0.2, values: { res_p: 1e-2 } },
    ]);
  });
});

describe('compiled parsers: series from rules', () => {
  it('values maps groups to series names, kinds, units and labels', () => {
    const { records, info } = run({ lines: { rules: [{
      match: '^It (?<iteration>\\d+) \\| p (?<p>\\S+) \\| drag (?<drag>\\S+)',
      values: { p: { series: 'res_p', kind: 'residual' }, drag: { kind: 'quantity', unit: 'N', label: 'drag force' } },
    }] } }, 'It 12 | p 1e-3 | drag 0.5\n');
    expect(records.map(plain)).toEqual([{ iteration: 12, values: { res_p: 1e-3, drag: 0.5 } }]);
    expect(info.get('res_p')).toEqual({ name: 'res_p', kind: 'residual' });
    expect(info.get('drag')).toEqual({ name: 'drag', kind: 'quantity', unit: 'N', label: 'drag force' });
  });

  it('pairs with repeat take every name/value match along the line; kinds from globs, else defaultKind', () => {
    const { records, info } = run({
      kinds: [{ names: 'R?', kind: 'residual' }], defaultKind: 'other',
      lines: { rules: [{ match: '(?<name>[A-Za-z]+)\\((?<value>[^)]*)\\)', pairs: { repeat: true } }] },
    }, 'Rp(1.0e-2) Ru(2.0e-2) cfl(0.8) junk(abc)\n');
    expect(records.map(plain)).toEqual([{ iteration: 1, values: { Rp: 0.01, Ru: 0.02, cfl: 0.8 } }]);
    expect([...info.values()].map((s) => `${s.name}:${s.kind}`)).toEqual(['Rp:residual', 'Ru:residual', 'cfl:other']);
  });

  it('user kind overrides (globs) win over the spec: --residual first, then --quantity', () => {
    const spec = { kinds: [{ names: 'res_*', kind: 'residual' as const }], lines: { rules: [{ keyValues: {} }] } };
    const { info } = run(spec, 'res_p=1 res_u=1 cd=0.3 cl=0.1 mass_err=1e-5\n', { residual: ['mass_*'], quantity: ['res_u', 'c?'] });
    expect([...info.values()].map((s) => `${s.name}:${s.kind}`)).toEqual(
      ['res_p:residual', 'res_u:quantity', 'cd:quantity', 'cl:quantity', 'mass_err:residual']);
  });

  it('ignore lines are neither data nor unmatched; blank lines are not unmatched; others are sampled', () => {
    const { stats } = run({ ignore: ['^#'], lines: { rules: [{ keyValues: {} }] } }, '# comment\n\n   \nhello\nx=1\nworld\n');
    expect(stats).toMatchObject({ lines: 6, unmatched: 2, unmatchedSample: ['hello', 'world'], records: 1 });
  });

  it('the unmatched sample keeps 10 lines, each cut to 160 characters', () => {
    const text = Array.from({ length: 15 }, (_, i) => `${'z'.repeat(200)}${i}`).join('\n');
    const { stats } = run({ lines: { rules: [{ keyValues: {} }] } }, text);
    expect(stats.unmatched).toBe(15);
    expect(stats.unmatchedSample).toHaveLength(10);
    expect(stats.unmatchedSample.every((l) => l.length === 160 && l.endsWith('…'))).toBe(true);
  });

  it('name/value scanning accepts blanks around the sign, commas between pairs, and another sign', () => {
    const { records } = run({ lines: { rules: [{ keyValues: { assign: ':' } }] } }, 'at 12:30:05, mass: 1.5,  energy :2e3; note: n/a\n');
    expect(records.map(plain)).toEqual([{ iteration: 1, values: { mass: 1.5, energy: 2000 } }]);
  });

  it('the same names on every line are read correctly when a line changes them', () => {
    const { records } = run({ lines: { rules: [{ keyValues: {} }] } }, 'a=1 b=2\na=3 c=4\nb=5 a=6\n');
    expect(records.map(plain).map((r) => r.values)).toEqual([{ a: 1, b: 2 }, { a: 3, c: 4 }, { b: 5, a: 6 }]);
  });
});

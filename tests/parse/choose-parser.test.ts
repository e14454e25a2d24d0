import { beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chooseParser } from '../../src/parse/choose-parser.js';
import { loadParserSpecs } from '../../src/parse/load-parser-specs.js';
import { InputError, UsageError } from '../../src/errors.js';
import type { KindOverrides } from '../../src/parse/record-parser.js';
import { linesOf, NO_OVERRIDES, plain, runChoice } from './parse-helpers.js';

const builtIns = loadParserSpecs({ files: [], configDir: null });

function choose(text: string, overrides: KindOverrides = NO_OVERRIDES, specs = builtIns) {
  const lines = linesOf(text);
  const choice = chooseParser(lines, { specs, overrides, source: 'case/run.log' });
  return { choice, ...runChoice(choice, lines) };
}

/** Residuals of a Jacobi-like iteration: r(k) = 0.5^k (falls one decade every 3.3 iterations). */
function falling(k: number): string {
  return (0.5 ** k).toExponential(4);
}

describe('chooseParser: detection of the built-in formats', () => {
  const samples: [string, string][] = [
    ['settle-kv', 'iter=1 res_p=1.0 nu_hot=1.0\niter=2 res_p=0.5 nu_hot=1.1\n'],
    ['settle-kv', 'step=1 time=1.000e-02 inner=1 res_p=1.0e+00 lift=0.0120\nstep=1 time=1.000e-02 inner=2 res_p=3.1e-02 lift=0.0121\n'],
    ['settle-block', '=== iteration 1 ===\n  residual  res_p  1.0\n  monitor   dp     120.4  [Pa]\n=== iteration 2 ===\n  residual  res_p  0.5\n'],
    ['settle-table', '   iter   res_p   nu_hot\n   1   1.0   1.0\n   2   0.5   1.1\n'],
    ['settle-csv', 'iter,res_p,nu_hot\n1,1.0,1.0\n2,0.5,1.1\n'],
    ['settle-jsonl', '{"iter":1,"res_p":1.0,"nu_hot":1.0}\n{"iter":2,"res_p":0.5,"nu_hot":"NaN"}\n'],
  ];
  it.each(samples)('picks %s', (id, text) => {
    const { choice, records } = choose(text);
    expect(choice.id).toBe(id);
    expect(choice.explanation).toMatch(new RegExp(`^spec ${id} \\(built-in\\): \\d+ of the first \\d+ lines match`));
    expect(records.length).toBeGreaterThanOrEqual(2);
  });

  it('prefers a fitting user spec over the built-ins', () => {
    const dir = mkdtempSync(join(tmpdir(), 'settle-choose-'));
    try {
      const file = join(dir, 'kv-too.json');
      writeFileSync(file, JSON.stringify({
        id: 'my-kv', description: 'also kv', detect: { patterns: ['^iter='] },
        counters: { iteration: 'iter' }, lines: { rules: [{ keyValues: {} }] },
      }));
      const specs = loadParserSpecs({ files: [file], configDir: null });
      const { choice } = choose('iter=1 res_p=1.0\niter=2 res_p=0.5\n', NO_OVERRIDES, specs);
      expect(choice.id).toBe('my-kv');
      expect(choice.explanation).toContain(file);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('uses a forced id without detection, and lists the known ids for an unknown one', () => {
    const lines = ['iter=1 res_p=1.0'];
    expect(chooseParser(lines, { specs: builtIns, forcedId: 'settle-csv', overrides: NO_OVERRIDES, source: 'x' }).explanation)
      .toBe('spec settle-csv (built-in): chosen with --parser');
    expect(() => chooseParser(lines, { specs: builtIns, forcedId: 'nope', overrides: NO_OVERRIDES, source: 'x' })).toThrow(UsageError);
    try {
      chooseParser(lines, { specs: builtIns, forcedId: 'nope', overrides: NO_OVERRIDES, source: 'x' });
    } catch (error) {
      expect((error as UsageError).hint).toMatch(/known ids: settle-block, settle-csv, settle-jsonl, settle-kv, settle-table/);
    }
  });
});

describe('chooseParser: inference for logs no spec fits', () => {
  let table: string;
  beforeAll(() => {
    const rows = Array.from({ length: 12 }, (_, i) => `${String(i + 1).padStart(5)}  ${falling(i)}  ${falling(i + 1)}  ${(0.61 + 0.001 * i).toFixed(4)}  ${(300 + i).toFixed(1)}`);
    table = ['Solver v2 starting', ' Iter  Continuity  X-momentum  Cd  T_out', ...rows.slice(0, 6), 'writing checkpoint', ' Iter  Continuity  X-momentum  Cd  T_out', ...rows.slice(6)].join('\n');
  });

  it('a whitespace table under a header whose names are not ours', () => {
    const { choice, records, info } = choose(table);
    expect(choice.id).toBe('inferred');
    expect(choice.explanation).toBe("inferred: whitespace table with 5 numeric columns under the header 'Iter Continuity X-momentum Cd T_out'; iteration from 'Iter'; 2 residuals, 2 quantities");
    expect(records.map((r) => r.iteration)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
    expect(records[0].values.get('Continuity')).toBe(1);
    // Continuity and X-momentum fall 0.5 per row: 11 rows = 3.3 decades, so residuals by behaviour.
    expect([...info.values()].map((s) => `${s.name}:${s.kind}`)).toEqual(['Continuity:residual', 'X-momentum:residual', 'Cd:quantity', 'T_out:quantity']);
  });

  it('a semicolon table; the iteration is the strictly increasing integer column when no name says so', () => {
    const { choice, records } = choose('n;rms_p;flux\n10;1e-1;3.0\n20;1e-2;3.1\n30;1e-3;3.1\n');
    expect(choice.explanation).toMatch(/^inferred: semicolon-separated table with 3 numeric columns .*; iteration from 'n';/);
    expect(records.map((r) => r.iteration)).toEqual([10, 20, 30]);
  });

  it("repeated 'name = value' pairs", () => {
    const { choice, records, info } = choose('Step = 1, resid = 1.0e-2, drag = 0.50\nStep = 2, resid = 1.0e-3, drag = 0.51\n');
    expect(choice.explanation).toBe("inferred: 'name = value' pairs on 2 lines (3 names); iteration from 'Step'; 1 residual, 1 quantity");
    expect(records.map(plain)).toEqual([
      { iteration: 1, values: { resid: 0.01, drag: 0.5 } },
      { iteration: 2, values: { resid: 0.001, drag: 0.51 } },
    ]);
    expect(info.get('resid')?.kind).toBe('residual');
  });

  it("repeated 'name: value' pairs, with a running count when no counter is named", () => {
    const { choice, records } = choose('started at 12:00:01\nmass: 3.0  energy: 1e5\nmass: 3.1  energy: 9e4\nmass: 3.1  energy: 8e4\n');
    expect(choice.explanation).toMatch(/^inferred: 'name: value' pairs on 3 lines \(2 names\); iterations counted;/);
    expect(records.map((r) => r.iteration)).toEqual([1, 2, 3]);
  });

  it('user overrides win over inferred kinds', () => {
    const { info } = choose(table, { residual: ['Cd'], quantity: ['Cont*'] });
    expect(info.get('Cd')?.kind).toBe('residual');
    expect(info.get('Continuity')?.kind).toBe('quantity');
  });

  it('nothing numeric: InputError naming the log, with a hint to write a spec', () => {
    const attempt = () => chooseParser(['hello', 'the solver is thinking', 'done'], { specs: builtIns, overrides: NO_OVERRIDES, source: 'case/run.log' });
    expect(attempt).toThrow(InputError);
    expect(attempt).toThrow(/^no iterations found in case\/run\.log: /);
    try { attempt(); } catch (error) { expect((error as InputError).hint).toMatch(/parser spec.*settle parsers list/); }
  });
});

describe('chooseParser: a live log that so far holds only a header', () => {
  it.each([['settle-table', '      iter        res_p        res_u'], ['settle-csv', 'iter,res_p,res_u']])('still picks %s', (id, header) => {
    const choice = chooseParser([header], { specs: builtIns, overrides: NO_OVERRIDES, source: 'live.log' });
    expect(choice.id).toBe(id);
    const { records } = runChoice(choice, [header, id === 'settle-csv' ? '1,1.0,0.5' : '  1  1.0  0.5']);
    expect(records.map(plain)).toEqual([{ iteration: 1, values: { res_p: 1, res_u: 0.5 } }]);
  });

  it('prefers a spec whose trial parse yields records over one that only matches its detection patterns', () => {
    const dir = mkdtempSync(join(tmpdir(), 'settle-choose-'));
    try {
      const file = join(dir, 'greedy.json');
      // Detection matches every line, but the rules read nothing from these logs.
      writeFileSync(file, JSON.stringify({ id: 'greedy', description: 'x', detect: { patterns: ['.'] }, lines: { rules: [{ match: '^never (?<x>\\d+)' }] } }));
      const mine = loadParserSpecs({ files: [file], configDir: null }).filter((s) => !s.builtIn);
      const other = { ...mine[0], id: 'reader', spec: { ...mine[0].spec, id: 'reader', detect: { patterns: ['^iter='] }, lines: { rules: [{ keyValues: {} }] } } };
      const choice = chooseParser(['iter=1 a=1', 'iter=2 a=2', 'noise'], { specs: [...mine, other], overrides: NO_OVERRIDES, source: 'x' });
      expect(choice.id).toBe('reader');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('chooseParser: more inferred shapes', () => {
  it('JSON objects without our keys; the counter from a key named like a step', () => {
    const { choice, records } = choose('{"Step": 5, "L2": 0.1, "name": "run"}\n{"Step": 6, "L2": 0.01, "name": "run"}\n');
    expect(choice.explanation).toBe("inferred: JSON objects on 2 lines; iteration from 'Step'; 0 residuals, 1 quantity");
    expect(records.map(plain)).toEqual([{ iteration: 5, values: { L2: 0.1 } }, { iteration: 6, values: { L2: 0.01 } }]);
  });

  it('a bar-separated table (| a | b |)', () => {
    const { choice, records } = choose('| it | resid | T |\n| 1 | 1e-1 | 300 |\n| 2 | 1e-2 | 301 |\n');
    expect(choice.explanation).toMatch(/^inferred: bar-separated table with 3 numeric columns/);
    expect(records.map(plain)).toEqual([{ iteration: 1, values: { resid: 0.1, T: 300 } }, { iteration: 2, values: { resid: 0.01, T: 301 } }]);
  });

  it('a transient table: step and inner columns become counters; time repeats within a step', () => {
    const { records } = choose('step inner time res_p\n1 1 0.1 1.0\n1 2 0.1 0.01\n2 1 0.2 1.0\n');
    expect(records.map(plain)).toEqual([
      { iteration: 1, timeStep: 1, inner: 1, time: 0.1, values: { res_p: 1 } },
      { iteration: 2, timeStep: 1, inner: 2, time: 0.1, values: { res_p: 0.01 } },
      { iteration: 3, timeStep: 2, inner: 1, time: 0.2, values: { res_p: 1 } },
    ]);
  });
});

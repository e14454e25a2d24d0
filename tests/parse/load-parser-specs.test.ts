import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadParserSpecs, defaultConfigDir } from '../../src/parse/load-parser-specs.js';
import { InputError, SpecError } from '../../src/errors.js';

let dir: string;
beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'settle-specs-')); });
afterAll(() => { rmSync(dir, { recursive: true, force: true }); });

function specFile(name: string, content: unknown): string {
  const path = join(dir, name);
  writeFileSync(path, typeof content === 'string' ? content : JSON.stringify(content, null, 2));
  return path;
}

const valid = {
  $schema: '../parsers/parser-spec.schema.json',
  id: 'my-solver',
  description: 'my solver: "It 12 | p 1e-3 | drag 0.5"',
  detect: { patterns: ['^It \\d+ \\|'] },
  lines: { rules: [{ match: '^It (?<iteration>\\d+) \\| p (?<p>\\S+) \\| drag (?<drag>\\S+)', values: { p: { series: 'res_p', kind: 'residual' }, drag: { kind: 'quantity', unit: 'N', label: 'drag force' } } }] },
};

function problemsOf(path: string): string[] {
  try {
    loadParserSpecs({ files: [path], configDir: null });
  } catch (error) {
    if (error instanceof SpecError) return [...error.problems];
    throw error;
  }
  throw new Error('expected a SpecError');
}

describe('loadParserSpecs', () => {
  it('loads the five built-in specs from the top-level parsers/ folder', () => {
    const specs = loadParserSpecs({ files: [], configDir: null });
    expect(specs.map((s) => s.id)).toEqual(['settle-block', 'settle-csv', 'settle-jsonl', 'settle-kv', 'settle-table']);
    expect(specs.every((s) => s.builtIn && s.file.endsWith(`parsers/${s.id}.json`) && s.description.length > 0)).toBe(true);
  });

  it('adds user files after the built-ins, with their absolute path', () => {
    const path = specFile('my-solver.json', valid);
    const specs = loadParserSpecs({ files: [path], configDir: null });
    const mine = specs[specs.length - 1];
    expect(mine).toMatchObject({ id: 'my-solver', builtIn: false, file: path, description: valid.description });
  });

  it('reads *.json from the config folder (not *.schema.json), and none when the folder is disabled or absent', () => {
    const config = join(dir, 'config-a');
    mkdirSync(config);
    writeFileSync(join(config, 'b.json'), JSON.stringify({ ...valid, id: 'from-config' }));
    writeFileSync(join(config, 'notes.txt'), 'not a spec');
    writeFileSync(join(config, 'x.schema.json'), '{}');
    expect(loadParserSpecs({ files: [], configDir: config }).filter((s) => !s.builtIn).map((s) => s.id)).toEqual(['from-config']);
    expect(loadParserSpecs({ files: [], configDir: null }).some((s) => !s.builtIn)).toBe(false);
    expect(loadParserSpecs({ files: [], configDir: join(dir, 'no-such-folder') }).some((s) => !s.builtIn)).toBe(false);
  });

  it('finds the default config folder through XDG_CONFIG_HOME (XDG Base Directory Specification)', () => {
    const saved = process.env.XDG_CONFIG_HOME;
    try {
      process.env.XDG_CONFIG_HOME = join(dir, 'xdg');
      expect(defaultConfigDir()).toBe(join(dir, 'xdg', 'settle', 'parsers'));
      mkdirSync(defaultConfigDir(), { recursive: true });
      writeFileSync(join(defaultConfigDir(), 'x.json'), JSON.stringify({ ...valid, id: 'from-xdg' }));
      expect(loadParserSpecs({ files: [] }).some((s) => s.id === 'from-xdg' && !s.builtIn)).toBe(true);
    } finally {
      if (saved === undefined) delete process.env.XDG_CONFIG_HOME; else process.env.XDG_CONFIG_HOME = saved;
    }
  });

  it('lets a user spec replace the built-in spec of the same id', () => {
    const path = specFile('kv-mine.json', { ...valid, id: 'settle-kv' });
    const specs = loadParserSpecs({ files: [path], configDir: null });
    expect(specs.filter((s) => s.id === 'settle-kv')).toHaveLength(1);
    expect(specs.find((s) => s.id === 'settle-kv')?.builtIn).toBe(false);
  });

  it('rejects two user specs with one id', () => {
    const a = specFile('dup-a.json', valid);
    const b = specFile('dup-b.json', valid);
    expect(() => loadParserSpecs({ files: [a, b], configDir: null })).toThrow(/id: 'my-solver' is already used by .*dup-a\.json/);
  });

  it('a missing file is an InputError naming it', () => {
    expect(() => loadParserSpecs({ files: [join(dir, 'nope.json')], configDir: null })).toThrow(InputError);
    expect(() => loadParserSpecs({ files: [join(dir, 'nope.json')], configDir: null })).toThrow(/nope\.json does not exist/);
  });

  it('malformed JSON is a SpecError with the line and column of the fault', () => {
    const path = specFile('broken.json', '{\n  "id": "x",\n  "description": "y",\n}\n');
    const problems = problemsOf(path);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatch(/^line 4, column 1: not valid JSON/);
    // 29 characters, the string never closes: the fault is at the end, column 30.
    const unterminated = specFile('broken2.json', '{"id": "x", "description": "y');
    expect(problemsOf(unterminated)[0]).toMatch(/^line 1, column 30: not valid JSON/);
  });

  it('lists every schema problem at once, each as file: path.to.field: message', () => {
    const path = specFile('bad-schema.json', {
      id: 'Bad Id',
      detect: { patterns: [], minMatches: 0 },
      kinds: [{ names: 'res_*', kind: 'residuals' }],
      lines: { rules: [{ match: 'x', startsRecord: 'yes', colour: 'red' }] },
      table: { header: '^iter' },
    });
    const problems = problemsOf(path);
    const expected = [
      'description: is required',
      'id: must match pattern',
      'detect.patterns: must NOT have fewer than 1 items',
      'detect.minMatches: must be >= 1',
      'kinds[0].kind: must be one of "residual", "quantity", "other"',
      'lines.rules[0].colour: unknown field',
      'lines.rules[0].startsRecord: must be boolean',
      'table.separator: is required',
      '(top level): give exactly one of lines, table or jsonl',
    ];
    for (const text of expected) expect(problems.some((p) => p.startsWith(`${path}: ${text}`)), text).toBe(true);
    expect(problems).toHaveLength(expected.length);
  });

  it('checks what a schema cannot: pattern syntax, backtracking constructs, capture group names', () => {
    const path = specFile('bad-semantics.json', {
      id: 'bad-semantics', description: 'x', detect: { patterns: ['(unclosed'], minMatches: 5, firstLines: 2 },
      ignore: ['(?<=x)y'],
      failure: ['(a)\\1'],
      counters: { iteration: 'it', step: 'it' },
      lines: { rules: [
        { match: '^p (?<value>\\S+)', values: { val: 'p' } },
        { match: '^(?<label>\\w+) = (?<value>\\S+)', pairs: { nameGroup: 'name' } },
        { match: '^just text$' },
        { keyValues: { assign: ':' }, match: 'x' },
      ] },
    });
    const problems = problemsOf(path).map((p) => p.slice(path.length + 2));
    expect(problems).toEqual([
      expect.stringMatching(/^lines\.rules\[3\]: give exactly one of match or keyValues/),
    ]);
    const fixed = specFile('bad-semantics2.json', {
      id: 'bad-semantics', description: 'x', detect: { patterns: ['(unclosed'], minMatches: 5, firstLines: 2 },
      ignore: ['(?<=x)y'],
      failure: ['(a)\\1'],
      counters: { iteration: 'it', step: 'it' },
      lines: { rules: [
        { match: '^p (?<value>\\S+)', values: { val: 'p' } },
        { match: '^(?<label>\\w+) = (?<value>\\S+)', pairs: { nameGroup: 'name' } },
        { match: '^just text$' },
      ] },
    });
    const all = problemsOf(fixed).map((p) => p.slice(fixed.length + 2));
    expect(all).toEqual([
      expect.stringMatching(/^detect\.patterns\[0\]: not a valid regular expression/),
      'detect.minMatches: 5 is more than detect.firstLines (2)',
      expect.stringMatching(/^ignore\[0\]: lookaround \(\?<= at 0: not allowed/),
      expect.stringMatching(/^failure\[0\]: backreference \\1 at 3: not allowed/),
      "counters: 'it' is named for two counters",
      "lines.rules[0].values.val: the pattern has no group named 'val' (its groups are value)",
      "lines.rules[1].pairs.nameGroup: the pattern has no group named 'name' (its groups are label, value); add (?<name>...)",
      expect.stringMatching(/^lines\.rules\[2\]\.match: the rule yields nothing/),
    ]);
  });

  it('a value of the wrong type is reported once, without the noise of the checks below it', () => {
    expect(problemsOf(specFile('array.json', []))).toEqual([`${join(dir, 'array.json')}: (top level): must be object`]);
  });

  it('a rule whose pattern is refused is still checked for its group names', () => {
    const path = specFile('lookahead.json', {
      id: 'x', description: 'd', detect: { patterns: ['^x'] },
      lines: { rules: [{ match: '^(?<v>\\d+)(?=s)', values: { w: 'z' } }] },
    });
    expect(problemsOf(path).map((p) => p.slice(path.length + 2))).toEqual([
      'lines.rules[0].match: lookaround (?= at 10: not allowed (it can backtrack without bound); match the text itself instead',
      "lines.rules[0].values.w: the pattern has no group named 'w' (its groups are v)",
    ]);
  });
});

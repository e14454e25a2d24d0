import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Command } from 'commander';
import { describe, expect, it } from 'vitest';
import { addCriteriaOptions, criteriaFromOptions } from '../../src/cli/criteria-options.js';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import { SpecError, UsageError } from '../../src/errors.js';

const dir = mkdtempSync(join(tmpdir(), 'settle-criteria-'));
function file(name: string, text: string): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}
function parse(argv: string[]): Record<string, unknown> {
  const command = addCriteriaOptions(new Command('t').exitOverride()).argument('[log...]');
  command.parse(argv, { from: 'user' });
  return command.opts();
}

describe('criteriaFromOptions', () => {
  it('gives the defaults when nothing is set', () => {
    expect(criteriaFromOptions(parse([]))).toEqual(DEFAULT_CRITERIA);
  });

  it('reads every flag, with --series repeatable', () => {
    const c = criteriaFromOptions(parse(['--drop', '4', '--target', '1e-6', '--qoi-tol', '5e-4', '--window', '300',
      '--series', 'res_*', '--series', 'drag', '--startup', '0', '--confirm', '5']));
    expect(c).toEqual({ ...DEFAULT_CRITERIA, drop: 4, target: 1e-6, qoiTol: 5e-4, window: 300, series: ['res_*', 'drag'], startup: 0, confirm: 5 });
  });

  it('lets flags override the file and the file override the defaults', () => {
    const path = file('c.json', JSON.stringify({ drop: 5, window: 400, perSeries: [{ pattern: 'res_T', drop: 6 }] }));
    const c = criteriaFromOptions(parse(['--criteria', path, '--drop', '2']));
    expect(c.drop).toBe(2);
    expect(c.window).toBe(400);
    expect(c.qoiTol).toBe(DEFAULT_CRITERIA.qoiTol);
    expect(c.perSeries).toEqual([{ pattern: 'res_T', drop: 6 }]);
  });

  it.each([
    ['--drop', '0'], ['--drop', '-1'], ['--drop', 'three'], ['--target', '0'], ['--qoi-tol', '1'], ['--qoi-tol', '0'],
    ['--window', '10.5'], ['--window', '0'], ['--window', '1'], ['--window', '4'], ['--startup', '-1'], ['--confirm', '0'], ['--confirm', '1.5'], ['--series', ''],
  ])('rejects %s %s with a usage error and a hint', (flag, value) => {
    let error: unknown;
    try {
      criteriaFromOptions(parse([flag, value]));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(UsageError);
    expect((error as UsageError).message).toContain(flag);
    expect((error as UsageError).hint).toMatch(/for example/);
  });

  it('lists every problem of a criteria file as file: path: message', () => {
    const path = file('bad.json', JSON.stringify({ drop: -1, windw: 5, perSeries: [{ drop: 2 }, { pattern: 'x', qoiTol: 2 }] }));
    let error: unknown;
    try {
      criteriaFromOptions({ criteria: path });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(SpecError);
    const problems = (error as SpecError).problems;
    expect(problems).toEqual(expect.arrayContaining([
      expect.stringMatching(new RegExp(`^${path.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}: drop: `)),
      expect.stringContaining(': windw: is not a criteria field'),
      expect.stringContaining(': perSeries.0.pattern: is required'),
      expect.stringContaining(': perSeries.1.qoiTol: '),
    ]));
    expect(problems).toHaveLength(4);
  });

  it('refuses a criteria file whose window is below 5 iterations (a trend needs 5 points)', () => {
    let error: unknown;
    try {
      criteriaFromOptions({ criteria: file('short-window.json', JSON.stringify({ window: 4 })) });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(SpecError);
    expect((error as SpecError).problems).toEqual([expect.stringMatching(/: window: .*5/)]);
  });

  it('reports invalid JSON and a missing file as user errors', () => {
    expect(() => criteriaFromOptions({ criteria: file('broken.json', '{ "drop": ') })).toThrow(SpecError);
    expect(() => criteriaFromOptions({ criteria: join(dir, 'missing.json') })).toThrow(UsageError);
  });
});

import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expandGlob, expandLogPaths } from '../../src/ui/expand-log-paths.js';
import { UsageError } from '../../src/errors.js';

let root: string;
beforeAll(() => {
  root = mkdtempSync(path.join(tmpdir(), 'settle-expand-'));
  for (const name of ['a.log', 'b.log', 'c.csv', 'notes.md', 'd.jsonl.gz', '.hidden.log']) writeFileSync(path.join(root, name), 'iter=1 res_p=1\n');
  for (const sub of ['case1', 'case2', 'other']) {
    mkdirSync(path.join(root, sub));
    writeFileSync(path.join(root, sub, 'run.log'), 'iter=1 res_p=1\n');
  }
  mkdirSync(path.join(root, 'empty'));
});
afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('expandLogPaths', () => {
  it('keeps a plain file, and a path that does not exist yet (the monitor waits for it)', () => {
    const later = path.join(root, 'later.log');
    expect(expandLogPaths([path.join(root, 'a.log'), later])).toEqual([path.join(root, 'a.log'), later]);
  });

  it('turns a folder into the logs in it, sorted, skipping hidden and other files', () => {
    expect(expandLogPaths([root])).toEqual(['a.log', 'b.log', 'c.csv', 'd.jsonl.gz'].map((name) => path.join(root, name)));
  });

  it('expands a quoted glob in any segment, sorted, without hidden files', () => {
    expect(expandLogPaths([path.join(root, '*.log')])).toEqual([path.join(root, 'a.log'), path.join(root, 'b.log')]);
    expect(expandGlob(path.join(root, 'case?', 'run.log'))).toEqual([path.join(root, 'case1', 'run.log'), path.join(root, 'case2', 'run.log')]);
  });

  it('drops repeats', () => {
    expect(expandLogPaths([path.join(root, 'a.log'), path.join(root, '?.log')])).toEqual([path.join(root, 'a.log'), path.join(root, 'b.log')]);
  });

  it.each([
    [[], 'needs at least one log'],
    [['NO_MATCH/*.log'], "no file matches 'NO_MATCH/*.log'"],
    [['EMPTY'], "folder 'EMPTY' holds no logs"],
    [['-', 'A'], 'standard input (-) cannot be watched together with other logs'],
  ])('refuses %j: %s', (inputs, message) => {
    const resolved = inputs.map((input) => input.replace('NO_MATCH', path.join(root, 'nothing')).replace('EMPTY', path.join(root, 'empty')).replace(/^A$/, path.join(root, 'a.log')));
    const expected = message.replace('NO_MATCH', path.join(root, 'nothing')).replace('EMPTY', path.join(root, 'empty'));
    expect(() => expandLogPaths(resolved)).toThrow(UsageError);
    expect(() => expandLogPaths(resolved)).toThrow(expected);
  });
});

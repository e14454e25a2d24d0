import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PassThrough } from 'node:stream';
import { gzipSync } from 'node:zlib';
import { readLogLines } from '../../src/parse/read-log-lines.js';
import { InputError } from '../../src/errors.js';

let dir: string;
beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'settle-read-lines-')); });
afterAll(() => { rmSync(dir, { recursive: true, force: true }); });

async function read(paths: string[], stdin?: NodeJS.ReadableStream): Promise<string[]> {
  const seen: string[] = [];
  await readLogLines(paths, { onLines: (lines) => seen.push(...lines), onFile: (path, index) => seen.push(`<file ${index}>`) }, stdin);
  return seen;
}

describe('readLogLines', () => {
  it('reads LF and CRLF lines, an unfinished last line, and files of a chain in order', async () => {
    const a = join(dir, 'a.log');
    const b = join(dir, 'b.log');
    writeFileSync(a, 'one\r\ntwo\n\nthree');
    writeFileSync(b, 'four\nfünf\n');
    expect(await read([a, b])).toEqual(['<file 0>', 'one', 'two', '', 'three', '<file 1>', 'four', 'fünf']);
  });

  it('splits lines that straddle chunk boundaries (2 MiB of lines)', async () => {
    const path = join(dir, 'big.log');
    const lines = Array.from({ length: 100_000 }, (_, i) => `iter=${i} res_p=${(1 / (i + 1)).toExponential(6)}`);
    writeFileSync(path, `${lines.join('\n')}\n`);
    const seen = await read([path]);
    expect(seen.length).toBe(lines.length + 1);
    expect(seen.slice(1)).toEqual(lines);
  });

  it('decompresses .gz files and reads standard input for -', async () => {
    const gz = join(dir, 'c.log.gz');
    writeFileSync(gz, gzipSync('x=1\nx=2\n'));
    expect(await read([gz])).toEqual(['<file 0>', 'x=1', 'x=2']);
    const stdin = new PassThrough();
    stdin.end('from\nstdin');
    expect(await read(['-'], stdin)).toEqual(['<file 0>', 'from', 'stdin']);
  });

  it('a missing log is an InputError naming it', async () => {
    await expect(read([join(dir, 'absent.log')])).rejects.toThrow(InputError);
    await expect(read([join(dir, 'absent.log')])).rejects.toThrow(/absent\.log does not exist/);
  });
});

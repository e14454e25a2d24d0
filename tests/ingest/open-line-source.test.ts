import { afterAll, describe, expect, it } from 'vitest';
import { chmodSync, mkdirSync, statSync, writeFileSync, readFileSync } from 'node:fs';
import { PassThrough } from 'node:stream';
import { gzipSync } from 'node:zlib';
import { createHash } from 'node:crypto';
import { execFileSync } from 'node:child_process';
import { open as openAsync } from 'node:fs/promises';
import { openLineSource } from '../../src/ingest/open-line-source.js';
import { InputError, UsageError } from '../../src/errors.js';
import { CollectingSink, tempFolder } from './collecting-sink.js';

const tmp = tempFolder();
afterAll(() => tmp.remove());

/** `iter=1 res_p=…` lines, numbered from `from`, so order and completeness can be checked. */
function numberedLines(count: number, from = 1): string[] {
  return Array.from({ length: count }, (_, i) => `iter=${from + i} res_p=${(1 / (from + i)).toExponential(4)} nu_hot=1.2345`);
}

async function readAll(paths: string[], extra: Partial<Parameters<typeof openLineSource>[0]> = {}): Promise<CollectingSink> {
  const sink = new CollectingSink();
  await openLineSource({ paths, follow: false, ...extra }).run(sink);
  return sink;
}

describe('openLineSource, reading a finished log (post-mortem)', () => {
  it('delivers every line in order, the unfinished last line as final, then end', async () => {
    const path = tmp.path('run.log');
    writeFileSync(path, 'iter=1 res_p=1e-1\niter=2 res_p=1e-2\r\n\niter=3 res_p=1e-');
    const sink = await readAll([path]);
    expect(sink.lines).toEqual(['iter=1 res_p=1e-1', 'iter=2 res_p=1e-2', '', 'iter=3 res_p=1e-']);
    expect(sink.events).toEqual([{ type: 'opened', path, index: 0 }, { type: 'end' }]);
  });

  it('reads an empty file as no lines', async () => {
    const path = tmp.path('empty.log');
    writeFileSync(path, '');
    const sink = await readAll([path]);
    expect(sink.lines).toEqual([]);
    expect(sink.eventTypes()).toEqual(['opened', 'end']);
  });

  it('reads a file of many chunks without losing, repeating or reordering a line, in one batch per chunk plus the lines cut by chunk ends', async () => {
    const path = tmp.path('big.log');
    const lines = numberedLines(60_000); // about 2.6 MB: three 1 MiB chunks
    writeFileSync(path, `${lines.join('\n')}\n`);
    const sink = await readAll([path]);
    expect(sink.lines).toEqual(lines);
    const chunks = Math.ceil(statSync(path).size / (1024 * 1024));
    // Each chunk but the first begins inside a line (1 MiB is not a multiple of these line
    // lengths), delivered as a batch of its own before the chunk's whole lines.
    expect(sink.batches).toBe(2 * chunks - 1);
  });

  it('reports progress that rises to the total size', async () => {
    const path = tmp.path('progress.log');
    writeFileSync(path, `${numberedLines(60_000).join('\n')}\n`);
    const size = statSync(path).size;
    const sink = await readAll([path], { progressEveryMs: 0 });
    const progress = sink.events.flatMap((e) => (e.type === 'progress' ? [e] : []));
    expect(progress.length).toBeGreaterThanOrEqual(3);
    const read = progress.map((p) => p.bytesRead);
    expect([...read].sort((a, b) => a - b)).toEqual(read);
    expect(progress.at(-1)).toEqual({ type: 'progress', bytesRead: size, totalBytes: size });
  });

  it('never changes the file it reads (content, size, inode, mode, modification time)', async () => {
    const path = tmp.path('untouched.log');
    writeFileSync(path, 'iter=1 x=1\niter=2 x=2');
    const before = statSync(path);
    const hash = createHash('sha256').update(readFileSync(path)).digest('hex');
    await readAll([path]);
    const after = statSync(path);
    expect(createHash('sha256').update(readFileSync(path)).digest('hex')).toBe(hash);
    expect([after.size, after.ino, after.mode, after.mtimeMs]).toEqual([before.size, before.ino, before.mode, before.mtimeMs]);
  });

  it('warns once per file about invalid UTF-8 and about cut lines, and keeps going', async () => {
    const path = tmp.path('dirty.log');
    writeFileSync(path, Buffer.concat([Buffer.from('a=\xff\n', 'latin1'), Buffer.from(`${'L'.repeat(50)}\n${'M'.repeat(50)}\nend\n`)]));
    const sink = await readAll([path], { maxLineBytes: 20 });
    expect(sink.lines).toEqual(['a=\uFFFD', 'L'.repeat(20), 'M'.repeat(20), 'end']);
    expect(sink.warnings()).toEqual([
      `${path}: bytes that are not valid UTF-8 were read as the replacement character (U+FFFD)`,
      `${path}: a line longer than 20 bytes was cut to that length (the rest of it was skipped; later long lines are cut without another warning)`,
    ]);
  });

  it('cuts a 10 MB line to the 1 MiB default and reads on', async () => {
    const path = tmp.path('huge-line.log');
    writeFileSync(path, `iter=1\n${'9'.repeat(10 * 1024 * 1024)}\niter=2\n`);
    const sink = await readAll([path]);
    expect(sink.lines.map((line) => line.length)).toEqual([6, 1024 * 1024, 6]);
    expect(sink.lines[2]).toBe('iter=2');
    expect(sink.warnings()).toHaveLength(1);
  });

  it('reads a named pipe (as from a shell\'s <(command)) to its end', async () => {
    const path = tmp.path('pipe');
    execFileSync('mkfifo', [path]);
    const sink = new CollectingSink();
    const done = openLineSource({ paths: [path], follow: false }).run(sink);
    const writer = await openAsync(path, 'w');
    await writer.write('iter=1\niter=2\nlast');
    await writer.close();
    await done;
    expect(sink.lines).toEqual(['iter=1', 'iter=2', 'last']);
  });

  it('stops early on close(), drops the line cut by the interruption, and still ends', async () => {
    const path = tmp.path('closing.log');
    writeFileSync(path, `${numberedLines(100_000).join('\n')}\n`);
    const sink = new CollectingSink();
    const source = openLineSource({ paths: [path], follow: false });
    const original = sink.onLines.bind(sink);
    sink.onLines = (lines) => {
      original(lines);
      void source.close();
    };
    await source.run(sink);
    expect(sink.lines.length).toBeGreaterThan(0);
    expect(sink.lines.length).toBeLessThan(100_000);
    expect(sink.lines).toEqual(numberedLines(sink.lines.length));
    expect(sink.eventTypes().at(-1)).toBe('end');
  });

  it('lets an error thrown by the sink through unchanged (it is not an input problem)', async () => {
    const path = tmp.path('sink-throws.log');
    writeFileSync(path, 'a\nb\n');
    const failure = new Error('downstream bug');
    const source = openLineSource({ paths: [path], follow: false });
    await expect(source.run({ onLines: () => { throw failure; }, onEvent: () => undefined })).rejects.toBe(failure);
  });

  it('runs only once', async () => {
    const path = tmp.path('once.log');
    writeFileSync(path, 'a\n');
    const source = openLineSource({ paths: [path], follow: false });
    await source.run(new CollectingSink());
    await expect(source.run(new CollectingSink())).rejects.toThrow(/only once/);
  });
});

describe('openLineSource, restart chains', () => {
  it('reads three files of one run in order, announcing each with its index', async () => {
    const paths = [tmp.path('part1.log'), tmp.path('part2.log'), tmp.path('part3.log')];
    writeFileSync(paths[0], `${numberedLines(3, 1).join('\n')}\n`);
    // The second file stops mid-line (the solver was killed): that line is final, not glued to the next file.
    writeFileSync(paths[1], `${numberedLines(3, 4).join('\n')}\niter=7 res_p=`);
    writeFileSync(paths[2], `${numberedLines(3, 7).join('\n')}\n`);
    const sink = await readAll(paths);
    expect(sink.lines).toEqual([...numberedLines(6), 'iter=7 res_p=', ...numberedLines(3, 7)]);
    expect(sink.events).toEqual([
      { type: 'opened', path: paths[0], index: 0 },
      { type: 'opened', path: paths[1], index: 1 },
      { type: 'opened', path: paths[2], index: 2 },
      { type: 'end' },
    ]);
    expect(openLineSource({ paths, follow: false }).description).toBe(paths.join(' + '));
  });

  it('delivers the readable files before failing on a missing one in the middle', async () => {
    const first = tmp.path('chain-a.log');
    writeFileSync(first, 'iter=1\n');
    const sink = new CollectingSink();
    const missing = tmp.path('chain-missing.log');
    await expect(openLineSource({ paths: [first, missing, first], follow: false }).run(sink))
      .rejects.toThrow(`cannot read ${missing}: no such file`);
    expect(sink.lines).toEqual(['iter=1']);
  });
});

describe('openLineSource, gzip', () => {
  const text = `${numberedLines(2000).join('\n')}\nlast partial`;
  const expected = [...numberedLines(2000), 'last partial'];

  it('decompresses a .gz file as it reads', async () => {
    const path = tmp.path('run.log.gz');
    writeFileSync(path, gzipSync(text));
    const sink = await readAll([path]);
    expect(sink.lines).toEqual(expected);
    expect(sink.warnings()).toEqual([]);
  });

  it('recognises gzip by its magic bytes whatever the name (RFC 1952: 1f 8b)', async () => {
    const path = tmp.path('compressed-without-suffix.log');
    writeFileSync(path, gzipSync(text));
    expect((await readAll([path])).lines).toEqual(expected);
  });

  it('reads concatenated gzip members as one log', async () => {
    const path = tmp.path('members.gz');
    writeFileSync(path, Buffer.concat([gzipSync('iter=1\niter='), gzipSync('2\niter=3\n')]));
    expect((await readAll([path])).lines).toEqual(['iter=1', 'iter=2', 'iter=3']);
  });

  it('reads a .gz-named file that is plain text as text, with a warning', async () => {
    const path = tmp.path('plain.log.gz');
    writeFileSync(path, 'iter=1\n');
    const sink = await readAll([path]);
    expect(sink.lines).toEqual(['iter=1']);
    expect(sink.warnings()).toEqual([`${path} is named .gz but is not gzip data; reading it as text`]);
  });

  it('keeps what it could decode from a cut-short gzip file, with a warning', async () => {
    const path = tmp.path('cut.gz');
    const whole = gzipSync(`${numberedLines(5000).join('\n')}\n`);
    writeFileSync(path, whole.subarray(0, Math.floor(whole.length * 0.6)));
    const sink = await readAll([path]);
    expect(sink.lines.length).toBeGreaterThan(0);
    // Every full line decoded is a true line of the original, in order; only the last may be cut.
    expect(sink.lines.slice(0, -1)).toEqual(numberedLines(sink.lines.length - 1));
    expect(sink.warnings()).toEqual([`${path}: the compressed data ends early (file cut short?); read what was there`]);
  });

  it('rejects gzip data that is corrupt with an InputError', async () => {
    const path = tmp.path('corrupt.gz');
    const whole = gzipSync(text);
    const broken = Buffer.from(whole);
    broken.fill(0x55, 10, 60);
    writeFileSync(path, broken);
    const error = await readAll([path]).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).message).toMatch(new RegExp(`^cannot read ${path}: not valid gzip data`));
  });

  it('reads a followed .gz file to its end, says it cannot follow it, and ends by itself', async () => {
    const path = tmp.path('followed.log.gz');
    writeFileSync(path, gzipSync('iter=1\niter=2\n'));
    const sink = new CollectingSink();
    await openLineSource({ paths: [path], follow: true }).run(sink);
    expect(sink.lines).toEqual(['iter=1', 'iter=2']);
    expect(sink.warnings()).toEqual([`${path} is compressed (gzip) and cannot be followed; reading it to its end`]);
    expect(sink.eventTypes().at(-1)).toBe('end');
  });
});

describe('openLineSource, standard input', () => {
  it('reads the injected stream for "-" in whatever pieces it arrives', async () => {
    const stdin = new PassThrough();
    const source = openLineSource({ paths: ['-'], follow: false, stdin });
    expect(source.description).toBe('standard input');
    const sink = new CollectingSink();
    const done = source.run(sink);
    for (const piece of ['iter=1 r=1', 'e-1\r', '\nite', 'r=2 r=1e-2\n', 'iter=3']) stdin.write(Buffer.from(piece));
    stdin.end();
    await done;
    expect(sink.lines).toEqual(['iter=1 r=1e-1', 'iter=2 r=1e-2', 'iter=3']);
    expect(sink.eventTypes()).toEqual(['opened', 'end']);
  });

  // gzip is told by its magic number (RFC 1952, section 2.3.1: 0x1f 0x8b), as for files.
  const gzipText = Array.from({ length: 2000 }, (_, k) => `iter=${k + 1} r=${(0.99 ** k).toExponential(3)}`);
  async function readStdin(pieces: readonly Buffer[]): Promise<CollectingSink> {
    const stdin = new PassThrough();
    const source = openLineSource({ paths: ['-'], follow: false, stdin });
    const sink = new CollectingSink();
    const done = source.run(sink);
    for (const piece of pieces) {
      stdin.write(piece);
      await new Promise((resolve) => setImmediate(resolve));
    }
    stdin.end();
    await done;
    return sink;
  }

  it('reads gzip data on standard input, even when its first two bytes arrive apart', async () => {
    const gz = gzipSync(`${gzipText.join('\n')}\n`);
    const sink = await readStdin([gz.subarray(0, 1), gz.subarray(1, 7), gz.subarray(7, 5000), gz.subarray(5000)]);
    expect(sink.lines).toEqual(gzipText);
    expect(sink.warnings()).toEqual([]);
    expect(sink.eventTypes()).toEqual(['opened', 'end']);
  });

  it('reads cut-off gzip data on standard input as far as it goes, with a warning', async () => {
    const gz = gzipSync(`${gzipText.join('\n')}\n`);
    const sink = await readStdin([gz.subarray(0, Math.floor(gz.length * 0.6))]);
    expect(sink.lines.length).toBeGreaterThan(100);
    expect(sink.lines.length).toBeLessThan(gzipText.length);
    expect(sink.lines.slice(0, 100)).toEqual(gzipText.slice(0, 100));
    expect(sink.warnings()).toEqual(['standard input: the compressed data ends early (cut short?); read what was there']);
  });

  it('reads plain text whose first bytes arrive one at a time, and an empty standard input', async () => {
    expect((await readStdin([Buffer.from('i'), Buffer.from('t'), Buffer.from('er=1\niter=2\n')])).lines).toEqual(['iter=1', 'iter=2']);
    expect((await readStdin([])).lines).toEqual([]);
  });

  it('stops reading standard input on close() without destroying the stream', async () => {
    const stdin = new PassThrough();
    const source = openLineSource({ paths: ['-'], follow: true, stdin });
    const sink = new CollectingSink();
    const done = source.run(sink);
    stdin.write('iter=1\niter=2 partial');
    await new Promise((resolve) => setImmediate(resolve));
    await source.close();
    await done;
    expect(sink.lines).toEqual(['iter=1', 'iter=2 partial']);
    expect(stdin.destroyed).toBe(false);
  });
});

describe('openLineSource, inputs it cannot read', () => {
  const folder = tmp.path('a-folder');
  mkdirSync(folder);
  const notAFolder = tmp.path('plain-file');
  writeFileSync(notAFolder, 'x\n');

  it.each([
    ['a missing file', () => tmp.path('nope.log'), 'no such file', /check the path/],
    ['a folder', () => folder, 'it is a folder, not a file', /name the log file inside/],
    ['a path through a file', () => `${notAFolder}/run.log`, 'a part of the path is not a folder', /check the path/],
  ])('rejects %s with a one-line InputError and a hint', async (_what, pathOf, reason, hint) => {
    const path = pathOf();
    const error = await readAll([path]).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).message).toBe(`cannot read ${path}: ${reason}`);
    expect((error as InputError).hint).toMatch(hint);
    expect((error as InputError).exitCode).toBe(3);
  });

  it.skipIf(process.getuid?.() === 0)('rejects a file without read permission', async () => {
    const path = tmp.path('secret.log');
    writeFileSync(path, 'x\n');
    chmodSync(path, 0o000);
    const error = await readAll([path]).catch((e: unknown) => e);
    expect((error as InputError).message).toBe(`cannot read ${path}: permission denied`);
  });

  it('rejects a folder even when asked to follow it (only a missing file is waited for)', async () => {
    const error = await openLineSource({ paths: [folder], follow: true }).run(new CollectingSink()).catch((e: unknown) => e);
    expect((error as InputError).message).toBe(`cannot read ${folder}: it is a folder, not a file`);
  });

  it.each([
    ['no paths', { paths: [] }, 'no log given'],
    ['"-" in a chain', { paths: ['a.log', '-'] }, 'standard input (-) cannot be part of a restart chain'],
    ['an empty path', { paths: [''] }, 'an empty log path was given'],
    ['a zero line limit', { paths: ['a.log'], maxLineBytes: 0 }, 'the line length limit must be a whole number of bytes >= 1, got 0'],
    ['a fractional line limit', { paths: ['a.log'], maxLineBytes: 2.5 }, 'the line length limit must be a whole number of bytes >= 1, got 2.5'],
    ['a negative poll interval', { paths: ['a.log'], pollMs: -1 }, 'the poll interval must be a positive number of milliseconds, got -1'],
    ['a NaN stat interval', { paths: ['a.log'], statIntervalMs: Number.NaN }, 'the stat interval must be a positive number of milliseconds, got NaN'],
  ])('refuses %s with a UsageError', (_what, options, message) => {
    let thrown: unknown;
    try {
      openLineSource({ follow: false, ...options });
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(UsageError);
    expect((thrown as UsageError).message).toBe(message);
    expect((thrown as UsageError).hint).toBeTruthy();
  });
});

import { afterAll, describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import fc from 'fast-check';
import { lineAlignedRanges } from '../../src/ingest/line-aligned-ranges.js';
import { readLineRange } from '../../src/ingest/read-line-range.js';
import { openLineSource } from '../../src/ingest/open-line-source.js';
import { InputError } from '../../src/errors.js';
import { CollectingSink, tempFolder } from './collecting-sink.js';

const tmp = tempFolder('settle-ranges-');
afterAll(() => tmp.remove());

async function linesOfRanges(path: string, parts: number, maxLineBytes?: number): Promise<{ lines: string[]; starts: number[] }> {
  const ranges = await lineAlignedRanges(path, parts);
  const lines: string[] = [];
  for (const range of ranges) await readLineRange(path, range, { onLines: (batch) => lines.push(...batch), maxLineBytes });
  return { lines, starts: ranges.map((r) => r.start) };
}

describe('lineAlignedRanges with readLineRange', () => {
  it('cuts just after newlines into ranges that cover the file exactly', async () => {
    const path = tmp.path('ten.log');
    writeFileSync(path, 'aaaa\nbbbb\ncccc\ndddd\neeee\n'); // 25 bytes, lines start at 0, 5, 10, 15, 20
    const ranges = await lineAlignedRanges(path, 3);
    // Targets 8 and 16 move to the next line starts, 10 and 20.
    expect(ranges).toEqual([{ start: 0, end: 10 }, { start: 10, end: 20 }, { start: 20, end: 25 }]);
  });

  it('keeps a cut that already sits at a line start', async () => {
    const path = tmp.path('exact.log');
    writeFileSync(path, 'abc\nabc\n'); // target 4 is a line start (byte 3 is a newline)
    expect(await lineAlignedRanges(path, 2)).toEqual([{ start: 0, end: 4 }, { start: 4, end: 8 }]);
  });

  it('gives fewer ranges when lines are longer than a range', async () => {
    const path = tmp.path('one-long-line.log');
    writeFileSync(path, `${'x'.repeat(100)}\nshort\n`);
    expect(await lineAlignedRanges(path, 8)).toEqual([{ start: 0, end: 101 }, { start: 101, end: 107 }]);
  });

  it('yields exactly the lines of a whole-file read, for any content and any number of parts (property)', async () => {
    const lineArb = fc.oneof(
      fc.string({ maxLength: 12 }).map((s) => s.replace(/\n/g, '')),
      fc.constant('y'.repeat(70_000)), // longer than one probe of 64 KiB
    );
    let run = 0;
    await fc.assert(
      fc.asyncProperty(fc.array(lineArb, { maxLength: 30 }), fc.boolean(), fc.integer({ min: 1, max: 7 }), async (lines, finalNewline, parts) => {
        const path = tmp.path(`prop-${(run += 1)}.log`);
        writeFileSync(path, lines.join('\n') + (finalNewline && lines.length > 0 ? '\n' : ''));
        const whole = new CollectingSink();
        await openLineSource({ paths: [path], follow: false, maxLineBytes: 1000 }).run(whole);
        const { lines: pieced } = await linesOfRanges(path, parts, 1000);
        expect(pieced).toEqual(whole.lines);
      }),
      { numRuns: 60, seed: 42 },
    );
  });

  it.each([0, -1, 1.5])('rejects %s parts', async (parts) => {
    const path = tmp.path('any.log');
    writeFileSync(path, 'a\n');
    await expect(lineAlignedRanges(path, parts)).rejects.toThrow(RangeError);
  });

  it('reports a missing file as an InputError', async () => {
    const missing = tmp.path('missing.log');
    await expect(lineAlignedRanges(missing, 2)).rejects.toBeInstanceOf(InputError);
    await expect(readLineRange(missing, { start: 0, end: 1 }, { onLines: () => undefined })).rejects.toThrow(`cannot read ${missing}: no such file`);
  });
});

import { describe, expect, it } from 'vitest';
import { createProgressBar, formatProgressLine, type ProgressStream } from '../../src/report/progress-bar.js';

function fakeStream(isTTY: boolean, columns = 80): ProgressStream & { written: string[] } {
  const written: string[] = [];
  return { isTTY, columns, written, write: (text: string) => { written.push(text); return true; } };
}

describe('formatProgressLine', () => {
  it('shows percentage, megabytes and a bar filled in proportion', () => {
    const line = formatProgressLine('run.log', 168.5e6, 337e6, 80);
    // 168.5 MB prints as 169 (three significant digits)
    expect(line).toBe(`reading run.log [${'#'.repeat(20)}${'-'.repeat(20)}]  50 %  169 / 337 MB`);
  });

  it.each([40, 60, 80, 200])('fits a terminal %i columns wide', (columns) => {
    expect(formatProgressLine('/very/long/path/to/a/case/directory/with/a/run.log', 1e8, 3e8, columns).length).toBeLessThan(columns);
  });

  it('clamps to 0–100 % (a file that grew while read, an empty total)', () => {
    expect(formatProgressLine('a', 5e8, 3e8, 80)).toContain('100 %');
    expect(formatProgressLine('a', 0, 0, 80)).toContain('  0 %');
  });
});

describe('createProgressBar', () => {
  it('draws nothing when the stream is not a terminal', () => {
    const stream = fakeStream(false);
    const bar = createProgressBar(stream, 'run.log', { minTotalBytes: 1 });
    bar.update(5, 10);
    bar.finish();
    expect(stream.written).toEqual([]);
  });

  it('draws nothing for a small input', () => {
    const stream = fakeStream(true);
    const bar = createProgressBar(stream, 'run.log', { minTotalBytes: 1000 });
    bar.update(5, 999);
    expect(stream.written).toEqual([]);
  });

  it('redraws at most once per interval, always draws completion, and wipes the line at the end', () => {
    let t = 0;
    const stream = fakeStream(true);
    const bar = createProgressBar(stream, 'run.log', { minTotalBytes: 1, intervalMs: 100, now: () => t });
    bar.update(10, 100); // drawn
    t = 50;
    bar.update(20, 100); // too soon
    t = 150;
    bar.update(30, 100); // drawn
    t = 160;
    bar.update(100, 100); // completion: drawn
    bar.finish();
    bar.finish();
    expect(stream.written).toHaveLength(4);
    expect(stream.written[0]).toMatch(/^\r.* 10 %/);
    expect(stream.written[2]).toMatch(/100 %/);
    expect(stream.written[3]).toBe('\r\x1b[K');
  });
});

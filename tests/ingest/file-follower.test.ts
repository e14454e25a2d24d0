/**
 * Following a growing log through the public entry point (openLineSource with follow: true), on
 * real files in the system temp folder. Every wait polls for the expected state with a timeout;
 * nothing sleeps for a fixed time.
 */
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { appendFileSync, closeSync, openSync, renameSync, writeSync, truncateSync, unlinkSync, writeFileSync } from 'node:fs';
import { openLineSource, type OpenLineSourceOptions } from '../../src/ingest/open-line-source.js';
import type { LineSource } from '../../src/ingest/line-source.js';
import { CollectingSink, tempFolder, waitUntil } from './collecting-sink.js';

const tmp = tempFolder('settle-follow-');
afterAll(() => tmp.remove());

const open: LineSource[] = [];
afterEach(async () => {
  await Promise.all(open.splice(0).map((source) => source.close()));
});

function follow(paths: string[], extra: Partial<OpenLineSourceOptions> = {}): { source: LineSource; sink: CollectingSink; done: Promise<void> } {
  const source = openLineSource({ paths, follow: true, ...extra });
  open.push(source);
  const sink = new CollectingSink();
  const done = source.run(sink);
  return { source, sink, done };
}

const has = (sink: CollectingSink, line: string) => () => sink.lines.includes(line);
const hasEvent = (sink: CollectingSink, type: string) => () => sink.events.some((e) => e.type === type);
const numbered = (from: number, to: number) => Array.from({ length: to - from + 1 }, (_, i) => `iter=${from + i}`);

describe('following a log as it grows', () => {
  it('delivers appended lines, holds a partial line until its newline, and ends on close()', async () => {
    const path = tmp.path('grow.log');
    writeFileSync(path, 'iter=1\n');
    const { source, sink, done } = follow([path]);
    await waitUntil('the existing line', has(sink, 'iter=1'));
    expect(sink.events[0]).toEqual({ type: 'opened', path, index: 0 });

    appendFileSync(path, 'iter=2\niter=3 res_p=1.5e');
    await waitUntil('the appended line', has(sink, 'iter=2'));
    // Written in the same append as iter=2, so it has been read: it must still be held back.
    expect(sink.lines).toEqual(['iter=1', 'iter=2']);

    appendFileSync(path, '-04\r\niter=4 unfinished');
    await waitUntil('the completed line', has(sink, 'iter=3 res_p=1.5e-04'));
    expect(sink.lines).toEqual(['iter=1', 'iter=2', 'iter=3 res_p=1.5e-04']);

    await source.close();
    await done;
    expect(sink.lines).toEqual(['iter=1', 'iter=2', 'iter=3 res_p=1.5e-04', 'iter=4 unfinished']);
    expect(sink.eventTypes()).toEqual(['opened', 'end']);
  });

  it('loses and repeats no line over 400 small appends, many splitting a line in two', async () => {
    const path = tmp.path('many.log');
    writeFileSync(path, '');
    const { source, sink, done } = follow([path]);
    await waitUntil('the watch to start', hasEvent(sink, 'opened'));
    for (let i = 1; i <= 400; i += 1) {
      const line = `iter=${i} res_p=${(1 / i).toExponential(3)}\n`;
      if (i % 3 === 0) {
        appendFileSync(path, line.slice(0, 7));
        appendFileSync(path, line.slice(7));
      } else {
        appendFileSync(path, line);
      }
    }
    await waitUntil('all 400 lines', () => sink.lines.length >= 400);
    await source.close();
    await done;
    expect(sink.lines).toEqual(Array.from({ length: 400 }, (_, k) => `iter=${k + 1} res_p=${(1 / (k + 1)).toExponential(3)}`));
  });

  it('starts again from the top after a truncation, and says so', async () => {
    const path = tmp.path('truncate.log');
    writeFileSync(path, `${numbered(1, 20).join('\n')}\n`);
    const { sink } = follow([path]);
    await waitUntil('the first content', has(sink, 'iter=20'));
    truncateSync(path, 0);
    appendFileSync(path, 'iter=1 again\n');
    await waitUntil('the rewritten line', has(sink, 'iter=1 again'));
    expect(sink.lines).toEqual([...numbered(1, 20), 'iter=1 again']);
    expect(sink.eventTypes()).toEqual(['opened', 'truncated']);
  });

  it('notices a file rewritten from the top past the old end (no shrink ever visible)', async () => {
    const path = tmp.path('rewrite.log');
    writeFileSync(path, 'old\n'.repeat(5));
    const { sink } = follow([path]);
    await waitUntil('the old content', () => sink.lines.length === 5);
    // Overwrite in place from byte 0 with more bytes than before, never truncating: only the
    // changed bytes before the old offset can tell.
    const fd = openSync(path, 'r+');
    writeSync(fd, Buffer.from('new\n'.repeat(8)), 0, 32, 0);
    closeSync(fd);
    await waitUntil('the rewritten content', () => sink.lines.length === 13);
    expect(sink.lines).toEqual([...Array(5).fill('old'), ...Array(8).fill('new')]);
    expect(sink.eventTypes()).toEqual(['opened', 'truncated']);
  });

  it('drains the old file, then reads the new one after a rename-over replacement', async () => {
    const path = tmp.path('replace.log');
    writeFileSync(path, 'old 1\n');
    const { sink } = follow([path]);
    await waitUntil('the old file', has(sink, 'old 1'));
    const next = tmp.path('replace.log.new');
    writeFileSync(next, 'new 1\nnew 2\n');
    appendFileSync(path, 'old 2\nold partial'); // written just before the swap: must not be lost
    renameSync(next, path);
    await waitUntil('the new file', has(sink, 'new 2'));
    expect(sink.lines).toEqual(['old 1', 'old 2', 'old partial', 'new 1', 'new 2']);
    const order = sink.log.map((entry) => ('event' in entry ? entry.event.type : entry.lines.join('|')));
    expect(order.indexOf('replaced')).toBeGreaterThan(order.findIndex((e) => e.includes('old partial')));
    expect(order.indexOf('replaced')).toBeLessThan(order.findIndex((e) => e.includes('new 1')));

    appendFileSync(path, 'new 3\n');
    await waitUntil('growth of the new file', has(sink, 'new 3'));
  });

  it('waits for a deleted file to come back, and reads the new one from the top', async () => {
    const path = tmp.path('delete.log');
    writeFileSync(path, 'first life\n');
    const { sink } = follow([path]);
    await waitUntil('the first file', has(sink, 'first life'));
    unlinkSync(path);
    await waitUntil('the deleted event', hasEvent(sink, 'deleted'));
    writeFileSync(path, 'second life\n');
    await waitUntil('the recreated file', has(sink, 'second life'));
    expect(sink.lines).toEqual(['first life', 'second life']);
    expect(sink.eventTypes()).toEqual(['opened', 'deleted', 'replaced']);
  });

  it('waits for a file that does not exist yet', async () => {
    const path = tmp.path('late.log');
    const { source, sink, done } = follow([path]);
    await waitUntil('the waiting event', hasEvent(sink, 'waiting'));
    expect(sink.events).toEqual([{ type: 'waiting', path }]);
    writeFileSync(path, 'iter=1\n');
    await waitUntil('the late file', has(sink, 'iter=1'));
    appendFileSync(path, 'iter=2\n');
    await waitUntil('growth of the late file', has(sink, 'iter=2'));
    await source.close();
    await done;
    expect(sink.eventTypes()).toEqual(['waiting', 'opened', 'end']);
  });

  it('ends cleanly when closed while still waiting for the file', async () => {
    const path = tmp.path('never.log');
    const { source, sink, done } = follow([path]);
    await waitUntil('the waiting event', hasEvent(sink, 'waiting'));
    await source.close();
    await done;
    expect(sink.eventTypes()).toEqual(['waiting', 'end']);
    expect(sink.lines).toEqual([]);
  });

  it('reads a restart chain and follows only its last file', async () => {
    const paths = [tmp.path('chain1.log'), tmp.path('chain2.log'), tmp.path('chain3.log')];
    writeFileSync(paths[0], `${numbered(1, 3).join('\n')}\n`);
    writeFileSync(paths[1], `${numbered(4, 6).join('\n')}\n`);
    writeFileSync(paths[2], `${numbered(7, 8).join('\n')}\n`);
    const { sink } = follow(paths);
    await waitUntil('the last file', has(sink, 'iter=8'));
    appendFileSync(paths[2], 'iter=9\n');
    await waitUntil('growth of the last file', has(sink, 'iter=9'));
    expect(sink.lines).toEqual(numbered(1, 9));
    expect(sink.events).toEqual([0, 1, 2].map((index) => ({ type: 'opened', path: paths[index], index })));
  });

  it('keeps reading when change events never arrive, from its own periodic checks', async () => {
    const path = tmp.path('no-events.log');
    writeFileSync(path, 'iter=1\n');
    // Polling every minute: chokidar reports nothing during this test; only the 100 ms checks can.
    const { sink } = follow([path], { pollMs: 60_000, statIntervalMs: 100 });
    await waitUntil('the existing line', has(sink, 'iter=1'));
    appendFileSync(path, 'iter=2\n');
    await waitUntil('the appended line', has(sink, 'iter=2'));
    expect(sink.lines).toEqual(['iter=1', 'iter=2']);
  });

  it('rejects run() with the error when the sink throws while following', async () => {
    const path = tmp.path('sink-fails.log');
    writeFileSync(path, 'iter=1\n');
    const failure = new Error('downstream bug');
    const source = openLineSource({ paths: [path], follow: true });
    open.push(source);
    let calls = 0;
    const done = source.run({ onLines: () => { calls += 1; if (calls > 1) throw failure; }, onEvent: () => undefined });
    await waitUntil('the first batch', () => calls === 1);
    appendFileSync(path, 'iter=2\n');
    await expect(done).rejects.toBe(failure);
  });

  it('waits for the last file of a chain after reading the earlier ones', async () => {
    const paths = [tmp.path('before-restart.log'), tmp.path('after-restart.log')];
    writeFileSync(paths[0], 'iter=1\niter=2\n');
    const { sink } = follow(paths);
    await waitUntil('the waiting event', hasEvent(sink, 'waiting'));
    writeFileSync(paths[1], 'iter=1\n');
    await waitUntil('the restarted run', () => sink.lines.length === 3);
    expect(sink.lines).toEqual(['iter=1', 'iter=2', 'iter=1']);
    expect(sink.events).toEqual([{ type: 'opened', path: paths[0], index: 0 }, { type: 'waiting', path: paths[1] }, { type: 'opened', path: paths[1], index: 1 }]);
  });

  it('sees a rename-over replacement when polling', async () => {
    const path = tmp.path('polled-replace.log');
    writeFileSync(path, 'old\n');
    const { sink } = follow([path], { pollMs: 50 });
    await waitUntil('the old file', has(sink, 'old'));
    writeFileSync(tmp.path('polled-replace.tmp'), 'new\n');
    renameSync(tmp.path('polled-replace.tmp'), path);
    await waitUntil('the new file', has(sink, 'new'));
    expect(sink.eventTypes()).toEqual(['opened', 'replaced']);
  });

  it('polls when asked (network file systems): appends and truncation are seen without events', async () => {
    const path = tmp.path('polled.log');
    writeFileSync(path, 'iter=1\n');
    const { sink } = follow([path], { pollMs: 50 });
    await waitUntil('the existing line', has(sink, 'iter=1'));
    appendFileSync(path, 'iter=2\n');
    await waitUntil('the appended line', has(sink, 'iter=2'));
    writeFileSync(path, 'x\n'); // rewrite in place: same inode, smaller
    await waitUntil('the rewritten line', has(sink, 'x'));
    expect(sink.lines).toEqual(['iter=1', 'iter=2', 'x']);
    expect(sink.eventTypes()).toEqual(['opened', 'truncated']);
  });
});

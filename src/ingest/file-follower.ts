/**
 * Follow one log file as a solver appends to it, surviving what happens to logs on real systems:
 * the file does not exist yet, is truncated, is replaced by a new file of the same name (rotation,
 * or a rerun that writes a fresh log), or is deleted.
 *
 * Method: change events are hints, never the truth. chokidar's `change` events are throttled and
 * dropped when appends come fast (paulmillr/chokidar#1455), so on every event the follower reads to
 * the end of the file, checks once more 150 ms later, and checks every second (or every poll
 * interval) regardless. A check is:
 *   1. `stat` the path. Gone: drain the open descriptor (bytes written before the deletion are still
 *      there), then `deleted`, and wait for the file to come back (it comes back as `replaced`).
 *   2. Another inode or device: drain the old descriptor, `replaced`, read the new file from 0.
 *   3. Polling (network file systems): open the path again, because attribute caches make a held
 *      descriptor's size stale; the fresh descriptor's size is what the server says now.
 *   4. Size below the offset read so far, or the last bytes read no longer the same (the file was
 *      emptied and rewritten past our offset between two checks, as `>` redirection or a
 *      copy-and-truncate rotation can do): `truncated`, read again from 0.
 *   5. Read from the offset to the end, in chunks at explicit positions.
 * Checks never overlap: a wake-up during a check runs one more check after it.
 *
 * Only whole lines go downstream; the unfinished last line waits in the splitter for its newline.
 * It is delivered as final only when the old content ends for good (truncation, replacement,
 * deletion) or when the follower stops.
 *
 * The file is opened read-only and never written, locked or renamed.
 */
import { open, stat, type FileHandle } from 'node:fs/promises';
import type { Stats } from 'node:fs';
import type { SourceEvent } from './line-source.js';
import type { LineSplitter } from './line-splitter.js';
import type { LineBatch } from './line-batch.js';
import { readFileChunks, type ChunkBuffers } from './read-file-chunks.js';
import { errorCodeOf, isSystemError, readFailure } from './read-failure.js';

export interface FileFollowerOptions {
  readonly path: string;
  /** Index of this file in the restart chain (for the `opened` event). */
  readonly index: number;
  readonly splitter: LineSplitter;
  readonly buffers: ChunkBuffers;
  /** Complete lines, in order (never called with an empty list). */
  readonly deliver: (lines: LineBatch) => void;
  readonly event: (event: SourceEvent) => void;
  /** Poll with this interval (ms) instead of trusting change events. */
  readonly pollMs?: number;
  /** Check this often regardless of events (ms). Default 1000, or pollMs when polling. */
  readonly statIntervalMs?: number;
  /** The extra check after each event (ms). Default 150. */
  readonly recheckMs?: number;
  /** Bytes read during the first catch-up read (for progress). */
  readonly onCatchUpBytes?: (bytes: number) => void;
  /** Asked between chunks of the first catch-up read: true abandons it (the source is closing). */
  readonly shouldStop?: () => boolean;
  /** A failure that must end the source (the sink threw, not the file system). */
  readonly onFatal: (error: unknown) => void;
}

type Watcher = { close(): Promise<void> };

/** How many of the last bytes read are kept to notice a rewrite from the top. */
const TAIL_BYTES = 64;

export class FileFollower {
  private handle: FileHandle | undefined;
  private ino = -1;
  private dev = -1;
  private offset = 0;
  /** The last bytes read (up to TAIL_BYTES), to notice a file rewritten from the top. */
  private tail: Buffer = Buffer.alloc(0);
  /** An earlier file had this name (deleted or replaced): the next file to appear replaces it. */
  private hadEarlierFile = false;
  /** No more checks (stopping, or failed). */
  private stopped = false;
  private stopCalled = false;
  private failed = false;
  /** The content there at start was read completely (not abandoned by a close). */
  private caughtUp = false;
  private running: Promise<void> | undefined;
  private again = false;
  private interval: NodeJS.Timeout | undefined;
  private recheck: NodeJS.Timeout | undefined;
  private watcher: Watcher | undefined;
  private readonly warned = new Set<string>();

  constructor(private readonly options: FileFollowerOptions) {}

  /**
   * Begin following. `handle` is the file already opened by the caller (with its stats), or
   * undefined when the file does not exist yet (then `waiting` is emitted). Resolves once the
   * existing content has been read and the watch is in place.
   */
  async start(handle: FileHandle | undefined, stats: Stats | undefined): Promise<void> {
    const { path, index } = this.options;
    if (handle && stats) {
      this.adopt(handle, stats);
      this.options.event({ type: 'opened', path, index });
      try {
        await this.readToEnd(this.options.onCatchUpBytes, this.options.shouldStop);
      } catch (error) {
        this.failed = true;
        this.stopped = true;
        throw isSystemError(error) ? readFailure(path, error) : error;
      }
      if (this.options.shouldStop?.()) return;
    } else {
      this.options.event({ type: 'waiting', path });
    }
    this.caughtUp = true;
    if (this.stopped) return;
    const every = this.options.statIntervalMs ?? this.options.pollMs ?? 1000;
    this.interval = setInterval(() => this.wake(), every);
    await this.startWatcher();
    this.wake();
  }

  /** Check the file now (coalesced with a check already running). */
  wake(): void {
    if (this.stopped) return;
    if (this.running) {
      this.again = true;
      return;
    }
    this.running = this.checkLoop();
  }

  /** Stop watching; read what is left, deliver the unfinished last line as final, close the file. */
  async stop(): Promise<void> {
    if (this.stopCalled) return;
    this.stopCalled = true;
    this.stopped = true;
    if (this.interval) clearInterval(this.interval);
    if (this.recheck) clearTimeout(this.recheck);
    const watcher = this.watcher;
    this.watcher = undefined;
    await watcher?.close().catch(() => undefined);
    await this.running;
    if (this.failed || !this.caughtUp) {
      // Failed, or closed in the middle of the first read: a line cut by the interruption is not
      // a real last line (its numbers could be cut short), so it is dropped.
      this.options.splitter.discardPartial();
      await this.closeHandle();
      return;
    }
    if (this.handle && this.caughtUp) {
      try {
        await this.readToEnd();
      } catch (error) {
        this.report(error);
      }
    }
    this.flushPartial();
    await this.closeHandle();
  }

  private async startWatcher(): Promise<void> {
    const { path, pollMs } = this.options;
    const every = this.options.statIntervalMs ?? pollMs ?? 1000;
    try {
      const { watch } = await import('chokidar');
      if (this.stopped) return;
      const watcher = watch(path, {
        persistent: true,
        ignoreInitial: true,
        usePolling: pollMs !== undefined,
        interval: pollMs,
        binaryInterval: pollMs,
      });
      watcher.on('all', () => this.hint());
      watcher.on('error', (error: unknown) => this.warnOnce('watch', `${path}: change events unavailable (${String((error as Error)?.message ?? error)}); checking every ${every} ms instead`));
      this.watcher = watcher;
    } catch (error) {
      this.warnOnce('watch', `${path}: change events unavailable (${String((error as Error)?.message ?? error)}); checking every ${every} ms instead`);
    }
  }

  /** A change event: check now, and once more shortly after (events inside chokidar's throttle
   * window are dropped, not delayed). */
  private hint(): void {
    this.wake();
    if (this.recheck === undefined && !this.stopped) {
      this.recheck = setTimeout(() => {
        this.recheck = undefined;
        this.wake();
      }, this.options.recheckMs ?? 150);
    }
  }

  private async checkLoop(): Promise<void> {
    do {
      this.again = false;
      try {
        await this.check();
      } catch (error) {
        if (isSystemError(error)) {
          this.report(error);
        } else {
          this.stopped = true;
          this.failed = true;
          this.options.onFatal(error);
        }
      }
    } while (this.again && !this.stopped);
    this.running = undefined;
  }

  private async check(): Promise<void> {
    const { path } = this.options;
    let current: Stats;
    try {
      current = await stat(path);
    } catch (error) {
      const code = errorCodeOf(error);
      if (code === 'ENOENT' || code === 'ENOTDIR') {
        if (this.handle) await this.endOldFile('deleted');
        return;
      }
      throw error;
    }
    if (this.stopped) return;
    if (!current.isFile()) return; // a folder or device took the name: wait for a file
    if (!this.handle) {
      await this.openNew();
      return;
    }
    if (current.ino !== this.ino || current.dev !== this.dev) {
      await this.endOldFile('replaced');
      await this.openNew();
      return;
    }
    if (this.options.pollMs !== undefined) {
      // Network file systems: a fresh open revalidates cached attributes (close-to-open consistency).
      const fresh = await open(path, 'r');
      const freshStats = await fresh.stat();
      if (!freshStats.isFile() || freshStats.ino !== this.ino || freshStats.dev !== this.dev) {
        await fresh.close();
        await this.endOldFile('replaced');
        await this.openNew();
        return;
      }
      const old = this.handle;
      this.handle = fresh;
      await old.close().catch(() => undefined);
    }
    const size = (await this.handle.stat()).size;
    if (size < this.offset || !(await this.tailUnchanged())) {
      this.flushPartial();
      this.options.event({ type: 'truncated', path });
      this.offset = 0;
      this.tail = Buffer.alloc(0);
    }
    if (size !== this.offset) await this.readToEnd();
  }

  /** The old content is over: read its last bytes, deliver its unfinished line, say why. */
  private async endOldFile(reason: 'deleted' | 'replaced'): Promise<void> {
    try {
      await this.readToEnd();
    } catch (error) {
      this.report(error);
    }
    this.flushPartial();
    await this.closeHandle();
    this.hadEarlierFile = true;
    if (reason === 'deleted') this.options.event({ type: 'deleted', path: this.options.path });
  }

  /** Open the file that now has the name; announce it (`opened`, or `replaced` for a file that
   * took the place of an earlier one) and read it from the start. */
  private async openNew(): Promise<void> {
    const { path, index } = this.options;
    let handle: FileHandle;
    try {
      handle = await open(path, 'r');
    } catch (error) {
      const code = errorCodeOf(error);
      if (code === 'ENOENT' || code === 'ENOTDIR') return; // gone again before we got to it
      throw error;
    }
    const stats = await handle.stat();
    if (!stats.isFile()) {
      await handle.close();
      return;
    }
    this.adopt(handle, stats);
    if (this.hadEarlierFile) this.options.event({ type: 'replaced', path });
    else this.options.event({ type: 'opened', path, index });
    this.hadEarlierFile = false;
    await this.readToEnd();
  }

  private adopt(handle: FileHandle, stats: Stats): void {
    this.handle = handle;
    this.ino = stats.ino;
    this.dev = stats.dev;
    this.offset = 0;
    this.tail = Buffer.alloc(0);
  }

  private async readToEnd(onBytes?: (bytes: number) => void, shouldStop?: () => boolean): Promise<void> {
    const handle = this.handle;
    if (!handle) return;
    const { splitter, deliver } = this.options;
    this.offset = await readFileChunks(handle, this.offset, this.options.buffers, (chunk) => {
      this.rememberTail(chunk);
      splitter.pushBatches(chunk, deliver);
      onBytes?.(chunk.length);
    }, { shouldStop });
  }

  /** Keep a copy of the last TAIL_BYTES bytes read (the chunk buffer is reused). */
  private rememberTail(chunk: Buffer): void {
    if (chunk.length >= TAIL_BYTES) {
      this.tail = Buffer.from(chunk.subarray(chunk.length - TAIL_BYTES));
    } else {
      const joined = Buffer.concat([this.tail, chunk]);
      this.tail = Buffer.from(joined.subarray(Math.max(0, joined.length - TAIL_BYTES)));
    }
  }

  /** Are the bytes just before the offset still the ones we read there? One small read. */
  private async tailUnchanged(): Promise<boolean> {
    const handle = this.handle;
    const length = this.tail.length;
    if (!handle || length === 0 || this.offset < length) return true;
    const now = Buffer.alloc(length);
    const { bytesRead } = await handle.read(now, 0, length, this.offset - length);
    return bytesRead === length && now.equals(this.tail);
  }

  private flushPartial(): void {
    this.options.splitter.endBatches(this.options.deliver);
  }

  private async closeHandle(): Promise<void> {
    const handle = this.handle;
    this.handle = undefined;
    this.ino = -1;
    this.dev = -1;
    this.offset = 0;
    this.tail = Buffer.alloc(0);
    await handle?.close().catch(() => undefined);
  }

  /** A file-system failure while following is not fatal: say so once per kind and keep trying. */
  private report(error: unknown): void {
    const failure = readFailure(this.options.path, error);
    this.warnOnce(errorCodeOf(error) ?? failure.message, `${failure.message}; still following (${failure.hint ?? ''})`);
  }

  private warnOnce(key: string, message: string): void {
    if (this.warned.has(key)) return;
    this.warned.add(key);
    this.options.event({ type: 'warning', message });
  }
}

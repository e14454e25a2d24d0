/**
 * Open a line source: the log files of one run (a restart chain, read in order) or standard input,
 * read once to the end (post-mortem) or followed as the last file grows (live).
 *
 * - Post-mortem: each file is read from start to end; its unfinished last line is delivered as a
 *   final line; `end` follows the last file. Files are read in 1 MiB chunks at explicit positions
 *   and split into lines before decoding (see LineSplitter). `progress` events, at most 10 a
 *   second, report bytes read against the total size of the files.
 * - gzip (RFC 1952): a file whose first bytes are the gzip magic number is decompressed as it is
 *   read. A compressed file cannot be followed: it is read to its end, with a warning.
 * - Pipes and devices (e.g. `<(command)`) are read as streams to their end.
 * - Standard input when the only path is `-`.
 * - Follow: the earlier files of a chain are read post-mortem; the last one is followed by a
 *   FileFollower until `close()`.
 *
 * Nothing read is ever written to, locked or renamed: files are opened read-only.
 *
 * Example:
 *   const source = openLineSource({ paths: ['case/run.log'], follow: false });
 *   await source.run({ onLines: (lines) => count += lines.length, onEvent: () => {} });
 */
import { open, stat, type FileHandle } from 'node:fs/promises';
import type { Stats } from 'node:fs';
import { SettleError, UsageError } from '../errors.js';
import type { LineSink, LineSource, LineSourceOptions } from './line-source.js';
import { DEFAULT_MAX_LINE_BYTES, LineSplitter, type SplitterWarning } from './line-splitter.js';
import { ProgressReporter } from './progress-reporter.js';
import { peekStreamHead } from './peek-stream-head.js';
import { Readable } from 'node:stream';
import { ChunkBuffers, readFileChunks } from './read-file-chunks.js';
import { readStreamChunks } from './read-stream-chunks.js';
import { readGzipFile, readGzipStream, startsWithGzipMagic } from './read-gzip-file.js';
import { errorCodeOf, isSystemError, readFailure } from './read-failure.js';
import { FileFollower } from './file-follower.js';

export interface OpenLineSourceOptions extends LineSourceOptions {
  /** The stream read for the path `-`. Default process.stdin. */
  readonly stdin?: NodeJS.ReadableStream;
  /** While following, check the file this often regardless of change events (ms). Default 1000,
   * or pollMs when polling. */
  readonly statIntervalMs?: number;
  /** Shortest gap between two `progress` events (ms). Default 100 (at most 10 a second). */
  readonly progressEveryMs?: number;
}

/** Shortest gap between two `progress` events (ms): at most 10 a second. */
const PROGRESS_EVERY_MS = 100;

export function openLineSource(options: OpenLineSourceOptions): LineSource {
  const { paths } = options;
  if (paths.length === 0) {
    throw new UsageError('no log given', 'name a log file, several files of one restarted run in order, or - for standard input');
  }
  if (paths.includes('-') && paths.length > 1) {
    throw new UsageError('standard input (-) cannot be part of a restart chain', 'give either - alone or the log files in order');
  }
  const emptyPath = paths.find((path) => path.trim() === '');
  if (emptyPath !== undefined) throw new UsageError('an empty log path was given', 'name a log file');
  const max = options.maxLineBytes ?? DEFAULT_MAX_LINE_BYTES;
  if (!Number.isInteger(max) || max < 1) {
    throw new UsageError(`the line length limit must be a whole number of bytes >= 1, got ${max}`, 'for example 1048576 (1 MiB)');
  }
  const intervals = [['poll interval', options.pollMs, 1], ['stat interval', options.statIntervalMs, 1], ['progress interval', options.progressEveryMs, 0]] as const;
  for (const [name, value, least] of intervals) {
    if (value !== undefined && (!Number.isFinite(value) || value < least)) {
      throw new UsageError(`the ${name} must be ${least === 0 ? 'zero or more' : 'a positive number of'} milliseconds, got ${value}`, 'for example 1000');
    }
  }
  return new LogLineSource(options, max);
}

/** Human size for messages: `1 MiB`, `64 KiB`, `100 bytes`. */
function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024 && bytes % (1024 * 1024) === 0) return `${bytes / (1024 * 1024)} MiB`;
  if (bytes >= 1024 && bytes % 1024 === 0) return `${bytes / 1024} KiB`;
  return `${bytes} bytes`;
}

class LogLineSource implements LineSource {
  readonly description: string;
  private readonly paths: readonly string[];
  private runPromise: Promise<void> | undefined;
  private closing = false;
  private readonly abort = new AbortController();
  private readonly buffers = new ChunkBuffers();
  private wakeOnClose: (() => void) | undefined;

  constructor(private readonly options: OpenLineSourceOptions, private readonly maxLineBytes: number) {
    this.paths = [...options.paths];
    this.description = this.paths[0] === '-' ? 'standard input' : this.paths.join(' + ');
  }

  run(sink: LineSink): Promise<void> {
    if (this.runPromise) return Promise.reject(new Error('a line source can run only once; open another'));
    this.runPromise = this.runAll(sink);
    return this.runPromise;
  }

  async close(): Promise<void> {
    this.closing = true;
    this.abort.abort();
    this.wakeOnClose?.();
    if (this.runPromise) await this.runPromise.catch(() => undefined);
  }

  private async runAll(sink: LineSink): Promise<void> {
    if (this.paths[0] === '-') {
      await this.readStdin(sink);
    } else {
      const progress = new ProgressReporter(await this.totalSize(), this.options.progressEveryMs ?? PROGRESS_EVERY_MS, (event) => sink.onEvent(event));
      for (let index = 0; index < this.paths.length && !this.closing; index += 1) {
        const last = index === this.paths.length - 1;
        if (this.options.follow && last) await this.followFile(this.paths[index], index, sink, progress);
        else await this.readFile(this.paths[index], index, sink, progress);
      }
      progress.finish();
    }
    sink.onEvent({ type: 'end' });
  }

  /** Sum of the sizes of the files, for progress (files that cannot be read count 0 here; they
   * fail when their turn comes). */
  private async totalSize(): Promise<number> {
    const sizes = await Promise.all(this.paths.map((path) => stat(path).then((s) => (s.isFile() ? s.size : 0), () => 0)));
    return sizes.reduce((a, b) => a + b, 0);
  }

  private splitterFor(path: string, sink: LineSink): LineSplitter {
    return new LineSplitter({
      maxLineBytes: this.maxLineBytes,
      onWarning: (warning: SplitterWarning) => sink.onEvent({ type: 'warning', message: warningText(path, warning) }),
    });
  }

  private async readStdin(sink: LineSink): Promise<void> {
    const stream = this.options.stdin ?? process.stdin;
    const splitter = this.splitterFor('standard input', sink);
    sink.onEvent({ type: 'opened', path: '-', index: 0 });
    const onChunk = (chunk: Buffer): void => splitter.pushBatches(chunk, (batch) => sink.onLines(batch));
    try {
      // gzip data is told by its magic number, as for files (`zcat run.log.gz | settle check -` and
      // `settle check - < run.log.gz` both work).
      const { head, ended } = await peekStreamHead(stream, 2, this.abort.signal);
      // A stream that ended while peeked holds just its head.
      const rest = ended ? Readable.from([head]) : stream;
      if (startsWithGzipMagic(head) && !this.closing) {
        const outcome = await readGzipStream(rest, 'standard input', onChunk, { signal: this.abort.signal });
        if (outcome === 'cut-short') {
          sink.onEvent({ type: 'warning', message: 'standard input: the compressed data ends early (cut short?); read what was there' });
        }
      } else if (ended) {
        if (head.length > 0) onChunk(head);
      } else {
        await readStreamChunks(stream, onChunk, { signal: this.abort.signal });
      }
    } catch (error) {
      if (errorCodeOf(error) !== undefined && !(error instanceof SettleError)) throw readFailure('standard input', error);
      throw error;
    }
    splitter.endBatches((batch) => sink.onLines(batch));
  }

  /** Open a file read-only and check it is something we can read; InputError otherwise. With
   * `missingIsFine`, a file that does not exist gives undefined instead. */
  private async openForReading(path: string, missingIsFine = false): Promise<{ handle: FileHandle; stats: Stats } | undefined> {
    let handle: FileHandle;
    try {
      handle = await open(path, 'r');
    } catch (error) {
      const code = errorCodeOf(error);
      if (missingIsFine && (code === 'ENOENT' || code === 'ENOTDIR')) return undefined;
      throw readFailure(path, error);
    }
    try {
      const stats = await handle.stat();
      if (stats.isDirectory()) throw readFailure(path, Object.assign(new Error('is a directory'), { code: 'EISDIR' }));
      return { handle, stats };
    } catch (error) {
      await handle.close().catch(() => undefined);
      throw error instanceof SettleError ? error : readFailure(path, error);
    }
  }

  /** Read one file from start to end (post-mortem). */
  private async readFile(path: string, index: number, sink: LineSink, progress: ProgressReporter): Promise<void> {
    const opened = await this.openForReading(path);
    if (!opened) return;
    const { handle, stats } = opened;
    try {
      sink.onEvent({ type: 'opened', path, index });
      await this.readOpened(path, handle, stats, sink, progress, false);
    } finally {
      await handle.close().catch(() => undefined);
    }
  }

  /**
   * Read an open file to its end whatever it holds: plain bytes, gzip data or a pipe. `following`
   * says the caller wanted to follow it (so a compressed file earns a warning).
   */
  private async readOpened(path: string, handle: FileHandle, stats: Stats, sink: LineSink,
    progress: ProgressReporter, following: boolean): Promise<void> {
    const splitter = this.splitterFor(path, sink);
    const onChunk = (chunk: Buffer): void => splitter.pushBatches(chunk, (batch) => sink.onLines(batch));
    try {
      if (!stats.isFile()) {
        await readStreamChunks(handle.createReadStream({ autoClose: false }), onChunk, { signal: this.abort.signal });
      } else if (await this.isGzip(path, handle, stats, sink)) {
        if (following) {
          sink.onEvent({ type: 'warning', message: `${path} is compressed (gzip) and cannot be followed; reading it to its end` });
        }
        let seen = 0;
        const outcome = await readGzipFile(handle, path, onChunk, {
          signal: this.abort.signal,
          onCompressedBytes: (total) => {
            progress.add(total - seen);
            seen = total;
          },
        });
        if (outcome === 'cut-short') {
          sink.onEvent({ type: 'warning', message: `${path}: the compressed data ends early (file cut short?); read what was there` });
        }
      } else {
        await readFileChunks(handle, 0, this.buffers, (chunk) => {
          onChunk(chunk);
          progress.add(chunk.length);
        }, { shouldStop: () => this.closing });
      }
    } catch (error) {
      if (error instanceof SettleError) throw error;
      if (isSystemError(error)) throw readFailure(path, error);
      throw error;
    }
    // Closed in the middle: a line cut by the interruption is not a real last line.
    if (this.closing) splitter.discardPartial();
    else splitter.endBatches((batch) => sink.onLines(batch));
  }

  /** gzip by its magic number. A `.gz` name on plain text is read as text, with a warning. */
  private async isGzip(path: string, handle: FileHandle, stats: Stats, sink: LineSink): Promise<boolean> {
    if (stats.size < 2) return false;
    const gzip = startsWithGzipMagic(await readHead(handle));
    if (!gzip && /\.gz$/i.test(path)) {
      sink.onEvent({ type: 'warning', message: `${path} is named .gz but is not gzip data; reading it as text` });
    }
    return gzip;
  }

  /** Follow the last file of the chain until close(). */
  private async followFile(path: string, index: number, sink: LineSink, progress: ProgressReporter): Promise<void> {
    // A missing file is waited for; any other failure is an error now.
    const opened = await this.openForReading(path, true);
    const unfollowable = opened !== undefined && (!opened.stats.isFile() || startsWithGzipMagic(await readHead(opened.handle)));
    if (opened && unfollowable) {
      // Compressed data and pipes cannot be followed by offset: read them to their end.
      try {
        sink.onEvent({ type: 'opened', path, index });
        await this.readOpened(path, opened.handle, opened.stats, sink, progress, true);
      } finally {
        await opened.handle.close().catch(() => undefined);
      }
      return;
    }
    let fatal: unknown;
    let failed = false;
    const closed = new Promise<void>((resolve) => {
      this.wakeOnClose = resolve;
    });
    const follower = new FileFollower({
      path,
      index,
      splitter: this.splitterFor(path, sink),
      buffers: this.buffers,
      deliver: (lines) => sink.onLines(lines),
      event: (event) => sink.onEvent(event),
      pollMs: this.options.pollMs,
      statIntervalMs: this.options.statIntervalMs,
      onCatchUpBytes: (bytes) => progress.add(bytes),
      shouldStop: () => this.closing,
      onFatal: (error) => {
        fatal = error;
        failed = true;
        this.wakeOnClose?.();
      },
    });
    try {
      if (!this.closing) {
        await follower.start(opened?.handle, opened?.stats);
        progress.finish();
        if (!this.closing && !failed) await closed;
      } else {
        await opened?.handle.close();
      }
    } finally {
      await follower.stop();
    }
    if (failed) throw fatal;
  }
}

/** The first two bytes of a file (fewer if it is shorter), for the gzip magic number. */
async function readHead(handle: FileHandle): Promise<Buffer> {
  const head = Buffer.alloc(2);
  const { bytesRead } = await handle.read(head, 0, 2, 0);
  return head.subarray(0, bytesRead);
}

/** What a splitter warning says to the user about a file. */
export function warningText(path: string, warning: SplitterWarning): string {
  switch (warning.kind) {
    case 'line-cut':
      return `${path}: a line longer than ${formatBytes(warning.maxLineBytes)} was cut to that length (the rest of it was skipped; later long lines are cut without another warning)`;
    case 'invalid-utf8':
      return `${path}: bytes that are not valid UTF-8 were read as the replacement character (U+FFFD)`;
  }
}

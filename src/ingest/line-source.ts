/**
 * The contract between ingest and everything after it: a source delivers complete lines, in order,
 * and tells what happened to the file along the way.
 */
import type { LineBatch } from './line-batch.js';

export type SourceEvent =
  /** The file does not exist yet; the source waits for it. */
  | { readonly type: 'waiting'; readonly path: string }
  /** Started reading a file (index into the restart chain; 0 for the first). */
  | { readonly type: 'opened'; readonly path: string; readonly index: number }
  /** The file shrank: reading starts again from the top. Downstream marks a restart. */
  | { readonly type: 'truncated'; readonly path: string }
  /** A new file took the old one's name (rotation): reading starts again from its top. */
  | { readonly type: 'replaced'; readonly path: string }
  /** The file was deleted; the source waits for it to come back (when following). */
  | { readonly type: 'deleted'; readonly path: string }
  /** Something the user may want to know that is not fatal (a line cut at the length limit,
   * invalid UTF-8 replaced). */
  | { readonly type: 'warning'; readonly message: string }
  /** Progress of a post-mortem read, for a progress bar. */
  | { readonly type: 'progress'; readonly bytesRead: number; readonly totalBytes: number }
  /** The source has ended: no more lines will come. */
  | { readonly type: 'end' };

export interface LineSink {
  /** Complete lines, in order, without their terminators (LF and CRLF both stripped), as byte
   * ranges; valid only during the call (see LineBatch). */
  onLines(lines: LineBatch): void;
  onEvent(event: SourceEvent): void;
}

export interface LineSource {
  /** Human description, e.g. `case/run.log` or `standard input`. */
  readonly description: string;
  /** Start delivering to the sink. Resolves once the source has ended (after the `end` event):
   * at end of input when not following, or after `close()` when following. Rejects with an
   * InputError when the input cannot be read at all. */
  run(sink: LineSink): Promise<void>;
  /** Stop following. A partial last line is delivered as final, then `end`. Idempotent. */
  close(): Promise<void>;
}

export interface LineSourceOptions {
  /** Files of one run, in order (a restart chain), or `['-']` for standard input. */
  readonly paths: readonly string[];
  /** Keep following the last file as it grows (live). When false, read to the end and stop. */
  readonly follow: boolean;
  /** Poll the file system every this many ms instead of relying on change events (network file systems). */
  readonly pollMs?: number;
  /** Lines longer than this many bytes are cut (with a warning). Default 1 MiB. */
  readonly maxLineBytes?: number;
}

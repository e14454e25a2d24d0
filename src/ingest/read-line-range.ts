/**
 * Read the lines of one byte range of a finished log (see lineAlignedRanges), for a worker that
 * parses its share of a large file. The range must begin at a line start and end just after a
 * newline or at the end of the file; the range's unfinished last line (only possible at the end of
 * the file) is delivered as final.
 *
 * Cost: O(range bytes); memory two 1 MiB read buffers and the splitter's carry.
 */
import { open } from 'node:fs/promises';
import type { ByteRange } from './line-aligned-ranges.js';
import { LineSplitter, type SplitterWarning } from './line-splitter.js';
import { ChunkBuffers, readFileChunks } from './read-file-chunks.js';
import { isSystemError, readFailure } from './read-failure.js';

export interface ReadLineRangeOptions {
  /** Complete lines in order, one call per chunk read (never with an empty list). */
  readonly onLines: (lines: string[]) => void;
  readonly maxLineBytes?: number;
  readonly onWarning?: (warning: SplitterWarning) => void;
}

export async function readLineRange(path: string, range: ByteRange, options: ReadLineRangeOptions): Promise<void> {
  if (!(Number.isInteger(range.start) && Number.isInteger(range.end) && range.start >= 0 && range.end >= range.start)) {
    throw new RangeError(`not a byte range: ${range.start}…${range.end}`);
  }
  const splitter = new LineSplitter({ maxLineBytes: options.maxLineBytes, onWarning: options.onWarning });
  let handle;
  try {
    handle = await open(path, 'r');
  } catch (error) {
    throw readFailure(path, error);
  }
  try {
    await readFileChunks(handle, range.start, new ChunkBuffers(), (chunk) => {
      const lines = splitter.push(chunk);
      if (lines.length > 0) options.onLines(lines);
    }, { end: range.end });
    const last = splitter.end();
    if (last.length > 0) options.onLines(last);
  } catch (error) {
    throw isSystemError(error) ? readFailure(path, error) : error;
  } finally {
    await handle.close().catch(() => undefined);
  }
}

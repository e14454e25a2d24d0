/**
 * Cut a finished log into byte ranges of about equal size that each begin at the start of a line,
 * so that several workers can split and parse one large file at once.
 *
 * Method: aim at k·size/parts for k = 1 … parts−1 and move each cut forward to just after the next
 * newline byte (a cut whose preceding byte is already a newline stays where it is). The lines of the
 * ranges, read one after another with readLineRange, are exactly the lines of the whole file, in
 * order (property-tested). Ranges may come out fewer than asked: a cut that would fall inside the
 * last line, or on another cut (a line longer than a range), is dropped.
 *
 * Only for regular, uncompressed files that have stopped growing; gzip data and pipes cannot be cut.
 *
 * Cost: one small read per cut (more when a cut lands in a very long line); no file is read whole.
 */
import { open } from 'node:fs/promises';
import { readFailure } from './read-failure.js';

export interface ByteRange {
  /** First byte (inclusive): the start of a line. */
  readonly start: number;
  /** Last byte (exclusive): just after a newline, or the end of the file. */
  readonly end: number;
}

const PROBE_BYTES = 64 * 1024;

export async function lineAlignedRanges(path: string, parts: number): Promise<ByteRange[]> {
  if (!Number.isInteger(parts) || parts < 1) throw new RangeError(`parts must be a whole number >= 1, got ${parts}`);
  let handle;
  try {
    handle = await open(path, 'r');
  } catch (error) {
    throw readFailure(path, error);
  }
  try {
    const { size } = await handle.stat();
    const cuts: number[] = [0];
    const probe = Buffer.allocUnsafe(PROBE_BYTES);
    for (let k = 1; k < parts; k += 1) {
      const target = Math.floor((k * size) / parts);
      if (target <= cuts[cuts.length - 1]) continue;
      // Find the first newline at or after target - 1: the cut goes just after it.
      let from = target - 1;
      let cut = -1;
      while (from < size) {
        const { bytesRead } = await handle.read(probe, 0, Math.min(PROBE_BYTES, size - from), from);
        if (bytesRead === 0) break;
        const newline = probe.subarray(0, bytesRead).indexOf(10);
        if (newline >= 0) {
          cut = from + newline + 1;
          break;
        }
        from += bytesRead;
      }
      if (cut < 0 || cut >= size) break; // no line starts after this point
      if (cut > cuts[cuts.length - 1]) cuts.push(cut);
    }
    return cuts.map((start, i) => ({ start, end: i + 1 < cuts.length ? cuts[i + 1] : size })).filter((r) => r.end > r.start || size === 0);
  } catch (error) {
    throw readFailure(path, error);
  } finally {
    await handle.close().catch(() => undefined);
  }
}

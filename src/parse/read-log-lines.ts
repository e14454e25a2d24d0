/**
 * A small post-mortem line reader for `settle parsers test`: reads the files of one run in order
 * (or standard input for `-`; `.gz` files are decompressed), splits on LF before decoding, strips a
 * CR before the LF, and hands lines over in batches. It never writes to what it reads. The live
 * path (following a growing log) is ingest's job, not this one's.
 * Cost: O(bytes); memory is one chunk plus the partial last line.
 */
import { createReadStream } from 'node:fs';
import { createGunzip } from 'node:zlib';
import { InputError } from '../errors.js';

export interface LogLineHandler {
  /** Complete lines of the current file, in order. */
  onLines(lines: string[]): void;
  /** File `index` (0 for the first) begins. */
  onFile(path: string, index: number): void;
}

export async function readLogLines(paths: readonly string[], handler: LogLineHandler, stdin: NodeJS.ReadableStream = process.stdin): Promise<void> {
  for (let index = 0; index < paths.length; index++) {
    const path = paths[index];
    handler.onFile(path, index);
    let stream: NodeJS.ReadableStream;
    if (path === '-') stream = stdin;
    else {
      const file = createReadStream(path, { highWaterMark: 1 << 20 });
      stream = path.endsWith('.gz') ? file.pipe(createGunzip()) : file;
      file.on('error', (error) => (stream as NodeJS.ReadableStream & { destroy(e: Error): void }).destroy(error));
    }
    let carry: Buffer | null = null;
    try {
      for await (const chunk of stream as AsyncIterable<Buffer>) {
        const data: Buffer = carry === null ? chunk : Buffer.concat([carry, chunk]);
        const lines: string[] = [];
        let start = 0;
        let newline = data.indexOf(10, start);
        while (newline >= 0) {
          const end = newline > start && data[newline - 1] === 13 ? newline - 1 : newline;
          lines.push(data.toString('utf8', start, end));
          start = newline + 1;
          newline = data.indexOf(10, start);
        }
        carry = start < data.length ? data.subarray(start) : null;
        if (lines.length > 0) handler.onLines(lines);
      }
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      const what = code === 'ENOENT' ? 'does not exist' : code === 'EISDIR' ? 'is a folder' : code === 'EACCES' ? 'cannot be read (permission denied)' : `cannot be read (${(error as Error).message})`;
      throw new InputError(`log ${path} ${what}`, 'check the path of the log');
    }
    if (carry !== null && carry.length > 0) {
      const end = carry[carry.length - 1] === 13 ? carry.length - 1 : carry.length;
      handler.onLines([carry.toString('utf8', 0, end)]);
    }
  }
}

/**
 * Read a gzip-compressed log (RFC 1952) from an open file, decompressing as it streams, so an
 * 800 MB log compressed to 80 MB never sits in memory whole.
 *
 * Concatenated gzip members (what `cat a.gz b.gz` or a log compressed in pieces gives) are read as
 * one stream, as zlib's gunzip does by default. A file that ends early (compression cut off) yields
 * what could be decoded and reports `cut-short`; a file that is not gzip data at all is an
 * InputError.
 *
 * Cost: O(compressed + decompressed bytes); memory a few stream buffers.
 */
import type { FileHandle } from 'node:fs/promises';
import { createGunzip } from 'node:zlib';
import { InputError } from '../errors.js';
import { CHUNK_BYTES } from './read-file-chunks.js';
import { readStreamChunks } from './read-stream-chunks.js';
import { errorCodeOf } from './read-failure.js';

/** The two bytes every gzip member starts with (RFC 1952, section 2.3.1). */
export const GZIP_MAGIC = [0x1f, 0x8b] as const;

/** True when the first bytes of a file are the gzip magic number. */
export function startsWithGzipMagic(head: Buffer): boolean {
  return head.length >= 2 && head[0] === GZIP_MAGIC[0] && head[1] === GZIP_MAGIC[1];
}

export interface ReadGzipOptions {
  readonly signal?: AbortSignal;
  /** Compressed bytes consumed so far (for progress). */
  readonly onCompressedBytes?: (total: number) => void;
}

export type GzipOutcome = 'complete' | 'cut-short';

export async function readGzipFile(
  handle: FileHandle,
  path: string,
  onChunk: (chunk: Buffer) => void,
  options: ReadGzipOptions = {},
): Promise<GzipOutcome> {
  const raw = handle.createReadStream({ start: 0, highWaterMark: CHUNK_BYTES, autoClose: false });
  const onCompressed = options.onCompressedBytes;
  if (onCompressed) raw.on('data', () => onCompressed(raw.bytesRead));
  try {
    return await readGzipStream(raw, path, onChunk, options);
  } finally {
    raw.destroy();
  }
}

/**
 * The same for a stream of gzip data (standard input): decompressed chunks go to `onChunk`. The
 * source stream is piped, not owned: it is not destroyed at the end (standard input stays usable).
 */
export async function readGzipStream(
  raw: NodeJS.ReadableStream,
  name: string,
  onChunk: (chunk: Buffer) => void,
  options: ReadGzipOptions = {},
): Promise<GzipOutcome> {
  const gunzip = createGunzip({ chunkSize: 256 * 1024 });
  const forwardError = (error: Error): void => { gunzip.destroy(error); };
  raw.on('error', forwardError);
  raw.pipe(gunzip);
  try {
    await readStreamChunks(gunzip, onChunk, { signal: options.signal });
    return 'complete';
  } catch (error) {
    const code = errorCodeOf(error);
    if (code === 'Z_BUF_ERROR') return 'cut-short';
    if (code !== undefined && code.startsWith('Z_')) {
      throw new InputError(`cannot read ${name}: not valid gzip data (${(error as Error).message})`,
        'check that the file was copied completely, or decompress it yourself and read the result');
    }
    throw error;
  } finally {
    raw.removeListener('error', forwardError);
    raw.unpipe(gunzip);
    gunzip.destroy();
  }
}

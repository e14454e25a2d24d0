/**
 * Read an open file from a byte offset to its current end (or to a given offset), in chunks of at most 1 MiB read at
 * explicit positions (never through a shared file position, so nothing else can move it).
 *
 * Method: double buffering. The read of the next chunk is started before the current chunk is
 * handed to `onChunk`, so the disk (or page-cache copy, done on libuv's thread pool) overlaps with
 * line splitting on the main thread. Reading stops at the first read that returns 0 bytes, so a
 * file that grows while it is read is read to its newest end.
 *
 * Cost: O(bytes read); memory two chunk buffers (2 MiB), reused from call to call.
 */
import type { FileHandle } from 'node:fs/promises';

export const CHUNK_BYTES = 1024 * 1024;

/** Two reusable read buffers; keep one per open source. */
export class ChunkBuffers {
  readonly first = Buffer.allocUnsafe(CHUNK_BYTES);
  readonly second = Buffer.allocUnsafe(CHUNK_BYTES);
}

export interface ReadFileChunksOptions {
  /** Asked between chunks; true stops reading (the chunks already read are delivered). */
  readonly shouldStop?: () => boolean;
  /** Stop at this byte offset (exclusive) instead of the end of the file. */
  readonly end?: number;
}

/**
 * Read `handle` from `from` to its end, calling `onChunk` with each chunk (a view into a reused
 * buffer, valid only during the call). Resolves with the offset after the last byte read.
 */
export async function readFileChunks(
  handle: FileHandle,
  from: number,
  buffers: ChunkBuffers,
  onChunk: (chunk: Buffer) => void,
  options: ReadFileChunksOptions = {},
): Promise<number> {
  const limit = options.end ?? Number.POSITIVE_INFINITY;
  const want = (at: number): number => Math.max(0, Math.min(CHUNK_BYTES, limit - at));
  let position = from;
  let current = buffers.first;
  let pending = want(position) > 0 ? handle.read(current, 0, want(position), position) : Promise.resolve({ bytesRead: 0 });
  for (;;) {
    const { bytesRead } = await pending;
    if (bytesRead === 0) return position;
    position += bytesRead;
    const next = current === buffers.first ? buffers.second : buffers.first;
    const stop = (options.shouldStop?.() ?? false) || position >= limit;
    // Prefetch only when the chunk was full: a short read almost always means the end was reached.
    const prefetch = !stop && bytesRead === CHUNK_BYTES;
    if (prefetch) pending = handle.read(next, 0, want(position), position);
    try {
      onChunk(current.subarray(0, bytesRead));
    } catch (error) {
      if (prefetch) await pending.catch(() => undefined);
      throw error;
    }
    if (stop) return position;
    if (!prefetch) pending = handle.read(next, 0, want(position), position);
    current = next;
  }
}

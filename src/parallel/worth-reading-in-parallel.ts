/**
 * Is a log worth reading with worker threads? Only a plain (uncompressed) regular file big enough
 * that starting workers pays: gzip data (by its magic number, or a `.gz` name, which the sequential
 * reader checks and warns about) is read sequentially.
 */
import { closeSync, openSync, readSync, statSync } from 'node:fs';

/** Below this size a sequential read is about as fast (worker start-up costs about 0.1 s). */
export const PARALLEL_MIN_BYTES = 32 * 1024 * 1024;

export function worthReadingInParallel(path: string, minBytes: number): boolean {
  if (/\.gz$/i.test(path)) return false;
  try {
    // Synchronous: three tiny calls, cheaper than three trips through the thread pool at start-up.
    const stats = statSync(path);
    if (!stats.isFile() || stats.size < Math.max(2, minBytes)) return false;
    const fd = openSync(path, 'r');
    try {
      const head = Buffer.alloc(2);
      readSync(fd, head, 0, 2, 0);
      return !(head[0] === 0x1f && head[1] === 0x8b);
    } finally {
      closeSync(fd);
    }
  } catch {
    // Unreadable: the sequential reader reports it the usual way.
    return false;
  }
}

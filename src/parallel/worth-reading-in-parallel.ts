/**
 * Is a log worth reading with worker threads? Only a plain (uncompressed) regular file big enough
 * that starting workers pays: gzip data (by its magic number, or a `.gz` name, which the sequential
 * reader checks and warns about) is read sequentially.
 */
import { open, stat } from 'node:fs/promises';

/** Below this size a sequential read is about as fast (worker start-up costs about 0.1 s). */
export const PARALLEL_MIN_BYTES = 32 * 1024 * 1024;

export async function worthReadingInParallel(path: string, minBytes: number): Promise<boolean> {
  if (/\.gz$/i.test(path)) return false;
  try {
    const stats = await stat(path);
    if (!stats.isFile() || stats.size < Math.max(2, minBytes)) return false;
    const handle = await open(path, 'r');
    try {
      const head = Buffer.alloc(2);
      await handle.read(head, 0, 2, 0);
      return !(head[0] === 0x1f && head[1] === 0x8b);
    } finally {
      await handle.close();
    }
  } catch {
    // Unreadable: the sequential reader reports it the usual way.
    return false;
  }
}

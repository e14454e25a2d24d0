/**
 * Write a stop file atomically: the text goes to a temporary file in the same folder, which is then
 * renamed over the target, so a solver polling for the stop file never sees it half written. The
 * temporary file is removed if anything fails. Only the folder the user named is written to.
 * Cost: one small write and one rename.
 */
import { rename, unlink, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';

let counter = 0;

export async function writeStopFile(path: string, content: string): Promise<void> {
  const temporary = join(dirname(path), `.${basename(path)}.settle-${process.pid}-${counter++}.tmp`);
  try {
    await writeFile(temporary, content, { flag: 'wx', mode: 0o644 });
    await rename(temporary, path);
  } catch (error) {
    await unlink(temporary).catch(() => undefined);
    throw error;
  }
}

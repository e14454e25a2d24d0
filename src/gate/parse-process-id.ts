/**
 * Parse a process id given on the command line (`--pid`, `--signal`). Only whole numbers above 1
 * are accepted: 0 and negative numbers would address whole process groups and 1 is the init
 * process, so a slip of the keyboard cannot signal everything. Pure; O(length of the text).
 */
import { UsageError, shorten } from '../errors.js';

export function parseProcessId(flag: string, text: string, hint = `for example ${flag} 4242 (the solver's process id, e.g. $! after starting it in the background)`): number {
  const trimmed = text.trim();
  if (!/^\d+$/.test(trimmed)) throw new UsageError(`${flag} needs a process id (a whole number), got '${shorten(text, 20)}'`, hint);
  const pid = Number(trimmed);
  if (!Number.isSafeInteger(pid) || pid <= 1) throw new UsageError(`${flag} needs a process id above 1, got '${shorten(text, 20)}'`, hint);
  return pid;
}

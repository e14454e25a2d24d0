/**
 * Up-front checks of the gate's flags against the system (the I/O half of validating them; the
 * text-level parsing is in parse-*.ts): the processes named exist, the stop file's folder exists and
 * is writable, and the stop file is not one of the logs. Each failure is a UsageError with one line
 * and a hint, raised before any log is read.
 */
import { accessSync, constants, realpathSync, statSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { UsageError } from '../errors.js';

/** True when a process with this id exists (signal 0 probes without sending anything). A process
 * owned by another user (EPERM) exists too. */
export function isProcessRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

export function checkProcessRunning(flag: string, pid: number): void {
  if (!isProcessRunning(pid)) {
    throw new UsageError(`${flag}: no process ${pid} is running`,
      'start the solver first and pass its process id (in a job script: solver & then use $!)');
  }
}

/** The real path when the file exists, else the resolved path (for comparing names of one file). */
function canonical(path: string): string {
  try {
    return realpathSync(path);
  } catch {
    return resolve(path);
  }
}

function sameFile(a: string, b: string): boolean {
  if (canonical(a) === canonical(b)) return true;
  try {
    const sa = statSync(a);
    const sb = statSync(b);
    return sa.dev === sb.dev && sa.ino === sb.ino;
  } catch {
    return false;
  }
}

/** Refuse a stop file that cannot be written or that would overwrite a log. Returns a warning to
 * show (or undefined) when a stop file is already there from an earlier run. */
export function checkStopFile(path: string, logs: readonly string[]): string | undefined {
  const hint = 'give --stop-file a path in an existing, writable folder, separate from the logs';
  for (const log of logs) {
    if (log !== '-' && sameFile(path, log)) throw new UsageError(`--stop-file ${path} is one of the logs`, hint);
  }
  const folder = dirname(resolve(path));
  let folderStat;
  try {
    folderStat = statSync(folder);
  } catch {
    throw new UsageError(`--stop-file: the folder ${folder} does not exist`, hint);
  }
  if (!folderStat.isDirectory()) throw new UsageError(`--stop-file: ${folder} is not a folder`, hint);
  try {
    accessSync(folder, constants.W_OK);
  } catch {
    throw new UsageError(`--stop-file: the folder ${folder} is not writable`, hint);
  }
  try {
    const existing = statSync(path);
    if (existing.isDirectory()) throw new UsageError(`--stop-file ${path} is a folder`, 'name a file inside it, e.g. --stop-file DIR/STOP');
    return `the stop file ${path} already exists (left from an earlier run?); a solver polling for it may stop early`;
  } catch (error) {
    if (error instanceof UsageError) throw error;
    return undefined;
  }
}

/**
 * Reading finished logs for the post-mortem commands (check, report, compare): refuse unreadable
 * logs before reading any, then one run monitor per log, read to its end.
 */
import { accessSync, constants as fsConstants, statSync } from 'node:fs';
import type { Criteria } from '../analysis/criteria.js';
import { InputError, UsageError } from '../errors.js';
import type { RunMonitor } from '../monitor/run-monitor-types.js';
import type { RunReading } from './common-options.js';

/** Refuse, before reading anything, logs that cannot be read (exit 3) and a doubled standard input. */
export function checkLogsReadable(logs: readonly string[], missingHint = 'check the path'): void {
  if (logs.filter((log) => log === '-').length > 1) throw new UsageError('standard input (-) can be read only once', 'name - at most once');
  for (const log of logs) {
    if (log === '-') continue;
    let isFile: boolean;
    try {
      isFile = statSync(log).isFile();
    } catch {
      throw new InputError(`cannot read ${log}: no such file`, missingHint);
    }
    if (!isFile) throw new InputError(`cannot read ${log}: not a file`, 'name the log file itself, not its folder');
    try {
      accessSync(log, fsConstants.R_OK);
    } catch {
      throw new InputError(`cannot read ${log}: permission denied`, 'check the file permissions');
    }
  }
}

/** A monitor that reads one finished log (or standard input) to its end and judges it. */
export async function postMortemMonitor(log: string, reading: RunReading, criteria: Criteria): Promise<RunMonitor> {
  const { createRunMonitor } = await import('../monitor/run-monitor.js');
  return createRunMonitor({ paths: [log], follow: false, ...reading, criteria });
}

/**
 * `settle watch LOG... [source options] [criteria options]`: the live terminal dashboard. One log
 * opens its run; several logs, a folder or a glob open an overview of runs, worst first. Without a
 * terminal it prints one line per state change instead.
 */
import { openSync } from 'node:fs';
import tty from 'node:tty';
import type { Command } from 'commander';
import type { Criteria } from '../analysis/criteria.js';
import type { KindOverrides } from '../parse/record-parser.js';
import { addPollOption, addSourceOptions, runReadingOf, type SourceOptions } from './common-options.js';
import { addCriteriaOptions, criteriaFromOptions } from './criteria-options.js';
import { SettleError, UsageError } from '../errors.js';

export interface WatchOptions {
  readonly paths: string[];
  readonly parserFiles: readonly string[];
  readonly parserId?: string;
  readonly kindOverrides: KindOverrides;
  readonly criteria: Criteria;
  readonly pollMs?: number;
  /** Shown in place of the log path (one run), e.g. by `settle demo`. */
  readonly title?: string;
  /** Keys (and the log, for the path `-` when not a TTY). Default process.stdin. */
  readonly stdin?: NodeJS.ReadableStream;
  /** Where the dashboard is drawn. Default process.stdout. */
  readonly stdout?: NodeJS.WritableStream;
  readonly stderr?: NodeJS.WritableStream;
  readonly env?: NodeJS.ProcessEnv;
}

const isTerminal = (stream: NodeJS.WritableStream | NodeJS.ReadableStream): boolean => (stream as { isTTY?: boolean }).isTTY === true;

/** Watch the logs until the person quits (exit code 0), or, without a terminal, until every source
 * ends (exit code of the worst final verdict). */
export async function runWatch(options: WatchOptions): Promise<number> {
  const { expandLogPaths } = await import('../ui/expand-log-paths.js');
  const { createRunMonitor } = await import('../monitor/run-monitor.js');
  const stdin = options.stdin ?? process.stdin;
  const stdout = options.stdout ?? process.stdout;
  const stderr = options.stderr ?? process.stderr;
  const paths = expandLogPaths(options.paths);
  const runs = paths.map((file) => ({
    label: paths.length === 1 && options.title !== undefined ? options.title : file === '-' ? 'standard input' : file,
    monitor: createRunMonitor({
      paths: [file],
      follow: true,
      pollMs: options.pollMs,
      parserFiles: options.parserFiles,
      parserId: options.parserId,
      kindOverrides: options.kindOverrides,
      criteria: options.criteria,
      stdin,
    }),
  }));

  if (!isTerminal(stdout)) {
    const { plainWatch } = await import('../ui/plain-watch.js');
    return plainWatch(runs, stdout, stderr);
  }

  // Keys come from the terminal; when the log itself arrives on standard input, from /dev/tty.
  let keys: NodeJS.ReadableStream = stdin;
  let ownTty: tty.ReadStream | undefined;
  if (paths.includes('-') || !isTerminal(stdin)) {
    try {
      ownTty = new tty.ReadStream(openSync('/dev/tty', 'r'));
    } catch {
      throw new UsageError('settle watch has no terminal to read keys from (standard input is not one, and /dev/tty cannot be opened)',
        'run it from a terminal, or use settle check --follow in scripts');
    }
    keys = ownTty;
  }
  const { openDashboard } = await import('../ui/dashboard-screen.js');
  // The recent span shows five judging windows, and at least 1000 iterations.
  const recentIterations = Math.max(1000, 5 * options.criteria.window);
  const dashboard = await openDashboard({ runs, input: keys, output: stdout, env: options.env, recentIterations });
  const running = runs.map((run, index) => run.monitor.run().catch((error: unknown) => {
    // An unreadable log must not take the other runs (or the terminal) down: say it in its panel.
    const message = error instanceof Error ? error.message : String(error);
    const hint = error instanceof SettleError && error.hint !== undefined ? ` (${error.hint})` : '';
    dashboard.note(index, `cannot read this log: ${message}${hint}`);
  }));
  try {
    await dashboard.done;
  } finally {
    dashboard.close();
    await Promise.all(runs.map((run) => run.monitor.stop()));
    await Promise.all(running);
    ownTty?.destroy();
  }
  return 0;
}

export function registerWatchCommand(program: Command): void {
  const command = program
    .command('watch')
    .description('live dashboard of a solver log: residuals, quantities, verdict and advice; several logs, a folder or a glob open an overview of runs')
    .argument('<log...>', 'log files, folders of logs, or quoted globs; - reads standard input');
  addPollOption(addSourceOptions(command));
  addCriteriaOptions(command);
  command.action(async (logs: string[], flags: SourceOptions & Record<string, unknown>) => {
    process.exitCode = await runWatch({ paths: logs, ...runReadingOf(flags), criteria: criteriaFromOptions(flags) });
  });
}

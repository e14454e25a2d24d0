/**
 * `settle check LOG... [--json]`: read each log to its end, judge it, print the verdict and advice,
 * and exit with the verdict's code (EXIT_CODES; several logs: the worst by SEVERITY decides).
 *
 * `settle check LOG --follow [--idle D] [--pid N] [--stop-file P] [--signal PID[:SIG]] [--exec CMD]
 * [--on VERDICTS] [--events] [--min-iterations N] [--dry-run]`: the batch gate. Follow the run until
 * its verdict is final, the log goes idle or the watched process ends; then act and exit with the
 * same code. Bad flags are refused before any log is read. The heavy parts (monitor, analysis) load
 * lazily so the command starts fast.
 */
import { constants as osConstants } from 'node:os';
import type { Command } from 'commander';
import type { Criteria } from '../analysis/criteria.js';
import { EXIT_CODES, type RunDiagnosis } from '../analysis/diagnosis.js';
import { addPollOption, addSourceOptions, runReadingOf, type RunReading, type SourceOptions } from './common-options.js';
import { checkLogsReadable, postMortemMonitor } from './read-run.js';
import { addCriteriaOptions, criteriaFromOptions } from './criteria-options.js';
import { DEFAULT_MIN_ITERATIONS, readGateFlags, type GateSettings, type RawGateFlags } from '../gate/read-gate-flags.js';
import { checkProcessRunning, checkStopFile } from '../gate/check-gate-inputs.js';
import { checkJson } from '../gate/check-json.js';
import { formatCheckText } from '../gate/format-check-text.js';
import { worstVerdict } from '../gate/worst-verdict.js';
import { EXEC_VARIABLE_MEANINGS, EXEC_VARIABLES } from '../gate/exec-variables.js';

export interface RunCheckOptions extends RunReading {
  logs: string[];
  json: boolean;
  criteria: Criteria;
  stdout: NodeJS.WritableStream;
}

/** Post-mortem check of each log in turn; prints the text block or the JSON document and returns
 * the exit code of the worst verdict. */
export async function runCheck(options: RunCheckOptions): Promise<number> {
  checkLogsReadable(options.logs, 'check the path (settle check reads logs that exist; use --follow to wait for one)');
  const runs: { log: string; diagnosis: RunDiagnosis }[] = [];
  for (const log of options.logs) {
    const monitor = await postMortemMonitor(log, options, options.criteria);
    runs.push({ log, diagnosis: await monitor.run() });
  }
  options.stdout.write(options.json ? `${JSON.stringify(checkJson(runs))}\n` : formatCheckText(runs));
  return EXIT_CODES[worstVerdict(runs.map((run) => run.diagnosis.verdict))];
}

export interface RunGateOptions extends Omit<RunCheckOptions, 'logs'> {
  log: string;
  gate: GateSettings;
  stderr: NodeJS.WritableStream;
}

/** The batch gate on one log (flags already read and checked). */
export async function runGate(options: RunGateOptions): Promise<number> {
  const { followAndGate } = await import('../gate/follow-run.js');
  return followAndGate({
    monitor: {
      paths: [options.log],
      pollMs: options.pollMs,
      parserFiles: options.parserFiles,
      parserId: options.parserId,
      kindOverrides: options.kindOverrides,
      criteria: options.criteria,
    },
    request: {
      log: options.log,
      on: options.gate.on,
      minIterations: options.gate.minIterations,
      stopFile: options.gate.stopFile,
      signal: options.gate.signal,
      exec: options.gate.exec,
    },
    idleMs: options.gate.idleMs,
    pid: options.gate.pid,
    dryRun: options.gate.dryRun,
    events: options.gate.events,
    json: options.json,
    stdout: options.stdout,
    stderr: options.stderr,
  });
}

/** System checks of the gate flags, before any log is read; returns warnings to show. */
function checkGateInputs(gate: GateSettings, logs: readonly string[]): string[] {
  const warnings: string[] = [];
  if (gate.pid !== undefined) checkProcessRunning('--pid', gate.pid);
  if (gate.signal !== undefined) checkProcessRunning('--signal', gate.signal.pid);
  if (gate.stopFile !== undefined) {
    const warning = checkStopFile(gate.stopFile, logs);
    if (warning !== undefined) warnings.push(warning);
  }
  return warnings;
}


type CheckFlags = SourceOptions & RawGateFlags & Record<string, unknown>;

export function registerCheckCommand(program: Command): void {
  const command = program
    .command('check')
    .description('judge each log (read to its end) and exit with the verdict\'s code; with --follow, watch one run and act when its verdict is final')
    .argument('<log...>', 'log files (.gz allowed), or - for standard input')
    .option('--json', 'print one JSON object (a stable contract, see README)')
    .option('--follow', 'follow the run live until its verdict is final, the log goes idle, or --pid ends; then act')
    .option('--idle <duration>', 'with --follow: stop when the log has not grown for this long (e.g. 30s, 5m, 2h, 1500ms)')
    .option('--pid <pid>', 'with --follow: stop when this process (the solver) ends')
    .option('--stop-file <path>', 'with --follow: write this file (atomically) with the verdict and reason when acting')
    .option('--signal <pid[:signal]>', 'with --follow: send a signal when acting (default SIGTERM), e.g. 4242:SIGUSR1')
    .option('--exec <command>', `with --follow: run this shell command when acting; its environment has ${EXEC_VARIABLES.join(', ')}`)
    .option('--on <verdicts>', 'with --follow: verdicts that trigger the actions, comma-separated (default: converged,stalled,oscillating,diverging,failed)')
    .option('--events', 'with --follow: write one JSON object per state change to stdout (NDJSON), the verdict last')
    .option('--min-iterations <n>', `with --follow: never act before this many iterations (default ${DEFAULT_MIN_ITERATIONS})`)
    .option('--dry-run', 'with --follow: say what would be done, do nothing');
  addPollOption(command, 'with --follow: poll the log every ms (default 1000) instead of waiting for change events; for network file systems');
  addCriteriaOptions(addSourceOptions(command));
  command.addHelpText('after', `
Exit codes: ${Object.entries(EXIT_CODES).map(([verdict, code]) => `${code} ${verdict}`).join(', ')};
  2 usage error, 3 unreadable input. Several logs: the worst verdict decides.

The --exec command's environment:
${EXEC_VARIABLES.map((name) => `  ${name.padEnd(17)} ${EXEC_VARIABLE_MEANINGS[name]}`).join('\n')}`);
  command.action(async (logs: string[], flags: CheckFlags) => {
    const gate = readGateFlags(flags, logs, osConstants.signals);
    const common = {
      json: flags.json === true,
      criteria: criteriaFromOptions(flags),
      ...runReadingOf(flags),
      stdout: process.stdout,
    };
    if (gate === undefined) {
      process.exitCode = await runCheck({ ...common, logs });
      return;
    }
    for (const warning of checkGateInputs(gate, logs)) process.stderr.write(`settle: warning: ${warning}\n`);
    process.exitCode = await runGate({ ...common, log: logs[0], gate, stderr: process.stderr });
  });
}

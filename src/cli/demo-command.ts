/**
 * `settle demo`: run the built-in cavity solver (src/demo/) and watch it converge, stall, oscillate
 * or diverge, live in the dashboard, or (with --no-ui, or when stdout is not a terminal) run it to
 * the end and print the `check` result.
 *
 * The solver runs in a child process appending to a log (a temporary one unless --out is given),
 * at most DEMO_RATE iterations per second so the dashboard visibly grows. When the dashboard closes
 * the solver is stopped and the temporary folder removed. --out never overwrites an existing file.
 */
import { fork, type ChildProcess } from 'node:child_process';
import { closeSync, existsSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Option, type Command } from 'commander';
import { UsageError } from '../errors.js';
import { DEFAULT_CRITERIA, type Criteria } from '../analysis/criteria.js';
import type { KindOverrides } from '../parse/record-parser.js';
import { parsePositiveNumber } from './common-options.js';
import { SCENARIOS, SCENARIO_NAMES, isScenarioName, type ScenarioName } from '../demo/cavity-scenarios.js';
import { LOG_FORMATS, isLogFormat, type LogFormat } from '../demo/log-writers.js';
import { DEMO_DEFAULTS } from '../demo/run-cavity-scenario.js';
import type { DemoProcessArguments } from '../demo/write-cavity-log.js';

/** Iterations per second the demo solver writes at most (live mode). */
export const DEMO_RATE = 250;
/** Grids the demo accepts: coarser is not a flow, finer is minutes per run with an explicit method. */
export const DEMO_GRID_RANGE = { min: 8, max: 128 } as const;
/** Rayleigh numbers the demo accepts (steady laminar flow; above 1e5 it needs grids of 64 and more). */
export const DEMO_RA_MAX = 1e6;

export interface DemoOptions {
  readonly scenario: ScenarioName;
  readonly rayleigh: number;
  readonly cells: number;
  readonly format: LogFormat;
  /** Live dashboard (false: run to the end and print the check result). */
  readonly ui: boolean;
  readonly out?: string;
}

interface RawDemoOptions {
  scenario: string;
  ra: string;
  grid: string;
  ui: boolean;
  out?: string;
  format: string;
  study?: boolean;
}

type RunWatch = (options: {
  paths: string[]; parserFiles: string[]; parserId?: string; kindOverrides: KindOverrides; criteria: Criteria; pollMs?: number; title?: string;
}) => Promise<number>;
type RunCheck = (options: {
  logs: string[]; json: boolean; criteria: Criteria; parserFiles: string[]; parserId?: string; kindOverrides: KindOverrides; stdout: NodeJS.WritableStream;
}) => Promise<number>;

const NO_OVERRIDES: KindOverrides = { residual: [], quantity: [] };
const EXTENSIONS: Record<LogFormat, string> = { kv: 'log', block: 'log', table: 'log', csv: 'csv', jsonl: 'jsonl' };

/** Check and type the command line (pure; throws UsageError). */
export function demoOptionsOf(raw: RawDemoOptions, stdoutIsTerminal: boolean): DemoOptions {
  if (raw.study) {
    throw new UsageError('settle demo --study is not available yet: it needs `settle compare`, which has not landed',
      'run the healthy case on several grids by hand: settle demo --no-ui --grid 16, then 24, then 32');
  }
  if (!isScenarioName(raw.scenario)) {
    throw new UsageError(`unknown scenario '${raw.scenario}'`, `choose one of: ${SCENARIO_NAMES.join(', ')}`);
  }
  if (!isLogFormat(raw.format)) {
    throw new UsageError(`unknown log format '${raw.format}'`, `choose one of: ${LOG_FORMATS.join(', ')}`);
  }
  const rayleigh = parsePositiveNumber('--ra', raw.ra);
  if (rayleigh > DEMO_RA_MAX) {
    throw new UsageError(`--ra ${raw.ra} is above ${DEMO_RA_MAX.toExponential()}, where this cavity's flow stops being steady and the demo's explicit method gets slow`,
      'use a Rayleigh number from 1e3 to 1e6 (1e5 and above want --grid 64 or finer)');
  }
  const cells = parsePositiveNumber('--grid', raw.grid, { integer: true });
  if (cells < DEMO_GRID_RANGE.min || cells > DEMO_GRID_RANGE.max) {
    throw new UsageError(`--grid ${raw.grid} is outside ${DEMO_GRID_RANGE.min} to ${DEMO_GRID_RANGE.max} cells per side`,
      `for example --grid ${DEMO_DEFAULTS.cells}`);
  }
  if (raw.out !== undefined && existsSync(raw.out)) {
    throw new UsageError(`--out ${raw.out} already exists; settle demo does not overwrite files`,
      'remove it first or give a new file name');
  }
  return { scenario: raw.scenario, rayleigh, cells, format: raw.format, ui: raw.ui && stdoutIsTerminal, out: raw.out };
}

export function registerDemoCommand(program: Command): void {
  program
    .command('demo')
    .description('run the built-in demo solver (natural convection in a heated square cavity) and watch settle judge it')
    .addOption(new Option('--scenario <name>', `what the run does: ${SCENARIO_NAMES.map((n) => `${n} (${SCENARIOS[n].expected})`).join(', ')}`)
      .default('healthy'))
    .option('--ra <number>', 'Rayleigh number', String(DEMO_DEFAULTS.rayleigh))
    .option('--grid <cells>', 'cells per side of the uniform grid', String(DEMO_DEFAULTS.cells))
    .option('--no-ui', 'run the solver to the end and print the check result instead of the dashboard')
    .option('--out <file>', 'keep the log in this new file (never overwrites) instead of a temporary one')
    .addOption(new Option('--format <format>', 'log format the solver writes').choices([...LOG_FORMATS]).default('kv'))
    .option('--study', 'grid study with the benchmark value (not available yet)')
    .action(async (raw: RawDemoOptions) => {
      const options = demoOptionsOf(raw, process.stdout.isTTY === true);
      process.exitCode = await runDemo(options, process.stdout, process.stderr);
    });
}

/** Run the demo; resolves with the exit code of the view (dashboard or check). */
export async function runDemo(options: DemoOptions, stdout: NodeJS.WritableStream, stderr: NodeJS.WritableStream): Promise<number> {
  const tempDir = options.out === undefined ? mkdtempSync(path.join(tmpdir(), 'settle-demo-')) : undefined;
  const logPath = options.out ?? path.join(tempDir as string, `cavity-${options.scenario}.${EXTENSIONS[options.format]}`);
  const parserId = `settle-${options.format}`;
  const title = `settle demo: ${options.scenario} cavity, Ra ${options.rayleigh.toExponential().replace('e+', 'e')}, grid ${options.cells}×${options.cells}`;
  // Create the log ourselves, exclusively: if a file appeared under that name since the check, fail
  // rather than write into it.
  try {
    closeSync(openSync(logPath, 'wx'));
  } catch {
    if (tempDir !== undefined) rmSync(tempDir, { recursive: true, force: true });
    throw new UsageError(`cannot create ${logPath} (it exists, or the folder is not writable)`, 'give --out a new file in a writable folder');
  }
  let child: ChildProcess | undefined;
  try {
    if (!options.ui) {
      const { writeCavityLog } = await import('../demo/write-cavity-log.js');
      const fd = openSync(logPath, 'a');
      let summary;
      try {
        summary = writeCavityLog(options, (text) => writeSync(fd, text));
      } finally {
        closeSync(fd);
      }
      const ending = { target: 'reached the solver\'s target', 'blow-up': 'stopped by the solver\'s divergence guard', budget: 'used its iteration budget' }[summary.end];
      stderr.write(`${title}: ${summary.iterations} iterations (${ending})${options.out === undefined ? '' : `, log in ${options.out}`}\n`);
      const runCheck = await loadView<RunCheck>('./check-command.js', 'runCheck', 'check');
      return await runCheck({ logs: [logPath], json: false, criteria: DEFAULT_CRITERIA, parserFiles: [], parserId, kindOverrides: NO_OVERRIDES, stdout });
    }
    const runWatch = await loadView<RunWatch>('./watch-command.js', 'runWatch', 'watch');
    child = startSolver({ ...options, out: logPath, rate: DEMO_RATE });
    const solverErrors = collectText(child);
    const code = await runWatch({ paths: [logPath], parserFiles: [], parserId, kindOverrides: NO_OVERRIDES, criteria: DEFAULT_CRITERIA, title });
    if (child.exitCode !== null && child.exitCode !== 0) stderr.write(solverErrors());
    return code;
  } finally {
    if (child !== undefined) await stopSolver(child);
    if (tempDir !== undefined) rmSync(tempDir, { recursive: true, force: true });
  }
}

/** The dashboard and the check live in other commands' modules, loaded only when needed. */
async function loadView<T>(specifier: string, name: string, command: string): Promise<T> {
  const module = (await import(specifier)) as Record<string, unknown>;
  const view = module[name];
  if (typeof view !== 'function') {
    throw new UsageError(`settle demo needs \`settle ${command}\`, which is not in this build yet`,
      command === 'watch' ? 'try settle demo --no-ui' : 'update settle, or use --out FILE and read the log with another command');
  }
  return view as T;
}

/** The solver gets no terminal: a node process restores the terminal settings it found at start-up
 * when it exits, which would undo the dashboard's raw mode if it shared the terminal. Its error
 * output is kept (first 4 KiB) and shown if it fails. */
function startSolver(args: DemoProcessArguments): ChildProcess {
  const script = fileURLToPath(new URL('../demo/demo-solver-process.js', import.meta.url));
  const { format, scenario, rayleigh, cells, out, rate } = args;
  return fork(script, [JSON.stringify({ format, scenario, rayleigh, cells, out, rate })], { stdio: ['ignore', 'ignore', 'pipe', 'ipc'] });
}

function collectText(child: ChildProcess): () => string {
  let text = '';
  child.stderr?.setEncoding('utf8');
  child.stderr?.on('data', (chunk: string) => {
    if (text.length < 4096) text += chunk;
  });
  return () => text;
}

/** Ask the solver to stop and wait for it (it finishes its current write first). */
function stopSolver(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
  });
}

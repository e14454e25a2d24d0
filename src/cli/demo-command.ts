/**
 * `settle demo`: run the built-in cavity solver (src/demo/) and watch it converge, stall, oscillate
 * or diverge, live in the dashboard, or (with --no-ui, or when stdout is not a terminal) run it to
 * the end and print the `check` result.
 *
 * `settle demo --study` runs the healthy case on three grids (src/demo/grid-study-plan.ts), unpaced,
 * writes the three logs to a temporary folder (or a new folder given by --out), hands them to the
 * real `settle compare` path (parse → analysis → Grid Convergence Index, Celik et al. 2008) for the
 * hot-wall Nusselt number, and prints its result followed by the benchmark value of de Vahl Davis
 * (1983) (src/demo/cavity-benchmark.ts).
 *
 * The solver runs in a child process appending to a log (a temporary one unless --out is given),
 * at most DEMO_RATE iterations per second so the dashboard visibly grows. When the dashboard closes
 * the solver is stopped and the temporary folder removed. --out never overwrites an existing file.
 */
import { fork, type ChildProcess } from 'node:child_process';
import { closeSync, existsSync, mkdirSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Writable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { Option, type Command } from 'commander';
import { InputError, UsageError } from '../errors.js';
import { DEFAULT_CRITERIA, type Criteria } from '../analysis/criteria.js';
import type { KindOverrides } from '../parse/record-parser.js';
import { parsePositiveNumber } from './common-options.js';
import { SCENARIOS, SCENARIO_NAMES, isScenarioName, type ScenarioName } from '../demo/cavity-scenarios.js';
import { LOG_FORMATS, isLogFormat, type LogFormat } from '../demo/log-writers.js';
import { DEMO_DEFAULTS } from '../demo/run-cavity-scenario.js';
import type { DemoProcessArguments } from '../demo/write-cavity-log.js';
import { benchmarkJson, benchmarkText, compareWithBenchmark, rayleighText } from '../demo/cavity-benchmark.js';
import { STUDY_GRID_STEP, STUDY_TARGET, defaultStudyCoarseGrid, studyGrids } from '../demo/grid-study-plan.js';
import { formatCount } from '../text/format-count.js';

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

/** `settle demo --study`. */
export interface DemoStudyOptions {
  readonly rayleigh: number;
  /** Cells per side of the three grids, fine first. */
  readonly grids: readonly [number, number, number];
  readonly format: LogFormat;
  readonly json: boolean;
  /** A new folder to keep the three logs in (otherwise a temporary one, removed afterwards). */
  readonly out?: string;
}

interface RawDemoOptions {
  scenario: string;
  ra: string;
  /** Undefined when not given: the demo's default grid, or the study's default coarse grid. */
  grid?: string;
  json?: boolean;
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
  if (raw.json) throw new UsageError('--json goes with --study (the grid study\'s result as JSON)', 'for example settle demo --study --json');
  if (!isScenarioName(raw.scenario)) {
    throw new UsageError(`unknown scenario '${raw.scenario}'`, `choose one of: ${SCENARIO_NAMES.join(', ')}`);
  }
  if (!isLogFormat(raw.format)) {
    throw new UsageError(`unknown log format '${raw.format}'`, `choose one of: ${LOG_FORMATS.join(', ')}`);
  }
  const rayleigh = rayleighOf(raw.ra);
  const cells = parsePositiveNumber('--grid', raw.grid ?? String(DEMO_DEFAULTS.cells), { integer: true });
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

function rayleighOf(text: string): number {
  const rayleigh = parsePositiveNumber('--ra', text);
  if (rayleigh > DEMO_RA_MAX) {
    throw new UsageError(`--ra ${text} is above ${DEMO_RA_MAX.toExponential()}, where this cavity's flow stops being steady and the demo's explicit method gets slow`,
      'use a Rayleigh number from 1e3 to 1e6 (1e5 and above want --grid 64 or finer)');
  }
  return rayleigh;
}

/** Check and type the command line of `settle demo --study` (pure but for the --out check; throws UsageError). */
export function demoStudyOptionsOf(raw: RawDemoOptions): DemoStudyOptions {
  if (raw.scenario !== 'healthy') {
    throw new UsageError(`--study runs the healthy case only, not '${raw.scenario}'`, 'drop --scenario (a grid study needs converged runs)');
  }
  if (!isLogFormat(raw.format)) {
    throw new UsageError(`unknown log format '${raw.format}'`, `choose one of: ${LOG_FORMATS.join(', ')}`);
  }
  const rayleigh = rayleighOf(raw.ra);
  const coarse = raw.grid === undefined ? defaultStudyCoarseGrid(rayleigh) : parsePositiveNumber('--grid', raw.grid, { integer: true });
  const coarsest = Math.ceil(DEMO_GRID_RANGE.min / STUDY_GRID_STEP) * STUDY_GRID_STEP;
  const finest = Math.floor(DEMO_GRID_RANGE.max / 2.25 / STUDY_GRID_STEP) * STUDY_GRID_STEP;
  if (coarse % STUDY_GRID_STEP !== 0 || coarse < coarsest || coarse > finest) {
    throw new UsageError(`with --study, --grid is the coarse grid of three (refined by 1.5 twice) and must be a multiple of ${STUDY_GRID_STEP} from ${coarsest} to ${finest}, got ${raw.grid}`,
      `for example --grid ${defaultStudyCoarseGrid(rayleigh)} (grids ${studyGrids(defaultStudyCoarseGrid(rayleigh)).slice().reverse().join(', ')})`);
  }
  if (raw.out !== undefined && existsSync(raw.out)) {
    throw new UsageError(`--out ${raw.out} already exists; settle demo --study keeps its three logs in a new folder and does not write into existing ones`,
      'give the name of a folder to create');
  }
  return { rayleigh, grids: studyGrids(coarse), format: raw.format, json: raw.json === true, out: raw.out };
}

export function registerDemoCommand(program: Command): void {
  program
    .command('demo')
    .description('run the built-in demo solver (natural convection in a heated square cavity) and watch settle judge it')
    .addOption(new Option('--scenario <name>', `what the run does: ${SCENARIO_NAMES.map((n) => `${n} (${SCENARIOS[n].expected})`).join(', ')}`)
      .default('healthy'))
    .option('--ra <number>', 'Rayleigh number', String(DEMO_DEFAULTS.rayleigh))
    .option('--grid <cells>', `cells per side of the uniform grid (default ${DEMO_DEFAULTS.cells}; with --study, the coarse grid: default 16, 24 above Ra 1e4)`)
    .option('--no-ui', 'run the solver to the end and print the check result instead of the dashboard')
    .option('--out <path>', 'keep the log in this new file (never overwrites) instead of a temporary one; with --study, a new folder for the three logs')
    .addOption(new Option('--format <format>', 'log format the solver writes').choices([...LOG_FORMATS]).default('kv'))
    .option('--study', 'grid study: the healthy case on three grids, the compare result for nu_hot, and the benchmark value')
    .option('--json', 'with --study: print the compare JSON with a benchmark field')
    .action(async (raw: RawDemoOptions) => {
      if (raw.study) {
        process.exitCode = await runDemoStudy(demoStudyOptionsOf(raw), process.stdout, process.stderr);
        return;
      }
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
      stderr.write(`${title}: ${formatCount(summary.iterations)} iterations (${ending})${options.out === undefined ? '' : `, log in ${options.out}`}\n`);
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

/**
 * The grid study: run the healthy case on the three grids (coarse first: the cheapest run fails
 * first), unpaced, each to STUDY_TARGET; then `runCompare` on the three logs for nu_hot with
 * cells = grid² in 2-D, and the benchmark comparison. Progress lines go to stderr. Resolves with 0
 * when the study was made; a run that does not reach the solver's target is an InputError.
 */
export async function runDemoStudy(options: DemoStudyOptions, stdout: NodeJS.WritableStream, stderr: NodeJS.WritableStream): Promise<number> {
  if (options.out !== undefined) {
    try {
      mkdirSync(options.out);
    } catch {
      throw new UsageError(`cannot create the folder ${options.out} (it exists, or its parent does not, or is not writable)`, 'give --out the name of a new folder in a writable place');
    }
  }
  const dir = options.out ?? mkdtempSync(path.join(tmpdir(), 'settle-demo-study-'));
  const ra = rayleighText(options.rayleigh);
  const logs = options.grids.map((cells) => path.join(dir, `cavity-ra${ra}-grid${cells}.${EXTENSIONS[options.format]}`));
  try {
    const { writeCavityLog } = await import('../demo/write-cavity-log.js');
    stderr.write(`settle demo --study: healthy cavity at Ra ${ra} on grids ${[...options.grids].reverse().join(', ')} (refinement ratio 1.5)\n`);
    for (const i of [2, 1, 0]) {
      const cells = options.grids[i];
      const fd = openSync(logs[i], 'wx');
      let summary;
      try {
        summary = writeCavityLog({ scenario: 'healthy', rayleigh: options.rayleigh, cells, format: options.format, target: STUDY_TARGET }, (text) => writeSync(fd, text));
      } finally {
        closeSync(fd);
      }
      const nu = summary.last === undefined ? 'none' : summary.last.nuHot.toFixed(4);
      stderr.write(`grid ${cells}: ${formatCount(summary.iterations)} iterations, nu_hot ${nu}\n`);
      if (summary.end !== 'target') {
        const why = summary.end === 'blow-up' ? 'was stopped by the solver\'s divergence guard' : 'used its iteration budget';
        throw new InputError(`the healthy case at Ra ${ra} on grid ${cells} ${why}, so it cannot enter a grid study`,
          options.rayleigh > 1e5 ? 'use --ra 1e5 or lower: above it this explicit solver needs finer grids than the demo allows' : 'use a finer coarse grid, e.g. --grid 32');
      }
    }
    const { runCompare } = await import('./compare-command.js');
    const captured = textSink();
    const study = await runCompare({
      logs, quantity: 'nu_hot', cells: options.grids.map((n) => n * n), dimensions: 2, allowUnsettled: false, json: options.json,
      criteria: DEFAULT_CRITERIA, parserFiles: [], parserId: `settle-${options.format}`, kindOverrides: { residual: [], quantity: ['nu_hot'] }, stdout: captured.stream,
    });
    const gci = study.gci;
    const comparison = compareWithBenchmark({
      rayleigh: options.rayleigh, fine: study.grids[0].value,
      extrapolated: gci.convergence === 'degenerate' ? undefined : gci.extrapolated,
      band: gci.convergence === 'degenerate' ? undefined : gci.gciFineAbsolute,
    });
    const kept = options.out === undefined ? null : dir;
    if (options.json) {
      const result = JSON.parse(captured.text()) as Record<string, unknown>;
      result.benchmark = benchmarkJson(comparison);
      result.demo = { rayleigh: options.rayleigh, cellsPerSide: options.grids, refinementRatio: 1.5, logsKeptIn: kept };
      stdout.write(`${JSON.stringify(result)}\n`);
    } else {
      const where = kept === null ? 'The logs were in a temporary folder, now removed (keep them with --out DIR).' : `The logs are in ${kept}.`;
      stdout.write(`${captured.text()}\n${benchmarkText(comparison)}${where}\n`);
    }
    return 0;
  } finally {
    if (options.out === undefined) rmSync(dir, { recursive: true, force: true });
  }
}

/** A stream that keeps what is written to it. */
function textSink(): { stream: NodeJS.WritableStream; text: () => string } {
  const chunks: string[] = [];
  const stream = new Writable({
    write(chunk: Buffer | string, _encoding, callback) {
      chunks.push(typeof chunk === 'string' ? chunk : chunk.toString('utf8'));
      callback();
    },
  });
  return { stream, text: () => chunks.join('') };
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

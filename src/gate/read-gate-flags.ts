/**
 * Read the gate's flags (`settle check --follow` and its actions) from their raw command-line text
 * into typed settings, refusing bad values and bad combinations with one-line UsageErrors and hints.
 * Pure: the platform's signal table is passed in, and the checks that need the system (is the
 * process running, is the folder writable) are in check-gate-inputs.ts. O(flags).
 *
 * Decisions: the action and follow flags (and --poll) need `--follow` (a post-mortem check acting on a finished
 * run would signal or stop a process that is not the run it read); `--follow` watches one run (start
 * one gate per run); `--events` owns standard output, so it does not mix with `--json`.
 */
import { FINAL_STATES, type State } from '../analysis/diagnosis.js';
import { UsageError, shorten } from '../errors.js';
import { parseDuration } from './parse-duration.js';
import { parseProcessId } from './parse-process-id.js';
import { parseSignalTarget, type SignalTarget } from './parse-signal-target.js';
import { parseVerdictList } from './parse-verdict-list.js';

/** Default of --min-iterations: nothing acts on a run younger than this (safe by default). */
export const DEFAULT_MIN_ITERATIONS = 50;

/** The raw values as commander hands them over (undefined when a flag was not given). */
export interface RawGateFlags {
  follow?: boolean;
  idle?: string;
  pid?: string;
  stopFile?: string;
  signal?: string;
  exec?: string;
  on?: string;
  events?: boolean;
  minIterations?: string;
  dryRun?: boolean;
  json?: boolean;
  /** --poll, which only a followed log uses (ms, or true for the default). */
  poll?: number | boolean;
}

export interface GateSettings {
  readonly idleMs?: number;
  readonly pid?: number;
  readonly stopFile?: string;
  readonly signal?: SignalTarget;
  readonly exec?: string;
  readonly on: ReadonlySet<State>;
  readonly events: boolean;
  readonly minIterations: number;
  readonly dryRun: boolean;
}

const FLAG_NAMES: readonly [keyof RawGateFlags, string][] = [
  ['idle', '--idle'], ['pid', '--pid'], ['stopFile', '--stop-file'], ['signal', '--signal'], ['exec', '--exec'],
  ['on', '--on'], ['events', '--events'], ['minIterations', '--min-iterations'], ['dryRun', '--dry-run'], ['poll', '--poll'],
];

/** Settings for a follow, or undefined for a plain post-mortem check (after refusing gate flags). */
export function readGateFlags(raw: RawGateFlags, logs: readonly string[], knownSignals: Readonly<Record<string, number>>): GateSettings | undefined {
  if (!raw.follow) {
    const given = FLAG_NAMES.filter(([key]) => raw[key] !== undefined && raw[key] !== false).map(([, flag]) => flag);
    if (given.length > 0) {
      throw new UsageError(`${given.join(', ')} ${given.length === 1 ? 'works' : 'work'} only with --follow`,
        given.length === 1 && given[0] === '--poll'
          ? 'drop --poll: a check without --follow reads each log once, to its end (or add --follow to watch a growing log)'
          : 'add --follow to watch the run and act once its verdict is final');
    }
    return undefined;
  }
  if (logs.length !== 1) {
    throw new UsageError(`--follow watches one run, got ${logs.length} logs`, 'start one settle check --follow per run (each in its job script)');
  }
  if (raw.events && raw.json) {
    throw new UsageError('--events and --json both want standard output', 'use --events alone: its last line is the verdict');
  }
  if (raw.exec !== undefined && raw.exec.trim() === '') throw new UsageError('--exec needs a command', `for example --exec 'echo "$SETTLE_VERDICT" >> verdicts.txt'`);
  if (raw.stopFile !== undefined && raw.stopFile.trim() === '') throw new UsageError('--stop-file needs a path', 'for example --stop-file ./STOP');
  return {
    idleMs: raw.idle === undefined ? undefined : parseDuration('--idle', raw.idle),
    pid: raw.pid === undefined ? undefined : parseProcessId('--pid', raw.pid),
    stopFile: raw.stopFile,
    signal: raw.signal === undefined ? undefined : parseSignalTarget(raw.signal, knownSignals),
    exec: raw.exec,
    on: raw.on === undefined ? FINAL_STATES : parseVerdictList(raw.on),
    events: raw.events === true,
    minIterations: raw.minIterations === undefined ? DEFAULT_MIN_ITERATIONS : parseCount('--min-iterations', raw.minIterations),
    dryRun: raw.dryRun === true,
  };
}

function parseCount(flag: string, text: string): number {
  const trimmed = text.trim();
  if (!/^\d+$/.test(trimmed) || !Number.isSafeInteger(Number(trimmed))) {
    throw new UsageError(`${flag} needs a whole number of iterations (0 or more), got '${shorten(text, 20)}'`, `for example ${flag} ${DEFAULT_MIN_ITERATIONS}`);
  }
  return Number(trimmed);
}

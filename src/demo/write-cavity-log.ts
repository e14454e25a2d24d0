/**
 * Write a demo scenario's log through a caller-given `write` function: all at once (for `--no-ui`
 * and the sample logs) or paced in wall-clock time (for the live dashboard).
 */
import { cavityLogRow, runCavityScenario, type CavityRunEnd, type CavityRunOptions } from './run-cavity-scenario.js';
import { createLogWriter, type LogFormat } from './log-writers.js';
import type { CavityIteration } from './cavity-solver.js';

export interface CavityLogOptions extends CavityRunOptions {
  readonly format: LogFormat;
  /** Write every k-th iteration only (default 1), to keep long logs small. The last is always written. */
  readonly every?: number;
}

export interface CavityLogSummary {
  /** Iterations the solver ran. */
  readonly iterations: number;
  readonly end: CavityRunEnd;
  /** The last iteration the solver ran (undefined only if it ran none). */
  readonly last?: CavityIteration;
}

/** What `settle demo` passes to the solver process. */
export interface DemoProcessArguments extends CavityLogOptions {
  /** The log file to append to. */
  readonly out: string;
  /** Iterations per second at most. */
  readonly rate: number;
}

const CHUNK = 1 << 16;

/** Run the scenario to its end, writing its log in chunks of about 64 KiB. */
export function writeCavityLog(options: CavityLogOptions, write: (text: string) => void): CavityLogSummary {
  const writer = createLogWriter(options.format);
  const every = options.every ?? 1;
  const run = runCavityScenario(options);
  let buffer = '';
  let iterations = 0;
  let unwritten: CavityIteration | undefined;
  let last: CavityIteration | undefined;
  for (;;) {
    const next = run.next();
    if (next.done) {
      // The generator says it has ended only after its last iteration: write that one if skipped.
      if (unwritten !== undefined) buffer += writer.row(cavityLogRow(unwritten));
      if (buffer.length > 0) write(buffer);
      return { iterations, end: next.value, last };
    }
    last = next.value;
    iterations = next.value.iteration;
    if (iterations % every === 0 || iterations === 1) {
      buffer += writer.row(cavityLogRow(next.value));
      unwritten = undefined;
    } else {
      unwritten = next.value;
    }
    if (buffer.length >= CHUNK) {
      write(buffer);
      buffer = '';
    }
  }
}

/** Run the scenario, writing at most `rate` iterations per second (checked every 40 ms), until it
 * ends or `stop.requested` turns true. */
export async function writeCavityLogPaced(
  options: DemoProcessArguments,
  write: (text: string) => void,
  stop: { readonly requested: boolean },
  clock: () => number = () => performance.now(),
  sleep: (ms: number) => Promise<void> = (ms) => new Promise((resolve) => setTimeout(resolve, ms)),
): Promise<CavityLogSummary> {
  const writer = createLogWriter(options.format);
  const run = runCavityScenario(options);
  const start = clock();
  let written = 0;
  for (;;) {
    const due = Math.floor(((clock() - start) / 1000) * options.rate) + 1;
    let text = '';
    while (written < due) {
      const next = run.next();
      if (next.done) {
        if (text.length > 0) write(text);
        return { iterations: written, end: next.value };
      }
      text += writer.row(cavityLogRow(next.value));
      written += 1;
    }
    if (text.length > 0) write(text);
    if (stop.requested) return { iterations: written, end: 'budget' };
    await sleep(40);
    if (stop.requested) return { iterations: written, end: 'budget' };
  }
}

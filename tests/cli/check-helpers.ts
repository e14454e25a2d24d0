/** Helpers for the end-to-end tests of `settle check`: run the built CLI, write settle-kv logs
 * (format: parsers/README.md) of known shape. The CLI must be built first (`npx tsc -p tsconfig.json`). */
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';

export const CLI = resolve('dist/src/cli/main.js');

export interface CliResult {
  code: number | null;
  signal: NodeJS.Signals | null;
  stdout: string;
  stderr: string;
}

/** Run `node dist/src/cli/main.js ...args`; kills it (and fails) after timeoutMs. `onStdout` sees
 * standard output as it arrives (to act while settle follows a log). */
export function runSettle(args: readonly string[], timeoutMs = 20_000, onStdout?: (soFar: string) => void): Promise<CliResult> {
  if (!existsSync(CLI)) throw new Error(`build settle first (npx tsc -p tsconfig.json): ${CLI} is missing`);
  return new Promise((resolvePromise, reject) => {
    const child = spawn(process.execPath, [CLI, ...args], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => {
      stdout += chunk;
      onStdout?.(stdout);
    });
    child.stderr.setEncoding('utf8').on('data', (chunk: string) => { stderr += chunk; });
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`settle ${args.join(' ')} did not finish in ${timeoutMs} ms\nstdout: ${stdout}\nstderr: ${stderr}`));
    }, timeoutMs);
    child.once('error', reject);
    child.once('close', (code, signal) => {
      clearTimeout(timer);
      resolvePromise({ code, signal, stdout, stderr });
    });
  });
}

/** A deterministic "noise" in [-0.5, 0.5) (the fractional part of a scaled sine; no randomness). */
export const noise = (i: number): number => {
  const x = Math.sin(i * 12.9898) * 43758.5453;
  return x - Math.floor(x) - 0.5;
};

/** settle-kv lines `iter=i res_p=...` for iterations first..last of a residual history. */
export function kvLines(first: number, last: number, residual: (i: number) => number): string {
  let text = '';
  for (let i = first; i <= last; i++) {
    const r = residual(i);
    text += `iter=${i} res_p=${Number.isFinite(r) ? r.toExponential(5) : String(r)}\n`;
  }
  return text;
}

/** Residual histories of known shape, each with the verdict a careful reader would give it. */
export const HISTORIES = {
  /** Geometric decay, factor 0.97 per iteration: 400 iterations fall 5.3 decades (> 3: converged). */
  converged: { last: 400, residual: (i: number) => 0.97 ** i },
  /** Factor 0.99 per iteration for 250 iterations: 1.1 decades down, still falling (converging). */
  converging: { last: 250, residual: (i: number) => 0.99 ** i },
  /** Two decades down in 50 iterations, then flat (±5 % noise) for 450 (stalled). */
  stalled: { last: 500, residual: (i: number) => (i <= 50 ? 10 ** (-2 * i / 50) : 1e-2 * (1 + 0.1 * noise(i))) },
  /** A cycle of 40 iterations, ±0.5 decades, no net decay, for 1000 iterations (oscillating). */
  oscillating: { last: 1000, residual: (i: number) => 1e-2 * 10 ** (0.5 * Math.sin(2 * Math.PI * i / 40)) },
  /** Growth by 5 % per iteration from 1e-3 (diverging). */
  diverging: { last: 300, residual: (i: number) => 1e-3 * 1.05 ** i },
  /** Falling, then NaN from iteration 90 (failed). */
  failed: { last: 100, residual: (i: number) => (i < 90 ? 0.9 ** i : Number.NaN) },
  /** Five iterations only (undecided: inside the start-up). */
  undecided: { last: 5, residual: (i: number) => 0.99 ** i },
} as const;

export function historyLog(name: keyof typeof HISTORIES): string {
  const history = HISTORIES[name];
  return kvLines(1, history.last, history.residual);
}

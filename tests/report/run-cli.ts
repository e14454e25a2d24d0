/** Helpers for the end-to-end tests of `settle report` and `settle compare`: run the built CLI
 * (`npx tsc -p tsconfig.json` first) and write settle-kv logs (format: parsers/README.md). */
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { seededRandom } from '../analysis/run-fixtures.js';

export const CLI = resolve('dist/src/cli/main.js');

export interface CliResult { code: number | null; stdout: string; stderr: string }

export function runCli(args: readonly string[], timeoutMs = 20_000): Promise<CliResult> {
  if (!existsSync(CLI)) throw new Error(`build settle first (npx tsc -p tsconfig.json): ${CLI} is missing`);
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [CLI, ...args], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (c: string) => { stdout += c; });
    child.stderr.setEncoding('utf8').on('data', (c: string) => { stderr += c; });
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      fail(new Error(`settle ${args.join(' ')} did not finish in ${timeoutMs} ms\n${stderr}`));
    }, timeoutMs);
    child.once('error', fail);
    child.once('close', (code) => {
      clearTimeout(timer);
      done({ code, stdout, stderr });
    });
  });
}

/** Deterministic pseudo-noise in [-0.5, 0.5), from the seeded generator the analysis tests use. */
export function seededNoise(seed: number): () => number {
  const random = seededRandom(seed);
  return () => random() - 0.5;
}

/**
 * A settle-kv log of a steady run: residuals res_p and res_u fall geometrically (a decade every
 * 400 iterations) and the quantity nu_hot relaxes exponentially (e-folding 60 iterations) to `phi`
 * with relative noise 2e-5, so it settles well inside the run. `restartAt` repeats the iteration
 * counter from there (a run continued from a checkpoint).
 */
export function steadyRunLog(phi: number, seed: number, iterations = 1200, restartAt?: number): string {
  const noise = seededNoise(seed);
  const lines: string[] = [];
  const write = (it: number): void => {
    const r = 10 ** (-it / 400) * (1 + 0.1 * Math.sin(it / 7));
    const nu = phi + 0.5 * Math.exp(-it / 60) + phi * 4e-5 * noise();
    lines.push(`iter=${it} res_p=${r.toExponential(4)} res_u=${(0.7 * r).toExponential(4)} nu_hot=${nu.toFixed(7)}`);
  };
  for (let it = 1; it <= iterations; it++) {
    write(it);
    if (restartAt !== undefined && it === restartAt) for (let again = restartAt - 50; again < restartAt; again++) write(again);
  }
  return `${lines.join('\n')}\n`;
}

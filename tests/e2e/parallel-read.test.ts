/**
 * End to end with real worker threads: the built binary reads a log in ranges (knobs set through
 * the environment, see run-monitor.ts) and prints exactly what the sequential read prints, for
 * `inspect --json` and `check --json` (same verdict, same exit code). Uses the benchmark's own
 * log generator on a small size, and the sample logs.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { generateBenchLog } from '../../src/bench/generate-bench-log.js';

const root = join(import.meta.dirname, '..', '..');
const cli = join(root, 'dist', 'src', 'cli', 'main.js');
const folder = mkdtempSync(join(tmpdir(), 'settle-parallel-e2e-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

function settle(args: string[], workers: number): { stdout: string; stderr: string; status: number | null } {
  const env = { ...process.env, SETTLE_READ_WORKERS: String(workers), SETTLE_READ_MIN_BYTES: '0', SETTLE_READ_RANGE_BYTES: '65536' };
  const result = spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', env });
  return { stdout: result.stdout, stderr: result.stderr, status: result.status };
}

describe('reading with worker threads gives what the sequential read gives', () => {
  it('the benchmark log format (block), 40 000 lines in 65 KiB ranges', async () => {
    const log = join(folder, 'bench.log');
    await generateBenchLog(log, 40_000);
    for (const command of [['inspect', '--json', log], ['check', '--json', log]]) {
      const sequential = settle(command, 0);
      const parallel = settle(command, 2);
      expect(parallel.stderr).toBe(sequential.stderr);
      expect(parallel.status).toBe(sequential.status);
      expect(JSON.parse(parallel.stdout)).toEqual(JSON.parse(sequential.stdout));
    }
    expect(JSON.parse(settle(['inspect', '--json', log], 2).stdout).records).toBe(5000);
  }, 30_000);

  it.each(['cavity-healthy.block.log', 'poisson-gauss-seidel.kv.log', 'poisson-jacobi.jsonl'])('sample log %s', (file) => {
    const log = join(root, 'sample-logs', file);
    const sequential = settle(['inspect', '--json', log], 0);
    expect(settle(['inspect', '--json', log], 2).stdout).toBe(sequential.stdout);
  }, 30_000);
});

/**
 * `npm run bench`: speed and memory figures, never run as tests.
 *
 * 1. Read throughput: a deterministic ~800 MB, 16-million-line log in the settle-block format;
 *    times `settle inspect` on it (the full read → parse → store path) as users run it (worker
 *    threads on a machine with several cores) and with the sequential read alone
 *    (SETTLE_READ_WORKERS=0), and `rg -c` / `grep -c` with an equivalent pattern where installed;
 *    each timed BENCH_RUNS times, best wall time kept (the machine may be shared); prints MB/s
 *    (wall and per CPU-second), the ratio settle/rg and peak memory; checks that both reads print
 *    the same summary.
 * 2. Other benchmarks that exist under src/bench/ (analysis, dashboard) are run after it.
 *
 * Options (environment): SETTLE_BENCH_LINES (default 16 000 000), SETTLE_BENCH_DIR (default a folder
 * in the system temp dir; the log is kept there between runs and regenerated when missing).
 */
import { existsSync, mkdirSync, statSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { generateBenchLog } from './generate-bench-log.js';

const here = dirname(fileURLToPath(import.meta.url));
const cli = join(here, '..', 'cli', 'main.js');

interface Timed {
  readonly seconds: number;
  /** User + system CPU seconds (NaN without /usr/bin/time): steadier than wall time on a shared machine. */
  readonly cpuSeconds: number;
  readonly maxRssMB: number;
  readonly stdout: string;
}

/** Run a command under /usr/bin/time when present (for peak RSS), else time it alone. */
function timedOnce(command: string, args: readonly string[], env: NodeJS.ProcessEnv = process.env): Timed {
  const useTime = existsSync('/usr/bin/time');
  const start = process.hrtime.bigint();
  const result = useTime
    ? spawnSync('/usr/bin/time', ['-f', '%U %S %M', command, ...args], { encoding: 'utf8', maxBuffer: 64 << 20, env })
    : spawnSync(command, args, { encoding: 'utf8', maxBuffer: 64 << 20, env });
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  if (result.error) throw result.error;
  const [user, system, rssKB] = useTime ? (result.stderr.trim().split('\n').pop() ?? '').split(' ').map(Number) : [Number.NaN, Number.NaN, Number.NaN];
  return { seconds, cpuSeconds: user + system, maxRssMB: rssKB / 1024, stdout: result.stdout };
}

/** Runs of each timed command; the best wall time is kept (others may share the machine). */
const RUNS = Number(process.env.BENCH_RUNS ?? 3);

function timed(command: string, args: readonly string[], env?: NodeJS.ProcessEnv): Timed {
  let best: Timed | undefined;
  for (let run = 0; run < RUNS; run++) {
    const t = timedOnce(command, args, env);
    if (best === undefined || t.seconds < best.seconds) best = t;
  }
  return best as Timed;
}

function have(command: string): boolean {
  return spawnSync('sh', ['-c', `command -v ${command}`], { encoding: 'utf8' }).status === 0;
}

async function readThroughput(): Promise<void> {
  const lines = Number(process.env.SETTLE_BENCH_LINES ?? 16_000_000);
  const dir = process.env.SETTLE_BENCH_DIR ?? join(tmpdir(), 'settle-bench');
  mkdirSync(dir, { recursive: true });
  const log = join(dir, `bench-block-v2-${lines}.log`);
  if (!existsSync(log)) {
    process.stdout.write(`generating ${log} (${lines} lines)...\n`);
    await generateBenchLog(log, lines);
  }
  const mb = statSync(log).size / 1e6;
  process.stdout.write(`\nread throughput: ${log}, ${mb.toFixed(0)} MB, ${lines} lines\n`);
  // Warm the page cache so every reader sees the same conditions.
  spawnSync('sh', ['-c', `cat '${log}' > /dev/null`]);

  const settle = timed(process.execPath, [cli, 'inspect', '--json', log]);
  const sequential = timed(process.execPath, [cli, 'inspect', '--json', log], { ...process.env, SETTLE_READ_WORKERS: '0' });
  const summary = JSON.parse(settle.stdout) as { records: number; series: unknown[] };
  const rows: [string, Timed][] = [['settle inspect', settle], ['  sequential', sequential]];
  const pattern = '^  (residual|monitor) ';
  if (have('rg')) rows.push(['rg -c', timed('rg', ['-c', pattern, log])]);
  if (have('grep')) rows.push(['grep -cE', timed('grep', ['-cE', pattern, log])]);
  for (const [name, t] of rows) {
    process.stdout.write(`  ${name.padEnd(16)} ${t.seconds.toFixed(2).padStart(7)} s  ${(mb / t.seconds).toFixed(0).padStart(6)} MB/s`
      + `  CPU ${t.cpuSeconds.toFixed(2)} s (${(mb / t.cpuSeconds).toFixed(0)} MB per CPU-second)  peak ${t.maxRssMB.toFixed(0)} MB\n`);
  }
  process.stdout.write(`  settle read ${summary.records} iterations, ${summary.series.length} series`
    + `${sequential.stdout === settle.stdout ? ' (the sequential read printed the same summary)' : ' — WARNING: the sequential read printed a different summary'}\n`);
  const rg = rows.find(([name]) => name === 'rg -c');
  if (rg) {
    process.stdout.write(`  ratio settle/rg throughput: ${(rg[1].seconds / settle.seconds).toFixed(2)} (target >= 0.5);`
      + ` sequential read alone: ${(rg[1].seconds / sequential.seconds).toFixed(2)}\n`);
  }
  process.stdout.write(`  peak memory: ${Math.max(settle.maxRssMB, sequential.maxRssMB).toFixed(0)} MB (target < 300 MB)\n`);
}

async function otherBenchmarks(): Promise<void> {
  for (const name of ['analysis-bench.js', 'dashboard-bench.js']) {
    const file = join(here, name);
    if (!existsSync(file)) continue;
    process.stdout.write(`\n${name.replace('.js', '')}:\n`);
    const result = spawnSync(process.execPath, [file], { stdio: 'inherit' });
    if (result.status !== 0) process.stdout.write(`  (${name} exited with ${result.status})\n`);
  }
}

await readThroughput();
await otherBenchmarks();

/**
 * Dashboard figures (run by `npm run bench`, never by the tests): the built CLI's `settle watch` in
 * a real terminal (tmux, 120×40) on a settle-kv log this script appends to.
 *
 * 1. Latency: from appending one line to the screen showing its iteration (median and worst of 20;
 *    the screen is polled every 2 ms, which adds up to ~2 ms plus one capture).
 * 2. CPU while the log is quiet (10 s), from /proc/<pid>/stat of the watch process.
 * 3. CPU while 1 000 lines a second are appended (10 s, 50 lines every 50 ms).
 * With 2 and 3, the bytes written to the terminal per second (tmux pipe-pane): the SSH bandwidth.
 * Targets (issue 4): < 250 ms, < 1 % and < 15 % of a core. Needs tmux and Linux /proc.
 */
import { execFileSync } from 'node:child_process';
import { appendFileSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const here = path.dirname(fileURLToPath(import.meta.url));
const cli = path.join(here, '..', 'cli', 'main.js');
/** Kernel clock ticks per second for /proc/<pid>/stat times (USER_HZ; 100 on Linux). */
const TICKS_PER_SECOND = 100;

const sleep = (ms: number): Promise<void> => new Promise((resolve) => setTimeout(resolve, ms));

function line(i: number): string {
  const r = 10 ** (-0.0005 * i) * (1 + 0.1 * Math.sin(i / 7));
  return `iter=${i} res_p=${r.toExponential(4)} res_u=${(0.6 * r).toExponential(4)} res_T=${(0.3 * r).toExponential(4)} nu_hot=${(2.243 - Math.exp(-i / 400)).toFixed(6)} dp=${(120 + Math.sin(i / 30)).toFixed(4)}\n`;
}

function cpuSeconds(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  // Fields after the command name: state is field 3, utime 14 and stime 15 (proc(5)), here 0-based 11 and 12.
  return (Number(fields[11]) + Number(fields[12])) / TICKS_PER_SECOND;
}

/** Iteration as the header prints it (groups of three digits). */
const grouped = (n: number): string => String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');

async function main(): Promise<void> {
  const socket = `settle-bench-${process.pid}`;
  const tmux = (...args: string[]): string => execFileSync('tmux', ['-L', socket, ...args], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  const dir = mkdtempSync(path.join(tmpdir(), 'settle-dashboard-bench-'));
  const log = path.join(dir, 'run.log');
  let next = 1;
  const append = (count: number): void => {
    let text = '';
    for (let k = 0; k < count; k++) text += line(next++);
    appendFileSync(log, text);
  };
  try {
    writeFileSync(log, '');
    append(2000);
    tmux('new-session', '-d', '-s', 'bench', '-x', '120', '-y', '40', `exec '${process.execPath}' '${cli}' watch '${log}'`);
    const pid = Number(tmux('display-message', '-p', '-t', 'bench', '#{pane_pid}').trim());
    const screen = (): string => tmux('capture-pane', '-p', '-t', 'bench');
    const waitFor = async (text: string, timeoutMs = 10_000): Promise<void> => {
      const start = Date.now();
      while (!screen().includes(text)) {
        if (Date.now() - start > timeoutMs) throw new Error(`screen never showed '${text}'`);
        await sleep(2);
      }
    };
    await waitFor(`iteration ${grouped(next - 1)}`);
    await sleep(1500);

    const latencies: number[] = [];
    for (let k = 0; k < 20; k++) {
      const iteration = next;
      const start = performance.now();
      append(1);
      await waitFor(`iteration ${grouped(iteration)}`);
      latencies.push(performance.now() - start);
      await sleep(300);
    }
    latencies.sort((a, b) => a - b);

    // Bytes the dashboard writes to the terminal (what an SSH link carries), via tmux pipe-pane.
    const bytesFile = path.join(dir, 'pane-bytes');
    writeFileSync(bytesFile, '');
    tmux('pipe-pane', '-t', 'bench', `cat >> '${bytesFile}'`);
    const bytesNow = (): number => statSync(bytesFile).size;

    await sleep(2000);
    let before = cpuSeconds(pid);
    let bytesBefore = bytesNow();
    await sleep(10_000);
    const quiet = (cpuSeconds(pid) - before) / 10;
    const quietBytes = (bytesNow() - bytesBefore) / 10;

    before = cpuSeconds(pid);
    bytesBefore = bytesNow();
    const started = performance.now();
    for (let k = 0; k < 200; k++) {
      append(50);
      const due = started + (k + 1) * 50;
      await sleep(Math.max(0, due - performance.now()));
    }
    const elapsed = (performance.now() - started) / 1000;
    const busy = (cpuSeconds(pid) - before) / elapsed;
    const busyBytes = (bytesNow() - bytesBefore) / elapsed;
    await waitFor(`iteration ${grouped(next - 1)}`);

    const percent = (x: number): string => `${(100 * x).toFixed(1)} %`;
    process.stdout.write([
      'dashboard (settle watch under tmux, 120×40, settle-kv log with 3 residuals and 2 quantities):',
      `  latency, appended line → on screen: median ${latencies[10].toFixed(0)} ms, worst ${latencies[19].toFixed(0)} ms (target < 250 ms)`,
      `  CPU while the log is quiet: ${percent(quiet)} of a core (target < 1 %); terminal output ${(quietBytes / 1024).toFixed(1)} KiB/s`,
      `  CPU at ${Math.round(10_000 / elapsed)} lines/s: ${percent(busy)} of a core (target < 15 %), history ${next - 1} iterations; terminal output ${(busyBytes / 1024).toFixed(1)} KiB/s`,
      '',
    ].join('\n'));
    tmux('send-keys', '-t', 'bench', 'q');
    await sleep(300);
  } finally {
    try {
      tmux('kill-server');
    } catch {
      // already gone
    }
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`dashboard-bench: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exitCode = 1;
});

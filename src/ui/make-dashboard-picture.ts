/**
 * Make the README picture of the dashboard: run the built CLI's `settle watch` under tmux on a
 * sample log that grows while it watches, capture the screen with its colours
 * (`tmux capture-pane -e -p`) and render it to SVG with our own converter (ansi-to-svg.ts).
 *
 * Usage (after a build): node dist/src/ui/make-dashboard-picture.js [LOG] [OUT.svg]
 * Defaults: sample-logs/cavity-healthy.block.log → sample-logs/pictures/dashboard.svg.
 * Needs tmux. Writes only OUT (and a temporary copy of the log, removed afterwards).
 */
import { execFileSync } from 'node:child_process';
import { appendFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ansiToSvg } from './ansi-to-svg.js';

const COLS = 120;
const ROWS = 36;

const sleep = (ms: number): Promise<void> => new Promise((resolve) => setTimeout(resolve, ms));

async function main(): Promise<void> {
  const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
  const source = path.resolve(process.argv[2] ?? path.join(root, 'sample-logs/cavity-healthy.block.log'));
  const out = path.resolve(process.argv[3] ?? path.join(root, 'sample-logs/pictures/dashboard.svg'));
  const cli = path.join(root, 'dist/src/cli/main.js');
  const socket = `settle-picture-${process.pid}`;
  const tmux = (...args: string[]): string => execFileSync('tmux', ['-L', socket, ...args], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  const dir = mkdtempSync(path.join(tmpdir(), 'settle-picture-'));
  const log = path.join(dir, path.basename(source));
  try {
    const lines = readFileSync(source, 'utf8').split('\n');
    const first = Math.floor(lines.length * 0.3);
    writeFileSync(log, `${lines.slice(0, first).join('\n')}\n`);
    // Started in the log's folder with a relative path, so the header shows a short name.
    tmux('new-session', '-d', '-s', 'picture', '-x', String(COLS), '-y', String(ROWS), '-c', dir, '-e', 'TERM=xterm-256color',
      `'${process.execPath}' '${cli}' watch '${path.basename(log)}'; sleep 5`);
    // Let the log grow for about three seconds, as a running solver's would.
    const steps = 30;
    const rest = lines.slice(first);
    for (let i = 0; i < steps; i++) {
      await sleep(100);
      const chunk = rest.slice(Math.floor((i * rest.length) / steps), Math.floor(((i + 1) * rest.length) / steps));
      if (chunk.length > 0) appendFileSync(log, `${chunk.join('\n')}\n`);
    }
    await sleep(600);
    const screen = tmux('capture-pane', '-e', '-p', '-t', 'picture');
    tmux('send-keys', '-t', 'picture', 'q');
    mkdirSync(path.dirname(out), { recursive: true });
    writeFileSync(out, ansiToSvg(screen, COLS, ROWS, { title: `settle watch on ${path.basename(source)}` }));
    process.stdout.write(`wrote ${path.relative(process.cwd(), out)}\n`);
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
  process.stderr.write(`make-dashboard-picture: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exitCode = 1;
});

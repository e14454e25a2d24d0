/**
 * `settle watch` end to end: the built CLI (node dist/src/cli/main.js, built before the tests run)
 * in a real terminal (tmux), on a log the test appends to while it runs; and without a terminal.
 */
import { execFileSync } from 'node:child_process';
import { appendFileSync, existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { PassThrough, Writable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { runWatch } from '../../src/cli/watch-command.js';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import { EXIT_CODES, type State } from '../../src/analysis/diagnosis.js';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const cli = path.join(root, 'dist/src/cli/main.js');

/** settle-kv lines (parsers/README.md) for iterations from..to: three residuals falling by `decadesPerIteration`
 * (rising when negative) from 1, and a quantity relaxing to 2.243. */
function kvLines(from: number, to: number, decadesPerIteration: number, start = 0): string {
  let out = '';
  for (let i = from; i <= to; i++) {
    const k = i - from + start;
    const r = 10 ** (-decadesPerIteration * k);
    out += `iter=${i} res_p=${r.toExponential(4)} res_u=${(0.5 * r).toExponential(4)} res_T=${(0.2 * r).toExponential(4)} nu_hot=${(2.243 - Math.exp(-i / 40)).toFixed(6)}\n`;
  }
  return out;
}

describe('runWatch without a terminal', () => {
  it('draws nothing, says so on stderr, prints plain state-change lines and ends with the final verdict as exit code', async () => {
    const stdin = new PassThrough();
    let out = '';
    let err = '';
    const stdout = new Writable({ write(chunk, _e, cb) { out += String(chunk); cb(); } });
    const stderr = new Writable({ write(chunk, _e, cb) { err += String(chunk); cb(); } });
    // 10 decades in 1000 iterations, well past the 3-decade drop of the default criteria (common practice).
    stdin.end(kvLines(1, 1000, 0.01));
    const code = await runWatch({ paths: ['-'], parserFiles: [], kindOverrides: { residual: [], quantity: [] }, criteria: DEFAULT_CRITERIA, stdin, stdout, stderr });
    expect(err).toContain('standard output is not a terminal');
    expect(out).toMatch(/^it \d+: res_p \w+/m);
    expect(out).toMatch(/final verdict: \w+ at iteration 1000/);
    expect(out).not.toContain('\x1b[');
    const verdict = /final verdict: (\w+)/.exec(out)?.[1] as State;
    // A steadily falling run is judged converged or still converging, never worse; the exit code is
    // the one the diagnosis contract gives that verdict.
    expect(['converged', 'converging']).toContain(verdict);
    expect(code).toBe(EXIT_CODES[verdict]);
  });
});

const hasTmux = ((): boolean => {
  try {
    execFileSync('tmux', ['-V'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
})();

describe.skipIf(!hasTmux)('settle watch in a real terminal (tmux)', () => {
  let socket: string;
  let dir: string;
  let log: string;
  const tmux = (...args: string[]): string => execFileSync('tmux', ['-L', socket, ...args], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  const screen = (): string => tmux('capture-pane', '-p', '-t', 'watch');
  async function waitFor(test: (text: string) => boolean, what: string, timeoutMs = 8000): Promise<string> {
    const start = Date.now();
    let text = '';
    while (Date.now() - start < timeoutMs) {
      text = screen();
      if (test(text)) return text;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    throw new Error(`timed out waiting for ${what}; screen was:\n${text}`);
  }
  function startWatch(cols: number, rows: number): void {
    const command = `'${process.execPath}' '${cli}' watch '${log}'; echo "settle exited with $?"; sleep 30`;
    tmux('new-session', '-d', '-s', 'watch', '-x', String(cols), '-y', String(rows), command);
  }

  beforeEach(() => {
    if (!existsSync(cli)) throw new Error(`build first (npx tsc -p tsconfig.json): ${cli} is missing`);
    socket = `settle-test-${process.pid}-${Math.random().toString(36).slice(2, 10)}`;
    dir = mkdtempSync(path.join(tmpdir(), 'settle-watch-'));
    log = path.join(dir, 'run.log');
  });
  afterEach(() => {
    try {
      tmux('kill-server');
    } catch {
      // already gone
    }
    rmSync(dir, { recursive: true, force: true });
  });

  it('shows series, iteration and verdict of a growing log, and a diverging tail changes the verdict', async () => {
    writeFileSync(log, kvLines(1, 60, 0.005));
    startWatch(120, 40);
    let text = await waitFor((t) => t.includes('iteration 60'), 'the first 60 iterations');
    for (const name of ['res_p', 'res_u', 'res_T', 'nu_hot', 'settle-kv']) expect(text).toContain(name);
    appendFileSync(log, kvLines(61, 400, 0.005, 60));
    text = await waitFor((t) => t.includes('iteration 400'), 'the appended iterations');
    expect(text).toMatch(/ (CONVERGING|CONVERGED|UNDECIDED|STALLED)/);
    // Residuals now rise by 0.05 decades per iteration: 10 decades in 200 iterations.
    appendFileSync(log, kvLines(401, 600, -0.05, -40));
    text = await waitFor((t) => t.includes('DIVERGING'), 'the diverging verdict');
    expect(text).toContain('iteration 600');
  });

  it('opens the help on ?, keeps every panel readable after a resize to 80×24, and q restores the terminal', async () => {
    writeFileSync(log, kvLines(1, 300, 0.01));
    startWatch(120, 40);
    await waitFor((t) => t.includes('iteration 300'), 'the log');
    tmux('send-keys', '-t', 'watch', '?');
    await waitFor((t) => t.includes('show or hide this help'), 'the help overlay');
    tmux('send-keys', '-t', 'watch', 'Escape');
    await waitFor((t) => !t.includes('show or hide this help'), 'the help to close');

    tmux('resize-window', '-t', 'watch', '-x', '80', '-y', '24');
    const small = await waitFor((t) => t.split('\n')[0].length <= 80 && t.includes('state changes') && t.includes('iteration 300'), 'the 80×24 layout');
    const lines = small.split('\n').filter((line) => line !== '');
    expect(lines.length).toBeLessThanOrEqual(24);
    for (const line of lines) expect([...line].length).toBeLessThanOrEqual(80);
    for (const panel of ['residuals', 'nu_hot', 'series', 'state changes', 'res_p', 'keys']) expect(small).toContain(panel);

    tmux('send-keys', '-t', 'watch', 'q');
    const after = await waitFor((t) => t.includes('settle exited with 0'), 'settle to exit');
    expect(after).not.toContain('residuals');
    // tmux reports whether the alternate screen is still on and whether the cursor is visible.
    expect(tmux('display-message', '-p', '-t', 'watch', '#{alternate_on} #{cursor_flag}').trim()).toBe('0 1');
  });
});

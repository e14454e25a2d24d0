/** The batch gate end to end (issue 5, "Batch gate"): `settle check LOG --follow` on logs in a temp
 * folder, with real processes to signal and watch. Small windows keep these quick. */
import { afterAll, describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { appendFileSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { historyLog, kvLines, runSettle } from './check-helpers.js';

const dir = mkdtempSync(join(tmpdir(), 'settle-follow-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Small judging windows so a geometric decay becomes final within a few hundred iterations. */
const QUICK = ['--follow', '--window', '50', '--startup', '5', '--confirm', '2', '--min-iterations', '50'];

function startSleeper(): { pid: number; ended: Promise<NodeJS.Signals | null>; kill: () => void } {
  const child = spawn('sleep', ['60'], { stdio: 'ignore' });
  const ended = new Promise<NodeJS.Signals | null>((resolve) => child.once('exit', (_code, signal) => resolve(signal)));
  return { pid: child.pid as number, ended, kill: () => void child.kill('SIGKILL') };
}

function file(name: string, text?: string): string {
  const path = join(dir, name);
  if (text !== undefined) writeFileSync(path, text);
  return path;
}

describe('settle check --follow', () => {
  it('follows a growing log until it converges, then writes the stop file, signals and runs the command', async () => {
    const log = file('growing.log', '');
    const stop = file('growing.STOP');
    const envOut = file('growing.env');
    const sleeper = startSleeper();
    // Factor 0.95 per iteration: 3 decades below the peak after about 135 iterations. The writer
    // keeps going for 12 s (6000 iterations), far longer than settle needs even on a loaded machine.
    const LINES = 6000;
    let written = 0;
    const writer = setInterval(() => {
      if (written >= LINES) return;
      appendFileSync(log, kvLines(written + 1, written + 20, (i) => Math.max(0.95 ** i, 1e-20)));
      written += 20;
    }, 40);
    try {
      const result = await runSettle(['check', log, ...QUICK, '--stop-file', stop, '--signal', `${sleeper.pid}:SIGUSR1`,
        '--exec', `printf '%s|%s|%s|%s|%s|%s' "$SETTLE_VERDICT" "$SETTLE_EXIT_CODE" "$SETTLE_LOG" "$SETTLE_REASON" "$SETTLE_ADVICE" "$SETTLE_ITERATION" > '${envOut}'`]);
      expect(result.code).toBe(0);
      expect(result.stdout).toMatch(/: converged \(exit 0\)/);
      expect(result.stdout).toContain('gate: stopped following because the verdict held for the confirmation window');
      expect(result.stdout).toContain(`gate: did write stop file ${stop}`);
      expect(result.stdout).toContain(`gate: did send SIGUSR1 to process ${sleeper.pid}`);
      const content = readFileSync(stop, 'utf8').split('\n');
      expect(content[0]).toBe('settle stop request');
      expect(content).toContain('verdict: converged');
      expect(content).toContain('exit-code: 0');
      expect(content).toContain(`log: ${log}`);
      expect(content.find((line) => line.startsWith('reason: '))).toMatch(/res_p/);
      const [verdict, code, seenLog, reason, advice, iteration] = readFileSync(envOut, 'utf8').split('|');
      expect([verdict, code, seenLog]).toEqual(['converged', '0', log]);
      expect(reason).toMatch(/res_p/);
      expect(advice).toMatch(/^stop/);
      expect(content).toContain(`iteration: ${iteration}`); // the same iteration as the stop file's
      expect(Number(iteration)).toBeGreaterThanOrEqual(50); // --min-iterations
      expect(await sleeper.ended).toBe('SIGUSR1');
      expect(written).toBeLessThan(LINES); // it stopped while the log was still growing
    } finally {
      clearInterval(writer);
      sleeper.kill();
    }
  });

  it('acts on a finished diverging log, with --events as NDJSON ending in the verdict', async () => {
    const log = file('diverging.log', historyLog('diverging'));
    const stop = file('diverging.STOP');
    const result = await runSettle(['check', log, ...QUICK, '--events', '--stop-file', stop]);
    expect(result.code).toBe(30);
    const events = result.stdout.trimEnd().split('\n').map((line) => JSON.parse(line));
    const last = events.at(-1);
    expect(last).toMatchObject({ type: 'verdict', verdict: 'diverging', exitCode: 30, final: true, acted: true, log });
    const changes = events.filter((event) => event.type === 'state-change');
    expect(changes.length).toBeGreaterThan(0);
    for (const change of changes) {
      expect(Object.keys(change)).toEqual(['type', 'iteration', 'series', 'from', 'to', 'text']);
    }
    expect(changes.some((change) => change.series === null && change.to === 'diverging')).toBe(true);
    expect(events.filter((event) => event.type === 'action')).toEqual([
      { type: 'action', action: 'stop-file', description: `write stop file ${stop}`, dryRun: false, ok: true },
    ]);
    expect(readFileSync(stop, 'utf8')).toContain('verdict: diverging');
  });

  it('does nothing on --dry-run but says what it would do', async () => {
    const log = file('dry.log', historyLog('converged'));
    const stop = file('dry.STOP');
    const sleeper = startSleeper();
    try {
      const result = await runSettle(['check', log, ...QUICK, '--dry-run', '--stop-file', stop, '--signal', String(sleeper.pid), '--exec', `touch '${file('dry.touched')}'`]);
      expect(result.code).toBe(0);
      expect(result.stdout).toContain(`gate: dry run, would write stop file ${stop}`);
      expect(result.stdout).toContain(`gate: dry run, would send SIGTERM to process ${sleeper.pid}`);
      expect(result.stdout).toMatch(/gate: dry run, would run 'touch /);
      expect(existsSync(stop)).toBe(false);
      expect(existsSync(file('dry.touched'))).toBe(false);
      expect(() => process.kill(sleeper.pid, 0)).not.toThrow();
    } finally {
      sleeper.kill();
    }
  });

  it('gives up after --idle when the log stops growing, without acting on a verdict that is not final', async () => {
    const log = file('idle.log', historyLog('converging'));
    const stop = file('idle.STOP');
    // How long the gate waits is tested on a fake clock (tests/gate/follow-run.test.ts); here, that
    // the finished log ends the follow through --idle, with the not-final verdict's exit code.
    const result = await runSettle(['check', log, ...QUICK, '--idle', '600ms', '--stop-file', stop]);
    expect(result.code).toBe(10);
    expect(result.stdout).toContain('gate: stopped following because the log did not grow for 600ms');
    expect(result.stdout).toMatch(/gate: no action, the verdict converging is not one of --on/);
    expect(existsSync(stop)).toBe(false);
  });

  it('never acts before --min-iterations', async () => {
    const log = file('young.log', historyLog('converged'));
    const stop = file('young.STOP');
    const result = await runSettle(['check', log, ...QUICK, '--min-iterations', '5000', '--idle', '400ms', '--stop-file', stop]);
    expect(result.code).toBe(0);
    expect(result.stdout).toContain('gate: no action, only 400 iterations logged, fewer than --min-iterations 5000');
    expect(existsSync(stop)).toBe(false);
  });

  it('stops when the watched process ends, and acts when --on asks for that verdict', async () => {
    const log = file('pid.log', historyLog('converging'));
    const stop = file('pid.STOP');
    const sleeper = startSleeper();
    // End the watched process once settle is following (its first event is out), not on a timer.
    const result = await runSettle(['check', log, ...QUICK, '--events', '--pid', String(sleeper.pid), '--on', 'converging', '--stop-file', stop],
      20_000, (soFar) => { if (soFar.includes('\n')) sleeper.kill(); });
    expect(result.code).toBe(10);
    const verdict = JSON.parse(result.stdout.trimEnd().split('\n').at(-1) as string);
    expect(verdict).toMatchObject({ type: 'verdict', verdict: 'converging', exitCode: 10, final: false, acted: true, endedBy: `process ${sleeper.pid} ended` });
    expect(readFileSync(stop, 'utf8')).toContain(`ended-by: process ${sleeper.pid} ended`);
  });
});

describe('settle check --follow: bad input, refused up front (exit 2, one line and a hint)', () => {
  const log = file('bad.log', historyLog('converged'));
  const deadPid = (): Promise<number> => new Promise((resolve) => {
    const child = spawn('true', { stdio: 'ignore' });
    child.once('exit', () => resolve(child.pid as number));
  });

  // A few cases through the built CLI (the whole table runs in-process in check-bad-input.test.ts).
  it.each([
    ['--signal without --follow', async () => ['--signal', String(process.pid)], /--signal works only with --follow/],
    ['a signal name that does not exist', async () => ['--follow', '--signal', `${process.pid}:SIGNOTHING`], /signal that does not exist/],
    ['a --pid that is not running', async () => ['--follow', '--pid', String(await deadPid())], /--pid: no process \d+ is running/],
    ['a stop file that is the log', async () => ['--follow', '--stop-file', log], /is one of the logs/],
  ])('refuses %s', async (_label, extra, message) => {
    const result = await runSettle(['check', log, ...(await extra())]);
    expect(result.code).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr.split('\n')[0]).toMatch(message);
    expect(result.stderr).toMatch(/\n {2}hint: \S/);
  });
});

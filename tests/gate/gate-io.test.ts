/** The gate's I/O pieces on a real file system and real processes: atomic stop file, signals,
 * commands with their environment, and the up-front checks. */
import { afterAll, describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeStopFile } from '../../src/gate/write-stop-file.js';
import { performGateActions } from '../../src/gate/perform-gate-actions.js';
import { checkProcessRunning, checkStopFile, isProcessRunning } from '../../src/gate/check-gate-inputs.js';
import { UsageError } from '../../src/errors.js';

const dir = mkdtempSync(join(tmpdir(), 'settle-gate-io-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function startSleeper(): { pid: number; ended: Promise<NodeJS.Signals | null> } {
  const child = spawn('sleep', ['30'], { stdio: 'ignore' });
  const ended = new Promise<NodeJS.Signals | null>((resolve) => child.once('exit', (_code, signal) => resolve(signal)));
  return { pid: child.pid as number, ended };
}

describe('writeStopFile', () => {
  it('writes the whole text and leaves no temporary file behind', async () => {
    const path = join(dir, 'STOP');
    await writeStopFile(path, 'settle stop request\nverdict: converged\n');
    expect(readFileSync(path, 'utf8')).toBe('settle stop request\nverdict: converged\n');
    await writeStopFile(path, 'second\n');
    expect(readFileSync(path, 'utf8')).toBe('second\n');
    expect(readdirSync(dir).filter((name) => name.includes('STOP'))).toEqual(['STOP']);
  });

  it('fails cleanly, leaving nothing, when the folder is missing', async () => {
    await expect(writeStopFile(join(dir, 'missing', 'STOP'), 'x')).rejects.toThrow(/ENOENT/);
  });
});

describe('performGateActions', () => {
  it('delivers the signal to a running process', async () => {
    const sleeper = startSleeper();
    const [outcome] = await performGateActions([{ kind: 'signal', pid: sleeper.pid, signal: 'SIGUSR1' }], { dryRun: false, execStdout: 'stderr' });
    expect(outcome.ok).toBe(true);
    expect(await sleeper.ended).toBe('SIGUSR1');
  });

  it('reports a process that has already ended, without throwing', async () => {
    const sleeper = startSleeper();
    process.kill(sleeper.pid, 'SIGKILL');
    await sleeper.ended;
    const [outcome] = await performGateActions([{ kind: 'signal', pid: sleeper.pid, signal: 'SIGTERM' }], { dryRun: false, execStdout: 'stderr' });
    expect(outcome).toMatchObject({ ok: false, message: `process ${sleeper.pid} has already ended` });
  });

  it('runs the command through the shell with the settle variables in its environment only', async () => {
    const out = join(dir, 'env.txt');
    const log = join(dir, 'we$(touch pwned)ird.log');
    const [outcome] = await performGateActions([{
      kind: 'exec',
      command: `printf '%s|%s|%s|%s' "$SETTLE_VERDICT" "$SETTLE_REASON" "$SETTLE_LOG" "$SETTLE_EXIT_CODE" > '${out}'`,
      env: { SETTLE_VERDICT: 'diverging', SETTLE_REASON: 'res_p grew 4 decades; `x`', SETTLE_LOG: log, SETTLE_EXIT_CODE: '30' },
    }], { dryRun: false, execStdout: 'stderr' });
    expect(outcome.ok).toBe(true);
    expect(readFileSync(out, 'utf8')).toBe(`diverging|res_p grew 4 decades; \`x\`|${log}|30`);
    expect(existsSync('pwned') || existsSync(join(dir, 'pwned'))).toBe(false);
  });

  it('reports a failing command with its status', async () => {
    const [outcome] = await performGateActions([{ kind: 'exec', command: 'exit 7', env: {} }], { dryRun: false, execStdout: 'stderr' });
    expect(outcome).toMatchObject({ ok: false, message: 'the command exited with status 7' });
  });

  it('does nothing on a dry run', async () => {
    const sleeper = startSleeper();
    const path = join(dir, 'DRY');
    const outcomes = await performGateActions([
      { kind: 'stop-file', path, content: 'x' },
      { kind: 'signal', pid: sleeper.pid, signal: 'SIGTERM' },
      { kind: 'exec', command: `touch '${join(dir, 'dry-exec')}'`, env: {} },
    ], { dryRun: true, execStdout: 'stderr' });
    expect(outcomes.every((o) => o.ok && o.message === 'dry run: not done')).toBe(true);
    expect(existsSync(path)).toBe(false);
    expect(existsSync(join(dir, 'dry-exec'))).toBe(false);
    expect(isProcessRunning(sleeper.pid)).toBe(true);
    process.kill(sleeper.pid, 'SIGKILL');
    await sleeper.ended;
  });
});

describe('up-front checks', () => {
  it('knows whether a process runs', async () => {
    expect(isProcessRunning(process.pid)).toBe(true);
    const sleeper = startSleeper();
    process.kill(sleeper.pid, 'SIGKILL');
    await sleeper.ended;
    expect(isProcessRunning(sleeper.pid)).toBe(false);
    expect(() => checkProcessRunning('--pid', sleeper.pid)).toThrow(`--pid: no process ${sleeper.pid} is running`);
  });

  const log = join(dir, 'run.log');
  writeFileSync(log, 'iter=1 res_p=1\n');
  mkdirSync(join(dir, 'readonly'));
  chmodSync(join(dir, 'readonly'), 0o555);
  symlinkSync(log, join(dir, 'link.log'));
  const rootCanWriteAnywhere = process.getuid?.() === 0;

  it.each([
    ['the stop file is the log', log, /is one of the logs/],
    ['the stop file is the log through a symbolic link', join(dir, 'link.log'), /is one of the logs/],
    ['the folder does not exist', join(dir, 'nowhere', 'STOP'), /does not exist/],
    ['the folder is a file', join(log, 'STOP'), /is not a folder/],
    ['the stop file is a folder', join(dir, 'readonly'), /is a folder/],
  ])('refuses a stop file when %s', (_label, path, message) => {
    expect(() => checkStopFile(path, [log])).toThrow(UsageError);
    expect(() => checkStopFile(path, [log])).toThrow(message);
  });

  it.skipIf(rootCanWriteAnywhere)('refuses a stop file in a folder that is not writable', () => {
    expect(() => checkStopFile(join(dir, 'readonly', 'STOP'), [log])).toThrow(/is not writable/);
  });

  it('accepts a fresh stop file, and warns about one left from before', () => {
    expect(checkStopFile(join(dir, 'FRESH'), [log])).toBeUndefined();
    writeFileSync(join(dir, 'OLD'), 'x');
    expect(checkStopFile(join(dir, 'OLD'), [log])).toMatch(/already exists/);
  });
});

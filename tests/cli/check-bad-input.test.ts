/** Bad input to `settle check`, refused up front (issue 5, "Bad input"): every case through the real
 * command table in this process (commander declarations, flag reading, system checks and the error
 * report of the entry point), so the whole table runs fast. check-follow.test.ts drives a few of
 * the same cases through the built CLI. */
import { afterAll, describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Command } from 'commander';
import { registerCheckCommand } from '../../src/cli/check-command.js';
import { reportFailure } from '../../src/cli/report-failure.js';
import { historyLog } from './check-helpers.js';

const dir = mkdtempSync(join(tmpdir(), 'settle-bad-input-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const log = join(dir, 'run.log');
writeFileSync(log, historyLog('converged'));

/** Run `settle check ...args` in this process up to the first failure; the exit code and stderr
 * the entry point would give. Only refusals are run here: nothing is read or followed. */
async function refuse(args: readonly string[]): Promise<{ code: number; stderr: string }> {
  const program = new Command('settle').exitOverride().configureOutput({ writeErr: () => undefined, writeOut: () => undefined });
  registerCheckCommand(program);
  let stderr = '';
  const sink = { write: (text: string) => { stderr += text; return true; } } as unknown as NodeJS.WritableStream;
  try {
    await program.parseAsync(['node', 'settle', 'check', ...args]);
  } catch (error) {
    return { code: reportFailure(error, sink), stderr };
  }
  throw new Error(`settle check ${args.join(' ')} was not refused`);
}

/** A second name for the log, in another folder (so the log folder itself stays untouched). */
const otherDir = mkdtempSync(join(tmpdir(), 'settle-bad-input-link-'));
afterAll(() => rmSync(otherDir, { recursive: true, force: true }));
function linkToLog(): string {
  const link = join(otherDir, 'alias.log');
  rmSync(link, { force: true });
  symlinkSync(log, link);
  return link;
}

const deadPid = (): Promise<number> => new Promise((resolve) => {
  const child = spawn('true', { stdio: 'ignore' });
  child.once('exit', () => resolve(child.pid as number));
});

describe('settle check refuses bad input with one line and a hint', () => {
  it.each([
    ['--signal without --follow', async () => [log, '--signal', String(process.pid)], /^settle: --signal works only with --follow$/],
    ['--pid and --stop-file without --follow', async () => [log, '--pid', String(process.pid), '--stop-file', join(dir, 'S')], /^settle: --pid, --stop-file work only with --follow$/],
    ['--exec, --on, --idle, --events, --dry-run, --min-iterations without --follow',
      async () => [log, '--exec', 'true', '--on', 'converged', '--idle', '1s', '--events', '--dry-run', '--min-iterations', '5'], /work only with --follow$/],
    ['--poll without --follow (a post-mortem read never polls)', async () => [log, '--poll'], /^settle: --poll works only with --follow$/],
    ['--poll 500 without --follow', async () => [log, '--poll', '500'], /^settle: --poll works only with --follow$/],
    ['a signal name that does not exist', async () => [log, '--follow', '--signal', `${process.pid}:SIGNOTHING`], /signal that does not exist: 'SIGNOTHING'/],
    ['a signal number instead of a name', async () => [log, '--follow', '--signal', `${process.pid}:9`], /signal that does not exist/],
    ['a --signal process that is not running', async () => [log, '--follow', '--signal', String(await deadPid())], /--signal: no process \d+ is running/],
    ['a --pid that is not running', async () => [log, '--follow', '--pid', String(await deadPid())], /--pid: no process \d+ is running/],
    ['--pid 0 (a whole process group)', async () => [log, '--follow', '--pid', '0'], /process id above 1/],
    ['--signal to -1 (every process)', async () => [log, '--follow', '--signal', '-1'], /needs a process id/],
    ['a stop file that is the log', async () => [log, '--follow', '--stop-file', log], /is one of the logs/],
    ['a stop file that is the log through a symbolic link', async () => [log, '--follow', '--stop-file', linkToLog()], /is one of the logs/],
    ['a stop-file folder that does not exist', async () => [log, '--follow', '--stop-file', join(dir, 'no', 'STOP')], /folder .* does not exist/],
    ['a stop file inside a file', async () => [log, '--follow', '--stop-file', join(log, 'STOP')], /is not a folder/],
    ['a stop file that is a folder', async () => [log, '--follow', '--stop-file', dir], /is a folder/],
    ['a duration without a unit', async () => [log, '--follow', '--idle', '30'], /--idle needs a unit/],
    ['a zero duration', async () => [log, '--follow', '--idle', '0s'], /--idle must be longer than zero/],
    ['a duration in days', async () => [log, '--follow', '--idle', '2d'], /--idle needs a duration/],
    ['--on with an unknown verdict', async () => [log, '--follow', '--on', 'converged,finished'], /unknown verdict 'finished'/],
    ['an empty --on', async () => [log, '--follow', '--on', ','], /--on needs at least one verdict/],
    ['--follow on two logs', async () => [log, log, '--follow'], /--follow watches one run, got 2 logs/],
    ['--events with --json', async () => [log, '--follow', '--events', '--json'], /--events and --json/],
    ['an empty --exec', async () => [log, '--follow', '--exec', ''], /--exec needs a command/],
    ['a bad --min-iterations', async () => [log, '--follow', '--min-iterations', '1e3'], /--min-iterations needs a whole number/],
    ['a missing log', async () => [join(dir, 'nope.log')], /cannot read .*nope\.log: no such file/],
    ['standard input twice', async () => ['-', '-'], /standard input \(-\) can be read only once/],
    ['a folder for a log', async () => [dir], /cannot read .*: not a file/],
    ['a bad criteria flag', async () => [log, '--window', 'ten'], /--window needs a whole number/],
  ])('refuses %s', async (_label, args, message) => {
    const { code, stderr } = await refuse(await args());
    expect(code).toBe(/cannot read/.test(message.source) ? 3 : 2);
    const lines = stderr.trimEnd().split('\n');
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatch(message);
    expect(lines[1]).toMatch(/^ {2}hint: \S/);
  });

  it('leaves nothing behind in the log folder after refusing', async () => {
    await refuse([log, '--follow', '--stop-file', log]);
    await refuse([log, '--follow', '--idle', 'soon', '--stop-file', join(dir, 'STOP')]);
    expect(readdirSync(dir)).toEqual(['run.log']);
  });
});

describe('settle check --poll', () => {
  it('hints to drop --poll (not to add --follow) when it is the only follow flag', async () => {
    const { stderr } = await refuse([log, '--poll', '250']);
    expect(stderr).toMatch(/hint: drop --poll: a check without --follow reads each log once, to its end/);
  });

  it('is accepted with --follow (refused here only for the bad signal that follows it)', async () => {
    const { stderr } = await refuse([log, '--follow', '--poll', '250', '--signal', `${process.pid}:SIGNOTHING`]);
    expect(stderr).toMatch(/signal that does not exist/);
  });
});

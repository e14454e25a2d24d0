/** `--poll` is offered only where a log is followed (settle watch, settle check --follow): a
 * post-mortem read (report, inspect, compare, check without --follow) reads each log once and never
 * polls, so there the flag is refused with one line and a hint instead of being silently ignored.
 * Runs the real command table in this process; refusals happen before any log is read. */
import { describe, expect, it } from 'vitest';
import { Command } from 'commander';
import { registerCheckCommand } from '../../src/cli/check-command.js';
import { registerCompareCommand } from '../../src/cli/compare-command.js';
import { registerInspectCommand } from '../../src/cli/inspect-command.js';
import { registerReportCommand } from '../../src/cli/report-command.js';
import { registerWatchCommand } from '../../src/cli/watch-command.js';
import { reportFailure } from '../../src/cli/report-failure.js';

function program(): Command {
  const root = new Command('settle').exitOverride().configureOutput({ writeErr: () => undefined, writeOut: () => undefined });
  for (const register of [registerWatchCommand, registerCheckCommand, registerReportCommand, registerInspectCommand, registerCompareCommand]) register(root);
  return root;
}

/** The exit code and stderr the entry point would give for `settle ...args` (which must fail). */
async function refuse(args: readonly string[]): Promise<{ code: number; stderr: string }> {
  let stderr = '';
  const sink = { write: (text: string) => { stderr += text; return true; } } as unknown as NodeJS.WritableStream;
  try {
    await program().parseAsync(['node', 'settle', ...args]);
  } catch (error) {
    return { code: reportFailure(error, sink), stderr };
  }
  throw new Error(`settle ${args.join(' ')} was not refused`);
}

const help = (name: string): string => {
  const command = program().commands.find((c) => c.name() === name);
  if (command === undefined) throw new Error(`no command ${name}`);
  return command.helpInformation();
};

describe('--poll', () => {
  it('is offered by watch, and by check as a --follow flag', () => {
    expect(help('watch')).toMatch(/--poll \[ms\] +poll the file every ms/);
    expect(help('check')).toMatch(/--poll \[ms\] +with --follow: poll the log every ms/);
  });

  it.each(['report', 'inspect', 'compare'])('is not offered by %s (a post-mortem read never polls)', (name) => {
    expect(help(name)).not.toMatch(/--poll/);
  });

  // The log path need not exist: the refusal comes before anything is read.
  it.each([
    ['report', ['report', 'no-such.log', '--poll']],
    ['report', ['report', 'no-such.log', '--poll', '500']],
    ['inspect', ['inspect', 'no-such.log', '--poll', '500']],
    ['compare', ['compare', 'a.log', 'b.log', 'c.log', '--quantity', 'q', '--cells', '3,2,1', '--poll']],
  ])('is refused by %s with one line and a hint, exit 2', async (name, args) => {
    const { code, stderr } = await refuse(args);
    expect(code).toBe(2);
    const lines = stderr.trimEnd().split('\n');
    expect(lines).toEqual([
      `settle: --poll has no effect on settle ${name}: it reads each log once, to its end`,
      '  hint: drop --poll; to follow a growing log, use settle watch --poll or settle check --follow --poll',
    ]);
  });
});

/**
 * Carry out a gate plan (the I/O half of plan-gate-actions.ts): write the stop file, send the
 * signal, run the command. Each action is attempted even if an earlier one failed, and each outcome
 * is reported; a failed action never throws. With `dryRun` nothing is done and every action is
 * reported as what would be done.
 *
 * `--exec` runs through the shell with the verdict, reason and log in environment variables only:
 * they are never pasted into the command line, so a log path or a reason cannot inject shell code.
 */
import { spawn } from 'node:child_process';
import type { GateAction } from './plan-gate-actions.js';
import { writeStopFile } from './write-stop-file.js';

export interface ActionOutcome {
  readonly action: GateAction;
  readonly ok: boolean;
  /** What happened, plain words (e.g. `process 4242 has already ended`). */
  readonly message?: string;
}

export interface PerformOptions {
  readonly dryRun: boolean;
  /** Where the command's own standard output goes: 'inherit' (settle's stdout) or 'stderr' (keeps
   * an NDJSON stdout clean). */
  readonly execStdout: 'inherit' | 'stderr';
}

export async function performGateActions(actions: readonly GateAction[], options: PerformOptions): Promise<ActionOutcome[]> {
  const outcomes: ActionOutcome[] = [];
  for (const action of actions) {
    if (options.dryRun) {
      outcomes.push({ action, ok: true, message: 'dry run: not done' });
      continue;
    }
    outcomes.push(await perform(action, options));
  }
  return outcomes;
}

async function perform(action: GateAction, options: PerformOptions): Promise<ActionOutcome> {
  switch (action.kind) {
    case 'stop-file':
      try {
        await writeStopFile(action.path, action.content);
        return { action, ok: true };
      } catch (error) {
        return { action, ok: false, message: `could not write ${action.path}: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}` };
      }
    case 'signal':
      try {
        process.kill(action.pid, action.signal);
        return { action, ok: true };
      } catch (error) {
        const code = (error as NodeJS.ErrnoException).code;
        const message = code === 'ESRCH' ? `process ${action.pid} has already ended`
          : code === 'EPERM' ? `not allowed to signal process ${action.pid}` : `could not signal process ${action.pid}: ${code ?? (error as Error).message}`;
        return { action, ok: false, message };
      }
    case 'exec':
      return runCommand(action, options);
  }
}

function runCommand(action: Extract<GateAction, { kind: 'exec' }>, options: PerformOptions): Promise<ActionOutcome> {
  return new Promise((resolve) => {
    const child = spawn(action.command, {
      shell: true,
      env: { ...process.env, ...action.env },
      stdio: ['ignore', options.execStdout === 'stderr' ? 2 : 'inherit', 'inherit'],
    });
    child.once('error', (error) => resolve({ action, ok: false, message: `could not start the command: ${error.message}` }));
    child.once('close', (code, signal) => {
      if (code === 0) resolve({ action, ok: true });
      else resolve({ action, ok: false, message: signal !== null ? `the command was ended by ${signal}` : `the command exited with status ${code}` });
    });
  });
}

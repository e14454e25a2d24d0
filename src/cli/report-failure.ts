/** Turn anything thrown out of a command into one clear message and an exit code. */
import { CommanderError } from 'commander';
import { SettleError } from '../errors.js';

export function reportFailure(error: unknown, stderr: NodeJS.WritableStream): number {
  if (error instanceof CommanderError) {
    // commander has already printed its message (unknown option, missing argument...).
    return error.exitCode === 0 ? 0 : 2;
  }
  if (error instanceof SettleError) {
    stderr.write(`settle: ${error.message}\n`);
    if (error.hint) stderr.write(`  hint: ${error.hint}\n`);
    return error.exitCode;
  }
  const detail = error instanceof Error ? (error.stack ?? error.message) : String(error);
  stderr.write(`settle: internal error: ${error instanceof Error ? error.message : String(error)}\n`
    + '  this is a bug in settle; please report it with the command you ran and the details below.\n');
  if (process.env.SETTLE_DEBUG) stderr.write(`${detail}\n`);
  else stderr.write('  (set SETTLE_DEBUG=1 to see the details)\n');
  return 70;
}

#!/usr/bin/env node
/**
 * settle's entry point: builds the command table and maps outcomes to exit codes. The only place
 * that calls process.exit. Heavy modules (the dashboard, the report charts) load lazily inside the
 * commands that need them, so `settle check` starts fast.
 */
import v8 from 'node:v8';
// User-written regular expressions (parser specs) must not hang settle: let V8 fall back to its
// linear-time engine when a pattern backtracks excessively. Must be set before any user pattern is
// compiled; it cannot be passed through NODE_OPTIONS.
v8.setFlagsFromString('--enable-experimental-regexp-engine-on-excessive-backtracks');

import { buildProgram } from './program.js';
import { reportFailure } from './report-failure.js';

async function main(): Promise<void> {
  const program = buildProgram();
  try {
    await program.parseAsync(process.argv);
  } catch (error) {
    process.exitCode = reportFailure(error, process.stderr);
  }
}

process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  // `settle check ... | head` closes the pipe early: not an error worth a message.
  if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
});

void main();

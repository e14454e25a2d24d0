/** The command table: one module per command, each adding itself to the program. */
import { Command } from 'commander';
import { registerInspectCommand } from './inspect-command.js';
import { registerParsersCommand } from './parsers-command.js';
import { registerCheckCommand } from './check-command.js';
import { registerWatchCommand } from './watch-command.js';
import { registerReportCommand } from './report-command.js';
import { registerCompareCommand } from './compare-command.js';
import { registerDemoCommand } from './demo-command.js';

export function buildProgram(): Command {
  const program = new Command('settle')
    .description('Watch a solver log and say whether the run has converged, is converging, has stalled, oscillates or diverges.')
    .version('0.1.0')
    .showHelpAfterError('(run with --help for usage)')
    .exitOverride();
  program.configureOutput({ outputError: (text, write) => write(`settle: ${text.replace(/^error: /, '')}`) });
  registerWatchCommand(program);
  registerCheckCommand(program);
  registerReportCommand(program);
  registerInspectCommand(program);
  registerCompareCommand(program);
  registerParsersCommand(program);
  registerDemoCommand(program);
  return program;
}

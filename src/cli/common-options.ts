/**
 * Options shared by several commands, declared once. Commands add them with these helpers and read
 * them back typed.
 *
 * OWNER: integration (lead). Helpers use these; ask before changing names.
 */
import { Command, Option } from 'commander';
import type { KindOverrides } from '../parse/record-parser.js';
import { statSync } from 'node:fs';
import { UsageError } from '../errors.js';

export interface SourceOptions {
  poll?: number | boolean;
  parser: string[];
  residual: string[];
  quantity: string[];
}

const collect = (value: string, previous: string[]): string[] => [...previous, value];

export function parsePositiveNumber(flag: string, value: string, { integer = false } = {}): number {
  const n = Number(value);
  if (value.trim() === '' || !Number.isFinite(n) || n <= 0 || (integer && !Number.isInteger(n))) {
    throw new UsageError(`${flag} needs a positive ${integer ? 'whole ' : ''}number, got '${value}'`,
      `for example ${flag} ${integer ? '500' : '1e-5'}`);
  }
  return n;
}

/** --parser, --residual, --quantity: how a log is read and understood. Polling is separate: only
 * commands that follow a growing log offer it (addPollOption); the others refuse it (refusePollOption). */
export function addSourceOptions(command: Command): Command {
  return command
    .addOption(new Option('--parser <spec>', 'parser spec file (JSON) or built-in spec id; repeatable').argParser(collect).default([]))
    .addOption(new Option('--residual <glob>', 'treat series matching this glob as residuals; repeatable').argParser(collect).default([]))
    .addOption(new Option('--quantity <glob>', 'treat series matching this glob as monitored quantities; repeatable').argParser(collect).default([]));
}

/** --poll [ms], for commands that follow a growing log (watch; check, where it needs --follow). */
export function addPollOption(command: Command, description = 'poll the file every ms (default 1000) instead of waiting for change events; for network file systems'): Command {
  return command.addOption(new Option('--poll [ms]', description)
    .argParser((v: string) => parsePositiveNumber('--poll', v, { integer: true })));
}

/** A hidden --poll for commands that read a log once to its end (report, inspect, compare): a
 * post-mortem read never polls, so the flag is refused with a hint instead of being ignored. */
export function refusePollOption(command: Command): Command {
  command.addOption(new Option('--poll [ms]').hideHelp());
  return command.hook('preAction', (self) => {
    if (self.opts().poll === undefined) return;
    throw new UsageError(`--poll has no effect on settle ${self.name()}: it reads each log once, to its end`,
      'drop --poll; to follow a growing log, use settle watch --poll or settle check --follow --poll');
  });
}

export function kindOverridesOf(options: SourceOptions): KindOverrides {
  return { residual: options.residual, quantity: options.quantity };
}

export function pollMsOf(options: SourceOptions): number | undefined {
  if (options.poll === undefined || options.poll === false) return undefined;
  return options.poll === true ? 1000 : options.poll;
}

/** Spec files (paths) and a forced built-in id, from the --parser values. A value that names an
 * existing file or ends in .json is a file; anything else is a spec id. */
export function parserSelectionOf(options: SourceOptions, isFile: (value: string) => boolean): { files: string[]; id?: string } {
  const files: string[] = [];
  let id: string | undefined;
  for (const value of options.parser) {
    if (value.endsWith('.json') || isFile(value)) files.push(value);
    else if (id === undefined) id = value;
    else throw new UsageError(`--parser names two spec ids ('${id}' and '${value}')`, 'give one spec id, or spec files');
  }
  return { files, id };
}

/** How every command reads a run, from its source flags: parser files or id, kind overrides, polling. */
export interface RunReading {
  readonly parserFiles: readonly string[];
  readonly parserId?: string;
  readonly kindOverrides: KindOverrides;
  readonly pollMs?: number;
}

export function runReadingOf(options: SourceOptions): RunReading {
  const selection = parserSelectionOf(options, isExistingFile);
  return { parserFiles: selection.files, parserId: selection.id, kindOverrides: kindOverridesOf(options), pollMs: pollMsOf(options) };
}

export function isExistingFile(value: string): boolean {
  try {
    return statSync(value).isFile();
  } catch {
    return false;
  }
}

/**
 * `settle report LOG... [--format text|md|html|json] [-o FILE]`: a post-mortem report of each log
 * (one section per log): verdict and reasons, advice, per-series states and rates, settled
 * quantities with intervals and iteration errors, the timeline of state changes, criteria met and
 * not met, parser and restarts; Markdown and HTML carry SVG charts. Ends with the cautions.
 *
 * Output goes to stdout, or to the file `-o` names (never over one of the input logs). A big log
 * shows a progress bar on stderr while it is read, only when stderr is a terminal. The exit code is
 * 0 once the report is written, whatever the verdicts (use `settle check` for verdict codes); 4
 * (OutputError) when the -o file cannot be written after the logs were read.
 */
import { realpathSync, statSync, writeFileSync } from 'node:fs';
import { dirname, extname, resolve } from 'node:path';
import { Option, type Command } from 'commander';
import type { Criteria } from '../analysis/criteria.js';
import { OutputError, UsageError } from '../errors.js';
import { REPORT_FORMATS, type ReportFormat, type ReportRun } from '../report/report-input.js';
import type { ProgressStream } from '../report/progress-bar.js';
import { addSourceOptions, refusePollOption, runReadingOf, type RunReading, type SourceOptions } from './common-options.js';
import { checkLogsReadable, postMortemMonitor } from './read-run.js';
import { addCriteriaOptions, criteriaFromOptions } from './criteria-options.js';

export interface RunReportOptions extends RunReading {
  readonly logs: readonly string[];
  readonly format: ReportFormat;
  /** Write here instead of stdout. */
  readonly output?: string;
  readonly criteria: Criteria;
  readonly stdout: NodeJS.WritableStream;
  /** Where the progress bar goes (drawn only when it is a terminal). */
  readonly stderr: ProgressStream;
  readonly version?: string;
}

/** The format: --format when given; else from the -o file's extension; else text. */
export function reportFormatOf(format: string | undefined, output: string | undefined): ReportFormat {
  if (format !== undefined) {
    if (!(REPORT_FORMATS as readonly string[]).includes(format)) {
      throw new UsageError(`--format must be one of ${REPORT_FORMATS.join(', ')}, got '${format}'`, 'for example --format html');
    }
    return format as ReportFormat;
  }
  const extension = output === undefined ? '' : extname(output).toLowerCase();
  if (extension === '.md' || extension === '.markdown') return 'md';
  if (extension === '.html' || extension === '.htm') return 'html';
  if (extension === '.json') return 'json';
  return 'text';
}

function sameFile(a: string, b: string): boolean {
  try {
    const sa = statSync(a);
    const sb = statSync(b);
    return sa.dev === sb.dev && sa.ino === sb.ino;
  } catch {
    return resolve(a) === resolve(b);
  }
}

/** Refuse an output path that is one of the logs, a folder, or in a folder that does not exist. */
export function checkReportOutput(output: string, logs: readonly string[]): void {
  if (output.trim() === '') throw new UsageError('-o needs a file name, got an empty value', 'for example -o run-report.html');
  for (const log of logs) {
    if (log !== '-' && sameFile(output, log)) {
      throw new UsageError(`-o ${output} is one of the logs being read; settle never writes over its input`, 'choose another file name, e.g. report.html');
    }
  }
  let existing;
  try {
    existing = statSync(output);
  } catch {
    existing = undefined;
  }
  if (existing?.isDirectory()) throw new UsageError(`-o ${output} is a folder`, 'give a file name inside it, e.g. -o ' + `${output.replace(/\/$/, '')}/report.html`);
  const folder = dirname(resolve(output));
  let folderIsDir = false;
  try {
    folderIsDir = statSync(realpathSync(folder)).isDirectory();
  } catch {
    folderIsDir = false;
  }
  if (!folderIsDir) throw new UsageError(`cannot write ${output}: the folder ${dirname(output)} does not exist`, 'create the folder first, or choose another path');
}

/** Read each log to its end, judge it, and write the report. */
export async function runReport(options: RunReportOptions): Promise<void> {
  checkLogsReadable(options.logs);
  if (options.output !== undefined) checkReportOutput(options.output, options.logs);
  const { createProgressBar } = await import('../report/progress-bar.js');
  const runs: ReportRun[] = [];
  for (const log of options.logs) {
    const monitor = await postMortemMonitor(log, options, options.criteria);
    const warnings: string[] = [];
    const bar = createProgressBar(options.stderr, log === '-' ? 'standard input' : log);
    monitor.on('source', (event) => {
      if (event.type === 'warning') warnings.push(event.message);
      else if (event.type === 'progress') bar.update(event.bytesRead, event.totalBytes);
    });
    let diagnosis;
    try {
      diagnosis = await monitor.run();
    } finally {
      bar.finish();
    }
    const choice = monitor.parserChoice();
    runs.push({
      log: log === '-' ? 'standard input' : monitor.label,
      diagnosis,
      snapshot: monitor.store.snapshot(),
      parser: choice === undefined ? undefined : { id: choice.id, explanation: choice.explanation },
      warnings,
    });
  }
  const { renderReport } = await import('../report/render-report.js');
  const text = renderReport({ runs, criteria: options.criteria, version: options.version }, options.format);
  if (options.output === undefined) {
    options.stdout.write(text);
    return;
  }
  try {
    writeFileSync(options.output, text, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code ?? 'error';
    throw new OutputError(`cannot write ${options.output} (${code}); the logs were read, the report is not saved`,
      code === 'EACCES' ? 'check the folder permissions or choose another path' : code === 'ENOSPC' ? 'free some disk space or choose another path' : 'choose another path');
  }
}


type ReportFlags = SourceOptions & Record<string, unknown> & { format?: string; output?: string };

export function registerReportCommand(program: Command): void {
  const command = program
    .command('report')
    .description('write a post-mortem report of each log: verdict, reasons, rates, settled quantities, timeline, criteria (Markdown and HTML with charts)')
    .argument('<log...>', 'log files (.gz allowed), or - for standard input; one section each')
    .addOption(new Option('--format <format>', 'text, md, html or json (default: from the -o extension, else text)'))
    .option('-o, --output <file>', 'write the report to this file instead of standard output');
  addCriteriaOptions(refusePollOption(addSourceOptions(command)));
  command.addHelpText('after', `
Exit codes: 0 report written (whatever the verdicts; settle check gives verdict codes), 2 usage error,
  3 unreadable input, 4 the report could not be written (-o) after the logs were read.`);
  command.action(async (logs: string[], flags: ReportFlags) => {
    const format = reportFormatOf(flags.format, flags.output);
    await runReport({
      logs,
      format,
      output: flags.output,
      criteria: criteriaFromOptions(flags),
      ...runReadingOf(flags),
      stdout: process.stdout,
      stderr: process.stderr,
      version: program.version(),
    });
  });
}

/**
 * `settle inspect LOG... [--json]`: what settle reads from a log (parser, iterations, restarts,
 * series with their kinds, counts, first and last values), without judging it. Several logs are one
 * run continued (a restart chain), read in the order given.
 */
import { existsSync, statSync } from 'node:fs';
import type { Command } from 'commander';
import { addSourceOptions, kindOverridesOf, parserSelectionOf, refusePollOption, type SourceOptions } from './common-options.js';
import { DEFAULT_CRITERIA } from '../analysis/criteria.js';
import { formatNumber, jsonNumber } from '../text/format-number.js';
import { formatCount } from '../text/format-count.js';

export interface InspectSummary {
  readonly parser: string;
  readonly explanation: string;
  readonly records: number;
  readonly restarts: number;
  readonly lastIteration: number;
  /** Transient runs: time steps seen and the last physical time. */
  readonly timeSteps?: number;
  readonly lastTime?: number;
  readonly series: readonly { name: string; kind: string; unit?: string; count: number; first: number; last: number }[];
  readonly warnings: readonly string[];
}

export async function inspectLogs(paths: readonly string[], options: SourceOptions): Promise<InspectSummary> {
  const { createRunMonitor } = await import('../monitor/run-monitor.js');
  const selection = parserSelectionOf(options, isFile);
  const monitor = createRunMonitor({
    paths,
    follow: false,
    parserFiles: selection.files,
    parserId: selection.id,
    kindOverrides: kindOverridesOf(options),
    criteria: DEFAULT_CRITERIA,
    analyse: false,
  });
  const warnings: string[] = [];
  monitor.on('source', (event) => {
    if (event.type === 'warning') warnings.push(event.message);
  });
  await monitor.read();
  const snapshot = monitor.store.snapshot();
  const choice = monitor.parserChoice();
  return {
    parser: choice?.id ?? 'none',
    explanation: choice?.explanation ?? 'the log is empty',
    records: snapshot.records,
    restarts: snapshot.restarts.length,
    lastIteration: snapshot.lastIteration,
    timeSteps: snapshot.timeSteps?.length,
    lastTime: snapshot.timeSteps?.[snapshot.timeSteps.length - 1]?.time,
    series: snapshot.series.map((column) => ({
      name: column.info.name,
      kind: column.info.kind,
      unit: column.info.unit,
      count: column.totalAdded,
      first: column.length > 0 ? column.values[0] : Number.NaN,
      last: column.length > 0 ? column.values[column.length - 1] : Number.NaN,
    })),
    warnings,
  };
}

/** The `inspect --json` contract: keep this shape stable (documented in the README). */
export function inspectJson(summary: InspectSummary): string {
  return JSON.stringify({
    parser: summary.parser,
    records: summary.records,
    restarts: summary.restarts,
    series: summary.series.map((s) => ({ name: s.name, kind: s.kind, count: s.count, first: jsonNumber(s.first), last: jsonNumber(s.last) })),
  });
}

export function inspectText(paths: readonly string[], summary: InspectSummary): string {
  const lines = [
    `log:       ${paths.join(' + ')}`,
    `parser:    ${summary.explanation}`,
    `records:   ${plural(summary.records, 'record')}${summary.records > 0 ? ` (last iteration ${formatCount(summary.lastIteration)})` : ''}`
      + (summary.restarts > 0 ? `, ${plural(summary.restarts, 'restart')}` : ''),
  ];
  if (summary.timeSteps !== undefined) {
    lines.push(`transient: ${plural(summary.timeSteps, 'time step')}${summary.lastTime !== undefined ? `, last at t = ${formatNumber(summary.lastTime)}` : ''}`);
  }
  if (summary.series.length === 0) {
    lines.push('series:    none');
  } else {
    const width = Math.max(6, ...summary.series.map((s) => s.name.length));
    lines.push('', `  ${'series'.padEnd(width)}  ${'kind'.padEnd(8)}  ${'count'.padStart(9)}  ${'first'.padStart(11)}  ${'last'.padStart(11)}  unit`);
    for (const s of summary.series) {
      lines.push(`  ${s.name.padEnd(width)}  ${s.kind.padEnd(8)}  ${formatCount(s.count).padStart(9)}  ${formatNumber(s.first).padStart(11)}  ${formatNumber(s.last).padStart(11)}  ${s.unit ?? ''}`.trimEnd());
    }
  }
  for (const warning of summary.warnings) lines.push(`warning:   ${warning}`);
  return `${lines.join('\n')}\n`;
}

function plural(count: number, word: string): string {
  return `${formatCount(count)} ${word}${count === 1 ? '' : 's'}`;
}

function isFile(value: string): boolean {
  return existsSync(value) && statSync(value).isFile();
}

export function registerInspectCommand(program: Command): void {
  refusePollOption(addSourceOptions(
    program
      .command('inspect')
      .description('show what settle reads from a log: parser, iterations, restarts and series (several logs = one run continued)')
      .argument('<log...>', 'log files in order (a restart chain), .gz allowed, or - for standard input')
      .option('--json', 'print one JSON object (a stable contract, see README)'),
  )).action(async (paths: string[], options: SourceOptions & { json?: boolean }) => {
    const summary = await inspectLogs(paths, options);
    process.stdout.write(options.json ? `${inspectJson(summary)}\n` : inspectText(paths, summary));
  });
}

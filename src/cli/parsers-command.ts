/**
 * `settle parsers list` and `settle parsers test SPEC LOG...`: the parser specs settle knows, and
 * what one of them extracts from a log (iterations, restarts, series with their kinds, the first
 * records, a sample of the lines it did not match). For writing and debugging specs.
 */
import { statSync } from 'node:fs';
import { resolve } from 'node:path';
import { Command, Option } from 'commander';
import type { LogRecord, SeriesKind } from '../parse/log-record.js';
import type { LoadedSpec } from '../parse/loaded-spec.js';
import { formatNumber } from '../text/format-number.js';

const collect = (value: string, previous: string[]): string[] => [...previous, value];
const FIRST_RECORDS = 5;

export function registerParsersCommand(program: Command): void {
  const parsers = program.command('parsers').description('list the parser specs settle knows, or test one on a log');

  parsers.command('list')
    .description('list parser specs: built-in ones, files given with --parser, and the user config folder')
    .addOption(new Option('--parser <file>', 'also load this spec file; repeatable').argParser(collect).default([]))
    .action(async (options: { parser: string[] }) => {
      const { loadParserSpecs, defaultConfigDir } = await import('../parse/load-parser-specs.js');
      const specs = loadParserSpecs({ files: options.parser });
      process.stdout.write(`${formatSpecList(specs, defaultConfigDir())}\n`);
    });

  parsers.command('test')
    .description('show what a parser spec (file or id) extracts from a log: records, restarts, series, unmatched lines')
    .argument('<spec>', 'parser spec file (JSON) or spec id')
    .argument('<log...>', 'log file(s) of one run, in order, or - for standard input')
    .addOption(new Option('--residual <glob>', 'treat series matching this glob as residuals; repeatable').argParser(collect).default([]))
    .addOption(new Option('--quantity <glob>', 'treat series matching this glob as monitored quantities; repeatable').argParser(collect).default([]))
    .action(async (spec: string, logs: string[], options: { residual: string[]; quantity: string[] }) => {
      const report = await testSpec(spec, logs, { residual: options.residual, quantity: options.quantity });
      process.stdout.write(`${report}\n`);
    });
}

export function formatSpecList(specs: readonly LoadedSpec[], configDir: string): string {
  const idWidth = Math.max(2, ...specs.map((s) => s.id.length));
  const origins = specs.map((s) => (s.builtIn ? 'built-in' : s.file));
  const originWidth = Math.max(6, ...origins.map((o) => o.length));
  const lines = [`${'id'.padEnd(idWidth)}  ${'source'.padEnd(originWidth)}  description`];
  specs.forEach((s, i) => lines.push(`${s.id.padEnd(idWidth)}  ${origins[i].padEnd(originWidth)}  ${s.description}`));
  lines.push('', `user specs: --parser FILE, or *.json files in ${configDir}`);
  return lines.join('\n');
}

interface SeriesTally { kind: SeriesKind; unit?: string; count: number; nonFinite: number; first: number; last: number }

async function testSpec(specArg: string, logs: readonly string[], overrides: { residual: string[]; quantity: string[] }): Promise<string> {
  const [{ loadParserSpecs }, { chooseParser }, { openLineSource }] = await Promise.all([
    import('../parse/load-parser-specs.js'), import('../parse/choose-parser.js'), import('../ingest/open-line-source.js'),
  ]);
  const isFile = specArg.endsWith('.json') || isExistingFile(specArg);
  const specs = loadParserSpecs({ files: isFile ? [specArg] : [] });
  const chosen = isFile ? specs.find((s) => s.file === resolve(specArg)) : undefined;
  const choice = chooseParser([], { specs, forcedId: chosen?.id ?? specArg, overrides, source: logs.join(' + ') });
  const loaded = specs.find((s) => s.id === choice.id) as LoadedSpec;

  const firstRecords: LogRecord[] = [];
  let failure: string | undefined;
  let firstIteration: number | undefined;
  let lastIteration: number | undefined;
  const tallies = new Map<string, SeriesTally>();
  const parser = choice.create((record) => {
    if (firstRecords.length < FIRST_RECORDS) firstRecords.push(record);
    if (record.failure !== undefined && failure === undefined) failure = record.failure;
    if (record.values.size === 0) return;
    firstIteration ??= record.iteration;
    lastIteration = record.iteration;
    for (const [name, value] of record.values) {
      let tally = tallies.get(name);
      if (tally === undefined) tallies.set(name, (tally = { kind: 'quantity', count: 0, nonFinite: 0, first: value, last: value }));
      tally.count++;
      if (!Number.isFinite(value)) tally.nonFinite++;
      tally.last = value;
    }
  });
  // The same reader as every other command (gzip by magic bytes, CRLF, invalid UTF-8, stdin).
  const warnings: string[] = [];
  await openLineSource({ paths: logs, follow: false }).run({
    onLines: (lines) => parser.pushBatch(lines),
    onEvent: (event) => {
      // The next file of a restart chain is a restart.
      if (event.type === 'opened' && event.index > 0) parser.noteRestart();
      if (event.type === 'warning') warnings.push(event.message);
    },
  });
  parser.finish();
  const stats = parser.stats();
  for (const [name, info] of parser.seriesInfo()) {
    const tally = tallies.get(name);
    if (tally !== undefined) { tally.kind = info.kind; tally.unit = info.unit; }
  }

  const out: string[] = [
    `spec:      ${loaded.id} (${loaded.builtIn ? 'built-in' : loaded.file})`,
    `log:       ${logs.join(' + ')}`,
    `lines:     ${stats.lines} read, ${stats.unmatched} not matched`,
    `records:   ${stats.records}${firstIteration !== undefined ? ` (first iteration ${firstIteration}, last ${lastIteration})` : ''}, ${stats.restarts} restart${stats.restarts === 1 ? '' : 's'}`,
  ];
  if (failure !== undefined) out.push(`failure:   ${failure}`);
  for (const warning of warnings) out.push(`warning:   ${warning}`);
  if (tallies.size === 0) {
    out.push('series:    none: the spec matched no values in this log');
  } else {
    const width = Math.max(6, ...[...tallies.keys()].map((n) => n.length));
    out.push('', `  ${'series'.padEnd(width)}  ${'kind'.padEnd(8)}  ${'count'.padStart(8)}  ${'non-finite'.padStart(10)}  ${'first'.padStart(10)}  ${'last'.padStart(10)}  unit`);
    for (const [name, t] of tallies) {
      out.push(`  ${name.padEnd(width)}  ${t.kind.padEnd(8)}  ${String(t.count).padStart(8)}  ${String(t.nonFinite).padStart(10)}  ${formatNumber(t.first).padStart(10)}  ${formatNumber(t.last).padStart(10)}  ${t.unit ?? ''}`.trimEnd());
    }
  }
  if (firstRecords.length > 0) {
    out.push('', `first ${firstRecords.length} record${firstRecords.length === 1 ? '' : 's'}:`);
    for (const r of firstRecords) out.push(`  ${describeRecord(r)}`);
  }
  if (stats.unmatchedSample.length > 0) {
    out.push('', `lines not matched (first ${stats.unmatchedSample.length} of ${stats.unmatched}):`);
    for (const line of stats.unmatchedSample) out.push(`  ${line}`);
  }
  return out.join('\n');
}

function describeRecord(record: LogRecord): string {
  const head = [`iteration ${record.iteration}`];
  if (record.timeStep !== undefined) head.push(`step ${record.timeStep}`);
  if (record.inner !== undefined) head.push(`inner ${record.inner}`);
  if (record.time !== undefined) head.push(`time ${formatNumber(record.time)}`);
  if (record.restart === true) head.push('restart');
  const values = [...record.values].map(([name, value]) => `${name}=${formatNumber(value)}`).join(' ');
  return `${head.join(', ')}: ${values}${record.failure !== undefined ? `${values ? ' ' : ''}failure: ${record.failure}` : ''}`;
}

function isExistingFile(path: string): boolean {
  try {
    return statSync(path).isFile();
  } catch {
    return false;
  }
}

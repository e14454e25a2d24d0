/** Test helpers: run a spec (by id, built-in) or a ParserChoice over text and collect what comes out. */
import type { LogRecord, SeriesInfo } from '../../src/parse/log-record.js';
import type { KindOverrides, ParserChoice, ParseStats, RecordParser } from '../../src/parse/record-parser.js';
import { loadParserSpecs } from '../../src/parse/load-parser-specs.js';
import { chooseParser } from '../../src/parse/choose-parser.js';

export const NO_OVERRIDES: KindOverrides = { residual: [], quantity: [] };

export interface Parsed {
  readonly records: LogRecord[];
  readonly info: ReadonlyMap<string, SeriesInfo>;
  readonly stats: ParseStats;
  readonly parser: RecordParser;
}

export function linesOf(text: string): string[] {
  const lines = text.split('\n');
  if (lines[lines.length - 1] === '') lines.pop();
  return lines;
}

export function runChoice(choice: ParserChoice, lines: readonly string[]): Parsed {
  const records: LogRecord[] = [];
  const parser = choice.create((record) => records.push(record));
  for (const line of lines) parser.pushLine(line);
  parser.finish();
  return { records, info: parser.seriesInfo(), stats: parser.stats(), parser };
}

export function builtInChoice(id: string, overrides: KindOverrides = NO_OVERRIDES): ParserChoice {
  const specs = loadParserSpecs({ files: [], configDir: null });
  return chooseParser([], { specs, forcedId: id, overrides, source: 'test.log' });
}

export function parseWith(id: string, text: string, overrides: KindOverrides = NO_OVERRIDES): Parsed {
  return runChoice(builtInChoice(id, overrides), linesOf(text));
}

/** A record as a plain object, for readable equality checks. */
export function plain(record: LogRecord): Record<string, unknown> {
  return { ...record, values: Object.fromEntries(record.values) };
}

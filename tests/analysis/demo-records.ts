/** Test helper: a demo cavity run (src/demo) written as a settle-kv log by the demo's own log writer and
 * read back into records, so the analysis sees the digits a real log carries. */
import type { LogRecord, SeriesKind } from '../../src/parse/log-record.js';
import { cavityLogRow, runCavityScenario, type CavityRunOptions } from '../../src/demo/run-cavity-scenario.js';
import { createLogWriter } from '../../src/demo/log-writers.js';

export interface DemoRun {
  readonly records: LogRecord[];
  readonly kinds: Record<string, SeriesKind>;
  /** The log text as written. */
  readonly text: string;
}

export function demoRun(options: CavityRunOptions): DemoRun {
  const writer = createLogWriter('kv');
  const kinds: Record<string, SeriesKind> = {};
  const records: LogRecord[] = [];
  let text = '';
  for (const it of runCavityScenario(options)) {
    const row = cavityLogRow(it);
    for (const f of row.fields) kinds[f.name] = f.kind;
    const line = writer.row(row);
    text += line;
    const values = new Map<string, number>();
    let iteration = Number.NaN;
    for (const pair of line.trim().split(/\s+/)) {
      const [key, value] = pair.split('=');
      if (key === 'iter') iteration = Number(value);
      else values.set(key, Number(value));
    }
    records.push({ iteration, values });
  }
  return { records, kinds, text };
}

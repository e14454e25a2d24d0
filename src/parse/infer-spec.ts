/**
 * Structure inference for a log no spec fits. Looks at the first lines for, in this order of
 * preference when they cover equally many lines: JSON objects, numeric columns under a header row
 * (comma, semicolon, tab, bar or whitespace separated), and repeated `name = value` or
 * `name: value` pairs. The winner (most lines covered) becomes an in-memory parser spec, so
 * inferred logs are read by the same compiled parser as specs from files.
 *
 * Counters: a column or key named like iter/iteration/it (or step, when there is no such name) is
 * the iteration counter; else the first strictly increasing integer column; else a running count.
 * `step`, `inner` and (when the log is transient) `time` become the transient counters.
 * Kinds: see inferKind. Cost: O(lines × fields) over the sample.
 */
import type { SeriesKind } from './log-record.js';
import type { CounterName, ParserSpec, SeriesDefinition, TableSeparator } from './parser-spec.js';
import { lexNumber } from './lex-number.js';
import { splitFields } from './split-fields.js';
import { scanKeyValues } from './scan-key-values.js';
import { compileSpec } from './compile-spec.js';
import { inferKind } from './infer-kind.js';

export interface InferredSpec {
  readonly spec: ParserSpec;
  /** One line, e.g. `inferred: whitespace table with 7 numeric columns ...`. */
  readonly explanation: string;
}

interface Candidate {
  readonly covered: number;
  readonly body: Pick<ParserSpec, 'lines' | 'table' | 'jsonl'>;
  readonly what: string;
}

const SEPARATORS: readonly TableSeparator[] = [',', ';', '\t', '|', 'whitespace'];
const SEPARATOR_NAMES: Record<TableSeparator, string> = { ',': 'comma-separated', ';': 'semicolon-separated', '\t': 'tab-separated', '|': 'bar-separated', whitespace: 'whitespace' };
const FAILURE = ['^\\s*FATAL\\b', '^\\s*ERROR\\b', '^\\s*Floating point exception'];

export function inferSpec(sampleLines: readonly string[]): InferredSpec | undefined {
  const candidates = [jsonCandidate(sampleLines), ...SEPARATORS.map((s) => tableCandidate(sampleLines, s)), pairCandidate(sampleLines, '='), pairCandidate(sampleLines, ':')]
    .filter((c): c is Candidate => c !== undefined);
  if (candidates.length === 0) return undefined;
  let best = candidates[0];
  for (const c of candidates) if (c.covered > best.covered) best = c;

  // First pass: every name is a series; collect the sample values.
  const draft: ParserSpec = { id: 'inferred', description: 'inferred from the first lines', detect: { patterns: ['.'] }, ...best.body };
  const sampleValues = collectValues(draft, sampleLines);
  const names = [...sampleValues.keys()];
  if (names.length === 0) return undefined;
  const counters = chooseCounters(names, sampleValues);
  const counterNames = new Set(Object.values(counters));
  const series: Record<string, SeriesDefinition> = {};
  const kinds: Record<SeriesKind, number> = { residual: 0, quantity: 0, other: 0 };
  for (const name of names) {
    if (counterNames.has(name)) continue;
    const kind = inferKind(name, sampleValues.get(name) ?? []);
    series[name] = { kind };
    kinds[kind]++;
  }
  const spec: ParserSpec = {
    ...draft,
    description: `inferred: ${best.what}`,
    failure: FAILURE,
    counters,
    series,
    kinds: [
      { names: 'res_*', kind: 'residual' }, { names: '*_res', kind: 'residual' },
      { names: '*resid*', kind: 'residual' }, { names: '*Resid*', kind: 'residual' }, { names: 'Res_*', kind: 'residual' },
    ],
    defaultKind: 'quantity',
  };
  const counterText = counters.iteration !== undefined ? `iteration from '${counters.iteration}'` : 'iterations counted';
  const explanation = `inferred: ${best.what}; ${counterText}; ${plural(kinds.residual, 'residual')}, ${plural(kinds.quantity, 'quantity', 'quantities')}`;
  return { spec, explanation };
}

function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

function collectValues(spec: ParserSpec, lines: readonly string[]): Map<string, number[]> {
  const values = new Map<string, number[]>();
  const parser = compileSpec(spec, { residual: [], quantity: [] })((record) => {
    for (const [name, value] of record.values) {
      let list = values.get(name);
      if (list === undefined) values.set(name, (list = []));
      list.push(value);
    }
  });
  for (const line of lines) parser.pushLine(line);
  parser.finish();
  return values;
}

const ITERATION_NAME = /^(?:#\s*)?(?:iter|iters|iteration|iterations|it|niter|n_?iter|iter_?(?:no|num|number)|iteration_?(?:no|num|number))\.?$/i;
const STEP_NAME = /^(?:step|steps|time_?step|timestep|ts|n_?step|step_?(?:no|num|number))$/i;
const INNER_NAME = /^(?:inner|inner_?iter(?:ation)?|sub_?iter(?:ation)?)$/i;
const TIME_NAME = /^(?:time|t|sim_?time|flow_?time|physical_?time)$/i;

function chooseCounters(names: readonly string[], values: ReadonlyMap<string, number[]>): Partial<Record<CounterName, string>> {
  const counters: Partial<Record<CounterName, string>> = {};
  const iteration = names.find((n) => ITERATION_NAME.test(n));
  const step = names.find((n) => STEP_NAME.test(n));
  const inner = names.find((n) => INNER_NAME.test(n));
  if (iteration !== undefined) counters.iteration = iteration;
  if (step !== undefined) {
    if (iteration === undefined && inner === undefined) counters.iteration = step;
    else counters.step = step;
  }
  if (inner !== undefined) counters.inner = inner;
  const time = names.find((n) => TIME_NAME.test(n));
  if (time !== undefined) {
    const list = values.get(time) ?? [];
    const nonDecreasing = list.every((v, i) => i === 0 || v >= list[i - 1]);
    const repeats = list.some((v, i) => i > 0 && v === list[i - 1]);
    if (nonDecreasing && (counters.step !== undefined || counters.inner !== undefined || repeats)) counters.time = time;
  }
  if (counters.iteration === undefined && counters.step === undefined && counters.time === undefined) {
    const increasing = names.find((n) => {
      const list = values.get(n) ?? [];
      return list.length >= 2 && list.every((v, i) => Number.isInteger(v) && (i === 0 || v > list[i - 1]));
    });
    if (increasing !== undefined) counters.iteration = increasing;
  }
  return counters;
}

function nonBlank(lines: readonly string[]): number {
  let n = 0;
  for (const line of lines) if (line.trim().length > 0) n++;
  return n;
}

/** Enough rows to call it a structure: two, or one in a log of at most three lines. */
function enough(rows: number, lines: readonly string[]): boolean {
  return rows >= 2 || (rows === 1 && nonBlank(lines) <= 3);
}

function jsonCandidate(lines: readonly string[]): Candidate | undefined {
  let rows = 0;
  for (const line of lines) {
    const text = line.trim();
    if (!text.startsWith('{')) continue;
    try {
      const value = JSON.parse(text) as unknown;
      if (value !== null && typeof value === 'object' && !Array.isArray(value) && Object.values(value).some((v) => typeof v === 'number')) rows++;
    } catch {
      // not JSON: not a row
    }
  }
  if (!enough(rows, lines)) return undefined;
  return { covered: rows, body: { jsonl: {} }, what: `JSON objects on ${rows} lines` };
}

const NAME = /^["']?[A-Za-z_#%([][^]*$/;

function tableCandidate(lines: readonly string[], separator: TableSeparator): Candidate | undefined {
  const fields: string[] = [];
  let best: { header: string[]; rows: number; numeric: number } | undefined;
  for (let i = 0; i < lines.length; i++) {
    const count = splitFields(lines[i], separator, fields);
    if (count < 2) continue;
    if (!fields.every((f) => f.length > 0 && lexNumber(f) === undefined && NAME.test(f))) continue;
    const header = fields.slice(0, count);
    if (best !== undefined && sameFields(best.header, header)) continue;
    let rows = 0;
    const numericPerColumn = new Array<number>(count).fill(0);
    for (let j = i + 1; j < lines.length; j++) {
      const n = splitFields(lines[j], separator, fields);
      if (n !== count) continue;
      let numeric = 0;
      for (let k = 0; k < n; k++) {
        if (lexNumber(fields[k]) !== undefined) { numeric++; numericPerColumn[k]++; }
      }
      if (numeric * 2 > n) rows++;
    }
    const numericColumns = numericPerColumn.filter((c) => c * 2 > rows && c > 0).length;
    if (enough(rows, lines) && (best === undefined || rows > best.rows)) best = { header, rows, numeric: numericColumns };
  }
  if (best === undefined) return undefined;
  const pattern = headerPattern(best.header, separator);
  const shown = best.header.join(separator === 'whitespace' ? ' ' : separator === '\t' ? ' ' : separator);
  return {
    covered: best.rows + 1,
    body: { table: { header: pattern, separator } },
    what: `${SEPARATOR_NAMES[separator]} table with ${best.numeric} numeric columns under the header '${shown.length > 60 ? `${shown.slice(0, 59)}…` : shown}'`,
  };
}

function sameFields(a: readonly string[], b: readonly string[]): boolean {
  return a.length === b.length && a.every((f, i) => f === b[i]);
}

function escape(text: string): string {
  return text.replace(/[\\^$.|?*+()[\]{}]/g, '\\$&');
}

function headerPattern(header: readonly string[], separator: TableSeparator): string {
  if (separator === 'whitespace') return `^\\s*${header.map(escape).join('\\s+')}\\s*$`;
  const sep = separator === '\t' ? '\\t' : escape(separator);
  const open = separator === '|' ? `^\\s*${sep}?\\s*` : '^\\s*';
  return `${open}${header.map((f) => `"?${escape(f)}"?`).join(`\\s*${sep}\\s*`)}`;
}

function pairCandidate(lines: readonly string[], assign: string): Candidate | undefined {
  const lineCount = new Map<string, number>();
  let rows = 0;
  for (const line of lines) {
    const names = new Set<string>();
    scanKeyValues(line, assign, (name, text, valueStart, valueEnd) => {
      if (lexNumber(text.slice(valueStart, valueEnd)) === undefined) return false;
      if (/^[A-Za-z_]/.test(name)) names.add(name);
      return true;
    });
    if (names.size === 0) continue;
    rows++;
    for (const name of names) lineCount.set(name, (lineCount.get(name) ?? 0) + 1);
  }
  const repeated = [...lineCount.values()].some((n) => n >= 2);
  if (!enough(rows, lines) || (rows >= 2 && !repeated)) return undefined;
  const shown = assign === '=' ? 'name = value' : 'name: value';
  return {
    covered: rows,
    body: { lines: { rules: [{ keyValues: { assign } }] } },
    what: `'${shown}' pairs on ${rows} lines (${lineCount.size} names)`,
  };
}

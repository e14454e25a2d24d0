/**
 * Writers for settle's five built-in log formats (parsers/README.md): `kv`, `block`, `table`, `csv`
 * and `jsonl`. The demo solver and the sample-log generator both write through these, so the
 * formats are produced in one place. Pure: each call returns text; the caller writes it.
 *
 * Conventions (parsers/README.md): the iteration key is `iter`; transient rows carry `step`, `time`
 * and `inner` (in kv, instead of `iter`, as the README's transient example shows); residual series
 * are named `res_<equation>`; every other field is a monitored quantity. Non-finite values print as
 * `NaN`, `Inf`, `-Inf` (JSON: the strings `"NaN"`, `"Infinity"`, `"-Infinity"`).
 *
 * Cost: O(fields) per row.
 */

export const LOG_FORMATS = ['kv', 'block', 'table', 'csv', 'jsonl'] as const;
export type LogFormat = (typeof LOG_FORMATS)[number];

export interface LogField {
  readonly name: string;
  readonly value: number;
  readonly kind: 'residual' | 'quantity';
  /** Unit, shown in the block format as `[unit]`. */
  readonly unit?: string;
}

export interface LogRow {
  readonly iter: number;
  /** Time-step index (transient runs). */
  readonly step?: number;
  /** Physical time (transient runs). */
  readonly time?: number;
  /** Inner iteration within the step (transient runs). */
  readonly inner?: number;
  readonly fields: readonly LogField[];
}

/** How numbers are spelled. `plain`: `1.2340e-03`. `fortran`: as a Fortran `D` edit descriptor
 * prints them, `0.1234D-02`, and with a three-digit exponent the letter is dropped: `0.1234-104`. */
export type NumberStyle = 'plain' | 'fortran';

export interface LogWriterOptions {
  /** Table format: repeat the header row after this many rows (default 50). */
  readonly headerEvery?: number;
  readonly numberStyle?: NumberStyle;
}

export interface LogWriter {
  readonly format: LogFormat;
  /** Text for one row (one or more complete lines, each ending in `\n`), headers included when due. */
  row(row: LogRow): string;
  /** The solver restarted: table and csv headers are written again before the next row. */
  restart(): void;
}

/** `1.2340e-03`: mantissa with `digits` decimals, exponent signed and at least two digits. */
export function formatExponential(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return nonFinite(value);
  const [mantissa, exponent] = value.toExponential(digits).split('e');
  const sign = exponent.startsWith('-') ? '-' : '+';
  return `${mantissa}e${sign}${exponent.replace(/^[+-]/, '').padStart(2, '0')}`;
}

/** Fortran `D` format with `digits` significant digits: `0.1234D-02`; three-digit exponents drop the
 * letter (`0.1234-104`, `0.5000+101`), as Fortran output does when the exponent needs three digits. */
export function formatFortran(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return nonFinite(value);
  if (value === 0) return `0.${'0'.repeat(digits)}D+00`;
  const [mantissa, exponent] = Math.abs(value).toExponential(digits - 1).split('e');
  const e = Number(exponent) + 1;
  const body = `${value < 0 ? '-' : ''}0.${mantissa.replace('.', '')}`;
  const sign = e < 0 ? '-' : '+';
  const magnitude = String(Math.abs(e));
  return magnitude.length > 2 ? `${body}${sign}${magnitude}` : `${body}D${sign}${magnitude.padStart(2, '0')}`;
}

/** Monitored quantities: seven significant digits. */
export function formatQuantity(value: number): string {
  if (!Number.isFinite(value)) return nonFinite(value);
  const magnitude = Math.abs(value);
  if (magnitude !== 0 && (magnitude < 1e-4 || magnitude >= 1e7)) return formatExponential(value, 6);
  return value.toPrecision(7);
}

function nonFinite(value: number): string {
  return Number.isNaN(value) ? 'NaN' : value > 0 ? 'Inf' : '-Inf';
}

function jsonValue(value: number, kind: 'residual' | 'quantity' | 'time'): number | string {
  if (Number.isNaN(value)) return 'NaN';
  if (value === Infinity) return 'Infinity';
  if (value === -Infinity) return '-Infinity';
  return Number(value.toPrecision(kind === 'residual' ? 5 : 8));
}

/** Create a writer. The table and csv column sets are fixed by the first row. */
export function createLogWriter(format: LogFormat, options: LogWriterOptions = {}): LogWriter {
  const headerEvery = options.headerEvery ?? 50;
  const fortran = options.numberStyle === 'fortran';
  const residual = (v: number): string => (fortran ? formatFortran(v, 5) : formatExponential(v, 4));
  const quantity = (v: number): string => (fortran ? formatFortran(v, 8) : formatQuantity(v));
  const time = (v: number): string => (fortran ? formatFortran(v, 4) : formatExponential(v, 3));
  const field = (f: LogField): string => (f.kind === 'residual' ? residual(f.value) : quantity(f.value));
  let headerDue = true;
  let rowsSinceHeader = 0;

  const transientKeys = (row: LogRow): { key: string; text: string }[] => {
    const keys: { key: string; text: string }[] = [];
    if (row.step !== undefined) keys.push({ key: 'step', text: String(row.step) });
    if (row.time !== undefined) keys.push({ key: 'time', text: time(row.time) });
    if (row.inner !== undefined) keys.push({ key: 'inner', text: String(row.inner) });
    return keys;
  };

  const writers: Record<LogFormat, (row: LogRow) => string> = {
    kv(row) {
      const transient = transientKeys(row);
      const head = transient.length > 0 ? transient.map((k) => `${k.key}=${k.text}`) : [`iter=${row.iter}`];
      return `${[...head, ...row.fields.map((f) => `${f.name}=${field(f)}`)].join(' ')}\n`;
    },
    block(row) {
      if (row.step !== undefined) throw new Error('the block format has no transient form (parsers/README.md)');
      const lines = [`=== iteration ${row.iter} ===`];
      for (const f of row.fields) {
        if (f.kind === 'residual') lines.push(`  residual  ${f.name.padEnd(9)} ${residual(f.value)}`);
        else lines.push(`  monitor   ${f.name.padEnd(9)} ${quantity(f.value).padEnd(11)}${f.unit === undefined ? '' : ` [${f.unit}]`}`.trimEnd());
      }
      return `${lines.join('\n')}\n`;
    },
    table(row) {
      const cells = [{ key: 'iter', text: String(row.iter) }, ...transientKeys(row), ...row.fields.map((f) => ({ key: f.name, text: field(f) }))];
      const width = (i: number, text: string): number => Math.max(i === 0 ? 10 : 13, text.length + 1);
      let out = '';
      if (headerDue || rowsSinceHeader >= headerEvery) {
        out += `${cells.map((c, i) => c.key.padStart(width(i, c.key))).join('')}\n`;
        headerDue = false;
        rowsSinceHeader = 0;
      }
      rowsSinceHeader += 1;
      return `${out}${cells.map((c, i) => c.text.padStart(Math.max(width(i, c.key), c.text.length + 1))).join('')}\n`;
    },
    csv(row) {
      const cells = [{ key: 'iter', text: String(row.iter) }, ...transientKeys(row), ...row.fields.map((f) => ({ key: f.name, text: field(f) }))];
      let out = '';
      if (headerDue) {
        out += `${cells.map((c) => c.key).join(',')}\n`;
        headerDue = false;
      }
      return `${out}${cells.map((c) => c.text).join(',')}\n`;
    },
    jsonl(row) {
      const object: Record<string, number | string> = { iter: row.iter };
      if (row.step !== undefined) object.step = row.step;
      if (row.time !== undefined) object.time = jsonValue(row.time, 'time');
      if (row.inner !== undefined) object.inner = row.inner;
      for (const f of row.fields) object[f.name] = jsonValue(f.value, f.kind);
      return `${JSON.stringify(object)}\n`;
    },
  };

  return {
    format,
    row: writers[format],
    restart() {
      headerDue = true;
    },
  };
}

/** Is this text one of the format names? */
export function isLogFormat(text: string): text is LogFormat {
  return (LOG_FORMATS as readonly string[]).includes(text);
}

/**
 * The criteria flags, declared once, and their reading into a Criteria object:
 * DEFAULT_CRITERIA ← criteria file (--criteria, JSON checked against CRITERIA_SCHEMA, every problem
 * listed as `file: path.to.field: message`) ← flags. Bad values give a UsageError with a hint.
 */
import { readFileSync } from 'node:fs';
import { Command, Option } from 'commander';
import { createRequire } from 'node:module';
import type { ErrorObject, ValidateFunction } from 'ajv';
import { DEFAULT_CRITERIA, type Criteria, type SeriesCriteria } from '../analysis/criteria.js';
import { CRITERIA_SCHEMA } from '../analysis/criteria-schema.js';
import { shorten, SpecError, UsageError } from '../errors.js';
import { MIN_WINDOW } from '../analysis/validate-criteria.js';

const collect = (value: string, previous: string[] = []): string[] => [...previous, value];

/** Adds --criteria, --drop, --target, --qoi-tol, --window, --series, --startup, --confirm. */
export function addCriteriaOptions(command: Command): Command {
  return command
    .addOption(new Option('--criteria <file>', 'convergence criteria file (JSON); flags override it'))
    .addOption(new Option('--drop <decades>', `decades each residual must fall from its peak (default ${DEFAULT_CRITERIA.drop})`))
    .addOption(new Option('--target <residual>', 'absolute residual target; reaching it also counts as converged'))
    .addOption(new Option('--qoi-tol <fraction>', `relative 95 % half-width a quantity must settle to (default ${DEFAULT_CRITERIA.qoiTol})`))
    .addOption(new Option('--window <iterations>', `trailing window over which trends are judged (default ${DEFAULT_CRITERIA.window})`))
    .addOption(new Option('--series <glob>', 'only series matching this glob count towards the verdict; repeatable').argParser(collect))
    .addOption(new Option('--startup <iterations>', `iterations not judged at the start and after a restart (default ${DEFAULT_CRITERIA.startup})`))
    .addOption(new Option('--confirm <evaluations>', `consecutive evaluations a stopping verdict must hold (default ${DEFAULT_CRITERIA.confirm})`));
}

type Mutable<T> = { -readonly [K in keyof T]: T[K] };

/** Criteria from parsed options (commander's camelCase keys: criteria, drop, target, qoiTol, window,
 * series, startup, confirm; values as strings or numbers). */
export function criteriaFromOptions(options: Record<string, unknown>): Criteria {
  const criteria: Mutable<Criteria> = { ...DEFAULT_CRITERIA };
  if (options.criteria !== undefined) Object.assign(criteria, readCriteriaFile(String(options.criteria)));
  const number = (flag: string, key: string, check: (n: number) => boolean, example: string, what: string): number | undefined => {
    const raw = options[key];
    if (raw === undefined) return undefined;
    const text = String(raw).trim();
    const value = Number(text);
    if (text === '' || !Number.isFinite(value) || !check(value)) {
      throw new UsageError(`${flag} needs ${what}, got '${shorten(String(raw), 40)}'`, `for example ${flag} ${example}`);
    }
    return value;
  };
  const drop = number('--drop', 'drop', (n) => n > 0, '3', 'a positive number of decades');
  const target = number('--target', 'target', (n) => n > 0, '1e-6', 'a positive residual value');
  const qoiTol = number('--qoi-tol', 'qoiTol', (n) => n > 0 && n < 1, '1e-3', 'a fraction between 0 and 1');
  const window = number('--window', 'window', (n) => Number.isInteger(n) && n >= MIN_WINDOW, '200', `a whole number of iterations, at least ${MIN_WINDOW}`);
  const startup = number('--startup', 'startup', (n) => Number.isInteger(n) && n >= 0, '20', 'a whole number of iterations (0 or more)');
  const confirm = number('--confirm', 'confirm', (n) => Number.isInteger(n) && n >= 1, '3', 'a positive whole number of evaluations');
  if (drop !== undefined) criteria.drop = drop;
  if (target !== undefined) criteria.target = target;
  if (qoiTol !== undefined) criteria.qoiTol = qoiTol;
  if (window !== undefined) criteria.window = window;
  if (startup !== undefined) criteria.startup = startup;
  if (confirm !== undefined) criteria.confirm = confirm;
  const series = options.series;
  if (series !== undefined) {
    const globs = (Array.isArray(series) ? series : [series]).map(String);
    const empty = globs.find((g) => g.trim() === '');
    if (empty !== undefined) throw new UsageError('--series needs a glob, got an empty value', 'for example --series "res_*"');
    if (globs.length > 0) criteria.series = globs;
  }
  return criteria;
}

let validator: ValidateFunction | undefined;

function validateFile(value: unknown): string[] {
  if (validator === undefined) {
    // Loaded on first use (a criteria file): ajv takes a few hundredths of a second to load.
    const Ajv = (createRequire(import.meta.url)('ajv') as typeof import('ajv')).default;
    validator = new Ajv({ allErrors: true, strict: false }).compile(CRITERIA_SCHEMA);
  }
  if (validator(value)) return [];
  return (validator.errors ?? []).map(problemOf);
}

function problemOf(error: ErrorObject): string {
  const segments = error.instancePath.split('/').slice(1).map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'));
  let path = segments.join('.');
  let message = error.message ?? 'is invalid';
  if (error.keyword === 'additionalProperties') {
    const extra = String((error.params as { additionalProperty?: string }).additionalProperty);
    path = path === '' ? extra : `${path}.${extra}`;
    message = 'is not a criteria field (known: drop, target, qoiTol, window, series, perSeries, startup, confirm)';
  } else if (error.keyword === 'required') {
    const missing = String((error.params as { missingProperty?: string }).missingProperty);
    path = path === '' ? missing : `${path}.${missing}`;
    message = 'is required';
  }
  return `${path === '' ? '(top level)' : path}: ${message}`;
}

/** Reads and validates a criteria file; the fields it sets. */
export function readCriteriaFile(file: string): Partial<Criteria> {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new UsageError(`cannot read criteria file ${file}${code ? ` (${code})` : ''}`, 'check the path given to --criteria');
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw new SpecError(file, [`(top level): not valid JSON: ${shorten((error as Error).message, 100)}`], 'a criteria file is a JSON object, e.g. {"drop": 4}');
  }
  const problems = validateFile(value);
  if (problems.length > 0) throw new SpecError(file, problems.map((p) => `${file}: ${p}`), 'see the criteria fields in the README');
  const result = value as Partial<Criteria> & { $schema?: unknown; description?: unknown };
  const { $schema: _schema, description: _description, ...fields } = result;
  return { ...fields, perSeries: (fields.perSeries ?? DEFAULT_CRITERIA.perSeries) as readonly SeriesCriteria[] };
}

/**
 * Loads parser specs: the built-in ones (top-level parsers/*.json), then the files the user named
 * (--parser FILE), then the user's config folder ($XDG_CONFIG_HOME/settle/parsers/*.json, default
 * ~/.config/settle/parsers). Every spec is validated; a spec with errors stops settle with a
 * SpecError that lists every problem as `file: path.to.field: message`.
 *
 * A user spec with the id of a built-in one replaces it; two user specs with one id are an error.
 * Synchronous: it runs once, before any log is read. Cost: one file read per spec, and one schema
 * check per user spec (the schema is compiled once per process, only when a user spec needs it).
 * Built-in specs are not checked at start-up: they ship with settle and the test suite checks every
 * one of them (tests/parse/parser-spec-schema.test.ts); compiling the schema costs about a third of a
 * second of start-up, which `settle inspect` on a large log would pay for nothing.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { homedir } from 'node:os';
import { join, resolve } from 'node:path';
import { InputError, SpecError } from '../errors.js';
import type { LoadedSpec } from './loaded-spec.js';
import type { ParserSpec } from './parser-spec.js';
import { builtInParsersDir } from './package-root.js';
import { validateParserSpec } from './validate-parser-spec.js';
import { jsonErrorPosition } from './json-error-position.js';

export interface LoadParserSpecsOptions {
  /** Spec files the user named, in order. */
  readonly files: readonly string[];
  /** The user's spec folder; default $XDG_CONFIG_HOME/settle/parsers (or ~/.config/settle/parsers);
   * null: do not read one. */
  readonly configDir?: string | null;
}

const SCHEMA_FILE = 'parser-spec.schema.json';
let schema: object | undefined;
let builtIns: LoadedSpec[] | undefined;

export function defaultConfigDir(): string {
  const xdg = process.env.XDG_CONFIG_HOME;
  const base = xdg !== undefined && xdg !== '' ? xdg : join(homedir(), '.config');
  return join(base, 'settle', 'parsers');
}

export function loadParserSpecs(options: LoadParserSpecsOptions): LoadedSpec[] {
  const builtIn = loadBuiltIns();
  const user: LoadedSpec[] = [];
  const seen = new Set<string>();
  const addUser = (file: string): void => {
    const path = resolve(file);
    if (seen.has(path)) return;
    seen.add(path);
    const spec = loadSpecFile(path, false);
    const clash = user.find((s) => s.id === spec.id);
    if (clash !== undefined) {
      throw new SpecError(path, [`id: '${spec.id}' is already used by ${clash.file}`], 'give each parser spec its own id');
    }
    user.push(spec);
  };
  for (const file of options.files) addUser(file);
  const configDir = options.configDir === undefined ? defaultConfigDir() : options.configDir;
  if (configDir !== null && isDirectory(configDir)) {
    for (const name of readdirSync(configDir).sort()) {
      if (name.endsWith('.json') && !name.endsWith('.schema.json')) addUser(join(configDir, name));
    }
  }
  const userIds = new Set(user.map((s) => s.id));
  return [...builtIn.filter((s) => !userIds.has(s.id)), ...user];
}

function isDirectory(path: string): boolean {
  try {
    return statSync(path).isDirectory();
  } catch {
    return false;
  }
}

function loadBuiltIns(): LoadedSpec[] {
  if (builtIns !== undefined) return builtIns;
  const dir = builtInParsersDir();
  const names = readdirSync(dir).filter((name) => name.endsWith('.json') && name !== SCHEMA_FILE).sort();
  builtIns = names.map((name) => loadSpecFile(join(dir, name), true));
  return builtIns;
}

function loadSchema(): object {
  if (schema === undefined) schema = JSON.parse(readFileSync(join(builtInParsersDir(), SCHEMA_FILE), 'utf8')) as object;
  return schema;
}

/** Reads and validates one spec file. */
export function loadSpecFile(path: string, builtIn: boolean): LoadedSpec {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') throw new InputError(`parser spec ${path} does not exist`, 'check the path given to --parser, or run `settle parsers list` for the built-in ids');
    if (code === 'EISDIR') throw new InputError(`parser spec ${path} is a folder, not a file`, 'give the path of a .json spec file');
    throw new InputError(`cannot read parser spec ${path}: ${(error as Error).message}`, 'check the file permissions');
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    const at = jsonErrorPosition(text);
    const where = at === undefined ? '' : `line ${at.line}, column ${at.column}: `;
    const reason = (error as Error).message.replace(/,? ".*" is not valid JSON$/s, '').replace(/ in JSON at position \d+.*$/s, '');
    throw new SpecError(path, [`${where}not valid JSON (${reason})`], 'fix the JSON syntax (a trailing comma or a missing quote is the usual cause)');
  }
  const problems = builtIn ? [] : validateParserSpec(value, loadSchema());
  if (problems.length > 0) {
    throw new SpecError(path, problems.map((p) => `${path}: ${p}`), `see ${join(builtInParsersDir(), SCHEMA_FILE)} and the specs beside it`);
  }
  const spec = value as ParserSpec;
  return { id: spec.id, file: path, builtIn, description: spec.description, spec };
}


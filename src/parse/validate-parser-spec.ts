/**
 * Checks a parsed spec file against the JSON Schema (parsers/parser-spec.schema.json, all errors at
 * once) and then against the rules a schema cannot say: patterns compile and cannot backtrack
 * without bound, capture groups named in the spec exist in the pattern, a rule yields something.
 * Returns every problem as `path.to.field: message` (empty when the spec is valid).
 */
import { createRequire } from 'node:module';
import type { ErrorObject, ValidateFunction } from 'ajv';
import { COUNTER_NAMES, type LineRule, type ParserSpec } from './parser-spec.js';
import { groupNames, patternProblems } from './user-pattern.js';

let validator: ValidateFunction | undefined;

function schemaValidator(schema: object): ValidateFunction {
  if (validator === undefined) {
    // Loaded on first use (ajv takes a tenth of a second to load): built-in specs need no check.
    const Ajv = (createRequire(import.meta.url)('ajv') as typeof import('ajv')).default;
    validator = new Ajv({ allErrors: true, strict: false }).compile(schema);
  }
  return validator;
}

export function validateParserSpec(value: unknown, schema: object): string[] {
  const validate = schemaValidator(schema);
  if (!validate(value)) return schemaProblems(validate.errors ?? []);
  return semanticProblems(value as ParserSpec);
}

/** `/lines/rules/0/match` → `lines.rules[0].match`. */
function dotPath(pointer: string): string {
  let out = '';
  for (const raw of pointer.split('/').slice(1)) {
    const part = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    if (/^\d+$/.test(part)) out += `[${part}]`;
    else out += out === '' ? part : `.${part}`;
  }
  return out;
}

function join(path: string, field: string): string {
  return path === '' ? field : `${path}.${field}`;
}

function schemaProblems(errors: readonly ErrorObject[]): string[] {
  const problems: string[] = [];
  // Where a value has the wrong type, other complaints about the same value are noise.
  const wrongType = new Set(errors.filter((e) => e.keyword === 'type' && !e.schemaPath.includes('/oneOf/')).map((e) => e.instancePath));
  for (const error of errors) {
    const path = dotPath(error.instancePath);
    if (wrongType.has(error.instancePath) && error.keyword !== 'type') continue;
    // Alternatives inside oneOf: report the oneOf once, in plain words.
    if (error.schemaPath.includes('/oneOf/')) continue;
    let problem: string;
    switch (error.keyword) {
      case 'required':
        problem = `${join(path, String(error.params.missingProperty))}: is required`;
        break;
      case 'additionalProperties':
        problem = `${join(path, String(error.params.additionalProperty))}: unknown field`;
        break;
      case 'oneOf':
        if (path === '') problem = '(top level): give exactly one of lines, table or jsonl';
        else if (/^lines\.rules\[\d+\]$/.test(path)) problem = `${path}: give exactly one of match or keyValues`;
        else problem = `${path}: must be a series name or a series definition`;
        break;
      case 'enum':
        problem = `${path}: must be one of ${(error.params.allowedValues as unknown[]).map((v) => JSON.stringify(v)).join(', ')}`;
        break;
      default:
        problem = `${path === '' ? '(top level)' : path}: ${error.message ?? 'is invalid'}`;
    }
    if (!problems.includes(problem)) problems.push(problem);
  }
  return problems;
}

function semanticProblems(spec: ParserSpec): string[] {
  const problems: string[] = [];
  const checkPattern = (path: string, pattern: string): boolean => {
    const found = patternProblems(pattern);
    for (const p of found) problems.push(`${path}: ${p}`);
    return found.length === 0;
  };
  spec.detect.patterns.forEach((p, i) => checkPattern(`detect.patterns[${i}]`, p));
  if (spec.detect.minMatches !== undefined && spec.detect.firstLines !== undefined && spec.detect.minMatches > spec.detect.firstLines) {
    problems.push(`detect.minMatches: ${spec.detect.minMatches} is more than detect.firstLines (${spec.detect.firstLines})`);
  }
  (spec.ignore ?? []).forEach((p, i) => checkPattern(`ignore[${i}]`, p));
  (spec.failure ?? []).forEach((p, i) => checkPattern(`failure[${i}]`, p));
  if (spec.table !== undefined) checkPattern('table.header', spec.table.header);
  const counterNames = Object.values(spec.counters ?? {});
  const duplicate = counterNames.find((name, i) => counterNames.indexOf(name) !== i);
  if (duplicate !== undefined) problems.push(`counters: '${duplicate}' is named for two counters`);
  (spec.lines?.rules ?? []).forEach((rule, i) => ruleProblems(rule, `lines.rules[${i}]`, checkPattern, problems));
  return problems;
}

function ruleProblems(rule: LineRule, path: string, checkPattern: (path: string, pattern: string) => boolean, problems: string[]): void {
  if (!('match' in rule)) return;
  checkPattern(`${path}.match`, rule.match);
  if (!compiles(rule.match)) return;
  const names = groupNames(rule.match);
  const counters = names.filter((n) => (COUNTER_NAMES as readonly string[]).includes(n));
  const known = names.length === 0 ? 'it has no named groups' : `its groups are ${names.join(', ')}`;
  if ('pairs' in rule && 'values' in rule) {
    problems.push(`${path}: give either pairs or values, not both`);
    return;
  }
  if ('pairs' in rule) {
    const p = rule.pairs;
    for (const [field, group] of [['nameGroup', p.nameGroup ?? 'name'], ['valueGroup', p.valueGroup ?? 'value'], ['unitGroup', p.unitGroup]] as const) {
      if (group !== undefined && !names.includes(group)) {
        problems.push(`${path}.pairs.${field}: the pattern has no group named '${group}' (${known}); add (?<${group}>...)`);
      }
    }
    return;
  }
  for (const group of Object.keys(rule.values ?? {})) {
    if (!names.includes(group)) problems.push(`${path}.values.${group}: the pattern has no group named '${group}' (${known})`);
  }
  const series = names.filter((n) => !counters.includes(n) || (rule.values !== undefined && n in rule.values));
  if (series.length === 0 && counters.length === 0 && rule.startsRecord !== true) {
    problems.push(`${path}.match: the rule yields nothing: name a group (?<name>...) for a series or a counter, or set startsRecord, or move the pattern to ignore`);
  }
}

function compiles(pattern: string): boolean {
  try {
    new RegExp(pattern);
    return true;
  } catch {
    return false;
  }
}

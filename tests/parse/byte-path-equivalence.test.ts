/**
 * The byte read path (ASCII lines matched on their bytes, see compile-spec.ts and byte-pattern.ts)
 * must give exactly the records of the text path (each line as a string, V8 regular expressions):
 * the same records in the same order, the same series info and the same statistics. The reference
 * is the text path itself, i.e. V8's RegExp (ECMA-262 semantics) on every line.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { join } from 'node:path';
import { LineSplitter } from '../../src/ingest/line-splitter.js';
import { compileSpec } from '../../src/parse/compile-spec.js';
import type { ParserSpec } from '../../src/parse/parser-spec.js';
import type { LogRecord } from '../../src/parse/log-record.js';
import type { ParserChoice, RecordParser } from '../../src/parse/record-parser.js';
import { loadParserSpecs } from '../../src/parse/load-parser-specs.js';
import { chooseParser } from '../../src/parse/choose-parser.js';
import { NO_OVERRIDES, plain } from './parse-helpers.js';
import { compileBytePattern } from '../../src/parse/byte-pattern.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'sample-logs');

interface Outcome { records: unknown[]; info: unknown[]; stats: unknown }

function outcome(records: LogRecord[], parser: RecordParser): Outcome {
  return { records: records.map(plain), info: [...parser.seriesInfo().values()], stats: parser.stats() };
}

/** Each line as text, one pushLine per line (the reference). */
function byText(create: ParserChoice['create'], bytes: Buffer): Outcome {
  const records: LogRecord[] = [];
  const parser = create((record) => records.push(record));
  const splitter = new LineSplitter();
  for (const line of [...splitter.push(bytes), ...splitter.end()]) parser.pushLine(line);
  parser.finish();
  return outcome(records, parser);
}

/** The same bytes as batches, cut into chunks of the given sizes (cycled). */
function byBatches(create: ParserChoice['create'], bytes: Buffer, cuts: readonly number[] = [1 << 20]): Outcome {
  const records: LogRecord[] = [];
  const parser = create((record) => records.push(record));
  const splitter = new LineSplitter();
  let at = 0;
  for (let k = 0; at < bytes.length; k++) {
    const size = Math.max(1, cuts[k % cuts.length]);
    splitter.pushBatches(bytes.subarray(at, at + size), (batch) => parser.pushBatch(batch));
    at += size;
  }
  splitter.endBatches((batch) => parser.pushBatch(batch));
  parser.finish();
  return outcome(records, parser);
}

const manifest = JSON.parse(readFileSync(join(SAMPLES, 'manifest.json'), 'utf8')) as { file: string }[];

describe('byte path = text path on every sample log', () => {
  const specs = loadParserSpecs({ files: [], configDir: null });
  it.each(manifest.map((entry) => entry.file))('%s', (file) => {
    const raw = readFileSync(join(SAMPLES, file));
    const bytes = file.endsWith('.gz') ? gunzipSync(raw) : raw;
    const first = bytes.toString('utf8').split('\n').slice(0, 200);
    const choice = chooseParser(first, { specs, overrides: NO_OVERRIDES, source: file });
    const reference = byText(choice.create, bytes);
    expect(byBatches(choice.create, bytes)).toEqual(reference);
    expect(byBatches(choice.create, bytes, [4093, 17, 65536])).toEqual(reference);
  });
});

/** Specs that exercise every kind of rule on the byte path: counters, fixed groups, pairs with
 * units and repeats, ignore and failure lines, a `contains` the pattern does not imply. */
const BLOCK = loadParserSpecs({ files: [], configDir: null }).find((s) => s.spec.id === 'settle-block')!.spec;
const KV = loadParserSpecs({ files: [], configDir: null }).find((s) => s.spec.id === 'settle-kv')!.spec;
/** Name/value pairs with another sign, a `contains` condition and a record opener. */
const COLON_PAIRS: ParserSpec = {
  id: 'test-colon-pairs', description: 'name: value pairs in blocks', detect: { patterns: ['x'] },
  counters: { iteration: 'it' },
  lines: { rules: [
    { match: '^=== (?<iteration>[0-9]+)', startsRecord: true },
    { keyValues: { assign: ':', kind: 'quantity' }, contains: ':' },
  ] },
};
const RULES: ParserSpec = {
  id: 'test-rules',
  description: 'rules of every kind',
  detect: { patterns: ['x'] },
  ignore: ['^\\s*#', '^-+$'],
  failure: ['^\\s*(?:FATAL|ABORT)\\b'],
  counters: { iteration: 'it' },
  lines: {
    rules: [
      { match: '^Step\\s+(?<step>\\d+)\\s+t\\s*=\\s*(?<time>\\S+)', startsRecord: true },
      { match: '^\\s*it\\s*[:=]\\s*(?<iteration>\\d+)\\s+cfl\\s*=\\s*(?<cfl>\\S+)', values: { cfl: { kind: 'other' } } },
      { match: '(?<name>[A-Za-z_]\\w*)\\s*=\\s*(?<value>[-+0-9.eEdDnaif*]+)', contains: '=', pairs: { repeat: true, kind: 'residual' } },
      { match: '^\\s*mon\\s+(?<name>\\S+)\\s+(?<value>\\S+)(?:\\s+\\[(?<unit>[^\\]]*)\\])?', contains: 'mon', pairs: { unitGroup: 'unit' } },
      { match: 'done', contains: 'all' },
    ],
  },
};

/** Lines that take the byte path's lane (one plain name/value rule for their first bytes): names
 * first seen without a unit and then with one (or an empty one), a name that is a counter, and
 * the same rules with one record per line (no record opener). */
const LANES: ParserSpec = {
  id: 'test-lanes', description: 'pairs on a lane', detect: { patterns: ['x'] },
  counters: { iteration: 'iter' },
  ignore: ['^#'],
  failure: ['^\\s*FATAL\\b'],
  lines: { rules: [
    { match: '^=== iteration (?<iteration>[0-9]+) ===', startsRecord: true },
    { match: '^\\s*val\\s+(?<name>\\S+)\\s+(?<value>\\S+)(?:\\s+\\[(?<unit>[^\\]]*)\\])?', pairs: { kind: 'quantity', unitGroup: 'unit' } },
    { match: '^\\s*res\\s+(?<name>\\S+)\\s+(?<value>\\S+)', pairs: { kind: 'residual' } },
  ] },
};
const LANES_ONE_PER_LINE: ParserSpec = { ...LANES, id: 'test-lanes-flat', lines: { rules: LANES.lines!.rules.slice(1) } };

/** The same with a pattern outside the byte matcher's subset: every line goes the text way. */
const RULES_WITH_ALTERNATION: ParserSpec = {
  ...RULES,
  id: 'test-alternation',
  lines: { rules: [...RULES.lines!.rules, { match: '(?<name>[a-z]+)~(?<value>[0-9.]+|nan)', pairs: {} }] },
};

function patternsOf(spec: ParserSpec): string[] {
  return [...(spec.ignore ?? []), ...(spec.failure ?? []), ...(spec.lines?.rules ?? []).map((rule) => ('match' in rule ? rule.match : ''))];
}

const FRAGMENTS = ['Step ', 'Step 3 t = 0.5', 'it = 12 cfl = 0.8', 'it: 7  cfl=1.5d-1', 'res_p=1e-3', ' res_u = 2.5E-04,', 'k=nan', 'w=****',
  'mon drag 0.331 [N]', 'iter=3 res_p=1e-3', ' step=2 time=0.5', 'it: 4 cl: 0.3', '=== 5', 'a:1,b:2', 'x = 7;', 'mon dp 12.5', 'mon q 1 [W', '  ', '\t', '# note', '---', 'FATAL x', ' ABORT', 'all done', 'done', '=', '[', ']',
  '=== iteration 4 ===', '  residual  res_p   1.0e-3', '  monitor   drag   0.3312  [-]', '  residual x', '1.5-105', '\r', 'é',
  '  monitor   drag   0.33', '  monitor   drag   0.34  []', '  monitor   q  1.5 [W]', '  monitor   q  nan',
  '  val iter 5', ' val drag 0.3', '  val drag 0.31 [N]', '\tval drag 0.32 []', 'val p 1e5 [Pa]', 'val p x', '  res r 1e-3', 'res r2 2e-3', ' res q 4', '   FATAL', '#val x 1'];

describe('byte path = text path on odd lines (property, V8 RegExp on text as the reference)', () => {
  const line = fc.array(fc.constantFrom(...FRAGMENTS), { minLength: 0, maxLength: 5 }).map((parts) => parts.join(''));
  const log = fc.array(line, { minLength: 1, maxLength: 40 }).map((lines) => Buffer.from(lines.join('\n'), 'utf8'));
  it('runs these specs on bytes (every pattern compiles), except the one with an alternation', () => {
    expect(patternsOf(BLOCK).every((p) => compileBytePattern(p) !== undefined)).toBe(true);
    expect(patternsOf(RULES).every((p) => compileBytePattern(p) !== undefined)).toBe(true);
    expect(patternsOf(RULES_WITH_ALTERNATION).every((p) => compileBytePattern(p) !== undefined)).toBe(false);
    expect(patternsOf(KV).every((p) => p === '' || compileBytePattern(p) !== undefined)).toBe(true);
  });

  it.each([['settle-block', BLOCK], ['settle-kv', KV], ['name: value in blocks', COLON_PAIRS], ['rules of every kind', RULES], ['with an alternation', RULES_WITH_ALTERNATION],
    ['pairs on a lane', LANES], ['pairs on a lane, one record per line', LANES_ONE_PER_LINE]] as const)('%s', (_name, spec) => {
    const create = compileSpec(spec, NO_OVERRIDES);
    fc.assert(fc.property(log, fc.array(fc.integer({ min: 1, max: 64 }), { minLength: 1, maxLength: 4 }), (bytes, cuts) => {
      expect(byBatches(create, bytes, cuts)).toEqual(byText(create, bytes));
    }), { numRuns: 600, seed: 20261201 });
  });
});

describe('byte path = text path past the name table\'s bound', () => {
  it('gives the same records when a log has more distinct names than ByteNames keeps (4 096)', () => {
    const lines: string[] = [];
    for (let k = 0; k < 5000; k++) lines.push(`=== iteration ${k + 1} ===`, `  val q${k} ${k}.5`, `  val q${k % 7} ${k} [m]`, `  res r${k % 3} 1e-${k % 9}`);
    const bytes = Buffer.from(lines.join('\n'), 'utf8');
    const create = compileSpec(LANES, NO_OVERRIDES);
    const reference = byText(create, bytes);
    expect(reference.records.length).toBe(5000);
    expect(byBatches(create, bytes)).toEqual(reference);
    expect(byBatches(create, bytes, [777, 65536])).toEqual(reference);
  });
});

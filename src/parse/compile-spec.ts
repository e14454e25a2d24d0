/**
 * Compiles a validated parser spec into a `RecordParser` factory. Patterns are compiled once; each
 * line then costs a few literal pre-filter checks, at most the regular expressions whose literal is
 * present, number lexing, and the record itself.
 *
 * Two paths give the same records: the text path (V8 regular expressions on the line's text, the
 * reference) and the byte path (ASCII lines of a batch, when every pattern of a `lines` spec
 * compiles to a byte matcher: patterns tried only when the line's first bytes allow them, values
 * and names read from the bytes, no string per line). Tested record for record against each other.
 * `rangeParsing` says how a finished log can be parsed in ranges by worker threads.
 */
import type { SeriesInfo, SeriesKind } from './log-record.js';
import type { KindOverrides, ParseStats, RecordParser, RecordSink, RecordSinkOptions } from './record-parser.js';
import { COUNTER_NAMES, type CounterName, type GroupSeries, type LineRule, type ParserSpec, type TableSeparator } from './parser-spec.js';
import { capLine, groupNames, leadingLiteral, PATTERN_LINE_LIMIT, UserPattern } from './user-pattern.js';
import { compileBytePattern, type BytePattern } from './byte-pattern.js';
import { ByteNames, MAX_BYTE_NAMES } from './byte-names.js';
import { indexOfBytes, latin1 } from './byte-text.js';
import { globMatcher } from '../text/glob.js';
import { lexNumber, lexNumberBytes, lexNumberIn } from './lex-number.js';
import { scanKeyValues, scanKeyValuesBytes } from './scan-key-values.js';
import { splitFieldBounds, splitFields } from './split-fields.js';

/** A table cell with no number in it. */
const EMPTY = null;
import { RecordAssembler } from './record-assembler.js';
import type { LineBatch } from '../ingest/line-batch.js';
import type { RangeParsing, SeriesRegistration } from './range-parsing.js';

export type RecordParserFactory = (onRecord: RecordSink, options?: RecordSinkOptions) => RecordParser;

/** Compile once; the factory creates independent parsers (one per run). */
export function compileSpec(spec: ParserSpec, overrides: KindOverrides): RecordParserFactory {
  const plan = planSpec(spec, overrides);
  return (onRecord, options) => new SpecParser(plan, onRecord, options?.copies ?? false);
}

interface CompiledGroup { readonly group: string; readonly series: string; readonly def: GroupSeries }

interface CompiledRule {
  readonly type: 'match' | 'pairs' | 'keyValues';
  readonly pattern?: UserPattern;
  readonly startsRecord: boolean;
  readonly counters: readonly CounterName[];
  readonly groups: readonly CompiledGroup[];
  readonly nameGroup: string;
  readonly valueGroup: string;
  readonly unitGroup?: string;
  readonly repeat: boolean;
  readonly kind?: SeriesKind;
  readonly assign: string;
  readonly contains?: string;
}

interface Plan {
  readonly spec: ParserSpec;
  readonly ignore: readonly UserPattern[];
  readonly failure: readonly UserPattern[];
  readonly rules: readonly CompiledRule[];
  readonly blocks: boolean;
  readonly counterOf: ReadonlyMap<string, CounterName>;
  readonly kindOf: (name: string, ruleKind: SeriesKind | undefined) => SeriesKind;
  readonly tableHeader?: UserPattern;
  readonly separator: TableSeparator;
  readonly jsonKeys?: ReadonlySet<string>;
  /** The same rules matched on the bytes of ASCII lines, when every pattern compiles to a byte
   * matcher (see byte-pattern.ts); otherwise undefined and every line is matched as text. */
  readonly bytes?: BytePlan;
}

/** A rule that runs on bytes: a pattern (capture k of the pattern is caps[2k], caps[2k + 1]), or
 * the name/value scanner (`assign`: its sign as bytes). */
interface ByteRule {
  readonly rule: CompiledRule;
  readonly pattern?: BytePattern;
  readonly assign?: Uint8Array;
  readonly caps: Int32Array;
  /** Literal the line must contain before the pattern runs, when the pattern does not imply it
   * (a spec's `contains` is a condition of its own: the text path checks it too). */
  readonly contains?: Buffer;
  readonly counters: readonly { readonly counter: CounterName; readonly cap: number }[];
  readonly groups: readonly { readonly group: CompiledGroup; readonly cap: number }[];
  readonly hasGroups: boolean;
  readonly nameCap: number;
  readonly valueCap: number;
  readonly unitCap: number;
}

interface BytePlan {
  readonly ignore: readonly BytePattern[];
  readonly failure: readonly BytePattern[];
  readonly rules: readonly ByteRule[];
  /** Scratch captures for ignore and failure patterns. */
  readonly caps: Int32Array;
  /** By the first byte of a line: the patterns and rules that can match a line starting with it
   * (anchored patterns whose start bytes exclude it are left out), in the same order. */
  readonly byFirstByte: readonly LineProgram[];
  /** Lanes by first byte and first byte after the blanks (see laneFor): filled on first use. */
  readonly lanes: (ByteRule | null | undefined)[];
}

/** The line's first byte and its first byte after leading blanks (-1: none) → the slot of its lane. */
function laneSlot(first: number, other: number): number {
  return first * 129 + other + 1;
}

/** The one rule a line starting with these bytes goes through when the usual work for it reduces
 * to one pattern and one name/value pair: no ignore or failure pattern can match it, exactly one
 * rule can, and that rule is a `pairs` rule matched once, with a name and a value, no counters,
 * no `contains` condition and not opening a record. Otherwise null (the line takes the general
 * way). Decided from the patterns' start bytes, as the general way filters them. */
function laneFor(plan: BytePlan, first: number, other: number): ByteRule | null {
  const program = plan.byFirstByte[first];
  if (program.ignore.some((pattern) => mayMatchAfterBlanks(pattern, other))) return null;
  if (program.failure.some((pattern) => mayMatchAfterBlanks(pattern, other))) return null;
  const rules = program.rules.filter((rule) => rule.pattern === undefined || mayMatchAfterBlanks(rule.pattern, other));
  if (rules.length !== 1) return null;
  const [only] = rules;
  const { rule } = only;
  const plain = only.pattern !== undefined && rule.type === 'pairs' && !rule.repeat && !rule.startsRecord
    && only.counters.length === 0 && only.contains === undefined && only.nameCap >= 0 && only.valueCap >= 0;
  return plain ? only : null;
}

interface LineProgram {
  readonly ignore: readonly BytePattern[];
  readonly failure: readonly BytePattern[];
  readonly rules: readonly ByteRule[];
}

function programFor(byte: number, ignore: readonly BytePattern[], failure: readonly BytePattern[], rules: readonly ByteRule[]): LineProgram {
  const may = (pattern: BytePattern | undefined): boolean => pattern === undefined || pattern.startBytes === undefined || pattern.startBytes[byte] !== 0;
  return { ignore: ignore.filter(may), failure: failure.filter(may), rules: rules.filter((rule) => may(rule.pattern)) };
}

function planSpec(spec: ParserSpec, overrides: KindOverrides): Plan {
  const isResidual = globMatcher(overrides.residual);
  const isQuantity = globMatcher(overrides.quantity);
  const kindRules = (spec.kinds ?? []).map((rule) => ({ test: globMatcher([rule.names]), kind: rule.kind }));
  const kindOf = (name: string, ruleKind: SeriesKind | undefined): SeriesKind => {
    if (isResidual(name)) return 'residual';
    if (isQuantity(name)) return 'quantity';
    const declared = spec.series?.[name]?.kind;
    if (declared !== undefined) return declared;
    if (ruleKind !== undefined) return ruleKind;
    for (const rule of kindRules) if (rule.test(name)) return rule.kind;
    return spec.defaultKind ?? 'quantity';
  };
  const counterOf = new Map<string, CounterName>();
  for (const counter of COUNTER_NAMES) {
    const name = spec.counters?.[counter];
    if (name !== undefined) counterOf.set(name, counter);
  }
  const rules = (spec.lines?.rules ?? []).map(compileRule);
  const lineRules = spec.lines?.rules ?? [];
  return {
    bytes: planBytes(spec.ignore ?? [], spec.failure ?? [], lineRules, rules),
    spec,
    ignore: (spec.ignore ?? []).map((p) => new UserPattern(p)),
    failure: (spec.failure ?? []).map((p) => new UserPattern(p)),
    rules,
    blocks: rules.some((rule) => rule.startsRecord),
    counterOf,
    kindOf,
    tableHeader: spec.table ? new UserPattern(spec.table.header, spec.table.contains) : undefined,
    separator: spec.table?.separator ?? 'whitespace',
    jsonKeys: spec.jsonl?.keys ? new Set(spec.jsonl.keys) : undefined,
  };
}

/** The byte plan, or undefined when some pattern has no byte matcher. */
function planBytes(ignore: readonly string[], failure: readonly string[], specRules: readonly LineRule[], rules: readonly CompiledRule[]): BytePlan | undefined {
  if (rules.length === 0) return undefined;
  const compileAll = (sources: readonly string[]): BytePattern[] | undefined => {
    const compiled = sources.map((source) => compileBytePattern(source));
    return compiled.every((p) => p !== undefined) ? compiled as BytePattern[] : undefined;
  };
  const ignorePatterns = compileAll(ignore);
  const failurePatterns = compileAll(failure);
  if (ignorePatterns === undefined || failurePatterns === undefined) return undefined;
  const byteRules: ByteRule[] = [];
  for (let r = 0; r < rules.length; r++) {
    const rule = rules[r];
    const specRule = specRules[r];
    if (rule.type === 'keyValues') {
      byteRules.push({
        rule, assign: Buffer.from(rule.assign, 'latin1'), caps: new Int32Array(2),
        contains: rule.contains !== undefined ? Buffer.from(rule.contains, 'utf8') : undefined,
        counters: [], groups: [], hasGroups: false, nameCap: -1, valueCap: -1, unitCap: -1,
      });
      continue;
    }
    if (!('match' in specRule)) return undefined;
    const pattern = compileBytePattern(specRule.match);
    if (pattern === undefined) return undefined;
    const implied = leadingLiteral(specRule.match)?.text ?? '';
    const contains = specRule.contains !== undefined && !implied.includes(specRule.contains) ? Buffer.from(specRule.contains, 'utf8') : undefined;
    byteRules.push({
      rule,
      pattern,
      caps: new Int32Array(Math.max(2, pattern.capsLength)),
      contains,
      counters: rule.counters.map((counter) => ({ counter, cap: pattern.groupIndex(counter) })),
      groups: rule.groups.map((group) => ({ group, cap: pattern.groupIndex(group.group) })),
      hasGroups: pattern.groupNames.length > 0,
      nameCap: pattern.groupIndex(rule.nameGroup),
      valueCap: pattern.groupIndex(rule.valueGroup),
      unitCap: rule.unitGroup !== undefined ? pattern.groupIndex(rule.unitGroup) : -1,
    });
  }
  const caps = new Int32Array(Math.max(2, ...[...ignorePatterns, ...failurePatterns].map((p) => p.capsLength)));
  const byFirstByte = Array.from({ length: 128 }, (_, byte) => programFor(byte, ignorePatterns, failurePatterns, byteRules));
  return { ignore: ignorePatterns, failure: failurePatterns, rules: byteRules, caps, byFirstByte, lanes: new Array<ByteRule | null | undefined>(128 * 129) };
}

function compileRule(rule: LineRule): CompiledRule {
  const startsRecord = rule.startsRecord ?? false;
  if ('keyValues' in rule) {
    return {
      type: 'keyValues', startsRecord, counters: [], groups: [], nameGroup: '', valueGroup: '', repeat: true,
      kind: rule.keyValues.kind, assign: rule.keyValues.assign ?? '=', contains: rule.contains,
    };
  }
  const names = groupNames(rule.match);
  const counters = COUNTER_NAMES.filter((c) => names.includes(c));
  if ('pairs' in rule) {
    const repeat = rule.pairs.repeat ?? false;
    return {
      type: 'pairs', pattern: new UserPattern(rule.match, rule.contains, repeat), startsRecord, counters, groups: [],
      nameGroup: rule.pairs.nameGroup ?? 'name', valueGroup: rule.pairs.valueGroup ?? 'value', unitGroup: rule.pairs.unitGroup,
      repeat, kind: rule.pairs.kind, assign: '',
    };
  }
  const values = rule.values ?? {};
  const groups: CompiledGroup[] = [];
  for (const group of names) {
    if ((COUNTER_NAMES as readonly string[]).includes(group) && !(group in values)) continue;
    const raw = values[group];
    const def: GroupSeries = typeof raw === 'string' ? { series: raw } : raw ?? {};
    groups.push({ group, series: def.series ?? group, def });
  }
  return {
    type: 'match', pattern: new UserPattern(rule.match, rule.contains), startsRecord, counters, groups,
    nameGroup: '', valueGroup: '', repeat: false, assign: '',
  };
}

class SpecParser implements RecordParser {
  readonly id: string;
  private readonly assembler: RecordAssembler;
  private readonly info = new Map<string, SeriesInfo>();
  private readonly byteNames = new ByteNames();
  /** Series registrations, recorded when this parser parses one range of a log (a worker). */
  private registrations: SeriesRegistration[] | undefined;
  private columns: string[] | null = null;
  private columnCounters: (CounterName | undefined)[] = [];
  private readonly fields: string[] = [];
  private readonly lexed: (number | typeof EMPTY)[] = [];
  private starts = new Int32Array(64);
  private ends = new Int32Array(64);
  private pairKind: SeriesKind | undefined;
  private pairsSeen = 0;
  /** Names seen at each pair position on the previous line (kept by scanKeyValues), and what the
   * parser found out about each: its counter, or that it is a known series. */
  private readonly pairNames: string[] = [];
  private readonly slotName: string[] = [];
  private readonly slotCounter: (CounterName | undefined)[] = [];
  private readonly onPair = (name: string, line: string, valueStart: number, valueEnd: number, index: number): boolean => {
    const value = lexNumberIn(line, valueStart, valueEnd);
    if (value === undefined) return false;
    return this.takePair(name, value, index);
  };

  /** A pair the name/value scanner found (text or bytes), at its position on the line. */
  private takePair(name: string, value: number, index: number): boolean {
    if (this.slotName[index] === name) {
      // Seen at this position before: a known counter or an already registered series.
      this.pairsSeen++;
      const counter = this.slotCounter[index];
      if (counter !== undefined) this.assembler.setCounter(counter, value);
      else this.assembler.current().set(name, value);
      return true;
    }
    this.addValue(name, value, undefined);
    this.slotName[index] = name;
    this.slotCounter[index] = this.plan.counterOf.get(name);
    return true;
  }

  /** By name index (ByteNames): what a pair of that name needs on the lane (see pushLaneLine):
   * NAME_SETTLED, NAME_WITHOUT_UNIT, or 0 (the general way: not seen on a lane yet, a counter, or
   * a series the parser does not know). Only ever set from `info`, which only gains names and
   * units, so a stale entry can only send a pair the general way. */
  private readonly nameState = new Uint8Array(MAX_BYTE_NAMES);
  /** Lane name guessing: the name index seen after each one (-1: none yet), the last index seen
   * on a lane and the guess for the next. One table for all lanes: a wrong guess costs one byte
   * comparison and the usual lookup. */
  private readonly laneNext = new Int32Array(MAX_BYTE_NAMES).fill(-1);
  private laneLast = -1;
  private laneGuess = -1;
  /** A DataView of the current batch's bytes (see BytePattern.exec). */
  private view: DataView | undefined;
  /** The line's bytes while the name/value scanner runs on them. */
  private pairBytes: Buffer = Buffer.alloc(0);
  /** onPair for the byte path: the same rules, the name and value read from the bytes. */
  private readonly onBytePair = (nameStart: number, nameEnd: number, valueStart: number, valueEnd: number, index: number): boolean => {
    const bytes = this.pairBytes;
    const value = lexNumberBytes(bytes, valueStart, valueEnd);
    if (value === undefined) return false;
    const known = this.byteNames.indexOf(bytes, nameStart, nameEnd);
    const name = known >= 0 ? this.byteNames.nameAt(known) : latin1(bytes, nameStart, nameEnd);
    return this.takePair(name, value, index);
  };

  constructor(private readonly plan: Plan, sink: RecordSink, sinkCopies: boolean) {
    this.id = plan.spec.id;
    this.assembler = new RecordAssembler(sink, plan.spec.counters?.step === undefined, sinkCopies);
  }

  pushLine(line: string): void {
    const assembler = this.assembler;
    assembler.lines++;
    if (line.length === 0) return;
    const plan = this.plan;
    for (const pattern of plan.ignore) if (pattern.test(line)) return;
    for (const pattern of plan.failure) {
      if (pattern.test(line)) { assembler.fail(line.trim()); return; }
    }
    let matched: boolean;
    if (plan.rules.length > 0) matched = this.pushRuleLine(line);
    else if (plan.tableHeader !== undefined) matched = this.pushTableLine(line);
    else matched = this.pushJsonLine(line);
    if (!matched) assembler.noteUnmatched(line);
  }

  pushBatch(batch: LineBatch, from = 0, to = batch.count): void {
    const plan = this.plan.bytes;
    if (plan === undefined || !batch.ascii) {
      for (let i = from; i < to; i++) this.pushLine(batch.text(i));
      return;
    }
    const { bytes, starts, ends } = batch;
    this.view = batch.view;
    for (let i = from; i < to; i++) this.pushLineBytes(plan, bytes, starts[i], ends[i]);
    // The batch's bytes are the reader's to reuse: keep no view of them.
    this.view = undefined;
  }

  /** `pushLine` on the bytes of an ASCII line: the same rules in the same order, the same records
   * (checked record for record on every sample log); text is made only for reports (failure and
   * unmatched lines) and for names and units seen for the first time. */
  private pushLineBytes(plan: BytePlan, bytes: Buffer, start: number, end: number): void {
    const assembler = this.assembler;
    assembler.lines++;
    if (start === end) return;
    // Patterns see at most PATTERN_LINE_LIMIT characters, as on the text path (ASCII: one byte each).
    const seen = end - start > PATTERN_LINE_LIMIT ? start + PATTERN_LINE_LIMIT : end;
    const first = bytes[start];
    const program = plan.byFirstByte[first];
    // The first byte after leading blanks (-1: blanks only), for patterns of the form ^\s*K.
    let firstOther = start;
    while (firstOther < seen && isBlankByte(bytes[firstOther])) firstOther++;
    const other = firstOther < seen ? bytes[firstOther] : -1;
    const slot = laneSlot(first, other);
    let lane = plan.lanes[slot];
    if (lane === undefined) lane = plan.lanes[slot] = laneFor(plan, first, other);
    if (lane !== null) {
      this.pushLaneLine(lane, bytes, start, seen, end);
      return;
    }
    for (const pattern of program.ignore) if (mayMatchAfterBlanks(pattern, other) && pattern.exec(bytes, start, seen, start, plan.caps) >= 0) return;
    for (const pattern of program.failure) {
      if (mayMatchAfterBlanks(pattern, other) && pattern.exec(bytes, start, seen, start, plan.caps) >= 0) { assembler.fail(latin1(bytes, start, end).trim()); return; }
    }
    let matched = false;
    for (const byteRule of program.rules) {
      if ((byteRule.pattern === undefined || mayMatchAfterBlanks(byteRule.pattern, other)) && this.applyByteRule(byteRule, bytes, start, seen, end)) matched = true;
    }
    if (!this.plan.blocks) assembler.close();
    if (!matched) assembler.noteUnmatched(latin1(bytes, start, end));
  }

  /** A line on its lane: what the general way does for it (the one rule, then the record closed
   * for formats of one record per line, or the line noted as unmatched), with the series lookup
   * skipped for a name already settled. */
  private pushLaneLine(byteRule: ByteRule, bytes: Buffer, start: number, end: number, lineEnd: number): void {
    const assembler = this.assembler;
    const pattern = byteRule.pattern as BytePattern;
    const caps = byteRule.caps;
    if (pattern.exec(bytes, start, end, start, caps, this.view) < 0) {
      if (!this.plan.blocks) assembler.close();
      assembler.noteUnmatched(latin1(bytes, start, lineEnd));
      return;
    }
    this.pairKind = byteRule.rule.kind;
    const valueCap = 2 * byteRule.valueCap;
    const nameCap = 2 * byteRule.nameCap;
    if (caps[valueCap] >= 0 && caps[nameCap] >= 0) {
      const value = lexNumberBytes(bytes, caps[valueCap], caps[valueCap + 1]);
      if (value !== undefined) {
        // Names come in the same order record after record: try the name that followed the last
        // one on this lane before looking it up.
        const nameStart = caps[nameCap];
        const nameEnd = caps[nameCap + 1];
        const guess = this.laneGuess;
        const index = guess >= 0 && this.byteNames.spells(guess, bytes, nameStart, nameEnd) ? guess : this.byteNames.indexOf(bytes, nameStart, nameEnd);
        if (this.laneLast >= 0) this.laneNext[this.laneLast] = index;
        this.laneLast = index;
        this.laneGuess = index >= 0 ? this.laneNext[index] : -1;
        const state = index >= 0 ? this.nameState[index] : 0;
        if (state === NAME_SETTLED || (state === NAME_WITHOUT_UNIT && (byteRule.unitCap < 0 || caps[2 * byteRule.unitCap] < 0))) {
          this.pairsSeen++;
          assembler.current().set(this.byteNames.nameAt(index), value);
        } else {
          this.addBytePair(byteRule, bytes);
          if (index >= 0) this.nameState[index] = this.laneStateOf(this.byteNames.nameAt(index));
        }
      }
    }
    if (!this.plan.blocks) assembler.close();
  }

  private laneStateOf(name: string): number {
    if (this.plan.counterOf.has(name)) return 0;
    const info = this.info.get(name);
    if (info === undefined) return 0;
    return info.unit !== undefined ? NAME_SETTLED : NAME_WITHOUT_UNIT;
  }

  /** One rule on the line's first `end - start` bytes (the pattern's view); `lineEnd` is the whole
   * line's end (a `contains` condition looks at the whole line, as on the text path). */
  private applyByteRule(byteRule: ByteRule, bytes: Buffer, start: number, end: number, lineEnd: number): boolean {
    if (byteRule.contains !== undefined && indexOfBytes(bytes, byteRule.contains, start, lineEnd) < 0) return false;
    const { caps, rule } = byteRule;
    const pattern = byteRule.pattern;
    if (pattern === undefined) {
      // The name/value scanner, on the whole line as on the text path.
      if (rule.startsRecord) this.assembler.close();
      this.pairKind = rule.kind;
      this.pairsSeen = 0;
      this.pairBytes = bytes;
      scanKeyValuesBytes(bytes, start, lineEnd, byteRule.assign as Uint8Array, this.onBytePair);
      return this.pairsSeen > 0;
    }
    const matchEnd = pattern.exec(bytes, start, end, start, caps, this.view);
    if (matchEnd < 0) return false;
    const assembler = this.assembler;
    if (rule.startsRecord) assembler.close();
    for (const { counter, cap } of byteRule.counters) {
      if (cap < 0 || caps[2 * cap] < 0) continue;
      const value = lexNumberBytes(bytes, caps[2 * cap], caps[2 * cap + 1]);
      if (value !== undefined) assembler.setCounter(counter, value);
    }
    if (rule.type === 'match') {
      const values = assembler.current();
      if (!byteRule.hasGroups) return true;
      for (const { group, cap } of byteRule.groups) {
        if (cap < 0 || caps[2 * cap] < 0) continue;
        const value = lexNumberBytes(bytes, caps[2 * cap], caps[2 * cap + 1]);
        if (value === undefined) continue;
        this.register(group.series, group.def.kind, group.def.unit, group.def.label);
        values.set(group.series, value);
      }
      return true;
    }
    this.pairKind = rule.kind;
    this.addBytePair(byteRule, bytes);
    if (rule.repeat) {
      // Go on from where the match ended (one further after an empty match), as the text path does.
      let from = matchEnd === pattern.matchStart ? matchEnd + 1 : matchEnd;
      while (from < end) {
        const next = pattern.exec(bytes, start, end, from, caps, this.view);
        if (next < 0) break;
        from = next === pattern.matchStart ? next + 1 : next;
        this.addBytePair(byteRule, bytes);
      }
    }
    return true;
  }

  /** `addValue` for a pair read from bytes, with one series lookup on the usual path (a known
   * series, or one that already has its unit). */
  private addBytePair(byteRule: ByteRule, bytes: Buffer): void {
    const { caps, nameCap, valueCap, unitCap } = byteRule;
    if (nameCap < 0 || valueCap < 0 || caps[2 * nameCap] < 0 || caps[2 * valueCap] < 0) return;
    const value = lexNumberBytes(bytes, caps[2 * valueCap], caps[2 * valueCap + 1]);
    if (value === undefined) return;
    const index = this.byteNames.indexOf(bytes, caps[2 * nameCap], caps[2 * nameCap + 1]);
    const name = index >= 0 ? this.byteNames.nameAt(index) : latin1(bytes, caps[2 * nameCap], caps[2 * nameCap + 1]);
    const plan = this.plan;
    if (plan.counterOf.size > 0) {
      const counter = plan.counterOf.get(name);
      if (counter !== undefined) { this.pairsSeen++; this.assembler.setCounter(counter, value); return; }
    }
    const hasUnit = unitCap >= 0 && caps[2 * unitCap] >= 0;
    const known = this.info.get(name);
    if (known === undefined || (hasUnit && known.unit === undefined)) {
      // New, or may get its first unit: the text path's rule, on the unit's text.
      this.addValue(name, value, hasUnit ? latin1(bytes, caps[2 * unitCap], caps[2 * unitCap + 1]) : undefined);
      return;
    }
    this.pairsSeen++;
    this.assembler.current().set(name, value);
  }

  private pushRuleLine(line: string): boolean {
    const assembler = this.assembler;
    let matched = false;
    for (const rule of this.plan.rules) {
      if (rule.type === 'keyValues') {
        if (rule.contains !== undefined && !line.includes(rule.contains)) continue;
        if (rule.startsRecord) assembler.close();
        this.pairKind = rule.kind;
        this.pairsSeen = 0;
        scanKeyValues(line, rule.assign, this.onPair, this.pairNames);
        if (this.pairsSeen > 0) matched = true;
        continue;
      }
      const pattern = rule.pattern as UserPattern;
      const match = pattern.exec(line);
      if (match === null) continue;
      matched = true;
      if (rule.startsRecord) assembler.close();
      const groups = match.groups;
      if (groups !== undefined) {
        for (const counter of rule.counters) {
          const text = groups[counter];
          if (text === undefined) continue;
          const value = lexNumber(text);
          if (value !== undefined) assembler.setCounter(counter, value);
        }
      }
      if (rule.type === 'match') {
        if (groups === undefined) { assembler.current(); continue; }
        const values = assembler.current();
        for (const g of rule.groups) {
          const text = groups[g.group];
          if (text === undefined) continue;
          const value = lexNumber(text);
          if (value === undefined) continue;
          this.register(g.series, g.def.kind, g.def.unit, g.def.label);
          values.set(g.series, value);
        }
      } else {
        this.pairKind = rule.kind;
        this.addMatchedPair(rule, match);
        if (rule.repeat) {
          // Go on from where the first match ended, on the same (length-capped) text.
          const regex = pattern.regex;
          const text = capLine(line);
          if (match[0].length === 0) regex.lastIndex++;
          let next: RegExpExecArray | null;
          while (regex.lastIndex < text.length && (next = regex.exec(text)) !== null) {
            if (next[0].length === 0) regex.lastIndex++;
            this.addMatchedPair(rule, next);
          }
        }
      }
    }
    if (!this.plan.blocks) assembler.close();
    return matched;
  }

  private addMatchedPair(rule: CompiledRule, match: RegExpExecArray): void {
    const groups = match.groups;
    if (groups === undefined) return;
    const name = groups[rule.nameGroup];
    const valueText = groups[rule.valueGroup];
    if (name === undefined || valueText === undefined) return;
    const unit = rule.unitGroup !== undefined ? groups[rule.unitGroup] : undefined;
    this.addPair(name, valueText, unit);
  }

  private addPair(name: string, valueText: string, unit?: string): void {
    const value = lexNumber(valueText);
    if (value !== undefined) this.addValue(name, value, unit);
  }

  private addValue(name: string, value: number, unit: string | undefined): void {
    this.pairsSeen++;
    const counter = this.plan.counterOf.size > 0 ? this.plan.counterOf.get(name) : undefined;
    if (counter !== undefined) { this.assembler.setCounter(counter, value); return; }
    if (this.pairNeedsRegistration(name, unit)) this.register(name, this.pairKind, unit === '' ? undefined : unit, undefined, true);
    this.assembler.current().set(name, value);
  }

  /** A pair's series is (re)registered when it is new, or gets its first unit. */
  private pairNeedsRegistration(name: string, unit: string | undefined): boolean {
    return !this.info.has(name) || (unit !== undefined && unit !== '' && this.info.get(name)?.unit === undefined);
  }

  private register(name: string, ruleKind: SeriesKind | undefined, unit?: string, label?: string, replace = false): void {
    if (!replace && this.info.has(name)) return;
    this.registrations?.push({ atRecord: this.assembler.emitted, name, ruleKind, unit, label, fromPair: replace });
    const declared = this.plan.spec.series?.[name];
    const info: { -readonly [K in keyof SeriesInfo]: SeriesInfo[K] } = { name, kind: this.plan.kindOf(name, ruleKind) };
    const finalUnit = unit ?? declared?.unit;
    if (finalUnit !== undefined) info.unit = finalUnit;
    const finalLabel = declared?.label ?? label;
    if (finalLabel !== undefined) info.label = finalLabel;
    this.info.set(name, info);
  }

  private pushTableLine(line: string): boolean {
    const plan = this.plan;
    const header = plan.tableHeader as UserPattern;
    if (header.test(line)) {
      const count = splitFields(line, plan.separator, this.fields);
      this.columns = this.fields.slice(0, count);
      this.columnCounters = this.columns.map((name) => plan.counterOf.get(name));
      if (this.starts.length < count) { this.starts = new Int32Array(count); this.ends = new Int32Array(count); }
      return true;
    }
    const columns = this.columns;
    if (columns === null) return false;
    const starts = this.starts;
    const ends = this.ends;
    const count = splitFieldBounds(line, plan.separator, starts, ends);
    if (count !== columns.length) return false;
    const lexed = this.lexed;
    const counters = this.columnCounters;
    let numeric = 0;
    let filled = 0;
    for (let i = 0; i < count; i++) {
      if (starts[i] === ends[i]) { lexed[i] = EMPTY; continue; }
      filled++;
      const value = lexNumberIn(line, starts[i], ends[i]);
      if (value === undefined) {
        if (counters[i] === 'iteration') return false;
        lexed[i] = EMPTY;
      } else {
        numeric++;
        lexed[i] = value;
      }
    }
    if (numeric === 0 || numeric * 2 <= filled) return false;
    const assembler = this.assembler;
    const values = assembler.current();
    for (let i = 0; i < count; i++) {
      const value = lexed[i];
      if (value === EMPTY) continue;
      const counter = counters[i];
      if (counter !== undefined) { assembler.setCounter(counter, value as number); continue; }
      const name = columns[i];
      if (!this.info.has(name)) this.register(name, undefined);
      values.set(name, value as number);
    }
    assembler.close();
    return true;
  }

  private pushJsonLine(line: string): boolean {
    let start = 0;
    while (start < line.length && (line.charCodeAt(start) === 32 || line.charCodeAt(start) === 9)) start++;
    if (line.charCodeAt(start) !== 123 /* { */) return false;
    let parsed: unknown;
    try {
      parsed = JSON.parse(line);
    } catch {
      return false;
    }
    if (parsed === null || typeof parsed !== 'object' || Array.isArray(parsed)) return false;
    const assembler = this.assembler;
    const keys = this.plan.jsonKeys;
    const counterOf = this.plan.counterOf;
    let found = 0;
    for (const [key, raw] of Object.entries(parsed as Record<string, unknown>)) {
      let value: number | undefined;
      if (typeof raw === 'number') value = raw;
      else if (typeof raw === 'string' && raw.length < 24) {
        // Strings count only when they spell a non-finite value ("NaN", "Infinity", "***"...).
        const lexed = lexNumber(raw);
        if (lexed !== undefined && !Number.isFinite(lexed)) value = lexed;
      }
      if (value === undefined) continue;
      const counter = counterOf.get(key);
      if (counter !== undefined) { assembler.setCounter(counter, value); found++; continue; }
      if (keys !== undefined && !keys.has(key)) continue;
      if (!this.info.has(key)) this.register(key, undefined);
      assembler.current().set(key, value);
      found++;
    }
    if (found === 0) return false;
    assembler.close();
    return true;
  }

  finish(): void {
    this.assembler.close();
  }

  rangeParsing(): RangeParsing | undefined {
    const plan = this.plan;
    // Only specs on the byte path: on the text path (a string per line) two workers measured
    // slower than one sequential read on a 2-core machine (a 190 MB name=value log: 2.6 s against
    // 2.2 s), as both threads allocate and collect at full speed.
    if (plan.bytes === undefined) return undefined;
    const assembler = this.assembler;
    return {
      boundary: plan.blocks ? 'record' : 'line',
      isBoundaryLine: (batch, i) => !plan.blocks || this.opensRecord(batch, i),
      recordRegistrations: () => (this.registrations = []),
      // Time steps carry from record to record (checked as the log is read: a spec may name step
      // and time columns that a log does not have).
      dependsOnEarlierRecords: () => assembler.dependsOnEarlierRecords || assembler.usesTimeSteps,
      totals: () => ({ ...assembler.stats(), lastIteration: assembler.lastIterationNumber, timeSteps: assembler.usesTimeSteps }),
      replayRegistrations: (registrations) => {
        for (const r of registrations) {
          if (!r.fromPair) this.register(r.name, r.ruleKind, r.unit, r.label);
          else if (this.pairNeedsRegistration(r.name, r.unit)) this.register(r.name, r.ruleKind, r.unit, undefined, true);
        }
      },
      resumeAfter: (totals) => assembler.resumeAfter(totals),
    };
  }

  /** Can line i of the batch start a range: is it neither empty, ignored nor a failure line, and
   * is the first rule that matches it one marked startsRecord (so that the line closes the open
   * record before it adds anything)? */
  private opensRecord(batch: LineBatch, i: number): boolean {
    const plan = this.plan;
    const bytes = plan.bytes;
    if (bytes !== undefined && batch.ascii) {
      const data = batch.bytes;
      const start = batch.starts[i];
      const end = batch.ends[i];
      if (start === end) return false;
      const seen = end - start > PATTERN_LINE_LIMIT ? start + PATTERN_LINE_LIMIT : end;
      const program = bytes.byFirstByte[data[start]];
      for (const pattern of program.ignore) if (pattern.exec(data, start, seen, start, bytes.caps) >= 0) return false;
      for (const pattern of program.failure) if (pattern.exec(data, start, seen, start, bytes.caps) >= 0) return false;
      // The first rule that matches decides: a rule before the one that opens the record would
      // add to the record being closed, so the line could not start a range.
      for (const byteRule of program.rules) {
        if (byteRule.contains !== undefined && indexOfBytes(data, byteRule.contains, start, end) < 0) continue;
        // A name/value rule counts as matching whenever it looks at the line (it may find pairs).
        if (byteRule.pattern === undefined || byteRule.pattern.exec(data, start, seen, start, byteRule.caps) >= 0) return byteRule.rule.startsRecord;
      }
      return false;
    }
    const line = batch.text(i);
    if (line.length === 0) return false;
    if (plan.ignore.some((pattern) => pattern.test(line)) || plan.failure.some((pattern) => pattern.test(line))) return false;
    for (const rule of plan.rules) {
      // A name/value rule counts as matching whenever it looks at the line (it may find pairs).
      const matches = rule.type === 'keyValues' ? rule.contains === undefined || line.includes(rule.contains) : (rule.pattern as UserPattern).test(line);
      if (matches) return rule.startsRecord;
    }
    return false;
  }

  noteRestart(): void {
    this.assembler.close();
    this.assembler.noteRestart();
    this.columns = null;
  }

  seriesInfo(): ReadonlyMap<string, SeriesInfo> {
    return this.info;
  }

  stats(): ParseStats {
    return this.assembler.stats();
  }
}

/** JS `\s` on ASCII bytes. */
/** A lane's pair of this name just sets its value: a known series with a unit. */
const NAME_SETTLED = 1;
/** The same, for a series with no unit yet: only when the pair brings no unit. */
const NAME_WITHOUT_UNIT = 2;

function isBlankByte(byte: number): boolean {
  return byte === 32 || (byte >= 9 && byte <= 13);
}

/** Can a pattern match a line whose first byte after leading blanks is `other` (-1: none)? */
function mayMatchAfterBlanks(pattern: BytePattern, other: number): boolean {
  const after = pattern.startBytesAfterBlanks;
  return after === undefined || other < 0 || after[other] !== 0;
}

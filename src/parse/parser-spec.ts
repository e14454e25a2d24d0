/**
 * The parser spec: settle's declarative description of a log format, as read from a JSON file in
 * `parsers/` (validated against `parsers/parser-spec.schema.json`) or built in memory by inference.
 *
 * A spec has exactly one of three bodies:
 * - `lines`: rules (regular expressions with named groups, or a fast name/value scanner) applied to
 *   each line; a record is either one line, or a block opened by a rule marked `startsRecord`;
 * - `table`: columns named by a header row (whitespace, comma, semicolon, tab or bar separated);
 *   the header may repeat, and a restart means it must be seen again;
 * - `jsonl`: one flat JSON object per line.
 */
import type { SeriesKind } from './log-record.js';

/** Record fields a spec can fill from the log: the counters. */
export type CounterName = 'iteration' | 'step' | 'time' | 'inner';
export const COUNTER_NAMES: readonly CounterName[] = ['iteration', 'step', 'time', 'inner'];

export interface SeriesDefinition {
  readonly kind?: SeriesKind;
  readonly unit?: string;
  readonly label?: string;
}

/** A capture group that becomes a fixed series. */
export interface GroupSeries extends SeriesDefinition {
  /** Series name; defaults to the group's name. */
  readonly series?: string;
}

export interface KindRule {
  /** Glob on series names (`*` any run of characters, `?` one character). */
  readonly names: string;
  readonly kind: SeriesKind;
}

export interface DetectSection {
  /** A sample line fits when it matches any of these patterns. */
  readonly patterns: readonly string[];
  /** How many sample lines must fit (default 1). */
  readonly minMatches?: number;
  /** How many of the first lines to look at (default 200). */
  readonly firstLines?: number;
}

interface RuleBase {
  /** Literal text the line must contain before the pattern is tried (a fast pre-filter). When
   * absent, settle derives one from the pattern's leading literal text where it can. */
  readonly contains?: string;
  /** This line opens a new record (and closes the one before). */
  readonly startsRecord?: boolean;
}

/** Named groups become series; groups named iteration, step, time or inner are counters. */
export interface MatchRule extends RuleBase {
  readonly match: string;
  readonly values?: Readonly<Record<string, string | GroupSeries>>;
}

/** The series name comes from one capture group and its value from another. */
export interface PairRule extends RuleBase {
  readonly match: string;
  readonly pairs: {
    readonly nameGroup?: string;
    readonly valueGroup?: string;
    readonly unitGroup?: string;
    /** Apply the pattern again after each match, along the whole line (default false). */
    readonly repeat?: boolean;
    /** Kind of every series this rule yields (else `kinds`, else `defaultKind`). */
    readonly kind?: SeriesKind;
  };
}

/** Fast scanner for `name=value` (or `name: value`, `name = value`) tokens anywhere in a line. */
export interface KeyValueRule extends RuleBase {
  readonly keyValues: {
    /** The sign between name and value (default `=`). */
    readonly assign?: string;
    readonly kind?: SeriesKind;
  };
}

export type LineRule = MatchRule | PairRule | KeyValueRule;

export type TableSeparator = 'whitespace' | ',' | ';' | '\t' | '|';

export interface TableSection {
  /** A line matching this is the header row; its fields name the columns. */
  readonly header: string;
  readonly contains?: string;
  readonly separator: TableSeparator;
}

export interface JsonLinesSection {
  /** Only these keys become series (default: every numeric key). */
  readonly keys?: readonly string[];
}

export interface ParserSpec {
  readonly $schema?: string;
  readonly id: string;
  readonly description: string;
  readonly detect: DetectSection;
  /** Lines that are neither data nor noise worth reporting. */
  readonly ignore?: readonly string[];
  /** Lines that mark a crash; the record gets `failure` with the line's text. */
  readonly failure?: readonly string[];
  /** Series names (from pairs, columns or JSON keys) that are counters, not series. */
  readonly counters?: Readonly<Partial<Record<CounterName, string>>>;
  /** Kind, unit and label per series name. */
  readonly series?: Readonly<Record<string, SeriesDefinition>>;
  /** Kinds by name glob for series named by the log itself; first match wins. */
  readonly kinds?: readonly KindRule[];
  /** Kind of a series nothing else classifies (default `quantity`). */
  readonly defaultKind?: SeriesKind;
  readonly lines?: { readonly rules: readonly LineRule[] };
  readonly table?: TableSection;
  readonly jsonl?: JsonLinesSection;
}

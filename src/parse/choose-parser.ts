/**
 * Chooses the parser for a log from its first lines: the spec the user forced, else the spec that
 * fits best (the user's specs before the built-in ones), else a structure inferred from the lines.
 * Says which and why in one line (`ParserChoice.explanation`).
 *
 * Fit: a spec fits when at least `detect.minMatches` of its first `detect.firstLines` sample lines
 * match one of its detection patterns. Among the fitting specs of one group (user, then built-in),
 * one whose trial parse of the sample yields a record beats one whose does not (a live log may so
 * far hold only a header); then the one matching most lines wins; ties go to the earlier spec.
 * Cost: one pass over the sample per spec.
 */
import { InputError, UsageError, shorten } from '../errors.js';
import type { LoadedSpec } from './loaded-spec.js';
import type { KindOverrides, ParserChoice } from './record-parser.js';
import type { ParserSpec } from './parser-spec.js';
import { compileSpec } from './compile-spec.js';
import { UserPattern } from './user-pattern.js';
import { inferSpec } from './infer-spec.js';

export interface ChooseParserOptions {
  readonly specs: readonly LoadedSpec[];
  /** Use this spec id without detection (unknown id: UsageError listing the known ids). */
  readonly forcedId?: string;
  readonly overrides: KindOverrides;
  /** The log's name, for messages. */
  readonly source: string;
}

const DEFAULT_FIRST_LINES = 200;

/** `inferenceLines`: the lines inference looks at when no spec fits (default the sample itself).
 * Spec fitting looks at most at the first 200 sample lines (`detect.firstLines` is at most 200),
 * so a caller may pass those and decode more lines only when inference needs them. */
export function chooseParser(sampleLines: readonly string[], options: ChooseParserOptions,
  inferenceLines: () => readonly string[] = () => sampleLines): ParserChoice {
  const { specs, overrides } = options;
  if (options.forcedId !== undefined) {
    const spec = specs.find((s) => s.id === options.forcedId);
    if (spec === undefined) {
      throw new UsageError(`no parser spec has the id '${options.forcedId}'`,
        `known ids: ${specs.map((s) => s.id).join(', ')}; or give the path of a spec file (run \`settle parsers list\`)`);
    }
    return choiceOf(spec.spec, `spec ${spec.id} (${origin(spec)}): chosen with --parser`, overrides);
  }
  const ordered = [...specs.filter((s) => !s.builtIn), ...specs.filter((s) => s.builtIn)];
  let best: { spec: LoadedSpec; matches: number; looked: number; records: boolean } | undefined;
  for (const loaded of ordered) {
    if (best !== undefined && best.spec.builtIn !== loaded.builtIn) break;
    const fit = specFit(loaded.spec, sampleLines);
    if (fit === undefined) continue;
    const better = best === undefined || (fit.records && !best.records) || (fit.records === best.records && fit.matches > best.matches);
    if (better) best = { spec: loaded, ...fit };
  }
  if (best !== undefined) {
    return choiceOf(best.spec.spec,
      `spec ${best.spec.id} (${origin(best.spec)}): ${best.matches} of the first ${best.looked} lines match its detection patterns`, overrides);
  }
  const lines = inferenceLines();
  const inferred = inferSpec(lines);
  if (inferred === undefined) {
    const first = lines.find((l) => l.trim().length > 0);
    throw new InputError(
      `no iterations found in ${options.source}: no parser spec fits its first ${lines.length} lines and no numeric table, name/value pairs or JSON lines were found${first === undefined ? '' : ` (first line: '${shorten(first, 60)}')`}`,
      'write a parser spec for this log and pass it with --parser FILE (see `settle parsers list` and parsers/README.md)');
  }
  return choiceOf(inferred.spec, inferred.explanation, overrides);
}

function origin(spec: LoadedSpec): string {
  return spec.builtIn ? 'built-in' : spec.file;
}

function choiceOf(spec: ParserSpec, explanation: string, overrides: KindOverrides): ParserChoice {
  const factory = compileSpec(spec, overrides);
  return { id: spec.id, explanation, create: factory, spec, overrides };
}

/** How well a spec's detection patterns fit the sample (undefined when it does not fit), and
 * whether a trial parse of the sample yields a record with values. */
export function specFit(spec: ParserSpec, sampleLines: readonly string[]): { matches: number; looked: number; records: boolean } | undefined {
  const looked = Math.min(sampleLines.length, spec.detect.firstLines ?? DEFAULT_FIRST_LINES);
  const patterns = spec.detect.patterns.map((p) => new UserPattern(p));
  let matches = 0;
  for (let i = 0; i < looked; i++) {
    const line = sampleLines[i];
    if (patterns.some((p) => p.test(line))) matches++;
  }
  if (matches < (spec.detect.minMatches ?? 1)) return undefined;
  let records = 0;
  const parser = compileSpec(spec, { residual: [], quantity: [] })((record) => { if (record.values.size > 0) records++; });
  for (let i = 0; i < looked; i++) parser.pushLine(sampleLines[i]);
  parser.finish();
  return { matches, looked, records: records > 0 };
}

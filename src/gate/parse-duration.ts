/**
 * Parse a human duration for the gate's `--idle` flag: a positive number followed by a unit,
 * `ms`, `s`, `m` or `h` (e.g. `1500ms`, `30s`, `5m`, `2h`, `1.5s`). A bare number is refused because
 * its unit would be a guess. Pure; O(length of the text).
 *
 * @example parseDuration('--idle', '5m') // 300000
 */
import { UsageError, shorten } from '../errors.js';

const MS_PER_UNIT: Readonly<Record<string, number>> = { ms: 1, s: 1000, m: 60_000, h: 3_600_000 };

/** Longest duration accepted: 30 days. Longer values are almost certainly a typo, and timers in
 * Node overflow past 2^31 − 1 ms (about 24.8 days) anyway, so waits are chunked by the caller. */
export const MAX_DURATION_MS = 30 * 24 * 3_600_000;

/** Milliseconds (rounded to a whole number) for a duration text; UsageError naming `flag` otherwise. */
export function parseDuration(flag: string, text: string): number {
  const match = /^\s*(\d+(?:\.\d+)?|\.\d+)\s*(ms|s|m|h)\s*$/i.exec(text);
  const hint = `for example ${flag} 30s (units: ms, s, m, h)`;
  if (match === null) {
    if (/^\s*\d+(?:\.\d+)?\s*$/.test(text)) throw new UsageError(`${flag} needs a unit, got '${shorten(text, 20)}'`, hint);
    throw new UsageError(`${flag} needs a duration such as 30s, 5m, 2h or 1500ms, got '${shorten(text, 20)}'`, hint);
  }
  const ms = Math.round(Number(match[1]) * MS_PER_UNIT[match[2].toLowerCase()]);
  if (!(ms > 0)) throw new UsageError(`${flag} must be longer than zero, got '${shorten(text, 20)}'`, hint);
  if (ms > MAX_DURATION_MS) throw new UsageError(`${flag} must be at most 30 days, got '${shorten(text, 20)}'`, hint);
  return ms;
}

/**
 * Print a duration in milliseconds the way a person would type it for `--idle` (the inverse of
 * parseDuration for whole units): `1500ms`, `30s`, `5m`, `2h`; other values under a minute in
 * milliseconds, longer ones in the largest unit with up to two decimals (`1.51m`). Pure; O(1).
 */
export function formatDuration(ms: number): string {
  if (!Number.isFinite(ms)) return String(ms);
  const units: readonly [string, number][] = [['h', 3_600_000], ['m', 60_000], ['s', 1000]];
  for (const [unit, size] of units) {
    if (ms >= size && ms % size === 0) return `${ms / size}${unit}`;
  }
  if (ms < 60_000) return `${Math.round(ms)}ms`;
  const [unit, size] = units.find(([, size]) => ms >= size) ?? units[units.length - 1];
  return `${Number((ms / size).toFixed(2))}${unit}`;
}

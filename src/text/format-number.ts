/** How numbers print in settle's text and JSON output (check, inspect, report, gate events). One style throughout. */

/** Compact text form: 4 significant digits, exponent form for very small or large magnitudes. */
export function formatNumber(value: number, digits = 4): string {
  if (Number.isNaN(value)) return 'NaN';
  if (value === Infinity) return 'Inf';
  if (value === -Infinity) return '-Inf';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e-3 && magnitude < 1e5) return String(Number(value.toPrecision(digits)));
  return value.toExponential(digits - 1).replace(/e\+?/, 'e');
}

/** JSON has no NaN or Infinity: settle's JSON contracts print them as strings. */
export function jsonNumber(value: number): number | string {
  if (Number.isNaN(value)) return 'NaN';
  if (value === Infinity) return 'Infinity';
  if (value === -Infinity) return '-Infinity';
  return value;
}

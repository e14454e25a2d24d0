/**
 * Plain-words number formatting for reasons, advice and timeline texts (one style everywhere):
 * counts with a space every three digits ("2 300"), residuals in short scientific form ("2.1e-4";
 * plain between 0.001 and 10 000: "1.6"),
 * a mean with its half-width rounded to the half-width's first significant digit ("0.3312 ± 0.0004").
 */

// Counts and estimates print exactly as in every view (one style throughout).
export { formatCount, formatEstimate } from '../text/format-count.js';

/** Two significant figures: short scientific form for small and large values (0.000213 → "2.1e-4",
 * 52 300 → "5.2e4"), plain between 0.001 and 10 000 (1.63 → "1.6", 0.0213 → "0.021", 870 → "870");
 * non-finite values by name. */
export function formatResidual(value: number): string {
  if (Number.isNaN(value)) return 'NaN';
  if (!Number.isFinite(value)) return value > 0 ? 'Infinity' : '-Infinity';
  if (value === 0) return '0';
  const rounded = Number(value.toPrecision(2));
  if (Math.abs(rounded) >= 1e-3 && Math.abs(rounded) < 1e4) return String(rounded);
  const [mantissa, exponent] = value.toExponential(1).split('e');
  return `${mantissa}e${Number(exponent)}`;
}

/** Decades with one decimal, rounded down (toward −∞): 3.24 → "3.2", 5.96 → "5.9". Rounding down
 * means a printed figure never crosses a threshold the value has not crossed (a drop of 2.96 of 3
 * decades reads "2.9", not "3"); every analysis text prints decades this way. A millionth of a tenth
 * is forgiven so that binary rounding (0.3 stored as 0.29999…) does not lose a tenth. */
export function formatDecades(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  const tenths = Math.floor(value * 10 + 1e-6);
  return (tenths / 10).toFixed(1).replace(/\.0$/, '').replace(/^-0$/, '0');
}

/** A value to four significant figures ("0.3312", "1204"); at or above a million or below 1e-4 in
 * the short scientific form of formatResidual ("1.2e6", "3.0e-5"). */
export function formatValue(value: number): string {
  if (!Number.isFinite(value)) return formatResidual(value);
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e6 || magnitude < 1e-4) return formatResidual(value);
  return String(Number(value.toPrecision(4)));
}

/** Mean ± half-width, both rounded at the half-width's first significant digit. */
export function formatMeanInterval(mean: number, halfWidth: number): string {
  if (!Number.isFinite(mean) || !Number.isFinite(halfWidth) || halfWidth <= 0) return formatValue(mean);
  const place = Math.floor(Math.log10(halfWidth));
  if (place < -10 || place > 10) return `${mean.toPrecision(4)} ± ${halfWidth.toPrecision(1)}`;
  const decimals = Math.max(0, -place);
  const unit = 10 ** place;
  const roundedHalf = Math.max(unit, Math.round(halfWidth / unit) * unit);
  const roundedMean = Math.round(mean / unit) * unit;
  return `${roundedMean.toFixed(decimals)} ± ${roundedHalf.toFixed(decimals)}`;
}

/** A fraction as a percentage with two significant figures: 0.00123 → "0.12 %". */
export function formatPercent(fraction: number): string {
  return `${Number((fraction * 100).toPrecision(2))} %`;
}

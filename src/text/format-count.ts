/**
 * How counts (iterations, records, cells) and estimated counts (iterations to a target) print in
 * settle's text: the style of the analysis's reasons and advice ("about 340 000 iterations"), so a
 * reason and the table under it read alike. Groups of three digits are separated by a plain space
 * (the SI and ISO 80000-1 digit grouping; a space, not a comma, so no reader mistakes it for a
 * decimal mark). Estimates are rounded to two significant figures: their own uncertainty is larger
 * than that. JSON outputs keep numbers as numbers and do not use these. O(digits).
 */

/** A whole number with a space between groups of three digits: 4210 → "4 210", 1054 → "1 054".
 * Non-whole values are rounded to the nearest whole number; non-finite values print by name. */
export function formatCount(value: number): string {
  if (Number.isNaN(value)) return 'NaN';
  if (!Number.isFinite(value)) return value > 0 ? 'Infinity' : '-Infinity';
  const rounded = Math.round(value);
  const digits = String(Math.abs(rounded)).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
  return rounded < 0 ? `-${digits}` : digits;
}

/** An estimated count to two significant figures, grouped like formatCount: 343 462 → "340 000",
 * 2 287 → "2 300"; below 100 the whole number itself (87.4 → "87"). */
export function formatEstimate(value: number): string {
  if (!Number.isFinite(value)) return formatCount(value);
  if (Math.abs(value) < 100) return formatCount(value);
  const unit = 10 ** (Math.floor(Math.log10(Math.abs(value))) - 1);
  return formatCount(Math.round(value / unit) * unit);
}

/**
 * Short, fixed-width renderings of the figures the dashboard shows: values, counts, durations and
 * ages. Pure; every function is O(1) apart from the digits it prints.
 */

/** A residual or quantity value in at most `digits` significant digits, as short as possible:
 * `2.13e-4`, `1.118`, `-3.2e5`, `0`, `NaN`, `Inf`, `-Inf`. Exponents carry no `+` and no leading
 * zeros, so residuals fit in 7 characters. */
export function formatValue(value: number, digits = 3): string {
  if (Number.isNaN(value)) return 'NaN';
  if (value === Number.POSITIVE_INFINITY) return 'Inf';
  if (value === Number.NEGATIVE_INFINITY) return '-Inf';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e-3 && magnitude < 1e5) {
    const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(magnitude)));
    const fixed = value.toFixed(Math.min(decimals, 8));
    return fixed;
  }
  const [mantissa, exponent] = value.toExponential(Math.max(0, digits - 1)).split('e');
  const trimmed = mantissa.includes('.') ? mantissa.replace(/0+$/, '').replace(/\.$/, '') : mantissa;
  return `${trimmed}e${Number(exponent)}`;
}

/** A residual in scientific notation always (`1e-3`, `2.1e-4`): how residuals are read. */
export function formatResidual(value: number, digits = 3): string {
  if (!Number.isFinite(value) || value === 0) return formatValue(value);
  const [mantissa, exponent] = value.toExponential(Math.max(0, digits - 1)).split('e');
  const trimmed = mantissa.includes('.') ? mantissa.replace(/0+$/, '').replace(/\.$/, '') : mantissa;
  return `${trimmed}e${Number(exponent)}`;
}

/** A power of ten for an axis label: `1e0`, `1e-3`, `1e5`. */
export function formatDecade(exponent: number): string {
  return `1e${exponent}`;
}

/** A whole count with thin groups of three digits separated by spaces: `4 210`, `1 000 000`. */
export function formatCount(count: number): string {
  if (!Number.isFinite(count)) return '-';
  const rounded = Math.round(count);
  const sign = rounded < 0 ? '-' : '';
  const digits = String(Math.abs(rounded));
  return sign + digits.replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
}

/** A count shortened to at most about 5 characters: `950`, `4.2k`, `12k`, `3.1M`. */
export function formatCountShort(count: number): string {
  if (!Number.isFinite(count)) return '-';
  const n = Math.round(count);
  const a = Math.abs(n);
  if (a < 10_000) return String(n);
  if (a < 1e6) return `${(n / 1e3).toFixed(a < 1e5 ? 1 : 0).replace(/\.0$/, '')}k`;
  if (a < 1e9) return `${(n / 1e6).toFixed(a < 1e8 ? 1 : 0).replace(/\.0$/, '')}M`;
  return `${(n / 1e9).toFixed(1).replace(/\.0$/, '')}G`;
}

/** A duration in seconds as a short human figure: `45 s`, `12 min`, `3.5 h`, `2.1 d`. */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return '-';
  if (seconds < 60) return `${Math.round(seconds)} s`;
  if (seconds < 3600) return `${Math.round(seconds / 60)} min`;
  if (seconds < 86_400) {
    const hours = seconds / 3600;
    return `${hours < 10 ? hours.toFixed(1).replace(/\.0$/, '') : Math.round(hours)} h`;
  }
  const days = seconds / 86_400;
  return `${days < 10 ? days.toFixed(1).replace(/\.0$/, '') : Math.round(days)} d`;
}

/** How long ago something happened, from clock times in ms: `just now`, `4 s ago`, `12 min ago`,
 * or `never` when `then` is NaN. Ages under one second read `just now`. */
export function formatAge(then: number, now: number): string {
  if (Number.isNaN(then)) return 'never';
  const seconds = Math.max(0, (now - then) / 1000);
  if (seconds < 1) return 'just now';
  return `${formatDuration(seconds)} ago`;
}

/** Cut `text` to `width` characters, ending in `…` when cut; pad with spaces to `width` when `pad`. */
export function fit(text: string, width: number, pad = false): string {
  if (width <= 0) return '';
  const chars = Array.from(text);
  if (chars.length > width) return width === 1 ? '…' : `${chars.slice(0, width - 1).join('')}…`;
  return pad ? text + ' '.repeat(width - chars.length) : text;
}

/** Fit a path in `width` characters, keeping its end (the file name tells runs apart) and cutting
 * the start with `…`. */
export function fitPath(text: string, width: number, pad = false): string {
  const chars = Array.from(text);
  if (width <= 0) return '';
  if (chars.length <= width) return fit(text, width, pad);
  return width === 1 ? '…' : `…${chars.slice(chars.length - (width - 1)).join('')}`;
}

/** Right-align `text` in `width` characters (cut with `…` when too long). */
export function fitRight(text: string, width: number): string {
  const cut = fit(text, width);
  return ' '.repeat(Math.max(0, width - Array.from(cut).length)) + cut;
}

import { describe, expect, it } from 'vitest';
import { fit, fitPath, fitRight, formatAge, formatCount, formatCountShort, formatDuration, formatResidual, formatValue } from '../../src/ui/format-figures.js';

// Expected strings follow from the rules stated in each function's doc comment (our own format).
describe('formatValue', () => {
  it.each([
    [0, 3, '0'],
    [1.118, 3, '1.12'],
    [4.519, 5, '4.5190'],
    [120.1, 5, '120.10'],
    [-3.2e5, 3, '-3.2e5'],
    [2.13e-4, 3, '2.13e-4'],
    [1e-3, 3, '0.00100'],
    [99999, 3, '99999'],
    [1.5e12, 3, '1.5e12'],
    [Number.NaN, 3, 'NaN'],
    [Number.POSITIVE_INFINITY, 3, 'Inf'],
    [Number.NEGATIVE_INFINITY, 3, '-Inf'],
  ])('formats %s with %i digits as %s', (value, digits, expected) => {
    expect(formatValue(value, digits)).toBe(expected);
  });
});

describe('formatResidual', () => {
  it.each([
    [1, '1e0'],
    [2.13e-4, '2.13e-4'],
    [1e-3, '1e-3'],
    [0.5, '5e-1'],
    [12345, '1.23e4'],
    [0, '0'],
    [Number.NaN, 'NaN'],
  ])('formats %s as %s (always scientific, no + and no leading zeros in the exponent)', (value, expected) => {
    expect(formatResidual(value)).toBe(expected);
  });
});

describe('counts, durations and ages', () => {
  it.each([[0, '0'], [999, '999'], [4210, '4 210'], [1_000_000, '1 000 000'], [-12345, '-12 345'], [Number.NaN, '-']])('formatCount(%s) = %s', (n, s) => {
    expect(formatCount(n)).toBe(s);
  });
  it.each([[950, '950'], [9999, '9999'], [12_345, '12.3k'], [123_456, '123k'], [3_100_000, '3.1M'], [2.5e9, '2.5G']])('formatCountShort(%s) = %s', (n, s) => {
    expect(formatCountShort(n)).toBe(s);
  });
  it.each([[45, '45 s'], [59.4, '59 s'], [720, '12 min'], [3.5 * 3600, '3.5 h'], [15 * 3600, '15 h'], [2.1 * 86_400, '2.1 d'], [-1, '-'], [Number.POSITIVE_INFINITY, '-']])('formatDuration(%s) = %s', (s, text) => {
    expect(formatDuration(s)).toBe(text);
  });
  it('reads ages from clock readings in ms, "never" before anything happened', () => {
    expect(formatAge(Number.NaN, 5000)).toBe('never');
    expect(formatAge(4500, 5000)).toBe('just now');
    expect(formatAge(1000, 5000)).toBe('4 s ago');
    expect(formatAge(0, 12 * 60_000)).toBe('12 min ago');
  });
});

describe('fit and fitRight', () => {
  it('cut with an ellipsis and pad to the width asked', () => {
    expect(fit('residual', 5)).toBe('resi…');
    expect(fit('res', 5, true)).toBe('res  ');
    expect(fit('res', 0)).toBe('');
    expect(fitRight('42', 5)).toBe('   42');
    expect(fitRight('123456', 4)).toBe('123…');
  });
});

describe('fitPath', () => {
  it('keeps the end of a long path, where the file name tells runs apart', () => {
    expect(fitPath('sample-logs/cavity-diverging.kv.log', 16)).toBe('…iverging.kv.log');
    expect(fitPath('sample-logs/cavity-diverging.kv.log', 16)).toHaveLength(16);
    expect(fitPath('run.log', 10, true)).toBe('run.log   ');
    expect(fitPath('run.log', 1)).toBe('…');
    expect(fitPath('run.log', 0)).toBe('');
  });
});

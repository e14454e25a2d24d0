/**
 * Number formatting in reasons and advice (format-figures.ts). Expected strings are settle's own
 * style (the analysis brief: "2 300", "2.1e-4", "0.3312 ± 0.0004"), checked by hand; decades are rounded
 * down so a printed figure never crosses a threshold the value has not (the reviewer's item 4).
 */
import { describe, expect, it } from 'vitest';
import { formatDecades, formatResidual, formatValue } from '../../src/analysis/format-figures.js';

describe('formatResidual', () => {
  it.each([
    [1.63, '1.6'],
    [2.3, '2.3'],
    [1, '1'],
    [0.0213, '0.021'],
    [0.001, '0.001'],
    [870, '870'],
    [9876, '9900'],
    [-4.5, '-4.5'],
  ])('between 0.001 and 10 000 plainly: %s → %s', (value, expected) => {
    expect(formatResidual(value)).toBe(expected);
  });

  it.each([
    [0.000213, '2.1e-4'],
    [0.00099, '9.9e-4'],
    [1e-6, '1.0e-6'],
    [52300, '5.2e4'],
    [9996, '1.0e4'],
    [5.317872e178, '5.3e178'],
    [-2e-9, '-2.0e-9'],
  ])('small and large values in short scientific form: %s → %s', (value, expected) => {
    expect(formatResidual(value)).toBe(expected);
  });

  it.each([
    [0, '0'],
    [Number.NaN, 'NaN'],
    [Number.POSITIVE_INFINITY, 'Infinity'],
    [Number.NEGATIVE_INFINITY, '-Infinity'],
  ])('special values: %s → %s', (value, expected) => {
    expect(formatResidual(value)).toBe(expected);
  });
});

describe('formatDecades (one decimal, rounded down everywhere)', () => {
  it.each([
    [3.24, '3.2'],
    [3.29, '3.2'],
    [5.96, '5.9'], // the drop in advice and in reasons reads the same (was "5.9 orders" above "6 decades")
    [2.96, '2.9'], // never shown as 3 when the 3-decade criterion is not met
    [3, '3'],
    [0.3, '0.3'], // 0.3 × 10 is 2.9999999999999996 in binary: still 0.3
    [0.7, '0.7'],
    [0, '0'],
    [-0.04, '-0.1'], // toward −∞
    [-2.5, '-2.5'],
  ])('%s → %s', (value, expected) => {
    expect(formatDecades(value)).toBe(expected);
  });

  it.each([Number.NaN, Number.POSITIVE_INFINITY])('non-finite %s by name', (value) => {
    expect(formatDecades(value)).toBe(String(value));
  });
});

describe('formatValue', () => {
  it.each([
    [0.33124, '0.3312'],
    [1204.4, '1204'],
    [1.2345e6, '1.2e6'],
    [3e-5, '3.0e-5'],
    [0, '0'],
    [Number.NaN, 'NaN'],
  ])('%s → %s', (value, expected) => {
    expect(formatValue(value)).toBe(expected);
  });
});

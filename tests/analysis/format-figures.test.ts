/**
 * Number formatting in reasons and advice (format-figures.ts). Expected strings are settle's own
 * style (the analysis brief: "2 300", "2.1e-4", "0.3312 ± 0.0004"), checked by hand.
 */
import { describe, expect, it } from 'vitest';
import { formatResidual } from '../../src/analysis/format-figures.js';

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

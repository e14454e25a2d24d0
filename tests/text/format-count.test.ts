/** Counts and estimated counts in settle's text: the style of the analysis's reasons. Digit grouping
 * by a space in threes: the SI Brochure (BIPM 2019, 9th ed., section 5.4.4) and ISO 80000-1:2009,
 * 7.3.1 (from memory); two significant figures for estimates (our choice, the same as
 * src/analysis/format-figures.ts, whose reasons print "about 340 000 iterations"). */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatCount, formatEstimate } from '../../src/text/format-count.js';

describe('formatCount', () => {
  it.each([
    [0, '0'], [7, '7'], [999, '999'], [1000, '1 000'], [1054, '1 054'], [2880, '2 880'], [343462, '343 462'],
    [1_000_000, '1 000 000'], [-4210, '-4 210'], [1053.6, '1 054'], [Number.NaN, 'NaN'], [Infinity, 'Infinity'], [-Infinity, '-Infinity'],
  ])('%d → %s', (value, text) => {
    expect(formatCount(value)).toBe(text);
  });

  it('reads back as the rounded number once the spaces are removed', () => {
    fc.assert(fc.property(fc.integer({ min: -1e12, max: 1e12 }), (n) => Number(formatCount(n).replace(/ /g, '')) === n));
  });
});

describe('formatEstimate', () => {
  it.each([
    [343462, '340 000'], [2287, '2 300'], [2290.4, '2 300'], [1054, '1 100'], [150, '150'], [155, '160'], [99.6, '100'], [87.4, '87'],
    [Infinity, 'Infinity'], [Number.NaN, 'NaN'],
  ])('%d → %s', (value, text) => {
    expect(formatEstimate(value)).toBe(text);
  });

  it('keeps two significant figures: within 5 % of the value from 100 up', () => {
    fc.assert(fc.property(fc.double({ min: 100, max: 1e12, noNaN: true }), (x) => {
      const shown = Number(formatEstimate(x).replace(/ /g, ''));
      return Math.abs(shown - x) <= 0.05 * x + 1e-9 && String(shown).replace(/0+$/, '').length <= 2;
    }));
  });
});

import { describe, expect, it } from 'vitest';
import { decadeTicks, niceTicks } from '../../src/ui/axis-ticks.js';

// Steps of 1, 2 or 5 times a power of ten: Heckbert (1990), "Nice numbers for graph labels",
// Graphics Gems, pp. 61–63 (its rounding thresholds 1.5, 3 and 7). Expected lists worked by hand:
// step = range/count rounded to the nearest nice number.
describe('niceTicks', () => {
  it.each([
    [0, 10, 5, [0, 2, 4, 6, 8, 10]],
    [0, 1, 4, [0, 0.2, 0.4, 0.6, 0.8, 1]],
    [1, 2214, 2, [1000, 2000]],
    [0.95, 1.32, 4, [1, 1.1, 1.2, 1.3]],
    [-3, 3, 3, [-2, 0, 2]],
  ])('from %s to %s, about %i ticks: %j', (min, max, count, expected) => {
    expect(niceTicks(min, max, count)).toEqual(expected);
  });

  it.each([
    [5, 5, 3, [5]],
    [2, 1, 3, []],
    [0, Number.NaN, 3, []],
    [0, 1, 0, []],
  ])('degenerate range %s..%s (count %i) gives %j', (min, max, count, expected) => {
    expect(niceTicks(min, max, count)).toEqual(expected);
  });
});

describe('decadeTicks', () => {
  it('gives every decade when a step of one is allowed', () => {
    expect(decadeTicks(-4, 0, 1)).toEqual([-4, -3, -2, -1, 0]);
  });
  // Steps of 1, 2, 3, 5, then 10, 20, 50 decades (our choice: 3 decades is the engineering prefix step).
  it.each([
    [-12, 0, 2.5, [-12, -9, -6, -3, 0]],
    [-7, 0, 3.3, [-5, 0]],
    [-6, 1, 1.5, [-6, -4, -2, 0]],
    [0, 93, 39, [0, 50]],
    [-300, 10, 120, [-200, 0]],
  ])('from 1e%i to 1e%i, at least %s decades apart: the multiples of the step, %j', (min, max, minStep, expected) => {
    expect(decadeTicks(min, max, minStep)).toEqual(expected);
  });
  it('rounds inwards and gives nothing for an empty range', () => {
    expect(decadeTicks(-2.5, 0.5, 1)).toEqual([-2, -1, 0]);
    expect(decadeTicks(0.2, 0.8, 1)).toEqual([]);
    expect(decadeTicks(0, 3, Number.NaN)).toEqual([]);
  });
});

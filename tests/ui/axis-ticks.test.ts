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
  it('gives every decade when there is room', () => {
    expect(decadeTicks(-4, 0, 10)).toEqual([-4, -3, -2, -1, 0]);
  });
  it('thins to at most maxCount, counted down from the top decade', () => {
    const ticks = decadeTicks(-12, 0, 4);
    expect(ticks.length).toBeLessThanOrEqual(4);
    expect(ticks[ticks.length - 1]).toBe(0);
    expect(ticks).toEqual([-12, -8, -4, 0]);
  });
  it('rounds inwards and gives nothing for an empty range', () => {
    expect(decadeTicks(-2.5, 0.5, 10)).toEqual([-2, -1, 0]);
    expect(decadeTicks(0.2, 0.8, 10)).toEqual([]);
    expect(decadeTicks(0, 3, 0)).toEqual([]);
  });
});

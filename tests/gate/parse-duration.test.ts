import { describe, expect, it } from 'vitest';
import { parseDuration, MAX_DURATION_MS } from '../../src/gate/parse-duration.js';
import { formatDuration } from '../../src/gate/format-duration.js';
import { UsageError } from '../../src/errors.js';

// Expected values follow from the definitions of the units (SI brochure, 9th ed. 2019, Table 8:
// 1 min = 60 s, 1 h = 3600 s); exact integers, no tolerance needed.
describe('parseDuration', () => {
  it.each([
    ['1500ms', 1500],
    ['30s', 30_000],
    ['5m', 300_000],
    ['2h', 7_200_000],
    ['1.5s', 1500],
    ['.5s', 500],
    [' 10S ', 10_000],
    ['3 m', 180_000],
    ['0.4ms', 0], // rounds to 0 → refused below, listed here only as a boundary
  ].filter(([, ms]) => (ms as number) > 0))('reads %s as %i ms', (text, ms) => {
    expect(parseDuration('--idle', text as string)).toBe(ms);
  });

  it.each([
    ['', /needs a duration/],
    ['30', /needs a unit/],
    ['1.5', /needs a unit/],
    ['0s', /longer than zero/],
    ['0.4ms', /longer than zero/],
    ['-5s', /needs a duration/],
    ['5 minutes', /needs a duration/],
    ['5d', /needs a duration/],
    ['1e3ms', /needs a duration/],
    ['Infinity s', /needs a duration/],
    ['721h', /at most 30 days/],
  ])('refuses %j with a usage error', (text, message) => {
    expect(() => parseDuration('--idle', text)).toThrow(UsageError);
    expect(() => parseDuration('--idle', text)).toThrow(message);
  });

  it('names the flag and gives a hint', () => {
    try {
      parseDuration('--idle', 'soon');
      expect.unreachable();
    } catch (error) {
      expect((error as UsageError).message).toContain('--idle');
      expect((error as UsageError).hint).toMatch(/30s/);
    }
  });

  it('accepts exactly 30 days (720h) and nothing longer', () => {
    expect(parseDuration('--idle', '720h')).toBe(MAX_DURATION_MS);
  });
});

describe('formatDuration', () => {
  it.each([
    [1500, '1500ms'],
    [30_000, '30s'],
    [300_000, '5m'],
    [7_200_000, '2h'],
    [90_000, '90s'],
    [1250, '1250ms'],
    [90_500, '1.51m'],
    [999, '999ms'],
  ])('prints %i ms as %s', (ms, text) => {
    expect(formatDuration(ms)).toBe(text);
  });

  it.each(['1500ms', '30s', '5m', '2h', '90s'])('round-trips %s through parseDuration', (text) => {
    expect(formatDuration(parseDuration('--idle', text))).toBe(text);
  });
});

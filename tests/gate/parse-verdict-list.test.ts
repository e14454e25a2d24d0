import { describe, expect, it } from 'vitest';
import { parseVerdictList, VERDICTS } from '../../src/gate/parse-verdict-list.js';
import { UsageError } from '../../src/errors.js';

describe('parseVerdictList', () => {
  it('knows the seven states of issue 3 ("Judge a run"), no more', () => {
    expect([...VERDICTS].sort()).toEqual(['converged', 'converging', 'diverging', 'failed', 'oscillating', 'stalled', 'undecided']);
  });

  it.each([
    ['converged', ['converged']],
    ['converged,diverging', ['converged', 'diverging']],
    [' Diverging , FAILED ', ['diverging', 'failed']],
    ['stalled,,stalled', ['stalled']],
  ])('reads %j', (text, expected) => {
    expect([...parseVerdictList(text)].sort()).toEqual([...expected].sort());
  });

  it.each([
    ['', /at least one verdict/],
    [' , ', /at least one verdict/],
    ['converged,done', /unknown verdict 'done'/],
    ['all', /unknown verdict/],
    ['converge', /unknown verdict/],
  ])('refuses %j', (text, message) => {
    expect(() => parseVerdictList(text)).toThrow(UsageError);
    expect(() => parseVerdictList(text)).toThrow(message);
  });
});

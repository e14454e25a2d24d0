/** `settle inspect` text: counts in the style of every other settle text (src/text/format-count.ts),
 * while `--json` keeps numbers as numbers (a contract). */
import { describe, expect, it } from 'vitest';
import { inspectJson, inspectText, type InspectSummary } from '../../src/cli/inspect-command.js';

const summary: InspectSummary = {
  parser: 'settle-kv',
  explanation: 'spec settle-kv (built-in)',
  records: 12_540,
  restarts: 1,
  lastIteration: 12_000,
  series: [{ name: 'res_p', kind: 'residual', count: 12_540, first: 1, last: 2.5e-4 }],
  warnings: [],
};

describe('inspect text', () => {
  it('groups the digits of counts by a space', () => {
    const lines = inspectText(['run.log'], summary).split('\n');
    expect(lines[2]).toBe('records:   12 540 records (last iteration 12 000), 1 restart');
    expect(lines[5]).toMatch(/^ {2}res_p +residual +12 540 +1 +2\.500e-4$/);
  });

  it('keeps plain numbers in the JSON', () => {
    expect(JSON.parse(inspectJson(summary))).toEqual({
      parser: 'settle-kv', records: 12540, restarts: 1,
      series: [{ name: 'res_p', kind: 'residual', count: 12540, first: 1, last: 2.5e-4 }],
    });
  });
});

/**
 * The advice and reasons of a verdict come from the series that support it in the same evaluation,
 * as the series table shows them (reviewer's defects 2 and 3). Replays sample-logs/cavity-oscillating
 * (the demo's natural-convection cavity with too little under-relaxation, written as a column table)
 * evaluation by evaluation, as `settle check --follow` does.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import type { LogRecord } from '../../src/parse/log-record.js';
import { follow } from './run-fixtures.js';

function tableRecords(file: string): LogRecord[] {
  const lines = readFileSync(new URL(`../../sample-logs/${file}`, import.meta.url), 'utf8').split('\n').filter((l) => l.trim() !== '');
  const names = lines[0].trim().split(/\s+/).slice(1);
  // The header is repeated every so many rows, as solvers print it.
  return lines.filter((line) => /^\s*\d/.test(line)).map((line) => {
    const cells = line.trim().split(/\s+/).map(Number);
    return { iteration: cells[0], values: new Map(names.map((name, i) => [name, cells[i + 1]])) };
  });
}

describe('cavity-oscillating followed evaluation by evaluation', () => {
  const records = tableRecords('cavity-oscillating.table.log');
  const kinds = Object.fromEntries([...records[0].values.keys()].map((name) => [name, name.startsWith('res_') ? 'residual' : 'quantity'] as const));
  const all = follow(records, kinds, DEFAULT_CRITERIA);

  it('reaches an alarm verdict (the premise of the checks below)', () => {
    expect(all.some((d) => ['diverging', 'oscillating', 'stalled'].includes(d.verdict))).toBe(true);
  });

  it('an alarm verdict\'s advice names only series the table shows in that state, or, when every series has moved on, says when the alarm was last seen', () => {
    for (const d of all) {
      if (!['diverging', 'oscillating', 'stalled'].includes(d.verdict)) continue;
      const inState = d.series.filter((s) => s.state === d.verdict).map((s) => s.name);
      const named = d.series.map((s) => s.name).filter((name) => new RegExp(`\\b${name}\\b`).test(d.advice));
      const where = `it ${d.iterations}: ${d.verdict}: ${d.advice} | ${d.series.map((s) => `${s.name}=${s.state}`).join(' ')}`;
      if (inState.length > 0) {
        expect(named.length, where).toBeGreaterThan(0);
        for (const name of named) expect(inState, where).toContain(name);
      } else {
        expect(d.advice, where).toMatch(/\(last seen at it [\d ]+\)/);
      }
    }
  });

  it('a final verdict carries no pending confirmation notes in its reasons', () => {
    const finals = all.filter((d) => d.final);
    expect(finals.length).toBeGreaterThan(0);
    for (const d of finals) for (const reason of d.reasons) expect(reason, `it ${d.iterations}`).not.toMatch(/confirming, \d+ of \d+ checks/);
  });
});

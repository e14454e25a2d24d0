// The five built-in formats, as parsers/README.md describes them. Expected values are the numbers
// printed in each sample log (exact decimal readings of the text).
import { describe, expect, it } from 'vitest';
import type { LogRecord } from '../../src/parse/log-record.js';
import { builtInChoice, linesOf, parseWith, plain } from './parse-helpers.js';

describe('settle-kv (name=value pairs, one line per iteration)', () => {
  it('reads a steady log: iteration from iter=, res_* as residuals, the rest as quantities', () => {
    const { records, info, stats } = parseWith('settle-kv', [
      'iter=1 res_p=1.000e+00 res_u=1.000e+00 res_v=1.000e+00 res_T=1.000e+00 nu_hot=1.0000 nu_cold=0.5000',
      'iter=2 res_p=7.210e-01 res_u=6.903e-01 res_v=6.511e-01 res_T=5.100e-01 nu_hot=1.0712 nu_cold=0.8010',
    ].join('\n'));
    expect(records.map(plain)).toEqual([
      { iteration: 1, values: { res_p: 1, res_u: 1, res_v: 1, res_T: 1, nu_hot: 1, nu_cold: 0.5 } },
      { iteration: 2, values: { res_p: 0.721, res_u: 0.6903, res_v: 0.6511, res_T: 0.51, nu_hot: 1.0712, nu_cold: 0.801 } },
    ]);
    expect([...info.values()].map((s) => `${s.name}:${s.kind}`)).toEqual(
      ['res_p:residual', 'res_u:residual', 'res_v:residual', 'res_T:residual', 'nu_hot:quantity', 'nu_cold:quantity']);
    expect(stats).toMatchObject({ lines: 2, unmatched: 0, records: 2, restarts: 0 });
  });

  it('reads the transient form: step, time and inner iteration; iteration is a running count', () => {
    const { records } = parseWith('settle-kv', [
      'step=1 time=1.000e-02 inner=1 res_p=1.0e+00 res_u=1.0e+00 lift=0.0120',
      'step=1 time=1.000e-02 inner=2 res_p=3.1e-02 res_u=2.2e-02 lift=0.0121',
      'step=2 time=2.000e-02 inner=1 res_p=8.5e-01 res_u=7.7e-01 lift=0.0150',
    ].join('\n'));
    expect(records.map(plain)).toEqual([
      { iteration: 1, timeStep: 1, inner: 1, time: 0.01, values: { res_p: 1, res_u: 1, lift: 0.012 } },
      { iteration: 2, timeStep: 1, inner: 2, time: 0.01, values: { res_p: 0.031, res_u: 0.022, lift: 0.0121 } },
      { iteration: 3, timeStep: 2, inner: 1, time: 0.02, values: { res_p: 0.85, res_u: 0.77, lift: 0.015 } },
    ]);
  });

  it('keeps non-finite values (NaN, Inf, overflow fields) as values, not errors', () => {
    const { records, stats } = parseWith('settle-kv', 'iter=7 res_p=NaN res_u=-Inf res_v=****** nu_hot=1.5D-03 nu_cold=1.234-105\n');
    const values = records[0].values;
    expect(values.get('res_p')).toBeNaN();
    expect(values.get('res_u')).toBe(-Infinity);
    expect(values.get('res_v')).toBe(Infinity);
    expect(values.get('nu_hot')).toBe(0.0015);
    expect(values.get('nu_cold')).toBe(1.234e-105);
    expect(stats.unmatched).toBe(0);
  });

  it('marks a crash from FATAL and ERROR lines, and reports other text as unmatched', () => {
    const { records, stats } = parseWith('settle-kv', 'iter=1 res_p=1.0\nsolver says hello\nERROR: linear solver failed to converge\n');
    expect(records.map(plain)).toEqual([
      { iteration: 1, values: { res_p: 1 } },
      { iteration: 1, values: {}, failure: 'ERROR: linear solver failed to converge' },
    ]);
    expect(stats.unmatched).toBe(1);
    expect(stats.unmatchedSample).toEqual(['solver says hello']);
  });
});

describe('settle-block (one block per iteration)', () => {
  const log = [
    '# case: heated cavity',
    '=== iteration 1 ===',
    '  residual  res_p     1.0000e+00',
    '  residual  res_T     1.0000e+00',
    '  monitor   nu_hot    1.00000     [-]',
    '  monitor   dp        1.2040e+02  [Pa]',
    '=== iteration 2 ===',
    '  residual  res_p     7.2100e-01',
    '  residual  res_T     5.1000e-01',
    '  monitor   nu_hot    1.07120     [-]',
    '  monitor   dp        1.1980e+02  [Pa]',
  ].join('\n');

  it('gathers each block into one record; kinds from the line type; units from the brackets', () => {
    const { records, info, stats } = parseWith('settle-block', log);
    expect(records.map(plain)).toEqual([
      { iteration: 1, values: { res_p: 1, res_T: 1, nu_hot: 1, dp: 120.4 } },
      { iteration: 2, values: { res_p: 0.721, res_T: 0.51, nu_hot: 1.0712, dp: 119.8 } },
    ]);
    expect(info.get('res_p')).toEqual({ name: 'res_p', kind: 'residual' });
    expect(info.get('nu_hot')).toEqual({ name: 'nu_hot', kind: 'quantity', unit: '-' });
    expect(info.get('dp')).toEqual({ name: 'dp', kind: 'quantity', unit: 'Pa' });
    expect(stats).toMatchObject({ lines: 11, unmatched: 0, records: 2 });
  });

  it('emits a block when the next one starts, and the last block only when the source ends', () => {
    const records: LogRecord[] = [];
    const parser = builtInChoice('settle-block').create((record) => records.push(record));
    for (const line of linesOf(log)) parser.pushLine(line);
    expect(records.map((r) => r.iteration)).toEqual([1]);
    parser.finish();
    expect(records.map((r) => r.iteration)).toEqual([1, 2]);
  });

  it('closes the open block with the failure text on a FATAL line', () => {
    const { records } = parseWith('settle-block', `${log}\nFATAL: floating point exception in energy equation`);
    expect(records).toHaveLength(2);
    expect(records[1].failure).toBe('FATAL: floating point exception in energy equation');
    expect(records[1].values.get('dp')).toBe(119.8);
  });
});

describe('settle-table (whitespace columns under a header row)', () => {
  it('reads columns by the header, and reads the header again where it repeats', () => {
    const { records, info, stats } = parseWith('settle-table', [
      '      iter        res_p        res_u       nu_hot',
      '         1   1.0000e+00   1.0000e+00   1.00000000',
      '         2   7.2100e-01   6.9030e-01   1.07120000',
      '      iter        res_p        res_u       nu_hot',
      '         3   5.0000e-01   4.0000e-01   1.10000000',
      '      iter        res_u        res_p',
      '         4   3.0000e-01   2.0000e-01',
    ].join('\n'));
    expect(records.map(plain)).toEqual([
      { iteration: 1, values: { res_p: 1, res_u: 1, nu_hot: 1 } },
      { iteration: 2, values: { res_p: 0.721, res_u: 0.6903, nu_hot: 1.0712 } },
      { iteration: 3, values: { res_p: 0.5, res_u: 0.4, nu_hot: 1.1 } },
      { iteration: 4, values: { res_u: 0.3, res_p: 0.2 } },
    ]);
    expect(info.get('res_u')?.kind).toBe('residual');
    expect(info.get('nu_hot')?.kind).toBe('quantity');
    expect(stats.unmatched).toBe(0);
  });

  it('does not take rows with the wrong number of fields, or text rows, as data', () => {
    const { records, stats } = parseWith('settle-table', '  iter res_p nu\n  1 1.0 2.0\n  2 0.5\n  solver restarted here\n  3 0.25 2.5\n');
    expect(records.map((r) => r.iteration)).toEqual([1, 3]);
    expect(stats.unmatched).toBe(2);
  });

  it('after noteRestart(), needs the header again before reading rows, and marks the next record', () => {
    const { parser, records } = parseWith('settle-table', '  iter res_p\n  1 1.0\n  2 0.5\n');
    parser.noteRestart();
    parser.pushLine('  3 0.25');
    parser.pushLine('  iter res_p');
    parser.pushLine('  1 0.9');
    expect(records.map((r) => [r.iteration, r.restart ?? false])).toEqual([[1, false], [2, false], [1, true]]);
    expect(parser.stats()).toMatchObject({ unmatched: 1, restarts: 1 });
  });
});

describe('settle-csv (comma-separated values with a header row)', () => {
  it('reads rows by the header; an empty cell is a missing value; NaN text is NaN', () => {
    const { records, info } = parseWith('settle-csv', 'iter,res_p,res_u,res_T,nu_hot,nu_cold\n1,1.0000e+00,1.0000e+00,1.0000e+00,1.0,0.5\n2,7.21e-01,,NaN,1.0712,0.801\n');
    expect(records.map(plain)).toEqual([
      { iteration: 1, values: { res_p: 1, res_u: 1, res_T: 1, nu_hot: 1, nu_cold: 0.5 } },
      { iteration: 2, values: { res_p: 0.721, res_T: NaN, nu_hot: 1.0712, nu_cold: 0.801 } },
    ]);
    expect(info.get('res_T')?.kind).toBe('residual');
    expect(info.get('nu_cold')?.kind).toBe('quantity');
  });

  it('accepts a quoted header and blanks around the commas', () => {
    const { records } = parseWith('settle-csv', '"iter", "res_p", "cd"\n 1 , 0.5 , 1.25\n');
    expect(records.map(plain)).toEqual([{ iteration: 1, values: { res_p: 0.5, cd: 1.25 } }]);
  });
});

describe('settle-jsonl (one JSON object per line)', () => {
  it('reads numeric keys; "NaN", "Infinity" and "-Infinity" strings are non-finite values', () => {
    const { records, stats } = parseWith('settle-jsonl', [
      '{"iter":1,"res_p":1.0,"res_u":1.0,"res_T":1.0,"nu_hot":1.0,"nu_cold":0.5}',
      '{"iter":2,"res_p":"NaN","res_u":"Infinity","res_T":"-Infinity","nu_hot":1.07,"note":"hello","nested":{"a":1}}',
      'not json at all',
      '{"iter":3,',
    ].join('\n'));
    expect(records.map(plain)).toEqual([
      { iteration: 1, values: { res_p: 1, res_u: 1, res_T: 1, nu_hot: 1, nu_cold: 0.5 } },
      { iteration: 2, values: { res_p: NaN, res_u: Infinity, res_T: -Infinity, nu_hot: 1.07 } },
    ]);
    expect(stats.unmatched).toBe(2);
  });

  it('reads the transient keys step, time and inner', () => {
    const { records } = parseWith('settle-jsonl', '{"step":3,"time":0.3,"inner":2,"res_p":0.01}\n');
    expect(records.map(plain)).toEqual([{ iteration: 1, timeStep: 3, time: 0.3, inner: 2, values: { res_p: 0.01 } }]);
  });
});

import { describe, expect, it } from 'vitest';
import { createLogWriter, formatExponential, formatFortran, formatQuantity, type LogRow } from '../../src/demo/log-writers.js';

// Expected shapes are the examples of parsers/README.md (settle's own formats).
const row1: LogRow = {
  iter: 1,
  fields: [
    { name: 'res_p', value: 1, kind: 'residual' },
    { name: 'res_T', value: 1, kind: 'residual' },
    { name: 'nu_hot', value: 1, kind: 'quantity', unit: '-' },
    { name: 'dp', value: 120.4, kind: 'quantity', unit: 'Pa' },
  ],
};
const row2: LogRow = { ...row1, iter: 2, fields: row1.fields.map((f) => ({ ...f, value: f.kind === 'residual' ? 0.721 : f.value * 1.0712 })) };

describe('createLogWriter', () => {
  it('kv: name=value pairs after iter, single spaces, one line per iteration', () => {
    const w = createLogWriter('kv');
    expect(w.row(row1) + w.row(row2)).toBe(
      'iter=1 res_p=1.0000e+00 res_T=1.0000e+00 nu_hot=1.000000 dp=120.4000\n'
      + 'iter=2 res_p=7.2100e-01 res_T=7.2100e-01 nu_hot=1.071200 dp=128.9725\n');
  });

  it('kv transient: step, time and inner instead of iter, as in the README\'s transient example', () => {
    const w = createLogWriter('kv');
    expect(w.row({ iter: 7, step: 1, time: 0.01, inner: 2, fields: [{ name: 'res_p', value: 0.031, kind: 'residual' }] }))
      .toBe('step=1 time=1.000e-02 inner=2 res_p=3.1000e-02\n');
  });

  it('block: a header line, then residual and monitor lines with the unit in brackets', () => {
    const w = createLogWriter('block');
    expect(w.row(row1)).toBe([
      '=== iteration 1 ===',
      '  residual  res_p     1.0000e+00',
      '  residual  res_T     1.0000e+00',
      '  monitor   nu_hot    1.000000    [-]',
      '  monitor   dp        120.4000    [Pa]',
      '',
    ].join('\n'));
  });

  it('block: refuses transient rows (the format has no transient form)', () => {
    expect(() => createLogWriter('block').row({ ...row1, step: 1 })).toThrow(/transient/);
  });

  it('table: right-aligned columns under a header that repeats every headerEvery rows and after a restart', () => {
    const w = createLogWriter('table', { headerEvery: 2 });
    const text = [row1, row2, row1].map((r) => w.row(r)).join('');
    w.restart();
    const afterRestart = w.row(row2);
    const header = '      iter        res_p        res_T       nu_hot           dp';
    expect(text).toBe(`${header}\n         1   1.0000e+00   1.0000e+00     1.000000     120.4000\n`
      + '         2   7.2100e-01   7.2100e-01     1.071200     128.9725\n'
      + `${header}\n         1   1.0000e+00   1.0000e+00     1.000000     120.4000\n`);
    expect(afterRestart.split('\n')[0]).toBe(header);
  });

  it('table: keeps a space between columns when a value is wider than its column', () => {
    const w = createLogWriter('table');
    const line = w.row({ iter: 1, fields: [{ name: 'q', value: -1.234567e21, kind: 'quantity' }] }).split('\n')[1];
    expect(line.trim().split(/\s+/)).toEqual(['1', '-1.234567e+21']);
  });

  it('csv: a header row, then comma-separated values; header again after a restart', () => {
    const w = createLogWriter('csv');
    expect(w.row(row1) + w.row(row2)).toBe('iter,res_p,res_T,nu_hot,dp\n1,1.0000e+00,1.0000e+00,1.000000,120.4000\n2,7.2100e-01,7.2100e-01,1.071200,128.9725\n');
    w.restart();
    expect(w.row(row1).split('\n')[0]).toBe('iter,res_p,res_T,nu_hot,dp');
  });

  it('jsonl: one flat object per line, non-finite values as strings', () => {
    const w = createLogWriter('jsonl');
    expect(w.row(row1)).toBe('{"iter":1,"res_p":1,"res_T":1,"nu_hot":1,"dp":120.4}\n');
    const special = w.row({ iter: 3, fields: [
      { name: 'res_p', value: Number.NaN, kind: 'residual' },
      { name: 'a', value: Infinity, kind: 'quantity' },
      { name: 'b', value: -Infinity, kind: 'quantity' },
    ] });
    expect(JSON.parse(special)).toEqual({ iter: 3, res_p: 'NaN', a: 'Infinity', b: '-Infinity' });
  });

  it('prints non-finite values as NaN, Inf and -Inf in the text formats', () => {
    const w = createLogWriter('kv');
    expect(w.row({ iter: 9, fields: [
      { name: 'res_p', value: Number.NaN, kind: 'residual' },
      { name: 'res_u', value: Infinity, kind: 'residual' },
      { name: 'q', value: -Infinity, kind: 'quantity' },
    ] })).toBe('iter=9 res_p=NaN res_u=Inf q=-Inf\n');
  });

  it('writes numbers that read back to their printed precision (5 significant digits for residuals, 7 for quantities)', () => {
    const values = [1, 0.721, 3.14159e-7, 6.02e23, 1e-300, 2.5e150];
    for (const v of values) {
      expect(Math.abs(Number(formatExponential(v)) - v) / v).toBeLessThan(5e-5);
      expect(Math.abs(Number(formatQuantity(v)) - v) / v).toBeLessThan(5e-7);
    }
  });
});

describe('number spellings', () => {
  it.each([
    [1.5e-3, 4, '1.5000e-03'],
    [1, 4, '1.0000e+00'],
    [-2.5e100, 2, '-2.50e+100'],
    [0, 4, '0.0000e+00'],
  ])('formatExponential(%d, %d) is %s', (value, digits, text) => {
    expect(formatExponential(value, digits)).toBe(text);
  });

  // Fortran D and E edit descriptors print 0.dddd with a two-digit exponent after the letter; a
  // three-digit exponent takes the letter's place (Fortran standard, output editing; from memory).
  it.each([
    [1.5e-3, 2, '0.15D-02'],
    [1.234e-105, 4, '0.1234-104'],
    [5e100, 4, '0.5000+101'],
    [-0.25, 4, '-0.2500D+00'],
    [0, 4, '0.0000D+00'],
    [Number.NaN, 4, 'NaN'],
  ])('formatFortran(%d, %d) is %s', (value, digits, text) => {
    expect(formatFortran(value, digits)).toBe(text);
  });
});

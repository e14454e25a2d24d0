import { describe, expect, it } from 'vitest';
import { formatCheckText, formatRunText, seriesFigures } from '../../src/gate/format-check-text.js';
import { makeDiagnosis, makeSeries } from './make-diagnosis.js';

describe('check text', () => {
  it('gives verdict, exit code, advice, reasons and one line per series', () => {
    const text = formatRunText('case/solver.log', makeDiagnosis({
      iterations: 1840,
      reasons: ['res_p down 3.2 decades from its peak', 'cd settled at 0.3312 ± 0.0004'],
      series: [
        makeSeries({ name: 'res_p', last: 9.1e-4, dropDecades: 3.2, ordersPerKilo: 2.4, rho: 0.99449 }),
        makeSeries({ name: 'cd', kind: 'quantity', last: 0.33121, mean: 0.33118, halfWidth: 0.00041 }),
      ],
    }));
    const lines = text.split('\n');
    expect(lines[0]).toBe('case/solver.log: converged (exit 0) at iteration 1 840');
    expect(lines[1]).toBe('  advice: stop: all residuals 3 orders down');
    expect(lines[2]).toBe('  why:    res_p down 3.2 decades from its peak');
    expect(lines[3]).toBe('          cd settled at 0.3312 ± 0.0004');
    expect(lines[5]).toMatch(/^ {2}series +kind +state +last +figures$/);
    expect(lines[6]).toMatch(/^ {2}res_p +residual +converged +9\.100e-4 +3\.2 decades down, falling 2\.4 decades\/1000 it, rho 0\.99449$/);
    expect(lines[7]).toMatch(/^ {2}cd +quantity +converged +0\.3312 +mean 0\.33118 ± 4\.1e-4$/);
  });

  it('names figures of cycles, time to target and iteration error', () => {
    expect(seriesFigures(makeSeries({ name: 'r', period: 37, amplitudeDecades: 0.81 }))).toBe('period 37 it, amplitude 0.81 decades');
    expect(seriesFigures(makeSeries({ name: 'q', kind: 'quantity', period: 120, amplitudeRelative: 0.012 }))).toBe('period 120 it, amplitude 1.2 %');
    // Estimates to two significant figures with space-grouped digits, the style of the analysis's
    // reasons (src/analysis/format-figures.ts: "about 340 000 iterations").
    expect(seriesFigures(makeSeries({ name: 'r', eta: 2290.4 }))).toBe('about 2 300 it to target');
    expect(seriesFigures(makeSeries({ name: 'r', eta: 343462 }))).toBe('about 340 000 it to target');
    expect(seriesFigures(makeSeries({ name: 'r', eta: 87.4 }))).toBe('about 87 it to target');
    expect(seriesFigures(makeSeries({ name: 'q', kind: 'quantity', mean: 2.243, iterationError: 3.1e-6 }))).toBe('mean 2.243, iteration error 3.1e-6');
    expect(seriesFigures(makeSeries({ name: 'r' }))).toBe('');
    expect(seriesFigures(makeSeries({ name: 'r', ordersPerKilo: -46 }))).toBe('rising 46 decades/1000 it');
    expect(seriesFigures(makeSeries({ name: 'r', ordersPerKilo: 0 }))).toBe('flat');
    expect(seriesFigures(makeSeries({ name: 'r', eta: 0 }))).toBe('');
    expect(seriesFigures(makeSeries({ name: 'r', eta: Infinity }))).toBe('target out of reach at this rate');
  });

  it('says so when no iterations were read', () => {
    expect(formatRunText('x.log', makeDiagnosis({ verdict: 'undecided', iterations: Number.NaN, series: [] }))).toMatch(/^x\.log: undecided \(exit 11\) with no iterations read\n/);
    expect(formatRunText('x.log', makeDiagnosis({ verdict: 'undecided', iterations: 0, records: 0, series: [] }))).toMatch(/^x\.log: undecided \(exit 11\) with no iterations read\n/);
  });

  it('ends several runs with the worst verdict', () => {
    const text = formatCheckText([
      { log: 'a.log', diagnosis: makeDiagnosis() },
      { log: 'b.log', diagnosis: makeDiagnosis({ verdict: 'diverging' }) },
    ]);
    expect(text).toContain('a.log: converged');
    expect(text).toContain('b.log: diverging');
    expect(text.trimEnd().split('\n').at(-1)).toBe('worst of 2 logs: diverging (exit 30)');
  });
});

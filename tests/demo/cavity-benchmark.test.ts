import { describe, expect, it } from 'vitest';
import { benchmarkJson, benchmarkNusselt, benchmarkText, compareWithBenchmark, rayleighText } from '../../src/demo/cavity-benchmark.js';

describe('benchmarkNusselt', () => {
  // de Vahl Davis (1983), "Natural convection of air in a square cavity: a bench mark numerical
  // solution", mean Nusselt number on the hot wall (from memory).
  it.each([
    [1e3, 1.118],
    [1e4, 2.243],
    [1e5, 4.519],
    [1e6, 8.8],
    [10000, 2.243],
  ])('Ra %d: %d', (ra, nu) => {
    expect(benchmarkNusselt(ra)).toBe(nu);
  });

  it.each([2e4, 5e3, 999, 1e7, 0, -1e4, Number.NaN])('has no value at Ra %d (no interpolation)', (ra) => {
    expect(benchmarkNusselt(ra)).toBeUndefined();
  });
});

describe('compareWithBenchmark', () => {
  it('gives signed relative differences of the extrapolated and fine values, and whether the band holds the benchmark', () => {
    // 2.243 × 1.01 = 2.26543 and 2.243 × 0.98 = 2.19814: +1 % and −2 % (tolerance 1e-12).
    const c = compareWithBenchmark({ rayleigh: 1e4, fine: 2.19814, extrapolated: 2.26543, band: 0.05 });
    expect(c.value).toBe(2.243);
    expect(c.relativeDifference).toBeCloseTo(0.01, 12);
    expect(c.fineRelativeDifference).toBeCloseTo(-0.02, 12);
    expect(c.withinFineGciBand).toBe(true); // |2.19814 − 2.243| = 0.04486 ≤ 0.05
    expect(compareWithBenchmark({ rayleigh: 1e4, fine: 2.19814, extrapolated: 2.26543, band: 0.04 }).withinFineGciBand).toBe(false);
  });

  it('says so when the study is degenerate (no extrapolated value, no band)', () => {
    const c = compareWithBenchmark({ rayleigh: 1e3, fine: 1.12 });
    expect(c.relativeDifference).toBeUndefined();
    expect(c.withinFineGciBand).toBeUndefined();
    expect(benchmarkText(c)).toMatch(/no extrapolated value \(the study is degenerate\); the fine grid's 1\.12 differs by \+0\.18 %\.\n$/);
  });

  it('prints both lines with signs, and OUTSIDE when the band misses the benchmark', () => {
    const text = benchmarkText(compareWithBenchmark({ rayleigh: 1e5, fine: 4.6, extrapolated: 4.51, band: 0.01 }));
    expect(text).toBe('Benchmark: de Vahl Davis (1983), hot-wall mean Nusselt number at Ra 1e5 = 4.519 (from memory); the extrapolated 4.51 differs by −0.20 %.\n'
      + 'The benchmark lies OUTSIDE the fine grid\'s GCI band, 4.6 ± 0.01 (the fine grid is +1.79 % off).\n');
  });

  it('makes up no value at a Rayleigh number the benchmark does not tabulate, in text and JSON', () => {
    const c = compareWithBenchmark({ rayleigh: 2e4, fine: 2.9, extrapolated: 2.76, band: 0.1 });
    expect(c.value).toBeUndefined();
    expect(c.relativeDifference).toBeUndefined();
    expect(benchmarkText(c)).toBe('Benchmark: de Vahl Davis (1983) has no hot-wall mean Nusselt number at Ra 2e4 (it tabulates Ra 1e3, 1e4, 1e5, 1e6); the extrapolated value is 2.76.\n');
    expect(benchmarkJson(c)).toMatchObject({ value: null, relativeDifference: null, fromMemory: false, rayleigh: 2e4, reason: 'de Vahl Davis (1983) tabulates no value at Ra 2e4' });
  });
});

describe('rayleighText', () => {
  it.each([[1e4, '1e4'], [2.5e4, '2.5e4'], [1000, '1e3']])('%d → %s', (ra, text) => {
    expect(rayleighText(ra)).toBe(text);
  });
});

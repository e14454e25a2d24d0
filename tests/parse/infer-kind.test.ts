// The rule under test is settle's own (src/parse/infer-kind.ts): positive values falling over
// several decades read as residuals, the rest as quantities (issue 2; residual decay of a converging
// iteration is geometric, e.g. Saad (2003), "Iterative Methods for Sparse Linear Systems", ch. 4).
import { describe, expect, it } from 'vitest';
import { inferKind, looksLikeResidualName } from '../../src/parse/infer-kind.js';

const geometric = (rho: number, n: number): number[] => Array.from({ length: n }, (_, k) => rho ** k);

describe('inferKind', () => {
  const cases: [string, string, number[], string][] = [
    ['falls 3 decades (rho 0.5, 11 values)', 'u', geometric(0.5, 11), 'residual'],
    ['falls 1 decade only', 'u', geometric(0.8, 11), 'quantity'],
    ['rises over decades', 'u', geometric(2, 11), 'quantity'],
    ['settles near a value', 'cd', [0.5, 0.55, 0.58, 0.6, 0.61, 0.61, 0.61], 'quantity'],
    ['has negative values', 'u', [1, 1e-1, -1e-2, 1e-3, 1e-4, 1e-5], 'quantity'],
    ['too few values to judge', 'u', [1, 1e-3, 1e-6], 'quantity'],
    ['residual name, positive values', 'res_p', [1, 0.9], 'residual'],
    ['residual name, negative values', 'res_p', [1, -0.9], 'quantity'],
    ['residual name, no values yet', 'Residual', [], 'residual'],
    ['non-finite values are ignored', 'u', [...geometric(0.5, 11), NaN, Infinity], 'residual'],
  ];
  it.each(cases)('%s', (_what, name, values, expected) => {
    expect(inferKind(name, Object.freeze(values))).toBe(expected);
  });

  it.each([['res_p', true], ['p_res', true], ['Residual', true], ['resid_u', true], ['Res', true], ['pressure', false], ['Cd', false], ['result', false]])('name %s looks like a residual: %s', (name, expected) => {
    expect(looksLikeResidualName(name as string)).toBe(expected);
  });
});

import { describe, expect, it } from 'vitest';
import { apparentOrder, gridConvergenceIndex, representativeCellSize, type GciEstimate, type GciInput } from '../../src/analysis/grid-convergence-index.js';

function estimate(input: GciInput): GciEstimate {
  const result = gridConvergenceIndex(input);
  if (result.convergence === 'degenerate') throw new Error(`unexpected degenerate result: ${result.reason}`);
  return result;
}

const celikExample: GciInput = Object.freeze({
  grids: Object.freeze([
    Object.freeze({ cells: 18000, value: 6.063 }),
    Object.freeze({ cells: 8000, value: 5.972 }),
    Object.freeze({ cells: 4500, value: 5.863 }),
  ]) as unknown as GciInput['grids'],
  dimensions: 2,
});

describe('representativeCellSize', () => {
  it('is (V/N)^(1/D) (Celik et al. 2008, eq. 1)', () => {
    expect(representativeCellSize(100, 2)).toBeCloseTo(0.1, 15);
    expect(representativeCellSize(1000, 3, 8)).toBeCloseTo(0.2, 15);
    expect(representativeCellSize(50, 1, 2)).toBeCloseTo(0.04, 15);
  });

  it.each([
    [0, 2, 1, /cell count/],
    [-5, 2, 1, /cell count/],
    [Number.NaN, 2, 1, /cell count/],
    [100, 4, 1, /dimensions/],
    [100, 0, 1, /dimensions/],
    [100, 2, 0, /domain size/],
  ])('refuses cells=%s, dims=%s, size=%s', (cells, dims, size, message) => {
    expect(() => representativeCellSize(cells, dims, size)).toThrow(message);
  });
});

describe('gridConvergenceIndex on the worked example of Celik et al. (2008), values from methods.md (from memory)', () => {
  const result = estimate(celikExample);

  it('finds the refinement ratios r21 = 1.5 and r32 = 1.333 (tolerance 1e-3)', () => {
    expect(result.r21).toBeCloseTo(1.5, 12);
    expect(Math.abs(result.r32 - 1.333)).toBeLessThan(1e-3);
  });

  it('finds the apparent order p ≈ 1.53 (tolerance 0.005) and calls the convergence monotone', () => {
    expect(Math.abs(result.order - 1.53)).toBeLessThan(0.005);
    expect(result.convergence).toBe('monotone');
    expect(result.sign).toBe(1);
    expect(result.notes).toEqual([]);
  });

  it('extrapolates to ≈ 6.168 (tolerance 0.001)', () => {
    expect(Math.abs(result.extrapolated - 6.168)).toBeLessThan(1e-3);
  });

  it('gives e_a ≈ 1.5 %, e_ext ≈ 1.7 % and GCI_fine ≈ 2.2 % (tolerance 0.05 percentage points)', () => {
    expect(Math.abs(result.approximateRelativeError * 100 - 1.5)).toBeLessThan(0.05);
    expect(Math.abs(result.extrapolatedRelativeError * 100 - 1.7)).toBeLessThan(0.05);
    expect(Math.abs(result.gciFine * 100 - 2.2)).toBeLessThan(0.05);
    expect(result.safetyFactor).toBe(1.25);
    expect(result.gciFineAbsolute).toBeCloseTo(result.gciFine * 6.063, 12);
  });

  it('satisfies the order equation of the procedure at the p it returns (tolerance 1e-9)', () => {
    const { r21, r32, epsilon21, epsilon32, order, sign } = result;
    const q = Math.log((r21 ** order - sign) / (r32 ** order - sign));
    expect(order * Math.log(r21)).toBeCloseTo(Math.abs(Math.log(Math.abs(epsilon32 / epsilon21)) + q), 9);
  });

  it('does not mutate its input (frozen)', () => {
    expect(() => gridConvergenceIndex(celikExample)).not.toThrow();
  });
});

describe('gridConvergenceIndex on synthetic values phi = phi_exact + C·h^p (Richardson\'s error model; exact by construction)', () => {
  it.each([
    // cells, dims, phi_exact, C, p
    [[64000, 8000, 1000], 3, 2.5, 0.8, 2],
    [[18000, 8000, 4500], 2, -1.25, 3, 1.5], // unequal ratios: exercises q(p)
    [[400, 200, 100], 1, 10, -4, 1],
    [[90000, 40000, 10000], 2, 0.3, 50, 2.7],
  ] as const)('cells %j in %i-D recovers phi_exact = %s and p (tolerance 1e-8)', (cells, dims, exact, c, p) => {
    const grids = cells.map((n) => ({ cells: n, value: exact + c * representativeCellSize(n, dims) ** p })) as unknown as GciInput['grids'];
    const result = estimate({ grids, dimensions: dims });
    expect(result.order).toBeCloseTo(p, 8);
    expect(result.extrapolated).toBeCloseTo(exact, 8);
    expect(result.convergence).toBe('monotone');
    // the index must cover the true error of the fine grid with its safety factor of 1.25
    expect(result.gciFineAbsolute).toBeGreaterThanOrEqual(Math.abs(grids[0].value - exact));
  });
});

describe('gridConvergenceIndex with oscillatory convergence (Celik et al. 2008: ε32/ε21 < 0)', () => {
  // Equal ratios r = 2 make q(p) = 0, so p = |ln|ε32/ε21|| / ln 2 exactly: here ln(1.5)/ln(2) = 0.58496.
  const result = estimate({ grids: [{ cells: 400, value: 1.0 }, { cells: 100, value: 1.01 }, { cells: 25, value: 0.995 }], dimensions: 2 });

  it('uses s = -1 and says the convergence is oscillatory', () => {
    expect(result.sign).toBe(-1);
    expect(result.convergence).toBe('oscillatory');
    expect(result.notes.join(' ')).toMatch(/oscillatory convergence/);
  });

  it('finds p = ln 1.5 / ln 2 (tolerance 1e-9)', () => {
    expect(result.order).toBeCloseTo(Math.log(1.5) / Math.log(2), 9);
  });

  it('flags values moving apart under refinement as divergent (Stern et al. 2001, |R| > 1; from memory)', () => {
    const apart = estimate({ grids: [{ cells: 400, value: 1.0 }, { cells: 100, value: 1.2 }, { cells: 25, value: 1.3 }], dimensions: 2 });
    expect(apart.convergence).toBe('divergent');
    expect(apart.notes.join(' ')).toMatch(/move apart/);
  });
});

describe('gridConvergenceIndex in degenerate cases', () => {
  it.each([
    ['all three values equal', [5, 5, 5], /same value/],
    ['fine and medium equal', [5, 5, 5.1], /fine and medium grids give the same value/],
    ['medium and coarse equal', [5, 5.1, 5.1], /medium and coarse grids give the same value/],
  ] as const)('%s: reports a reason instead of numbers', (_label, values, reason) => {
    const result = gridConvergenceIndex({ grids: [{ cells: 400, value: values[0] }, { cells: 100, value: values[1] }, { cells: 25, value: values[2] }], dimensions: 2 });
    expect(result.convergence).toBe('degenerate');
    if (result.convergence === 'degenerate') expect(result.reason).toMatch(reason);
  });

  it('says relative errors are undefined when the fine value is zero, but still gives the absolute band', () => {
    const result = estimate({ grids: [{ cells: 400, value: 0 }, { cells: 100, value: 0.1 }, { cells: 25, value: 0.4 }], dimensions: 2 });
    expect(result.notes.join(' ')).toMatch(/fine-grid value is zero/);
    // h halves each time, ε32/ε21 = 3 → p = log2 3; band = 1.25·0.1/(2^p − 1) = 0.0625
    expect(result.gciFineAbsolute).toBeCloseTo(0.0625, 12);
  });

  it('notes refinement ratios below 1.3 (the procedure asks for more)', () => {
    const result = gridConvergenceIndex({ grids: [{ cells: 1000, value: 1.0 }, { cells: 900, value: 1.01 }, { cells: 800, value: 1.025 }], dimensions: 2 });
    expect(result.notes.join(' ')).toMatch(/refinement ratio below 1.3/);
  });

  it.each([
    ['cells increasing', [[100, 1], [400, 1.1], [1600, 1.2]], 2, /fine to coarse/],
    ['equal cell counts (ratio 1)', [[400, 1], [400, 1.1], [100, 1.2]], 2, /must exceed 1/],
    ['a non-finite value', [[400, Number.NaN], [100, 1.1], [25, 1.2]], 2, /fine grid's value is not a finite number/],
    ['an infinite coarse value', [[400, 1], [100, 1.1], [25, Infinity]], 2, /coarse grid's value/],
    ['zero cells', [[400, 1], [100, 1.1], [0, 1.2]], 2, /cell count/],
    ['four dimensions', [[400, 1], [100, 1.1], [25, 1.2]], 4, /dimensions/],
  ] as const)('refuses %s', (_label, grids, dims, message) => {
    const input = { grids: grids.map(([cells, value]) => ({ cells, value })), dimensions: dims } as unknown as GciInput;
    expect(() => gridConvergenceIndex(input)).toThrow(message);
  });

  it('refuses a safety factor below 1', () => {
    expect(() => gridConvergenceIndex({ ...celikExample, safetyFactor: 0.5 })).toThrow(/safety factor/);
  });
});

describe('apparentOrder', () => {
  it('needs a single step when r21 = r32 and s = +1 (q = 0): p = ln(ε32/ε21)/ln r', () => {
    const { order, iterations } = apparentOrder(-1, -4, 2, 2);
    expect(order).toBeCloseTo(2, 12);
    expect(iterations).toBe(1);
  });
});

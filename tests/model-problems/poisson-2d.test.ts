import { describe, expect, it } from 'vitest';
import { optimalSorOmega, solvePoisson2d } from '../../src/model-problems/poisson-2d.js';

// Expected factors: Young (1971), "Iterative Solution of Large Linear Systems"; Saad (2003),
// "Iterative Methods for Sparse Linear Systems", 2nd ed., §4.2. For N = 31, h = 1/32:
// Jacobi cos(π/32) = 0.995185, Gauss–Seidel cos²(π/32) = 0.990393 (values also in methods.md).
// Measured here directly from the residual ratio over 200 late iterations (the analysis tests check
// the trend estimator on the same histories).
function observedFactor(history: { residualL2: number }[], from: number, to: number): number {
  return Math.pow(history[to - 1].residualL2 / history[from - 1].residualL2, 1 / (to - from));
}

describe('solvePoisson2d', () => {
  it('Jacobi residuals fall at cos(πh) per sweep (Young 1971), to 1e-6', () => {
    const history = solvePoisson2d({ n: 31, method: 'jacobi', iterations: 1200 });
    expect(history).toHaveLength(1200);
    expect(observedFactor(history, 1000, 1200)).toBeCloseTo(Math.cos(Math.PI / 32), 6);
    expect(Math.cos(Math.PI / 32)).toBeCloseTo(0.995185, 6); // methods.md check value
  });

  it('Gauss–Seidel residuals fall at cos²(πh) per sweep (Young 1971), to 1e-6', () => {
    const history = solvePoisson2d({ n: 31, method: 'gauss-seidel', iterations: 1200 });
    expect(observedFactor(history, 1000, 1200)).toBeCloseTo(Math.cos(Math.PI / 32) ** 2, 6);
  });

  it('optimal SOR approaches ω_opt − 1 from above (Jordan block, Young 1971): within 5 % in decay rate', () => {
    const omega = optimalSorOmega(31);
    expect(omega).toBeCloseTo(2 / (1 + Math.sin(Math.PI / 32)), 12);
    const history = solvePoisson2d({ n: 31, method: 'sor', iterations: 200 });
    const rho = observedFactor(history, 100, 150);
    const ratio = (1 - rho) / (1 - (omega - 1));
    expect(ratio).toBeGreaterThan(0.9);
    expect(ratio).toBeLessThan(1.0);
  });

  it('SOR with ω = 1 is Gauss–Seidel (same residuals to 1e-12 relative)', () => {
    const gs = solvePoisson2d({ n: 9, method: 'gauss-seidel', iterations: 30 });
    const sor1 = solvePoisson2d({ n: 9, method: 'sor', omega: 1, iterations: 30 });
    for (let i = 0; i < 30; i++) expect(sor1[i].residualL2 / gs[i].residualL2).toBeCloseTo(1, 12);
  });

  it('the first Jacobi sweep from u = 0 gives the hand-computed residual', () => {
    // After one sweep u = h²/4 at every interior point: r = 1 − (4u − Σ neighbours)/h² is 1 in the
    // deep interior (3×3 points for N = 5), 3/4 beside an edge (12 points) and 1/2 at a corner (4).
    // L2 = sqrt(h² (9 + 12·9/16 + 4/4)) with h = 1/6 (hand computation); tolerance 1e-12.
    const [first] = solvePoisson2d({ n: 5, method: 'jacobi', iterations: 1 });
    expect(first.residualMax).toBeCloseTo(1, 12);
    expect(first.residualL2).toBeCloseTo(Math.sqrt(16.75 / 36), 12);
  });

  it.each([
    [{ n: 0, method: 'jacobi' as const, iterations: 1 }, /n must/],
    [{ n: 2.5, method: 'jacobi' as const, iterations: 1 }, /n must/],
    [{ n: 4, method: 'jacobi' as const, iterations: -1 }, /iterations/],
    [{ n: 4, method: 'sor' as const, omega: 2, iterations: 1 }, /omega/],
    [{ n: 4, method: 'sor' as const, omega: 0, iterations: 1 }, /omega/],
    [{ n: 4, method: 'newton' as unknown as 'sor', iterations: 1 }, /unknown method/],
  ])('rejects %o', (options, message) => {
    expect(() => solvePoisson2d(options)).toThrow(message);
  });
});

import { describe, expect, it } from 'vitest';
import { simulateHeatFtcs } from '../../src/model-problems/heat-ftcs-1d.js';

// Von Neumann stability of FTCS for u_t = α u_xx: amplification 1 − 4d·sin²(kπh/2), stable for
// d ≤ 1/2 (Morton & Mayers 2005, "Numerical Solution of PDEs", 2nd ed., §2.6).
describe('simulateHeatFtcs', () => {
  it('decays to steady state below the stability limit (d = 0.4): slowest mode 1 − 1.6·sin²(π/102)', () => {
    const history = simulateHeatFtcs({ n: 50, diffusionNumber: 0.4, steps: 3000 });
    expect(history).toHaveLength(3000);
    const factor = Math.pow(history[2999].residual / history[1999].residual, 1 / 1000);
    expect(factor).toBeCloseTo(1 - 4 * 0.4 * Math.sin(Math.PI / 102) ** 2, 6);
  });

  it('grows above the stability limit (d = 0.6): highest mode |1 − 2.4·sin²(10π/22)| per step', () => {
    // n = 10 keeps the two highest modes well apart (1.351 vs 1.209 per step), so the highest dominates.
    const history = simulateHeatFtcs({ n: 10, diffusionNumber: 0.6, steps: 300 });
    const factor = Math.pow(history[299].residual / history[249].residual, 1 / 50);
    expect(factor).toBeCloseTo(Math.abs(1 - 4 * 0.6 * Math.sin((10 * Math.PI) / 22) ** 2), 6);
  });

  it('overflows to a non-finite residual eventually when unstable, as a real solver log would show', () => {
    const history = simulateHeatFtcs({ n: 20, diffusionNumber: 0.9, steps: 2000 });
    expect(Number.isFinite(history[1999].residual)).toBe(false);
  });

  it.each([
    [{ n: 0, diffusionNumber: 0.4, steps: 1 }, /n must/],
    [{ n: 5, diffusionNumber: 0, steps: 1 }, /diffusionNumber/],
    [{ n: 5, diffusionNumber: Number.NaN, steps: 1 }, /diffusionNumber/],
    [{ n: 5, diffusionNumber: 0.4, steps: 1.5 }, /steps/],
  ])('rejects %o', (options, message) => {
    expect(() => simulateHeatFtcs(options)).toThrow(message);
  });
});

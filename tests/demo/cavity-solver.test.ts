import { describe, expect, it } from 'vitest';
import { createCavitySolver, type CavityIteration, type CavitySolverOptions } from '../../src/demo/cavity-solver.js';

/** Run to every residual below `target` (or the budget) and return the last iteration. */
function converge(options: CavitySolverOptions, target = 1e-8, budget = 40_000): CavityIteration {
  const solver = createCavitySolver(options);
  let last = solver.step();
  while (last.iteration < budget && Math.max(last.resPsi, last.resOmega, last.resT) >= target) last = solver.step();
  if (last.iteration >= budget) throw new Error(`did not reach ${target} in ${budget} iterations`);
  return last;
}

// Benchmark: de Vahl Davis (1983), "Natural convection of air in a square cavity: a bench mark
// numerical solution", Int. J. Numer. Methods Fluids 3:249–264, mean hot-wall Nusselt number and
// mid-plane peak velocities (values from memory, as in methods.md).
const BENCHMARK = {
  1e3: { nu: 1.118, uMax: 3.649, vMax: 3.697 },
  1e4: { nu: 2.243, uMax: 16.178, vMax: 19.617 },
} as const;

describe('the cavity solver against de Vahl Davis (1983)', () => {
  const ra3 = converge({ rayleigh: 1e3, cells: 40, dtFactor: 0.8 });
  const ra4Fine = converge({ rayleigh: 1e4, cells: 40, dtFactor: 0.8 });
  const ra4Coarse = converge({ rayleigh: 1e4, cells: 20, dtFactor: 0.8 });

  it('gives the Ra = 1e3 mean Nusselt number within 0.5 % on a 40 × 40 grid (second-order error there: about 0.2 %)', () => {
    expect(Math.abs(ra3.nuHot - BENCHMARK[1e3].nu) / BENCHMARK[1e3].nu).toBeLessThan(0.005);
  });

  it('gives the Ra = 1e3 mid-plane peak velocities within 1 % on a 40 × 40 grid', () => {
    expect(Math.abs(ra3.uMax - BENCHMARK[1e3].uMax) / BENCHMARK[1e3].uMax).toBeLessThan(0.01);
    expect(Math.abs(ra3.vMax - BENCHMARK[1e3].vMax) / BENCHMARK[1e3].vMax).toBeLessThan(0.01);
  });

  it('gives the Ra = 1e4 mean Nusselt number within 2 % on a 40 × 40 grid (thinner boundary layers: about 1.5 % high)', () => {
    expect(Math.abs(ra4Fine.nuHot - BENCHMARK[1e4].nu) / BENCHMARK[1e4].nu).toBeLessThan(0.02);
    expect(Math.abs(ra4Fine.uMax - BENCHMARK[1e4].uMax) / BENCHMARK[1e4].uMax).toBeLessThan(0.02);
    expect(Math.abs(ra4Fine.vMax - BENCHMARK[1e4].vMax) / BENCHMARK[1e4].vMax).toBeLessThan(0.02);
  });

  it('approaches the Ra = 1e4 benchmark as the grid is refined, at second order: Richardson extrapolation of the 20 and 40 grids lands within 0.5 %', () => {
    // Second-order central differences: error ~ h², so phi_exact ≈ phi_fine + (phi_fine − phi_coarse)/(2² − 1)
    // (Richardson extrapolation; Roache 1994).
    expect(Math.abs(ra4Coarse.nuHot - BENCHMARK[1e4].nu)).toBeGreaterThan(Math.abs(ra4Fine.nuHot - BENCHMARK[1e4].nu));
    const extrapolated = ra4Fine.nuHot + (ra4Fine.nuHot - ra4Coarse.nuHot) / 3;
    expect(Math.abs(extrapolated - BENCHMARK[1e4].nu) / BENCHMARK[1e4].nu).toBeLessThan(0.005);
  });

  it('balances energy: hot- and cold-wall Nusselt numbers agree within 1e-4 relative once converged', () => {
    for (const run of [ra3, ra4Fine, ra4Coarse]) {
      expect(Math.abs(run.nuHot - run.nuCold) / run.nuHot).toBeLessThan(1e-4);
    }
  });
});

describe('createCavitySolver', () => {
  it('starts its residuals at 1 (normalised by the first iterations) and keeps them finite', () => {
    const solver = createCavitySolver({ rayleigh: 1e4, cells: 16, dtFactor: 0.8 });
    const first = solver.step();
    expect([first.resPsi, first.resOmega, first.resT]).toEqual([1, 1, 1]);
    expect(solver.dt).toBeCloseTo(0.8 * (1 / 16) ** 2 / 4, 15);
  });

  it('is deterministic: two solvers with the same options give identical iterations', () => {
    const a = createCavitySolver({ rayleigh: 1e4, cells: 12, dtFactor: 0.8 });
    const b = createCavitySolver({ rayleigh: 1e4, cells: 12, dtFactor: 0.8 });
    for (let k = 0; k < 200; k++) expect(a.step()).toEqual(b.step());
  });

  it('keeps the temperature within the wall temperatures and turns the flow clockwise (rising at the hot wall)', () => {
    const solver = createCavitySolver({ rayleigh: 1e4, cells: 16, dtFactor: 0.8 });
    for (let k = 0; k < 1500; k++) solver.step();
    const { temperature, psi } = solver.fields();
    expect(Math.min(...temperature)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...temperature)).toBeLessThanOrEqual(1);
    // Centre node: ψ < 0 means clockwise circulation with u = ∂ψ/∂y (rising at the hot wall).
    expect(psi[8 * 17 + 8]).toBeLessThan(0);
  });

  it.each([
    [{ rayleigh: 1e4, cells: 3, dtFactor: 0.8 }, /cells/],
    [{ rayleigh: 1e4, cells: 10.5, dtFactor: 0.8 }, /cells/],
    [{ rayleigh: -1, cells: 10, dtFactor: 0.8 }, /rayleigh/],
    [{ rayleigh: Number.NaN, cells: 10, dtFactor: 0.8 }, /rayleigh/],
    [{ rayleigh: 1e4, cells: 10, dtFactor: 0 }, /dtFactor/],
    [{ rayleigh: 1e4, cells: 10, dtFactor: 0.8, prandtl: 0 }, /prandtl/],
  ])('rejects invalid options %o', (options, message) => {
    expect(() => createCavitySolver(options)).toThrow(message);
  });
});

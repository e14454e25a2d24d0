/**
 * Run one demo scenario to its end, one iteration at a time, and turn iterations into log rows.
 * Pure: the caller decides where rows go and how fast.
 *
 * A run ends when every residual is below SOLVER_TARGET (or the caller's target) (converged), when a residual exceeds
 * SOLVER_BLOW_UP or is not finite (the solver's divergence guard), or at the scenario's iteration
 * budget.
 */
import { createCavitySolver, type CavityIteration } from './cavity-solver.js';
import { SCENARIOS, SOLVER_BLOW_UP, SOLVER_TARGET, type ScenarioName } from './cavity-scenarios.js';
import type { LogRow } from './log-writers.js';

export interface CavityRunOptions {
  readonly scenario: ScenarioName;
  readonly rayleigh: number;
  readonly cells: number;
  /** Overrides the scenario's iteration budget. */
  readonly maxIterations?: number;
  /** Overrides the solver's target (default SOLVER_TARGET): the run ends when every residual is below it. */
  readonly target?: number;
}

export type CavityRunEnd = 'target' | 'blow-up' | 'budget';

/** Default Rayleigh number and grid of the demo: a real recirculating flow that converges in about
 * 2 000 iterations (seconds at the demo's pace). */
export const DEMO_DEFAULTS = { rayleigh: 1e4, cells: 24 } as const;

/** Iterations of the scenario, in order. The generator's return value says why the run ended. */
export function* runCavityScenario(options: CavityRunOptions): Generator<CavityIteration, CavityRunEnd> {
  const scenario = SCENARIOS[options.scenario];
  const solver = createCavitySolver({ ...scenario.solver, rayleigh: options.rayleigh, cells: options.cells });
  const budget = options.maxIterations ?? scenario.maxIterations(options.cells);
  const target = options.target ?? SOLVER_TARGET;
  for (let k = 0; k < budget; k++) {
    const it = solver.step();
    yield it;
    const residuals = [it.resPsi, it.resOmega, it.resT];
    if (residuals.some((r) => !(r <= SOLVER_BLOW_UP))) return 'blow-up';
    if (residuals.every((r) => r < target)) return 'target';
  }
  return 'budget';
}

/** The log row of one iteration: residuals res_psi, res_omega, res_T; quantities nu_hot, nu_cold,
 * u_max, v_max (non-dimensional). */
export function cavityLogRow(it: CavityIteration): LogRow {
  return {
    iter: it.iteration,
    fields: [
      { name: 'res_psi', value: it.resPsi, kind: 'residual' },
      { name: 'res_omega', value: it.resOmega, kind: 'residual' },
      { name: 'res_T', value: it.resT, kind: 'residual' },
      { name: 'nu_hot', value: it.nuHot, kind: 'quantity', unit: '-' },
      { name: 'nu_cold', value: it.nuCold, kind: 'quantity', unit: '-' },
      { name: 'u_max', value: it.uMax, kind: 'quantity', unit: '-' },
      { name: 'v_max', value: it.vMax, kind: 'quantity', unit: '-' },
    ],
  };
}

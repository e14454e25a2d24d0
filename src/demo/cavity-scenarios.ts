/**
 * The demo's scenarios: the same cavity solver (cavity-solver.ts) with one setting changed, each
 * reaching its verdict through a real numerical mechanism. Nothing is injected: no noise, no
 * scripted residuals.
 *
 * The pseudo-time step is given as a multiple of h²/4, the explicit (forward Euler, central
 * differences) stability limit of two-dimensional diffusion with unit diffusivity: a Fourier mode
 * (k, l) of a diffusion equation with diffusivity D is multiplied each step by
 * g = 1 − 4 D Δt/h² (sin²(k h/2) + sin²(l h/2)), and |g| ≤ 1 for every mode exactly when
 * Δt ≤ h²/(4 D) (von Neumann analysis; e.g. Ferziger & Perić 2002, "Computational Methods for Fluid
 * Dynamics", §6.3). The energy equation has D = 1 and the vorticity equation D = Pr = 0.71, so
 * their limits are dtFactor = 1 and dtFactor = 1/0.71 ≈ 1.41.
 */
import type { CavitySolverOptions } from './cavity-solver.js';

export const SCENARIO_NAMES = ['healthy', 'diverging', 'oscillating', 'stalled'] as const;
export type ScenarioName = (typeof SCENARIO_NAMES)[number];

export interface CavityScenario {
  readonly name: ScenarioName;
  /** One line for `settle demo --help` and the sample-logs README. */
  readonly summary: string;
  /** The verdict settle should reach on this scenario's log. */
  readonly expected: 'converged' | 'diverging' | 'oscillating' | 'stalled';
  /** The solver settings besides Rayleigh number and grid. */
  readonly solver: Omit<CavitySolverOptions, 'rayleigh' | 'cells'>;
  /** Iteration budget for a grid of `cells` cells per side. */
  maxIterations(cells: number): number;
}

/** The solver's own stopping rule: every residual below this (healthy runs end here). */
export const SOLVER_TARGET = 1e-6;
/** The solver's own divergence guard: any residual above this, or not finite, ends the run. */
export const SOLVER_BLOW_UP = 1e8;

export const SCENARIOS: Readonly<Record<ScenarioName, CavityScenario>> = {
  /** A step at 80 % of the tighter (energy) limit: every mode decays; residuals fall
   * geometrically to the solver's target and the Nusselt numbers settle, hot and cold walls agreeing. */
  healthy: {
    name: 'healthy',
    summary: 'pseudo-time step at 80 % of the stability limit: residuals fall to 1e-6, Nusselt numbers settle',
    expected: 'converged',
    solver: { dtFactor: 0.8 },
    maxIterations: (cells) => Math.max(2000, 12 * cells * cells),
  },
  /** A step 1.5 times the energy limit, above the vorticity limit (1/0.71 ≈ 1.41) too: the
   * shortest-wave vorticity mode (k = l = N − 1 on N cells) is multiplied each step by
   * g = 1 − 0.71·1.5·2 sin²((N − 1)π/2N), which is −1.12 on the default grid of 24 (and still below
   * −1 on the coarsest grid the demo accepts, 8). It flips sign every iteration and grows by about a
   * decade every 20 iterations; once the velocities it induces are large, the nonlinear convection
   * terms take over and the residuals jump by decades within a few iterations until the solver's
   * guard stops the run. Temperature stays bounded; vorticity has no bound. */
  diverging: {
    name: 'diverging',
    summary: 'pseudo-time step 1.5 × the stability limit: the vorticity residual grows by decades until the solver gives up',
    expected: 'diverging',
    solver: { dtFactor: 1.5 },
    maxIterations: () => 2000,
  },
  /** A step 1.2 times the energy limit but below the vorticity limit: the vorticity equation is
   * stable, the energy equation is not. Its shortest-wave (checkerboard) mode has g ≈ 1 − 2.4 = −1.4:
   * it flips sign every iteration and grows until the temperature bounds [0, 1] clip it. Clipping
   * is what stops the growth, so the iteration neither converges nor blows up: it locks into a
   * period-2 cycle, the temperature field swapping between two states and the wall Nusselt numbers
   * and peak velocities alternating between two values every iteration for as long as it runs
   * (the residual norms, equal on both halves of the cycle, stay flat far above their start). */
  oscillating: {
    name: 'oscillating',
    summary: 'pseudo-time step 1.2 × the energy equation\'s limit: bounded temperature locks the iteration into a period-2 cycle',
    expected: 'oscillating',
    solver: { dtFactor: 1.2 },
    maxIterations: (cells) => Math.max(1500, 3 * cells * cells),
  },
  /** The hot and cold walls are given heat fluxes instead of temperatures, and the flux out is set
   * to 80 % of the flux in (an inconsistent boundary condition). A cavity whose walls all fix the
   * flux has a steady state only when the fluxes balance; here 0.2 units of heat per unit time stay
   * inside, so the temperature rises uniformly for ever (∂T/∂t → 0.2 everywhere). Buoyancy sees only
   * ∂T/∂x, so vorticity and stream function converge normally, while the energy residual, which is
   * ∂T/∂t, flattens at the imbalance: about 1.3 decades below its start, far above any target. With
   * balanced fluxes the same run converges. */
  stalled: {
    name: 'stalled',
    summary: 'wall heat fluxes that do not balance (out = 80 % of in): the energy residual flattens at the imbalance',
    expected: 'stalled',
    solver: { dtFactor: 0.8, thermalWalls: 'fixed-flux', fluxIn: 1, fluxOut: 0.8 },
    maxIterations: (cells) => Math.max(2000, 5 * cells * cells),
  },
};

export function isScenarioName(text: string): text is ScenarioName {
  return (SCENARIO_NAMES as readonly string[]).includes(text);
}

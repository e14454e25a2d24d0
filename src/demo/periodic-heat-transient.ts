/**
 * A small transient run with inner iterations, for the transient sample log: the 1-D heat equation
 * u_t = u_xx on 0 ≤ x ≤ 1 with an oscillating temperature at the left end, u(0, t) = 1 + ½ sin(2π t / P),
 * and u(1, t) = 0, starting from u = 0. Pure computation.
 *
 * Each time step is implicit (backward Euler): (1 + 2r) u_i − r (u_{i−1} + u_{i+1}) = u_i^old with
 * r = Δt/h², and that linear system is solved by Gauss–Seidel inner iterations until the inner
 * residual has fallen by `innerDrop` (or `maxInner` sweeps). Backward Euler is unconditionally
 * stable; Gauss–Seidel converges on this strictly diagonally dominant system (e.g. Saad 2003,
 * "Iterative Methods for Sparse Linear Systems", 2nd ed., §4.2).
 *
 * Reported per inner iteration: `res_T`, the RMS of the step's equation residual after the sweep
 * divided by the RMS before the step's first sweep (so each step starts near 1); quantities
 * `t_mid` = u(1/2) and `q_right` = −∂u/∂x at x = 1 (heat flux leaving the right end, second-order
 * one-sided). After the start-up transient (decay time about 1/π²) the quantities become periodic
 * with the forcing period, around non-zero means (t_mid about 1/2, q_right about 1): a physical
 * cycle, not a fault.
 *
 * Cost: O(points) per inner iteration.
 */
import type { LogRow } from './log-writers.js';

export interface PeriodicHeatOptions {
  /** Interior points (h = 1 / (points + 1)). */
  readonly points: number;
  readonly dt: number;
  /** Forcing period P. */
  readonly period: number;
  readonly steps: number;
  /** Decades the inner residual must fall in each step (default 4). */
  readonly innerDrop?: number;
  /** Inner iterations at most per step (default 40). */
  readonly maxInner?: number;
}

/** Rows of the run, one per inner iteration, with a running iteration count. */
export function simulatePeriodicHeat(options: PeriodicHeatOptions): LogRow[] {
  const { points: n, dt, period, steps } = options;
  if (!Number.isInteger(n) || n < 3) throw new RangeError(`points must be a whole number ≥ 3, got ${n}`);
  if (!(dt > 0) || !(period > 0)) throw new RangeError('dt and period must be positive');
  const innerDrop = options.innerDrop ?? 4;
  const maxInner = options.maxInner ?? 40;
  const h = 1 / (n + 1);
  const r = dt / (h * h);
  const u = new Float64Array(n + 2);
  const old = new Float64Array(n + 2);
  const rows: LogRow[] = [];
  let iteration = 0;
  const residualRms = (): number => {
    let sum = 0;
    for (let i = 1; i <= n; i++) {
      const res = old[i] - ((1 + 2 * r) * u[i] - r * (u[i - 1] + u[i + 1]));
      sum += res * res;
    }
    return Math.sqrt(sum / n);
  };
  for (let step = 1; step <= steps; step++) {
    const time = step * dt;
    old.set(u);
    u[0] = 1 + 0.5 * Math.sin((2 * Math.PI * time) / period);
    const initial = residualRms();
    for (let inner = 1; inner <= maxInner; inner++) {
      for (let i = 1; i <= n; i++) u[i] = (old[i] + r * (u[i - 1] + u[i + 1])) / (1 + 2 * r);
      const relative = initial > 0 ? residualRms() / initial : 0;
      iteration += 1;
      rows.push({
        iter: iteration,
        step,
        time,
        inner,
        fields: [
          { name: 'res_T', value: relative, kind: 'residual' },
          { name: 't_mid', value: interpolateMid(u, n), kind: 'quantity' },
          { name: 'q_right', value: -(3 * u[n + 1] - 4 * u[n] + u[n - 1]) / (2 * h), kind: 'quantity' },
        ],
      });
      if (relative <= 10 ** -innerDrop) break;
    }
  }
  return rows;
}

function interpolateMid(u: Float64Array, n: number): number {
  const position = (n + 1) / 2;
  const lo = Math.floor(position);
  return u[lo] + (position - lo) * (u[lo + 1] - u[lo]);
}

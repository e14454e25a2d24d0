/**
 * Explicit (forward-time, centred-space) stepping of the 1-D heat equation u_t = α u_xx to steady state.
 *
 * Problem: x in [0, 1], u(0) = 0, u(1) = 1, u = 0 inside at t = 0; n interior points, h = 1/(n+1),
 * diffusion number d = α·dt/h². The steady state is the straight line u = x. Each step is
 * u_i ← u_i + d (u_{i−1} − 2u_i + u_{i+1}), and the step's residual is the RMS of the update divided
 * by d (the discrete u_xx·h², which is zero at steady state).
 *
 * Stability (von Neumann analysis): the amplification factor of Fourier mode k is
 * 1 − 4d·sin²(kπh/2); all modes decay when d ≤ 1/2, and the highest modes grow when d > 1/2.
 * Source: e.g. Morton & Mayers (2005), "Numerical Solution of Partial Differential Equations",
 * 2nd ed., Cambridge, §2.6; Ferziger & Perić (2002), §6.3.
 *
 * Cost: O(n) per step. Values overflow to Infinity when unstable; stepping goes on regardless, so the
 * history shows what a real solver log would.
 */
export interface HeatFtcsOptions {
  /** Interior points (≥ 1). */
  readonly n: number;
  /** α·dt/h² (> 0). Stable for ≤ 1/2. */
  readonly diffusionNumber: number;
  /** Time steps to take (≥ 0). */
  readonly steps: number;
}

export interface HeatFtcsStep {
  readonly step: number;
  readonly residual: number;
}

export function simulateHeatFtcs(options: HeatFtcsOptions): HeatFtcsStep[] {
  const { n, diffusionNumber: d, steps } = options;
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`n must be a whole number ≥ 1, got ${n}`);
  if (!(d > 0) || !Number.isFinite(d)) throw new RangeError(`diffusionNumber must be a positive number, got ${d}`);
  if (!Number.isInteger(steps) || steps < 0) throw new RangeError(`steps must be a whole number ≥ 0, got ${steps}`);
  let u = new Float64Array(n + 2);
  let next = new Float64Array(n + 2);
  u[n + 1] = 1;
  next[n + 1] = 1;
  const history: HeatFtcsStep[] = [];
  for (let s = 1; s <= steps; s++) {
    let sum = 0;
    for (let i = 1; i <= n; i++) {
      const change = d * (u[i - 1] - 2 * u[i] + u[i + 1]);
      next[i] = u[i] + change;
      sum += change * change;
    }
    const swap = u;
    u = next;
    next = swap;
    history.push({ step: s, residual: Math.sqrt(sum / n) / d });
  }
  return history;
}

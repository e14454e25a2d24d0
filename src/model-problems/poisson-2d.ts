/**
 * The 2-D Poisson model problem, solved by the classical stationary iterations.
 *
 * Problem: −Δu = 1 on the unit square, u = 0 on the boundary, discretised with the 5-point stencil on
 * N × N interior points, h = 1/(N+1). Starting from u = 0, each sweep of Jacobi, lexicographic
 * Gauss–Seidel or SOR is performed for real and the residual r = f − A·u is measured after it.
 *
 * Why: the asymptotic convergence factors of these iterations are known exactly, so the residual
 * histories are honest test data for the trend analysis. Jacobi: cos(πh); Gauss–Seidel: cos²(πh);
 * SOR with ω_opt = 2 / (1 + sin(πh)): ω_opt − 1 (approached slowly, because of a Jordan block).
 * Sources: Young (1971), "Iterative Solution of Large Linear Systems", Academic Press;
 * Saad (2003), "Iterative Methods for Sparse Linear Systems", 2nd ed., SIAM, §4.2.
 *
 * Norms: residualL2 is the grid L2 norm sqrt(h² Σ r²); residualMax is max |r|.
 * Cost: O(N²) per iteration, O(N²) memory.
 *
 * @example
 * solvePoisson2d({ n: 31, method: 'jacobi', iterations: 2 })
 * // → [{ iteration: 1, residualL2: …, residualMax: … }, { iteration: 2, … }]
 */
export type PoissonMethod = 'jacobi' | 'gauss-seidel' | 'sor';

export interface PoissonOptions {
  /** Interior points per side (≥ 1). */
  readonly n: number;
  readonly method: PoissonMethod;
  /** Relaxation factor for SOR (0 < ω < 2); default the optimal 2 / (1 + sin(πh)). */
  readonly omega?: number;
  /** Sweeps to perform (≥ 0). */
  readonly iterations: number;
}

export interface PoissonIterate {
  readonly iteration: number;
  readonly residualL2: number;
  readonly residualMax: number;
}

/** The optimal SOR factor for the model problem, 2 / (1 + sin(πh)) (Young 1971). */
export function optimalSorOmega(n: number): number {
  const h = 1 / (n + 1);
  return 2 / (1 + Math.sin(Math.PI * h));
}

export function solvePoisson2d(options: PoissonOptions): PoissonIterate[] {
  const { n, method, iterations } = options;
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`n must be a whole number ≥ 1, got ${n}`);
  if (!Number.isInteger(iterations) || iterations < 0) throw new RangeError(`iterations must be a whole number ≥ 0, got ${iterations}`);
  if (method !== 'jacobi' && method !== 'gauss-seidel' && method !== 'sor') throw new RangeError(`unknown method '${String(method)}'`);
  const omega = method === 'sor' ? (options.omega ?? optimalSorOmega(n)) : 1;
  if (!(omega > 0 && omega < 2)) throw new RangeError(`omega must lie in (0, 2), got ${omega}`);

  const h = 1 / (n + 1);
  const h2 = h * h;
  const side = n + 2; // with the boundary ring, held at 0
  let u = new Float64Array(side * side);
  let next = new Float64Array(side * side);
  const f = 1;
  const history: PoissonIterate[] = [];

  for (let it = 1; it <= iterations; it++) {
    if (method === 'jacobi') {
      for (let i = 1; i <= n; i++) {
        for (let j = 1; j <= n; j++) {
          const k = i * side + j;
          next[k] = 0.25 * (u[k - side] + u[k + side] + u[k - 1] + u[k + 1] + h2 * f);
        }
      }
      const swap = u;
      u = next;
      next = swap;
    } else {
      for (let i = 1; i <= n; i++) {
        for (let j = 1; j <= n; j++) {
          const k = i * side + j;
          const gs = 0.25 * (u[k - side] + u[k + side] + u[k - 1] + u[k + 1] + h2 * f);
          u[k] += omega * (gs - u[k]);
        }
      }
    }
    let sum = 0;
    let max = 0;
    for (let i = 1; i <= n; i++) {
      for (let j = 1; j <= n; j++) {
        const k = i * side + j;
        const r = f - (4 * u[k] - u[k - side] - u[k + side] - u[k - 1] - u[k + 1]) / h2;
        sum += r * r;
        const a = Math.abs(r);
        if (a > max) max = a;
      }
    }
    history.push({ iteration: it, residualL2: Math.sqrt(h2 * sum), residualMax: max });
  }
  return history;
}

/**
 * The demo solver: steady two-dimensional natural convection in a differentially heated square
 * cavity, marched in pseudo-time to its steady state. Pure computation (no I/O, no clock); the
 * demo process and the sample-log generator drive it one iteration at a time.
 *
 * Problem (de Vahl Davis 1983, "Natural convection of air in a square cavity: a bench mark numerical
 * solution", Int. J. Numer. Methods Fluids 3:249–264): air (Pr = 0.71), Boussinesq, left wall hot
 * (T = 1), right wall cold (T = 0), top and bottom adiabatic, no slip everywhere.
 *
 * Scaling: lengths by the cavity side L, velocities by the thermal diffusivity over L (α/L), time by
 * L²/α, temperature (T − T_cold)/(T_hot − T_cold). This is the benchmark's own scaling, so `u_max`
 * and `v_max` compare with its tables directly (Ra = 1e3: 3.649 and 3.697, from memory).
 *
 * Method: stream function ψ, vorticity ω = ∂v/∂x − ∂u/∂y, temperature T, with u = ∂ψ/∂y, v = −∂ψ/∂x:
 *
 *     ∇²ψ = −ω
 *     ∂ω/∂t + u ∂ω/∂x + v ∂ω/∂y = Pr ∇²ω + Ra Pr ∂T/∂x
 *     ∂T/∂t + u ∂T/∂x + v ∂T/∂y = ∇²T
 *
 * on a uniform grid of `cells` × `cells` cells, second-order central differences throughout. Each
 * iteration is one explicit (forward Euler) pseudo-time step of the ω and T equations, followed by
 * `psiSweeps` sweeps of successive over-relaxation for ψ. Wall vorticity comes from Thom's formula
 * ω_wall = −2 ψ_next / h² (no slip, ψ = 0 on the walls); adiabatic walls use the second-order
 * one-sided condition T_wall = (4 T_1 − T_2) / 3. The explicit step is stable for
 * Δt ≤ h² / (4 D) with D the diffusivity (1 for T, Pr for ω): `dtFactor` gives Δt in units of
 * h²/4, so the energy equation's limit is dtFactor = 1 and the vorticity equation's is 1/Pr ≈ 1.41.
 *
 * Temperature is bounded to the range of the wall temperatures after each update, as solvers bound
 * physically bounded scalars (the steady solution obeys that maximum principle, so a healthy run
 * never touches the bounds).
 *
 * Residuals, per equation: the root-mean-square over interior nodes of the steady equation's
 * residual evaluated at the current iterate (for T and ω, the right-hand side above minus the
 * convection terms, i.e. ∂/∂t that the step applies; for ψ, ∇²ψ + ω after the ω update and before
 * the ψ sweeps), divided by the largest value seen over the first five iterations (so each starts
 * near 1, the trade's usual normalisation). Reported as `res_psi`, `res_omega`, `res_T`.
 *
 * Monitored quantities: `nu_hot`, `nu_cold`, the mean Nusselt numbers on the hot and the cold wall
 * (−∂T/∂x by a second-order one-sided difference, integrated along the wall with the trapezoidal
 * rule; for fixed-flux walls, the wall heat flux over the difference of the walls' mean
 * temperatures); `u_max`, the largest |u| on the vertical mid-line x = 1/2, and `v_max`, the largest
 * |v| on the horizontal mid-line y = 1/2 (interpolated between the two middle grid lines when
 * `cells` is odd), as the benchmark defines them.
 *
 * Cost: O(cells² × (1 + psiSweeps)) per iteration, about (cells + 1)² × 4 doubles of memory.
 */

/** How the hot and cold walls are heated. `fixed-temperature`: T = 1 and T = 0 (the benchmark).
 * `fixed-flux`: a heat flux enters through the left wall and leaves through the right one. */
export type ThermalWalls = 'fixed-temperature' | 'fixed-flux';

export interface CavitySolverOptions {
  /** Rayleigh number (based on the wall temperature difference, or on the flux for fixed-flux walls). */
  readonly rayleigh: number;
  /** Prandtl number (default 0.71, air). */
  readonly prandtl?: number;
  /** Cells per side (the grid has cells + 1 nodes per side). At least 4. */
  readonly cells: number;
  /** Pseudo-time step in units of h²/4, the explicit stability limit of the energy equation. */
  readonly dtFactor: number;
  /** SOR sweeps of the stream-function equation per iteration (default 2). */
  readonly psiSweeps?: number;
  /** SOR factor (default: the optimum for the Dirichlet Poisson problem, 2 / (1 + sin(π h))). */
  readonly sorFactor?: number;
  /** Default `fixed-temperature`. */
  readonly thermalWalls?: ThermalWalls;
  /** For fixed-flux walls: flux in through the hot wall (default 1). */
  readonly fluxIn?: number;
  /** For fixed-flux walls: flux out through the cold wall (default equal to fluxIn). */
  readonly fluxOut?: number;
}

export interface CavityIteration {
  readonly iteration: number;
  readonly resPsi: number;
  readonly resOmega: number;
  readonly resT: number;
  readonly nuHot: number;
  readonly nuCold: number;
  readonly uMax: number;
  readonly vMax: number;
}

export interface CavitySolver {
  readonly options: Required<Omit<CavitySolverOptions, 'sorFactor'>> & { readonly sorFactor: number };
  /** Grid spacing h = 1 / cells. */
  readonly h: number;
  /** Pseudo-time step Δt = dtFactor · h² / 4. */
  readonly dt: number;
  /** Advance one iteration and report it. */
  step(): CavityIteration;
  /** Copies of the current fields (node (i, j) at index j·(cells + 1) + i; i along x, j along y). */
  fields(): { psi: Float64Array; omega: Float64Array; temperature: Float64Array };
}

/** Iterations over which the residual normalisation is taken (their largest value). */
export const NORMALISATION_ITERATIONS = 5;

/** Create a solver at its initial state: fluid at rest, interior at the cold-wall temperature. */
export function createCavitySolver(options: CavitySolverOptions): CavitySolver {
  const prandtl = options.prandtl ?? 0.71;
  const cells = options.cells;
  if (!Number.isInteger(cells) || cells < 4) throw new RangeError(`cells must be a whole number ≥ 4, got ${cells}`);
  if (!(options.rayleigh >= 0)) throw new RangeError(`rayleigh must be ≥ 0, got ${options.rayleigh}`);
  if (!(options.dtFactor > 0)) throw new RangeError(`dtFactor must be > 0, got ${options.dtFactor}`);
  if (!(prandtl > 0)) throw new RangeError(`prandtl must be > 0, got ${prandtl}`);
  const h = 1 / cells;
  const resolved = {
    rayleigh: options.rayleigh,
    prandtl,
    cells,
    dtFactor: options.dtFactor,
    psiSweeps: options.psiSweeps ?? 2,
    sorFactor: options.sorFactor ?? 2 / (1 + Math.sin(Math.PI * h)),
    thermalWalls: options.thermalWalls ?? 'fixed-temperature',
    fluxIn: options.fluxIn ?? 1,
    fluxOut: options.fluxOut ?? options.fluxIn ?? 1,
  } as const;
  const dt = (resolved.dtFactor * h * h) / 4;
  const n1 = cells + 1;
  const size = n1 * n1;
  const psi = new Float64Array(size);
  const omega = new Float64Array(size);
  const temp = new Float64Array(size);
  const rOmega = new Float64Array(size);
  const rTemp = new Float64Array(size);
  const at = (i: number, j: number): number => j * n1 + i;
  const h2 = h * h;
  const invH2 = 1 / h2;
  const inv2h = 1 / (2 * h);
  const fixedTemperature = resolved.thermalWalls === 'fixed-temperature';
  const raPr = resolved.rayleigh * prandtl;
  const reference = { psi: 0, omega: 0, temperature: 0 };
  let iteration = 0;

  if (fixedTemperature) for (let j = 0; j < n1; j++) temp[at(0, j)] = 1;

  function applyTemperatureWalls(): void {
    for (let i = 1; i < cells; i++) {
      temp[at(i, 0)] = (4 * temp[at(i, 1)] - temp[at(i, 2)]) / 3;
      temp[at(i, cells)] = (4 * temp[at(i, cells - 1)] - temp[at(i, cells - 2)]) / 3;
    }
    if (!fixedTemperature) {
      // −∂T/∂x = q on both walls, second-order one-sided.
      for (let j = 0; j < n1; j++) {
        temp[at(0, j)] = (4 * temp[at(1, j)] - temp[at(2, j)] + 2 * h * resolved.fluxIn) / 3;
        temp[at(cells, j)] = (4 * temp[at(cells - 1, j)] - temp[at(cells - 2, j)] - 2 * h * resolved.fluxOut) / 3;
      }
    }
  }

  function applyVorticityWalls(): void {
    for (let k = 0; k < n1; k++) {
      omega[at(0, k)] = (-2 * psi[at(1, k)]) * invH2;
      omega[at(cells, k)] = (-2 * psi[at(cells - 1, k)]) * invH2;
      omega[at(k, 0)] = (-2 * psi[at(k, 1)]) * invH2;
      omega[at(k, cells)] = (-2 * psi[at(k, cells - 1)]) * invH2;
    }
  }

  function wallGradient(i0: number, i1: number, i2: number, sign: number): number {
    // Mean over the wall of −∂T/∂x, trapezoidal rule; sign +1 on the left wall, −1 on the right.
    let sum = 0;
    for (let j = 0; j < n1; j++) {
      const g = -sign * (-3 * temp[at(i0, j)] + 4 * temp[at(i1, j)] - temp[at(i2, j)]) * inv2h;
      sum += j === 0 || j === cells ? g / 2 : g;
    }
    return sum * h;
  }

  function wallMeanTemperature(i: number): number {
    let sum = 0;
    for (let j = 0; j < n1; j++) sum += j === 0 || j === cells ? temp[at(i, j)] / 2 : temp[at(i, j)];
    return sum * h;
  }

  function midlineSpeeds(): { uMax: number; vMax: number } {
    const lo = Math.floor(cells / 2);
    const hi = Math.ceil(cells / 2);
    let uMax = 0;
    let vMax = 0;
    for (let k = 1; k < cells; k++) {
      // u = ∂ψ/∂y on x = 1/2; v = −∂ψ/∂x on y = 1/2.
      const uLo = (psi[at(lo, k + 1)] - psi[at(lo, k - 1)]) * inv2h;
      const uHi = (psi[at(hi, k + 1)] - psi[at(hi, k - 1)]) * inv2h;
      const vLo = -(psi[at(k + 1, lo)] - psi[at(k - 1, lo)]) * inv2h;
      const vHi = -(psi[at(k + 1, hi)] - psi[at(k - 1, hi)]) * inv2h;
      uMax = Math.max(uMax, Math.abs((uLo + uHi) / 2));
      vMax = Math.max(vMax, Math.abs((vLo + vHi) / 2));
    }
    return { uMax, vMax };
  }

  function normalise(value: number, key: keyof typeof reference): number {
    if (iteration <= NORMALISATION_ITERATIONS) reference[key] = Math.max(reference[key], value);
    return reference[key] > 0 ? value / reference[key] : value;
  }

  function step(): CavityIteration {
    iteration += 1;
    applyTemperatureWalls();
    applyVorticityWalls();
    let sumT = 0;
    let sumOmega = 0;
    for (let j = 1; j < cells; j++) {
      for (let i = 1; i < cells; i++) {
        const c = at(i, j);
        const u = (psi[c + n1] - psi[c - n1]) * inv2h;
        const v = -(psi[c + 1] - psi[c - 1]) * inv2h;
        const tx = (temp[c + 1] - temp[c - 1]) * inv2h;
        const ty = (temp[c + n1] - temp[c - n1]) * inv2h;
        const lapT = (temp[c + 1] + temp[c - 1] + temp[c + n1] + temp[c - n1] - 4 * temp[c]) * invH2;
        const wx = (omega[c + 1] - omega[c - 1]) * inv2h;
        const wy = (omega[c + n1] - omega[c - n1]) * inv2h;
        const lapW = (omega[c + 1] + omega[c - 1] + omega[c + n1] + omega[c - n1] - 4 * omega[c]) * invH2;
        const rt = lapT - (u * tx + v * ty);
        const rw = prandtl * lapW + raPr * tx - (u * wx + v * wy);
        rTemp[c] = rt;
        rOmega[c] = rw;
        sumT += rt * rt;
        sumOmega += rw * rw;
      }
    }
    const low = fixedTemperature ? 0 : -Infinity;
    const high = fixedTemperature ? 1 : Infinity;
    for (let j = 1; j < cells; j++) {
      for (let i = 1; i < cells; i++) {
        const c = at(i, j);
        omega[c] += dt * rOmega[c];
        const t = temp[c] + dt * rTemp[c];
        temp[c] = t < low ? low : t > high ? high : t;
      }
    }
    let sumPsi = 0;
    for (let j = 1; j < cells; j++) {
      for (let i = 1; i < cells; i++) {
        const c = at(i, j);
        const r = (psi[c + 1] + psi[c - 1] + psi[c + n1] + psi[c - n1] - 4 * psi[c]) * invH2 + omega[c];
        sumPsi += r * r;
      }
    }
    const sor = resolved.sorFactor;
    for (let sweep = 0; sweep < resolved.psiSweeps; sweep++) {
      for (let j = 1; j < cells; j++) {
        for (let i = 1; i < cells; i++) {
          const c = at(i, j);
          const gaussSeidel = (psi[c + 1] + psi[c - 1] + psi[c + n1] + psi[c - n1] + h2 * omega[c]) / 4;
          psi[c] += sor * (gaussSeidel - psi[c]);
        }
      }
    }
    applyTemperatureWalls();
    const interior = (cells - 1) * (cells - 1);
    let nuHot: number;
    let nuCold: number;
    if (fixedTemperature) {
      nuHot = wallGradient(0, 1, 2, 1);
      nuCold = wallGradient(cells, cells - 1, cells - 2, -1);
    } else {
      const difference = wallMeanTemperature(0) - wallMeanTemperature(cells);
      nuHot = resolved.fluxIn / difference;
      nuCold = resolved.fluxOut / difference;
    }
    const { uMax, vMax } = midlineSpeeds();
    return {
      iteration,
      resPsi: normalise(Math.sqrt(sumPsi / interior), 'psi'),
      resOmega: normalise(Math.sqrt(sumOmega / interior), 'omega'),
      resT: normalise(Math.sqrt(sumT / interior), 'temperature'),
      nuHot,
      nuCold,
      uMax,
      vMax,
    };
  }

  return {
    options: resolved,
    h,
    dt,
    step,
    fields: () => ({ psi: psi.slice(), omega: omega.slice(), temperature: temp.slice() }),
  };
}

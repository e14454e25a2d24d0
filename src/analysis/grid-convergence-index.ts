/**
 * Grid Convergence Index (GCI) of a three-grid mesh study, by the procedure of Celik, Ghia, Roache,
 * Freitas, Coleman & Raad (2008), "Procedure for estimation and reporting of uncertainty due to
 * discretization in CFD applications", J. Fluids Eng. 130(7):078001, which builds on Richardson
 * extrapolation and on Roache (1994), "Perspective: a method for uniform reporting of grid refinement
 * studies", J. Fluids Eng. 116:405–413.
 *
 * Purpose: from one quantity computed on a fine, a medium and a coarse grid, estimate how far the
 * fine-grid value may be from the grid-independent one.
 *
 * Method (the steps of the procedure, numbered as in Celik et al. 2008):
 * 1. Representative cell size h = (V / N)^(1/D) for N cells filling a domain of size V in D dimensions.
 * 2. Refinement ratios r21 = h2 / h1 and r32 = h3 / h2 (grid 1 is the finest); the procedure asks for
 *    r > 1.3 (a rule of thumb of the procedure; a smaller ratio gets a note, not a refusal).
 * 3. Apparent order p from ε32 = φ3 − φ2, ε21 = φ2 − φ1, s = sign(ε32 / ε21):
 *      p = |ln|ε32 / ε21| + q(p)| / ln r21,   q(p) = ln((r21^p − s) / (r32^p − s)),
 *    solved by fixed-point iteration starting from q = 0 (q ≡ 0 when r21 = r32).
 * 4. Extrapolated value φ21_ext = (r21^p φ1 − φ2) / (r21^p − 1).
 * 5. Approximate relative error e21_a = |(φ1 − φ2) / φ1|, extrapolated relative error
 *    e21_ext = |(φ21_ext − φ1) / φ21_ext|, and the fine-grid index GCI21_fine = 1.25 e21_a / (r21^p − 1)
 *    (safety factor 1.25 for three grids, following Roache).
 * A negative ratio ε32 / ε21 means oscillatory convergence: the procedure still applies (with s = −1)
 * and says so; the result then deserves less trust. When ε21 or ε32 is zero the procedure does not
 * work: either the exact solution has been reached or convergence is oscillatory; the result is
 * reported as degenerate with a message rather than as numbers. The convergence-ratio classification
 * (R = ε21 / ε32: 0 < R < 1 monotone, −1 < R < 0 oscillatory, |R| > 1 divergent) follows Stern, Wilson,
 * Coleman & Paterson (2001), "Comprehensive approach to verification and validation of CFD
 * simulations — Part 1", J. Fluids Eng. 123:793–802 (from memory).
 *
 * Cost: O(1), plus at most a few hundred fixed-point steps.
 *
 * Example (Celik et al. 2008, worked example, from memory): cells 18000, 8000, 4500 in 2-D, values
 * 6.063, 5.972, 5.863 give p ≈ 1.53, φ_ext ≈ 6.168, e_a ≈ 1.5 %, e_ext ≈ 1.7 %, GCI_fine ≈ 2.2 %.
 */

/** One grid of the study. */
export interface GciGrid {
  /** Number of cells (or elements, or control volumes). */
  readonly cells: number;
  /** The quantity computed on this grid. */
  readonly value: number;
}

export interface GciInput {
  /** Fine, medium, coarse (in that order: cells strictly decreasing). */
  readonly grids: readonly [GciGrid, GciGrid, GciGrid];
  /** Spatial dimensions: 1, 2 or 3. */
  readonly dimensions: 1 | 2 | 3;
  /** Size of the domain (volume, area or length). Only scales h; ratios do not depend on it. Default 1. */
  readonly domainSize?: number;
  /** Safety factor of the index. Default 1.25 (three or more grids, following Roache). */
  readonly safetyFactor?: number;
}

/** How the three values approach each other as the grid is refined. */
export type GciConvergence = 'monotone' | 'oscillatory' | 'divergent' | 'degenerate';

interface GciCommon {
  /** Representative cell sizes h1, h2, h3 (fine to coarse). */
  readonly cellSizes: readonly [number, number, number];
  readonly r21: number;
  readonly r32: number;
  /** ε21 = φ2 − φ1 and ε32 = φ3 − φ2. */
  readonly epsilon21: number;
  readonly epsilon32: number;
  /** Convergence ratio R = ε21 / ε32 (NaN when ε32 = 0). */
  readonly convergenceRatio: number;
  readonly convergence: GciConvergence;
  /** Plain-English remarks the user should read (oscillation, small ratios, unusual order). */
  readonly notes: readonly string[];
}

export interface GciEstimate extends GciCommon {
  readonly convergence: 'monotone' | 'oscillatory' | 'divergent';
  /** Sign term s of the procedure (+1 monotone, −1 oscillatory). */
  readonly sign: 1 | -1;
  /** Apparent order p. */
  readonly order: number;
  /** Fixed-point steps taken to find p. */
  readonly orderIterations: number;
  /** Richardson-extrapolated value φ21_ext. */
  readonly extrapolated: number;
  /** e21_a = |(φ1 − φ2) / φ1| (a fraction, not a percentage). */
  readonly approximateRelativeError: number;
  /** e21_ext = |(φ21_ext − φ1) / φ21_ext| (a fraction). */
  readonly extrapolatedRelativeError: number;
  /** GCI21_fine = Fs · e21_a / (r21^p − 1) (a fraction). */
  readonly gciFine: number;
  /** The same band in the quantity's units: Fs · |ε21| / (r21^p − 1) (= gciFine · |φ1|; finite even when φ1 = 0). */
  readonly gciFineAbsolute: number;
  readonly safetyFactor: number;
}

export interface GciDegenerate extends GciCommon {
  readonly convergence: 'degenerate';
  /** Why no estimate could be made, and what to do. */
  readonly reason: string;
}

export type GciResult = GciEstimate | GciDegenerate;

const MAX_ORDER_ITERATIONS = 500;
const ORDER_TOLERANCE = 1e-12;
/** Below this the procedure's ratio rule (r > 1.3) is not met. */
const SMALL_RATIO = 1.3;

/**
 * Representative cell size h = (V / N)^(1/D) (Celik et al. 2008, eq. 1, for cells of equal size or
 * the mean cell size otherwise).
 */
export function representativeCellSize(cells: number, dimensions: number, domainSize = 1): number {
  if (!(Number.isFinite(cells) && cells > 0)) throw new RangeError(`cell count must be a positive number, got ${cells}`);
  if (![1, 2, 3].includes(dimensions)) throw new RangeError(`dimensions must be 1, 2 or 3, got ${dimensions}`);
  if (!(Number.isFinite(domainSize) && domainSize > 0)) throw new RangeError(`domain size must be a positive number, got ${domainSize}`);
  return (domainSize / cells) ** (1 / dimensions);
}

/**
 * Apparent order by the fixed-point iteration of the procedure (step 3). Returns NaN order when the
 * iteration does not settle or leaves the range where q(p) is defined.
 */
export function apparentOrder(epsilon21: number, epsilon32: number, r21: number, r32: number): { order: number; iterations: number } {
  const ratio = epsilon32 / epsilon21;
  const s = Math.sign(ratio);
  const lnRatio = Math.log(Math.abs(ratio));
  const lnR21 = Math.log(r21);
  const q = (p: number): number => Math.log((r21 ** p - s) / (r32 ** p - s));
  let p = Math.abs(lnRatio) / lnR21;
  for (let step = 1; step <= MAX_ORDER_ITERATIONS; step++) {
    const next = Math.abs(lnRatio + q(p)) / lnR21;
    if (!Number.isFinite(next)) return { order: Number.NaN, iterations: step };
    if (Math.abs(next - p) <= ORDER_TOLERANCE * Math.max(1, Math.abs(next))) return { order: next, iterations: step };
    p = next;
  }
  return { order: Number.NaN, iterations: MAX_ORDER_ITERATIONS };
}

/** The Grid Convergence Index of the fine grid of a three-grid study (see the file comment). */
export function gridConvergenceIndex(input: GciInput): GciResult {
  const { grids, dimensions } = input;
  const domainSize = input.domainSize ?? 1;
  const safetyFactor = input.safetyFactor ?? 1.25;
  if (grids.length !== 3) throw new RangeError(`a mesh study needs exactly three grids, got ${grids.length}`);
  if (!(Number.isFinite(safetyFactor) && safetyFactor >= 1)) throw new RangeError(`safety factor must be at least 1, got ${safetyFactor}`);
  const names = ['fine', 'medium', 'coarse'];
  grids.forEach((grid, i) => {
    if (!Number.isFinite(grid.value)) throw new RangeError(`the ${names[i]} grid's value is not a finite number (${grid.value})`);
  });
  const h = grids.map((grid) => representativeCellSize(grid.cells, dimensions, domainSize)) as [number, number, number];
  const r21 = h[1] / h[0];
  const r32 = h[2] / h[1];
  if (!(r21 > 1) || !(r32 > 1)) {
    throw new RangeError(`grids must go from fine to coarse with fewer cells each time (refinement ratios ${fmt(r21)} and ${fmt(r32)} must exceed 1; cells ${grids.map((g) => g.cells).join(', ')})`);
  }
  const [phi1, phi2, phi3] = grids.map((grid) => grid.value);
  const epsilon21 = phi2 - phi1;
  const epsilon32 = phi3 - phi2;
  const convergenceRatio = epsilon32 === 0 ? Number.NaN : epsilon21 / epsilon32;
  const notes: string[] = [];
  if (r21 < SMALL_RATIO || r32 < SMALL_RATIO) {
    notes.push(`refinement ratio below ${SMALL_RATIO} (r21 = ${fmt(r21)}, r32 = ${fmt(r32)}): the procedure asks for more than ${SMALL_RATIO}, so grid differences may drown in other errors`);
  }
  const common = { cellSizes: h, r21, r32, epsilon21, epsilon32, convergenceRatio };

  if (epsilon21 === 0 && epsilon32 === 0) {
    return { ...common, convergence: 'degenerate', notes,
      reason: 'the three grids give the same value: either the quantity no longer depends on the grid or it is printed with too few digits; no order can be estimated' };
  }
  if (epsilon21 === 0 || epsilon32 === 0) {
    const which = epsilon21 === 0 ? 'fine and medium' : 'medium and coarse';
    return { ...common, convergence: 'degenerate', notes,
      reason: `the ${which} grids give the same value while the other pair differs: the procedure does not work here (oscillatory convergence, or the exact value reached by chance); try another grid or more printed digits` };
  }

  const sign: 1 | -1 = epsilon32 / epsilon21 > 0 ? 1 : -1;
  const { order, iterations } = apparentOrder(epsilon21, epsilon32, r21, r32);
  if (!(Number.isFinite(order) && order > 0)) {
    return { ...common, convergence: 'degenerate', notes,
      reason: 'the apparent order could not be found (the fixed-point iteration of the procedure did not settle): the grids are probably not in the asymptotic range; refine further' };
  }
  const convergence = Math.abs(convergenceRatio) > 1 ? 'divergent' : sign < 0 ? 'oscillatory' : 'monotone';
  if (convergence === 'oscillatory') {
    notes.push('oscillatory convergence (the differences between successive grids change sign): the procedure applies with s = -1, but the estimate is less reliable');
  } else if (convergence === 'divergent') {
    notes.push(`the values move apart as the grid is refined (|e21| > |e32|, convergence ratio ${fmt(convergenceRatio)}): the grids are not in the asymptotic range and the index is not meaningful`);
  }
  if (order < 0.5 || order > 5) {
    notes.push(`apparent order ${fmt(order)} is far from the usual 1 to 3 of common schemes (common practice): the grids may not be in the asymptotic range`);
  }
  if (phi1 === 0) notes.push('the fine-grid value is zero, so relative errors are undefined: read the band in the quantity\'s units');
  const rp = r21 ** order;
  const extrapolated = (rp * phi1 - phi2) / (rp - 1);
  const approximateRelativeError = Math.abs((phi1 - phi2) / phi1);
  const extrapolatedRelativeError = Math.abs((extrapolated - phi1) / extrapolated);
  const gciFine = (safetyFactor * approximateRelativeError) / (rp - 1);
  return {
    ...common, convergence, notes, sign, order, orderIterations: iterations, extrapolated,
    approximateRelativeError, extrapolatedRelativeError, gciFine, gciFineAbsolute: (safetyFactor * Math.abs(epsilon21)) / (rp - 1), safetyFactor,
  };
}

function fmt(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(4))) : String(x);
}

/**
 * The three grids of `settle demo --study`: a coarse grid and two refinements by a constant ratio of
 * 1.5 per side (16, 24, 36 cells per side by default at Ra up to 1e4), so the study meets the
 * refinement-ratio rule of Celik et al. (2008) (r > 1.3) with the same ratio twice, which keeps the
 * apparent-order equation of the procedure explicit.
 *
 * Measured (healthy scenario run to STUDY_TARGET, through `settle compare`, 2-core machine): Ra 1e4 on
 * 16, 24, 36 gives nu_hot 2.4883, 2.3416, 2.2840, apparent order 2.31 (the scheme is second order)
 * and an extrapolated 2.2468 against the benchmark's 2.243 (+0.17 %), in under a second of solving;
 * Ra 1e3 gives order 2.10 and 1.1179 against 1.118. Above Ra 1e4 the 16-cell grid does not resolve
 * the wall boundary layers (Ra 1e5 on 16, 24, 36: order 1.9 but 2.5 % off the benchmark), so the
 * coarse grid is 24 there (Ra 1e5 on 24, 36, 54: order 2.33, 4.5219 against 4.519, about 2 s; on 32,
 * 48, 72: order 2.38, 4.5261, about 6 s). At Ra 1e6 the healthy case blows up on these grids
 * (central differences of the convection terms at a cell Péclet number far above 2).
 *
 * Pure. Cost: O(1).
 */

/**
 * The solver's target in a study: every residual below 1e-10 instead of the demo's 1e-6. A grid
 * study wants the iteration error two to three orders of magnitude below the discretisation error
 * (common practice), and `settle compare` takes a run's value only once settle judges it settled.
 * At 1e-6 the hot-wall Nusselt number of the Ra 1e3 run on 36 cells is still creeping (about 1e-5
 * relative per 500 iterations, a geometric tail) and settle calls it converging; at 1e-8 some runs
 * (Ra 2e4 on 16 cells, Ra 1e4 on 8) still end before the printed value has stopped moving for long
 * enough; at 1e-10 every case tried (Ra 4e2 to 1e5, coarse grids 8 to 32) settles. 1e-12 is at the
 * round-off floor of the normalised residuals on the finer grids (runs end at their budget).
 * Cost: about 1.7 times the iterations of a run to 1e-6.
 */
export const STUDY_TARGET = 1e-10;

/** Refinement ratio per side between successive grids. */
export const STUDY_RATIO = 1.5;
/** The coarse grid must be a multiple of this so that 1.5 and 2.25 times it are whole. */
export const STUDY_GRID_STEP = 4;

/** The default coarse grid at this Rayleigh number (see the file comment for why). */
export function defaultStudyCoarseGrid(rayleigh: number): number {
  return rayleigh <= 1e4 ? 16 : 24;
}

/** Cells per side of the three grids, fine first (the order `settle compare` takes them). */
export function studyGrids(coarse: number): readonly [number, number, number] {
  if (!(Number.isInteger(coarse) && coarse > 0 && coarse % STUDY_GRID_STEP === 0)) {
    throw new RangeError(`the coarse grid of a study must be a positive multiple of ${STUDY_GRID_STEP}, got ${coarse}`);
  }
  const medium = (coarse * 3) / 2;
  return [(medium * 3) / 2, medium, coarse];
}

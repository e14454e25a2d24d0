import { describe, expect, it } from 'vitest';
import { STUDY_RATIO, defaultStudyCoarseGrid, studyGrids } from '../../src/demo/grid-study-plan.js';

describe('studyGrids', () => {
  it('refines the coarse grid twice by the same ratio, fine first', () => {
    expect(studyGrids(16)).toEqual([36, 24, 16]);
    expect(studyGrids(24)).toEqual([54, 36, 24]);
    const [fine, medium, coarse] = studyGrids(32);
    expect(medium / coarse).toBe(STUDY_RATIO);
    expect(fine / medium).toBe(STUDY_RATIO);
    // Celik et al. (2008) ask for a refinement ratio above 1.3.
    expect(STUDY_RATIO).toBeGreaterThan(1.3);
  });

  it.each([18, 0, -4, 2.5, Number.NaN])('refuses a coarse grid of %d (not a positive multiple of 4)', (coarse) => {
    expect(() => studyGrids(coarse)).toThrow(RangeError);
  });
});

describe('defaultStudyCoarseGrid', () => {
  it('uses 16 up to Ra 1e4 and 24 above, where the boundary layers are thinner', () => {
    expect(defaultStudyCoarseGrid(1e3)).toBe(16);
    expect(defaultStudyCoarseGrid(1e4)).toBe(16);
    expect(defaultStudyCoarseGrid(1e5)).toBe(24);
  });
});

import { describe, expect, it } from 'vitest';
import type { RunDiagnosis, SeriesDiagnosis } from '../../src/analysis/diagnosis.js';
import { meshStudy, parseCellCounts, parseDimensions, type MeshStudyRun } from '../../src/report/mesh-study.js';
import { meshStudyJson, renderMeshStudyText } from '../../src/report/render-mesh-study.js';
import { InputError, UsageError } from '../../src/errors.js';

function run(log: string, cells: number, nu: Partial<SeriesDiagnosis>): MeshStudyRun {
  const diagnosis: RunDiagnosis = {
    verdict: 'converged', exitCode: 0, iterations: 3000, records: 3000, advice: '', reasons: [], timeline: [], criteria: [], final: true,
    series: [
      { name: 'res_p', kind: 'residual', state: 'converged', last: 1e-8, reason: '' },
      { name: 'nu_hot', kind: 'quantity', state: 'converged', last: Number.NaN, reason: 'settled', ...nu },
      { name: 'dp', kind: 'quantity', state: 'converged', last: 1, reason: '', mean: 1 },
    ],
  };
  return { log, cells, diagnosis };
}

// Worked example of Celik et al. (2008) as given in methods.md (from memory).
const celik = (iterationError = 1e-5): MeshStudyRun[] => [
  run('fine.log', 18000, { mean: 6.063, halfWidth: iterationError, last: 6.0631 }),
  run('medium.log', 8000, { mean: 5.972, halfWidth: iterationError / 2, iterationError: -iterationError / 4, last: 5.9721 }),
  run('coarse.log', 4500, { mean: 5.863, last: 5.8631 }),
];

describe('meshStudy', () => {
  it('takes the settled means and reproduces the worked example: p ≈ 1.53, φ_ext ≈ 6.168, GCI ≈ 2.2 % (tolerances as in the GCI tests)', () => {
    const study = meshStudy(celik(), 'nu_hot', 2, false);
    expect(study.grids.map((g) => g.source)).toEqual(['settled mean', 'settled mean', 'settled mean']);
    if (study.gci.convergence === 'degenerate') throw new Error('degenerate');
    expect(Math.abs(study.gci.order - 1.53)).toBeLessThan(0.005);
    expect(Math.abs(study.gci.extrapolated - 6.168)).toBeLessThan(1e-3);
    expect(Math.abs(study.gci.gciFine * 100 - 2.2)).toBeLessThan(0.05);
  });

  it('prints the study as text: ratios, order, extrapolated value, errors, GCI band and the caution', () => {
    const text = renderMeshStudyText(meshStudy(celik(), 'nu_hot', 2, false));
    expect(text).toMatch(/^Mesh study of nu_hot \(2-D grids; Celik et al\. 2008\)/);
    expect(text).toMatch(/refinement ratios +r21 = 1\.5, r32 = 1\.333/);
    expect(text).toMatch(/apparent order p +1\.534/);
    expect(text).toMatch(/extrapolated value +6\.168496/);
    expect(text).toMatch(/approximate relative error +e21_a = 1\.5 %/);
    expect(text).toMatch(/extrapolated relative error +e21_ext = 1\.71 %/);
    expect(text).toMatch(/GCI of the fine grid +2\.17 %, i\.e\. 6\.063 ± 0\.132 \(safety factor 1\.25\)/);
    expect(text).toMatch(/Caution: .*asymptotic range/);
  });

  it('calls an iteration error two orders below the discretisation error negligible, and one order below not (Eça & Hoekstra, common practice, from memory)', () => {
    // discretisation error = GCI band of the fine grid ≈ 0.1319 (1.25 · 0.091 / (1.5^1.534 − 1))
    const small = meshStudy(celik(1e-4), 'nu_hot', 2, false);
    expect(small.discretisationError).toBeCloseTo(0.1319, 3);
    expect(small.grids[0].iterationToDiscretisation).toBeCloseTo(1e-4 / 0.13187, 5);
    expect(small.grids.map((g) => g.iterationErrorNegligible)).toEqual([true, true, undefined]);
    expect(small.iterationVerdict).toMatch(/^iteration error negligible/);
    expect(small.iterationVerdict).toMatch(/1 run gave no iteration error/);

    const large = meshStudy(celik(0.01), 'nu_hot', 2, false);
    expect(large.grids[0].iterationErrorNegligible).toBe(false);
    expect(large.iterationVerdict).toMatch(/NOT negligible: the fine run's is 7.6 %/);

    const huge = meshStudy(celik(0.5), 'nu_hot', 2, false);
    expect(huge.iterationVerdict).toMatch(/as large as the discretisation error or larger/);
  });

  it('uses max(halfWidth, |iterationError|) as a run\'s iteration error', () => {
    const study = meshStudy([
      run('f', 800, { mean: 1.0, halfWidth: 1e-6, iterationError: -3e-6 }),
      run('m', 200, { mean: 1.1, halfWidth: 2e-6 }),
      run('c', 50, { mean: 1.3, iterationError: 4e-6 }),
    ], 'nu_hot', 2, false);
    expect(study.grids.map((g) => g.iterationError)).toEqual([3e-6, 2e-6, 4e-6]);
  });

  it('refuses an unsettled run, naming the run and its state', () => {
    const runs = celik();
    runs[1] = run('medium.log', 8000, { state: 'converging', reason: 'still moving', last: 5.95 });
    expect(() => meshStudy(runs, 'nu_hot', 2, false)).toThrow(InputError);
    expect(() => meshStudy(runs, 'nu_hot', 2, false)).toThrow(/medium run medium\.log: nu_hot has not settled \(state converging: still moving\)/);
  });

  it('with --allow-unsettled uses the last value and says so', () => {
    const runs = celik();
    runs[1] = run('medium.log', 8000, { state: 'converging', reason: 'still moving', last: 5.972 });
    const study = meshStudy(runs, 'nu_hot', 2, true);
    expect(study.grids[1]).toMatchObject({ source: 'last value', value: 5.972, state: 'converging' });
    expect(study.notes.join(' ')).toMatch(/medium \(medium\.log\): nu_hot has not settled \(state converging\); its last value was used/);
    expect(renderMeshStudyText(study)).toMatch(/last value/);
  });

  it('uses the mean over whole periods of an oscillating quantity, and says so', () => {
    const runs = celik();
    runs[2] = run('coarse.log', 4500, { state: 'oscillating', mean: 5.863, halfWidth: 1e-4, period: 40 });
    const study = meshStudy(runs, 'nu_hot', 2, false);
    expect(study.grids[2].source).toBe('periodic mean');
    expect(study.notes.join(' ')).toMatch(/oscillates; its mean over whole periods was used/);
  });

  it.each([
    ['an unknown quantity (lists the known ones)', 'nu_cold', false, UsageError, /has no series named 'nu_cold'/],
    ['a residual', 'res_p', false, UsageError, /res_p is a residual series, not a monitored quantity/],
  ] as const)('refuses %s', (_label, quantity, allow, kind, message) => {
    expect(() => meshStudy(celik(), quantity, 2, allow)).toThrow(kind);
    expect(() => meshStudy(celik(), quantity, 2, allow)).toThrow(message);
  });

  it('lists the known quantities in the hint for an unknown one', () => {
    try {
      meshStudy(celik(), 'nu_cold', 2, false);
      throw new Error('no error');
    } catch (error) {
      expect((error as UsageError).hint).toBe('known quantities: nu_hot, dp');
    }
  });

  it('refuses a diverged run even with --allow-unsettled', () => {
    const runs = celik();
    runs[0] = run('fine.log', 18000, { state: 'diverging', last: Number.NaN });
    expect(() => meshStudy(runs, 'nu_hot', 2, true)).toThrow(/last value of nu_hot is NaN/);
  });

  it('reports a degenerate study (equal values) with its reason in text and JSON', () => {
    const study = meshStudy([run('f', 800, { mean: 2 }), run('m', 200, { mean: 2 }), run('c', 50, { mean: 2 })], 'nu_hot', 2, false);
    expect(study.gci.convergence).toBe('degenerate');
    expect(renderMeshStudyText(study)).toMatch(/degenerate: no estimate/);
    expect(meshStudyJson(study)).toMatchObject({ convergence: 'degenerate', reason: expect.stringMatching(/same value/) });
  });
});

describe('compare flag parsing', () => {
  it('reads --cells as whole numbers, fine to coarse (underscores allowed as digit separators)', () => {
    expect(parseCellCounts('18000, 8_000,4500', 3)).toEqual([18000, 8000, 4500]);
    expect(parseCellCounts('1e6,125000,15625', 3)).toEqual([1e6, 125000, 15625]);
  });

  it.each([
    ['18000,abc,4500', 3, /positive whole numbers.*'abc'/],
    ['18000,,4500', 3, /positive whole numbers/],
    ['18000,-8000,4500', 3, /positive whole numbers/],
    ['18000,8000.5,4500', 3, /positive whole numbers/],
    ['18000,8000', 3, /2 cell counts for 3 logs/],
    ['18000,8000,4500,100', 3, /4 cell counts for 3 logs/],
    ['4500,8000,18000', 3, /must decrease from fine to coarse/],
    ['8000,8000,4500', 3, /must decrease from fine to coarse/],
  ] as const)('refuses --cells %s', (text, logs, message) => {
    expect(() => parseCellCounts(text, logs)).toThrow(UsageError);
    expect(() => parseCellCounts(text, logs)).toThrow(message);
  });

  it.each([['2', 2], ['3', 3], [undefined, 3]] as const)('--dims %s gives %i', (text, d) => {
    expect(parseDimensions(text)).toBe(d);
  });

  it.each(['4', 'two', '', '2.5'])('refuses --dims %j', (text) => {
    expect(() => parseDimensions(text)).toThrow(/--dims must be 2 or 3/);
  });
});

import { describe, expect, it } from 'vitest';
import { DEFAULT_CRITERIA, type Criteria } from '../../src/analysis/criteria.js';
import { diagnoseRun } from '../../src/analysis/diagnose-run.js';
import { createRunJudge } from '../../src/analysis/run-judge.js';
import type { RunDiagnosis } from '../../src/analysis/diagnosis.js';
import { solvePoisson2d } from '../../src/model-problems/poisson-2d.js';
import { simulateHeatFtcs } from '../../src/model-problems/heat-ftcs-1d.js';
import { follow, kindsOf, recordsOf, seededNormal, storeOf, type SeriesSpec } from './run-fixtures.js';

const ALARMS = ['stalled', 'oscillating', 'diverging', 'failed'];
const residual = (name: string, values: readonly number[]): SeriesSpec => ({ name, kind: 'residual', values });
const quantity = (name: string, values: readonly number[]): SeriesSpec => ({ name, kind: 'quantity', values });
function once(series: SeriesSpec[], criteria: Criteria = DEFAULT_CRITERIA): RunDiagnosis {
  return diagnoseRun(storeOf(recordsOf(series), kindsOf(series)).snapshot(), criteria);
}

describe('residual rate against the 2-D Poisson model problem (Young 1971; Saad 2003 §4.2)', () => {
  // (1 − rho_estimated) / (1 − rho_theory) within 0.98–1.02 (issue 3); window 200 ending at it 1 200.
  it.each([
    ['jacobi', Math.cos(Math.PI / 32)],
    ['gauss-seidel', Math.cos(Math.PI / 32) ** 2],
  ] as const)('%s: estimated decay rate within 2 % of the theory', (method, rhoTheory) => {
    const h = solvePoisson2d({ n: 31, method, iterations: 1200 });
    const d = once([residual('res', h.map((x) => x.residualL2))], { ...DEFAULT_CRITERIA, drop: 12 });
    const ratio = (1 - d.series[0].rho!) / (1 - rhoTheory);
    expect(ratio).toBeGreaterThan(0.98);
    expect(ratio).toBeLessThan(1.02);
    expect(d.series[0].state).toBe('converging');
    expect(d.series[0].ordersPerKilo).toBeCloseTo(-1000 * Math.log10(rhoTheory), 0);
  });

  it('optimal SOR: decay rate within 10 % of ω_opt − 1 (approached slowly: Jordan block, Young 1971)', () => {
    const h = solvePoisson2d({ n: 31, method: 'sor', iterations: 150 });
    const d = once([residual('res', h.map((x) => x.residualL2))], { ...DEFAULT_CRITERIA, drop: 20, window: 60 });
    const rhoTheory = 2 / (1 + Math.sin(Math.PI / 32)) - 1;
    const ratio = (1 - d.series[0].rho!) / (1 - rhoTheory);
    expect(ratio).toBeGreaterThan(0.9);
    expect(ratio).toBeLessThan(1.02);
  });

  it('estimates the iterations left to the target from the rate: eta = (log target − log r) / slope, within 2 %', () => {
    const h = solvePoisson2d({ n: 31, method: 'jacobi', iterations: 1200 });
    const d = once([residual('res', h.map((x) => x.residualL2))], { ...DEFAULT_CRITERIA, target: 1e-8, drop: 20 });
    const expected = (Math.log10(1e-8) - Math.log10(h[1199].residualL2)) / Math.log10(Math.cos(Math.PI / 32));
    expect(d.series[0].eta! / expected).toBeCloseTo(1, 1);
    expect(d.advice).toMatch(/^keep going: about [\d ]+ iterations to the target at the current rate/);
  });

  it('Gauss–Seidel followed to 6 decades: never an alarm at any evaluation, converged and final at the end', () => {
    const h = solvePoisson2d({ n: 31, method: 'gauss-seidel', iterations: 1500 });
    const series = [residual('res_p', h.map((x) => x.residualL2)), residual('res_max', h.map((x) => x.residualMax))];
    const all = follow(recordsOf(series), kindsOf(series), DEFAULT_CRITERIA);
    for (const d of all) expect(ALARMS).not.toContain(d.verdict);
    const last = all[all.length - 1];
    expect(last.verdict).toBe('converged');
    expect(last.final).toBe(true);
    expect(last.advice).toMatch(/^stop: all residuals \d+(\.\d)? decades down$/);
  });
});

describe('explicit heat stepping (von Neumann: stable for d ≤ 1/2; Morton & Mayers 2005 §2.6)', () => {
  it('d = 0.6 is called diverging early, long before the values overflow', () => {
    const h = simulateHeatFtcs({ n: 50, diffusionNumber: 0.6, steps: 3000 });
    const overflowAt = h.findIndex((s) => !Number.isFinite(s.residual)) + 1;
    const series = [residual('res_T', h.map((s) => s.residual))];
    const all = follow(recordsOf(series), kindsOf(series), DEFAULT_CRITERIA);
    const first = all.find((d) => d.verdict === 'diverging' && d.final)!;
    expect(first).toBeDefined();
    expect(first.iterations).toBeLessThan(150);
    expect(first.iterations).toBeLessThan(overflowAt / 10);
    expect(first.advice).toMatch(/^stop now: res_T (grew [\d.]+ decades in [\d ]+ iterations|rising steadily)/);
  });

  it('d = 0.4 is converging, then converged, and never an alarm', () => {
    const h = simulateHeatFtcs({ n: 30, diffusionNumber: 0.4, steps: 4000 });
    const series = [residual('res_T', h.map((s) => s.residual))];
    const all = follow(recordsOf(series), kindsOf(series), DEFAULT_CRITERIA);
    for (const d of all) expect(ALARMS).not.toContain(d.verdict);
    expect(all.some((d) => d.verdict === 'converging')).toBe(true);
    expect(all[all.length - 1].verdict).toBe('converged');
  });
});

describe('false-alarm guards and robustness', () => {
  const geometric = (n: number, rho: number, start = 1) => Array.from({ length: n }, (_, k) => start * rho ** k);

  it('a single spike of 5 decades is not divergence', () => {
    const values = geometric(600, 0.995);
    values[400] = 10;
    const series = [residual('res', values)];
    for (const d of follow(recordsOf(series), kindsOf(series), { ...DEFAULT_CRITERIA, drop: 6 })) expect(ALARMS).not.toContain(d.verdict);
  });

  it('a brief bump (8 iterations, 2 decades) is not divergence while followed', () => {
    const values = geometric(800, 0.99);
    for (let k = 500; k < 508; k++) values[k] *= 100;
    const series = [residual('res', values)];
    for (const d of follow(recordsOf(series), kindsOf(series), { ...DEFAULT_CRITERIA, drop: 6 })) expect(ALARMS).not.toContain(d.verdict);
  });

  it('residuals that reach exactly zero or underflow count as converged, not failed', () => {
    const values = geometric(300, 0.5).map((v) => (v < 1e-200 ? 0 : v));
    values.push(5e-324, 0, 0);
    const d = once([residual('res', values)]);
    expect(d.series[0].state).toBe('converged');
    expect(d.verdict).toBe('converged');
  });

  it('a NaN makes the run failed at once, naming the iteration', () => {
    const values = geometric(100, 0.99);
    values[70] = Number.NaN;
    const d = once([residual('res_p', values)]);
    expect(d.verdict).toBe('failed');
    expect(d.series[0].reason).toBe('res_p became NaN at it 71');
    expect(d.final).toBe(true);
  });

  it('a crash line marked by the parser makes the run failed', () => {
    const records = recordsOf([residual('res', geometric(50, 0.99))], (i) => (i === 49 ? { failure: 'FATAL: solver error' } : {}));
    const d = diagnoseRun(storeOf(records, { res: 'residual' }).snapshot(), DEFAULT_CRITERIA);
    expect(d.verdict).toBe('failed');
    expect(d.advice).toContain('FATAL: solver error');
  });

  it('start-up iterations are not judged', () => {
    const d = once([residual('res', [1, 10, 1e4, 1e6, 1e8])]);
    expect(d.verdict).toBe('undecided');
    expect(d.advice).toMatch(/^wait: /);
  });

  it('judges from the last restart on: a diverged first attempt does not doom the restarted run', () => {
    const first = Array.from({ length: 300 }, (_, k) => 1e-3 * 1.05 ** k); // blew up
    const second = geometric(600, 0.98);
    const records = [
      ...recordsOf([residual('res', first)]),
      ...recordsOf([residual('res', second)]).map((r, i) => ({ ...r, restart: i === 0 })),
    ];
    const d = diagnoseRun(storeOf(records, { res: 'residual' }).snapshot(), DEFAULT_CRITERIA);
    expect(d.verdict).toBe('converged');
    expect(d.series[0].dropDecades).toBeCloseTo(597 * -Math.log10(0.98), 6); // from the new segment's first value to the median of the last five
  });

  it('a flat noisy residual is stalled; a cycle without decay is oscillating with its period', () => {
    const normal = seededNormal(5);
    const flat = Array.from({ length: 1000 }, (_, k) => (k < 100 ? 0.99 ** k : 0.99 ** 100) * 10 ** (0.05 * normal()));
    const stalled = once([residual('res_p', flat)]);
    expect(stalled.verdict).toBe('stalled');
    // Levels between 0.001 and 10 000 print plainly (0.36, not 3.6e-1).
    expect(stalled.advice).toMatch(/^stop: res_p flat at 0\.\d\d? for [\d ]+ iterations/);
    const cycling = Array.from({ length: 1000 }, (_, k) => 1e-2 * 10 ** (0.5 * Math.sin((2 * Math.PI * k) / 50)));
    const oscillating = once([residual('res_p', cycling)]);
    expect(oscillating.verdict).toBe('oscillating');
    expect(oscillating.series[0].period! / 50).toBeCloseTo(1, 1);
    expect(oscillating.series[0].amplitudeDecades!).toBeCloseTo(0.5, 1);
  });

  it('shows an alarm only after criteria.confirm evaluations, and a timeline text for it', () => {
    const normal = seededNormal(6);
    const values = Array.from({ length: 2000 }, (_, k) => (k < 100 ? 0.98 ** k : 0.98 ** 100) * 10 ** (0.05 * normal()));
    const all = follow(recordsOf([residual('res_p', values)]), { res_p: 'residual' }, DEFAULT_CRITERIA);
    const firstStalled = all.findIndex((d) => d.verdict === 'stalled');
    expect(firstStalled).toBeGreaterThan(0);
    expect(all[firstStalled - 1].reasons.join(' ')).toMatch(/looks stalled; confirming, 2 of 3 checks/);
    expect(all[firstStalled].timeline.map((t) => t.text)).toContainEqual(expect.stringMatching(/^it [\d ]+: res_p stalled at 0\.\d\d?$/));
  });
});

describe('quantities', () => {
  it('a settled quantity reports its mean and interval; the advice names it', () => {
    const normal = seededNormal(9);
    const h = solvePoisson2d({ n: 31, method: 'gauss-seidel', iterations: 1500 });
    const d = once([residual('res_p', h.map((x) => x.residualL2)),
      quantity('drag', h.map((_, k) => 0.3312 + 0.05 * Math.exp(-k / 40) + 0.0005 * normal()))]);
    expect(d.verdict).toBe('converged');
    const drag = d.series[1];
    expect(Math.abs(drag.mean! - 0.3312)).toBeLessThan(drag.halfWidth! * 3);
    expect(d.advice).toMatch(/^stop: res_p [\d.]+ decades down and drag settled at 0\.33\d+ ± 0\.0+\d+ for [\d ]+ iterations$/);
  });

  it('a quantity approaching its limit geometrically is converging, with the Ferziger & Perić error estimate', () => {
    const values = Array.from({ length: 400 }, (_, k) => 2 + 0.5 * 0.99 ** k);
    const d = once([quantity('lift', values)]);
    expect(d.series[0].state).toBe('converging');
    expect(d.series[0].limit!).toBeCloseTo(2, 8);
    expect(d.series[0].iterationError!).toBeCloseTo(2 - values[399], 8);
  });

  it('a quantity cycling in a steady run is oscillating, with its period and mean over whole periods', () => {
    const values = Array.from({ length: 1200 }, (_, k) => 1 + 0.05 * Math.sin((2 * Math.PI * k) / 80));
    const d = once([quantity('dp', values)]);
    expect(d.series[0].state).toBe('oscillating');
    expect(d.series[0].period! / 80).toBeCloseTo(1, 1);
    expect(d.series[0].mean!).toBeCloseTo(1, 3);
    expect(d.series[0].amplitudeRelative!).toBeCloseTo(0.05, 2);
  });
});

describe('criteria', () => {
  const stalledSeries = Array.from({ length: 800 }, (_, k) => 10 ** (-1 - 0.0005 * Math.min(k, 100)));
  const good = Array.from({ length: 800 }, (_, k) => 0.98 ** k);

  it('--series globs restrict which series count; perSeries can ignore one', () => {
    const series = [residual('res_p', good), residual('res_k', stalledSeries)];
    expect(once(series).verdict).toBe('stalled');
    expect(once(series, { ...DEFAULT_CRITERIA, series: ['res_p'] }).verdict).toBe('converged');
    expect(once(series, { ...DEFAULT_CRITERIA, perSeries: [{ pattern: 'res_?', ignore: true }, { pattern: 'res_p', ignore: false }] }).verdict).toBe('converged');
  });

  it('perSeries drop overrides the run-wide drop for matching series', () => {
    const d = once([residual('res_T', good)], { ...DEFAULT_CRITERIA, perSeries: [{ pattern: 'res_*', drop: 20 }] });
    expect(d.verdict).toBe('converging');
    expect(d.criteria[0].description).toBe('res_T down 20 decades from peak');
  });

  it.each([
    [{ drop: 0 }], [{ qoiTol: -1 }], [{ window: 0 }], [{ window: 2.5 }], [{ startup: -1 }], [{ confirm: 0 }], [{ target: 0 }],
    [{ perSeries: [{ pattern: '' }] }],
  ])('createRunJudge refuses invalid criteria %o', (override) => {
    expect(() => createRunJudge({ ...DEFAULT_CRITERIA, ...override } as Criteria)).toThrow(/invalid criteria/);
  });
});

describe('incremental and one-shot', () => {
  const h = solvePoisson2d({ n: 15, method: 'jacobi', iterations: 900 });
  const normal = seededNormal(3);
  const series = [residual('res', h.map((x) => x.residualL2)), quantity('q', h.map(() => 1 + 0.001 * normal()))];
  const records = recordsOf(series);

  it('the followed verdict at the end equals the one-shot diagnosis of the same data', () => {
    const all = follow(records, kindsOf(series), DEFAULT_CRITERIA);
    const last = all[all.length - 1];
    const one = diagnoseRun(storeOf(records, kindsOf(series)).snapshot(), DEFAULT_CRITERIA);
    expect(last.verdict).toBe(one.verdict);
    expect(last.series.map((s) => s.state)).toEqual(one.series.map((s) => s.state));
    expect(last.series[0].rho).toBe(one.series[0].rho);
    expect(last.series[1].mean).toBe(one.series[1].mean);
  });

  it('peek changes no state: update after peeks equals update alone', () => {
    const a = storeOf(records.slice(0, 400), kindsOf(series));
    const judgeA = createRunJudge(DEFAULT_CRITERIA);
    const judgeB = createRunJudge(DEFAULT_CRITERIA);
    judgeA.peek(a.snapshot());
    judgeA.peek(a.snapshot());
    expect(judgeA.update(a.snapshot())).toEqual(judgeB.update(a.snapshot()));
  });

  it('does not modify the snapshot it reads', () => {
    const store = storeOf(records, kindsOf(series));
    const snapshot = store.snapshot();
    const before = snapshot.series.map((c) => [Array.from(c.iterations.subarray(0, c.length)), Array.from(c.values.subarray(0, c.length))]);
    diagnoseRun(snapshot, DEFAULT_CRITERIA);
    createRunJudge(DEFAULT_CRITERIA).update(snapshot);
    const after = snapshot.series.map((c) => [Array.from(c.iterations.subarray(0, c.length)), Array.from(c.values.subarray(0, c.length))]);
    expect(after).toEqual(before);
    expect(snapshot.records).toBe(900);
  });

  it('gives the same diagnoses when the history is thinned by a small store (bounded memory)', () => {
    const small = follow(records, kindsOf(series), DEFAULT_CRITERIA, 256);
    expect(['converging', 'converged']).toContain(small[small.length - 1].verdict);
  });
});

describe('transient runs', () => {
  it('judges inner convergence per time step, and a periodic quantity over physical time is not a fault', () => {
    const records = [];
    let iteration = 0;
    for (let step = 1; step <= 200; step++) {
      for (let inner = 1; inner <= 12; inner++) {
        iteration++;
        const values = new Map<string, number>([['res_p', 0.5 ** inner], ['lift', 0.2 * Math.sin((2 * Math.PI * step) / 25) + 1e-4 * inner]]);
        records.push({ iteration, timeStep: step, inner, time: step * 0.01, values });
      }
    }
    const d = diagnoseRun(storeOf(records, { res_p: 'residual', lift: 'quantity' }).snapshot(), DEFAULT_CRITERIA);
    expect(d.series[0].state).toBe('converged'); // 11 halvings = 3.3 decades per step
    expect(d.series[1].state).not.toBe('oscillating');
    expect(ALARMS).not.toContain(d.verdict);
  });
});

describe('negligible remaining change, periodic transients, restarts (lead review of the sample logs)', () => {
  const geometric = (n: number, rho: number, start = 1) => Array.from({ length: n }, (_, k) => start * rho ** k);
  it('a quantity approaching its limit geometrically, printed with 7 digits, settles once the tail is negligible (Ferziger & Perić 2002 §5.7; methods.md common practice 0.1 %)', () => {
    // limit 2.4883 reached as 0.99^k: after 1500 iterations the change left is 2.4e-7, far below 1e-3 relative
    const values = Array.from({ length: 1500 }, (_, k) => Number((2.4883 + 0.3 * 0.99 ** k).toPrecision(7)));
    const d = once([quantity('nu_hot', values)]);
    expect(d.series[0].state).toBe('converged');
    expect(Math.abs(d.series[0].mean! - 2.4883)).toBeLessThan(1e-5);
    expect(d.series[0].halfWidth!).toBeGreaterThan(0);
    expect(d.series[0].reason).toMatch(/^nu_hot settled at 2\.48830/);
    expect(d.advice).toMatch(/^stop: nu_hot settled at 2\.48830\d* ± 0\.0+\d+$/);
  });

  it('a linear drift of 0.05 % per 200 iterations is not settled by the change rule (no decay, unbounded tail)', () => {
    const values = Array.from({ length: 1500 }, (_, k) => 1 + 2.5e-6 * k);
    expect(once([quantity('q', values)]).series[0].state).toBe('converging');
  });

  it('transient: a cycle around a mean near zero is settled by its period-to-period stability, not a relative half-width', () => {
    const records = [];
    let iteration = 0;
    for (let step = 1; step <= 250; step++) {
      for (let inner = 1; inner <= 8; inner++) {
        iteration++;
        const t = step * 0.005;
        // start-up decaying over 0.1 time units, then a cycle of period 0.25 (50 steps) around 0.003
        const mid = 0.003 + 0.08 * Math.sin((2 * Math.PI * t) / 0.25) * (1 - Math.exp(-t / 0.1));
        records.push({ iteration, timeStep: step, inner, time: t, values: new Map([['res_T', 0.3 ** inner], ['t_mid', mid]]) });
      }
    }
    const d = diagnoseRun(storeOf(records, { res_T: 'residual', t_mid: 'quantity' }).snapshot(), DEFAULT_CRITERIA);
    const tMid = d.series[1];
    expect(tMid.state).toBe('converged');
    expect(tMid.period! / (50 * 8)).toBeCloseTo(1, 1); // 50 steps of 8 inner iterations
    expect(Math.abs(tMid.mean! - 0.003)).toBeLessThan(1e-3);
    expect(d.verdict).toBe('converged');
  });

  it('transient: a cycle whose amplitude still grows by 5 % per period is converging', () => {
    const records = [];
    for (let step = 1; step <= 250; step++) {
      const amplitude = 0.08 * 1.05 ** (step / 50);
      records.push({ iteration: step, timeStep: step, inner: 1, time: step, values: new Map([['q', amplitude * Math.sin((2 * Math.PI * step) / 50)]]) });
    }
    const d = diagnoseRun(storeOf(records, { q: 'quantity' }).snapshot(), DEFAULT_CRITERIA);
    expect(d.series[0].state).toBe('converging');
    expect(d.series[0].reason).toMatch(/periodic every 50 time steps/);
  });

  it('a run resumed from a checkpoint keeps the run\'s peak as the reference for the drop', () => {
    const full = geometric(900, 0.985);
    // stopped at 600, resumed from the checkpoint at 400: the counter goes back, values carry on
    const records = [
      ...recordsOf([residual('res', full.slice(0, 600))]),
      ...recordsOf([residual('res', full.slice(400))]).map((r, i) => ({ ...r, iteration: 401 + i, restart: i === 0 })),
    ];
    const d = diagnoseRun(storeOf(records, { res: 'residual' }).snapshot(), DEFAULT_CRITERIA);
    expect(d.series[0].dropDecades!).toBeGreaterThan(5); // from the value at iteration 1, not at 401
    expect(d.verdict).toBe('converged');
  });

  it('a residual blowing up in its newest values is not "below its peak"', () => {
    const values = [...geometric(80, 0.98), 10, 1e3, 1e5, 1e8, 1e13];
    const d = once([residual('res', values)]);
    expect(d.series[0].state).toBe('diverging');
  });
});

import { describe, expect, it } from 'vitest';
import { buildOverviewModel, commonFolder, overviewOrder, worstResidual } from '../../src/ui/build-overview-model.js';
import type { RunSummary } from '../../src/ui/build-overview-model.js';
import { initialViewState } from '../../src/ui/view-state.js';
import { SeriesStore } from '../../src/series/series-store.js';
import type { State } from '../../src/analysis/diagnosis.js';
import { pace, runDiagnosis, steadyStore } from './run-fixture.js';

const summary = (label: string, verdict: State, records = 10, lastGrowthAt = 0): RunSummary => ({
  label,
  diagnosis: runDiagnosis({ verdict }),
  snapshot: records > 0 ? steadyStore(records).snapshot() : new SeriesStore().snapshot(),
  pace: pace({ lastGrowthAt }),
});

describe('overview of runs', () => {
  it('sorts worst verdict first (severity order of the diagnosis contract), runs without records last, ties as given', () => {
    const runs = [summary('a', 'converged'), summary('b', 'diverging'), summary('c', 'stalled'), summary('d', 'converging', 0), summary('e', 'stalled')];
    expect(overviewOrder(runs)).toEqual([1, 2, 4, 0, 3]);
  });

  it('builds rows with verdict, iteration, worst residual and last growth, and a title that counts verdicts', () => {
    const runs = [summary('a.log', 'converged', 1001, 0), summary('b.log', 'diverging', 10, 50_000)];
    const model = buildOverviewModel(runs, initialViewState(2), { cols: 100, rows: 30 }, 60_000);
    expect(model.rows.map((row) => row.label)).toEqual(['b.log', 'a.log']);
    expect(model.rows[0]).toMatchObject({ verdict: 'diverging', iteration: '10', lastGrowth: '10 s ago', stale: false, cursor: true });
    expect(model.rows[1]).toMatchObject({ verdict: 'converged', iteration: '1 001', lastGrowth: '1 min ago', stale: true, cursor: false });
    expect(model.title).toBe('2 runs: 1 diverging, 1 converged');
    // A cursor the person moved stays on its run whatever the order.
    const chosen = buildOverviewModel(runs, { ...initialViewState(2), runIndex: 0, runChosen: true }, { cols: 100, rows: 30 }, 60_000);
    expect(chosen.rows.map((row) => row.cursor)).toEqual([false, true]);
  });

  it('calls the residual with the largest last value the worst, a non-finite one worst of all', () => {
    // Fixture at k = 1000: res_p = 1e-3, res_u = 0.5e-2 = 5e-3, res_T = 1e-4.
    expect(worstResidual(steadyStore(1001).snapshot())).toBe('res_u 5e-3');
    const store = new SeriesStore();
    store.add({ iteration: 1, values: new Map([['res_p', 1e-3], ['res_T', Number.NaN]]) }, (name) => ({ name, kind: 'residual' }));
    expect(worstResidual(store.snapshot())).toBe('res_T NaN');
    expect(worstResidual(new SeriesStore().snapshot())).toBe('');
  });
});

describe('commonFolder', () => {
  it.each([
    [['sample-logs/a.log', 'sample-logs/b.csv'], 'sample-logs/'],
    [['/runs/wing/a/run.log', '/runs/wing/b/run.log'], '/runs/wing/'],
    [['/runs/wing-a/run.log', '/runs/wing-b/run.log'], '/runs/'],
    [['a.log', 'b.log'], ''],
    [['x/a.log'], ''],
    [['x/a.log', 'y/a.log'], ''],
    [['/a/x.log', 'b.log'], ''],
    [['/a/x.log', '/b/y.log'], '/'],
  ])('of %j is %j (whole path parts only)', (labels, expected) => {
    expect(commonFolder(labels)).toBe(expected);
  });

  it('names runs inside the shared folder and the folder in the title, while it fits', () => {
    const runs = [summary('case/a.log', 'converged'), summary('case/b.log', 'diverging')];
    const wide = buildOverviewModel(runs, initialViewState(2), { cols: 100, rows: 30 }, 0);
    expect(wide.rows.map((row) => row.label)).toEqual(['b.log', 'a.log']);
    expect(wide.title).toBe('2 runs in case/: 1 diverging, 1 converged');
    // 41 characters do not fit 36 columns: the folder goes first, then the count.
    expect(buildOverviewModel(runs, initialViewState(2), { cols: 36, rows: 30 }, 0).title).toBe('2 runs: 1 diverging, 1 converged');
    expect(buildOverviewModel(runs, initialViewState(2), { cols: 30, rows: 30 }, 0).title).toBe('1 diverging, 1 converged');
  });
});

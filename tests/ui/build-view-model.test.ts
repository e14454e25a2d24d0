import { describe, expect, it } from 'vitest';
import { buildViewModel, chartedQuantities, tableOrder, withoutLeadingName } from '../../src/ui/build-view-model.js';
import type { RunContext } from '../../src/ui/build-view-model.js';
import { initialViewState } from '../../src/ui/view-state.js';
import type { ViewState } from '../../src/ui/view-state.js';
import { SeriesStore } from '../../src/series/series-store.js';
import { change, pace, runDiagnosis, seriesDiagnosis, steadyStore } from './run-fixture.js';

const context: RunContext = { label: 'case/run.log', parser: 'settle-kv', runCount: 1 };
const size = { cols: 120, rows: 40 };
const view = (changes: Partial<ViewState> = {}): ViewState => ({ ...initialViewState(1), ...changes });

describe('buildViewModel: header', () => {
  it('names the file and parser, and gives the iteration with grouped digits, the pace and the age of the last growth', () => {
    const store = steadyStore(4210);
    const model = buildViewModel(runDiagnosis(), store.snapshot(), view(), pace({ linesPerSecond: 312.4, lastGrowthAt: 10_000 }), size, 14_000, context);
    expect(model.header.file).toBe('case/run.log');
    expect(model.header.parser).toBe('settle-kv');
    expect(model.header.position).toBe('iteration 4 210');
    expect(model.header.pace).toBe('312 lines/s');
    expect(model.header.growth).toBe('grew 4 s ago');
    expect(model.header.stale).toBe(false);
  });

  it('flags a log that has not grown for more than 30 s (a run that stopped writing)', () => {
    const store = steadyStore(10);
    const model = buildViewModel(runDiagnosis(), store.snapshot(), view(), pace({ lastGrowthAt: 0 }), size, 31_000, context);
    expect(model.header.stale).toBe(true);
    expect(model.header.growth).toBe('grew 31 s ago');
  });

  it('gives the time step and physical time of a transient run', () => {
    const store = new SeriesStore();
    const info = (name: string) => ({ name, kind: 'residual' as const });
    let iteration = 0;
    for (let step = 1; step <= 12; step++) {
      for (let inner = 1; inner <= 3; inner++) store.add({ iteration: ++iteration, timeStep: step, inner, time: step * 0.01, values: new Map([['res_p', 10 ** -inner]]) }, info);
    }
    const model = buildViewModel(runDiagnosis(), store.snapshot(), view(), pace(), size, 0, context);
    expect(model.header.position).toBe('time step 12 · t 0.1200 · iteration 36');
  });

  it('says when it is paused and when it shows only recent iterations', () => {
    const store = steadyStore(10);
    const model = buildViewModel(runDiagnosis(), store.snapshot(), view({ paused: true, span: 'recent', recentIterations: 500 }), pace(), size, 0, context);
    expect(model.header.paused).toBe(true);
    expect(model.header.span).toBe('last 500 it');
  });
});

describe('buildViewModel: verdict', () => {
  it('waits for data before the first record, with the source news as advice', () => {
    const model = buildViewModel(runDiagnosis(), new SeriesStore().snapshot(), view(), pace(), size, 0, { ...context, parser: undefined, note: 'waiting for case/run.log to appear' });
    expect(model.verdict.state).toBeNull();
    expect(model.verdict.headline).toBe('WAITING FOR DATA');
    expect(model.verdict.advice).toBe('waiting for case/run.log to appear');
    expect(model.header.parser).toBe('detecting format');
    expect(model.header.position).toBe('no records yet');
  });

  it('shows the verdict in capitals, confirmed when final, with the advice and the unmet criteria', () => {
    const diagnosis = runDiagnosis({
      verdict: 'stalled',
      final: true,
      advice: 'stop: the residuals have stopped falling',
      reasons: ['res_p flat for 600 iterations'],
      criteria: [
        { description: 'res_p down 3 decades from peak', met: false, detail: '1.2 of 3 decades' },
        { description: 'res_u down 3 decades from peak', met: true, detail: '3.4 of 3 decades' },
      ],
    });
    const model = buildViewModel(diagnosis, steadyStore(100).snapshot(), view(), pace(), size, 0, context);
    expect(model.verdict.state).toBe('stalled');
    expect(model.verdict.headline).toBe('STALLED (confirmed)');
    expect(model.verdict.advice).toBe('stop: the residuals have stopped falling');
    expect(model.verdict.details).toBe('res_p flat for 600 iterations; res_p down 3 decades from peak: 1.2 of 3 decades');
  });

  it('shows the crash line of a failed run', () => {
    const store = new SeriesStore();
    store.add({ iteration: 1, values: new Map([['res_p', 1]]), failure: 'FATAL: negative volume in cell 7' }, (name) => ({ name, kind: 'residual' }));
    const model = buildViewModel(runDiagnosis({ verdict: 'failed', reasons: [] }), store.snapshot(), view(), pace(), size, 0, context);
    expect(model.verdict.details).toContain('crash line: FATAL: negative volume in cell 7');
  });
});

describe('buildViewModel: series table', () => {
  const diagnosis = runDiagnosis({
    series: [
      seriesDiagnosis('res_p', { last: 2.13e-4, ordersPerKilo: 3, eta: 1234, target: 1e-6 }),
      seriesDiagnosis('res_u', { state: 'converged', last: 1e-7, ordersPerKilo: 2 }),
      seriesDiagnosis('res_T', { state: 'oscillating', last: 3e-3, period: 48, amplitudeDecades: 0.4 }),
      seriesDiagnosis('nu_hot', { state: 'converged', last: 4.519, mean: 4.5191, halfWidth: 0.0021, settledFrom: 300 }),
      seriesDiagnosis('dp', { state: 'converging', last: 120.5, iterationError: 0.034 }),
    ],
  });
  const build = (p = pace()) => buildViewModel(diagnosis, steadyStore(900).snapshot(), view(), p, size, 0, context);

  it('lists residuals first, then quantities, then the rest, each in log order', () => {
    expect(build().rows.map((row) => row.name)).toEqual(['res_p', 'res_u', 'res_T', 'nu_hot', 'dp', 'cfl']);
    expect(tableOrder(steadyStore(3).snapshot()).map((c) => c.info.name)).toEqual(['res_p', 'res_u', 'res_T', 'nu_hot', 'dp', 'cfl']);
    expect(chartedQuantities(steadyStore(3).snapshot()).map((c) => c.info.name)).toEqual(['nu_hot', 'dp', 'cfl']);
  });

  it('gives the rate as the change in decades per 1000 iterations (falling is negative), or the period of a cycle', () => {
    const rows = build().rows;
    expect(rows[0].trend).toBe('-3.0/1k');
    expect(rows[1].trend).toBe('-2.0/1k');
    expect(rows[2].trend).toBe('period 48');
    expect(rows[4].trend).toBe('err 0.034');
  });

  it('gives iterations left and, from the observed pace, wall-clock time left', () => {
    const rows = build(pace({ iterationsPerSecond: 2 })).rows;
    expect(rows[0].etaIterations).toBe('~1234');
    expect(rows[0].etaTime).toBe('10 min'); // 1234 it / 2 it/s = 617 s
    expect(rows[1].etaIterations).toBe('reached');
    expect(build().rows[0].etaTime).toBe(''); // no pace yet: no time
  });

  it('gives the settled mean with its 95 % half-width', () => {
    expect(build().rows[3].settled).toBe('4.5191 ±0.0021');
    expect(build().rows[4].settled).toBe('');
  });

  it('shows residuals in scientific notation and quantities in five digits; carried series are not judged', () => {
    const rows = build().rows;
    expect(rows[0].last).toBe('2.13e-4');
    expect(rows[3].last).toBe('4.5190');
    expect(rows[5].stateText).toBe('not judged');
    expect(rows[0].stateText).toBe('converging');
  });

  it('marks the cursor row and hidden series', () => {
    const model = buildViewModel(diagnosis, steadyStore(10).snapshot(), view({ seriesCursor: 2, hidden: new Set(['res_u']) }), pace(), size, 0, context);
    expect(model.rows.map((row) => row.cursor)).toEqual([false, false, true, false, false, false]);
    expect(model.rows[1].hidden).toBe(true);
  });
});

describe('buildViewModel: residual chart', () => {
  it('plots log10 of each residual, with whole decades as bounds and powers of ten as labels', () => {
    const model = buildViewModel(runDiagnosis(), steadyStore(1001).snapshot(), view(), pace(), size, 0, context);
    const chart = model.residuals;
    expect(chart.lines.map((line) => line.name)).toEqual(['res_p', 'res_u', 'res_T']);
    // res_p = 10^(-0.003 k): at k = 0 log10 = 0; res_T at k = 1000 is 10^-4 (fixture definition).
    expect(chart.lines[0].y[0]).toBeCloseTo(0, 12);
    expect(chart.lines[2].y[chart.lines[2].y.length - 1]).toBeCloseTo(-4, 12);
    expect(chart.yMax).toBe(0);
    expect(chart.yMin).toBe(-4);
    expect(chart.yTicks.map((tick) => tick.label)).toEqual(['1e-4', '1e-3', '1e-2', '1e-1', '1e0']);
    expect(chart.xMin).toBe(1);
    expect(chart.xMax).toBe(1001);
  });

  it('downsamples a long history to about two points per braille column', () => {
    const model = buildViewModel(runDiagnosis(), steadyStore(50_000).snapshot(), view(), pace(), size, 0, context);
    const plotCols = model.layout.residuals.width - 2 - 6;
    for (const line of model.residuals.lines) {
      expect(line.x.length).toBeLessThanOrEqual(2 * plotCols);
      expect(line.x[0]).toBe(1);
      expect(line.x[line.x.length - 1]).toBe(50_000);
    }
  });

  it('after a restart that set the counter back, shows each iteration once, with its latest value', () => {
    const store = new SeriesStore();
    const info = (name: string) => ({ name, kind: 'residual' as const });
    for (let i = 1; i <= 300; i++) store.add({ iteration: i, values: new Map([['res_p', 1]]) }, info);
    for (let i = 201; i <= 400; i++) store.add({ iteration: i, values: new Map([['res_p', 0.01]]), restart: i === 201 }, info);
    // A wide terminal keeps every one of the 400 points (threshold 2 × plot columns > 400).
    const line = buildViewModel(runDiagnosis(), store.snapshot(), view(), pace(), { cols: 400, rows: 40 }, 0, context).residuals.lines[0];
    expect(line.x).toEqual(Array.from({ length: 400 }, (_, i) => i + 1));
    expect(line.y.slice(0, 200).every((y) => y === 0)).toBe(true);
    expect(line.y.slice(200).every((y) => Math.abs(y + 2) < 1e-12)).toBe(true);
    expect(buildViewModel(runDiagnosis(), store.snapshot(), view(), pace(), size, 0, context).residuals.restarts).toEqual([201]);
  });

  it('maps zero, negative and non-finite residuals to NaN (gaps), never to ±Infinity', () => {
    const store = new SeriesStore();
    const values = [1, 0.1, 0, -1, Number.POSITIVE_INFINITY, Number.NaN, 0.01];
    values.forEach((value, i) => store.add({ iteration: i + 1, values: new Map([['res_p', value]]) }, (name) => ({ name, kind: 'residual' })));
    const line = buildViewModel(runDiagnosis(), store.snapshot(), view(), pace(), size, 0, context).residuals.lines[0];
    expect(line.y.slice(0, 2)).toEqual([0, -1]);
    expect(line.y.slice(2, 6).every((y) => Number.isNaN(y))).toBe(true);
    expect(line.y[6]).toBeCloseTo(-2, 12);
  });

  it('draws the target each residual is held to, and widens the axis to show it', () => {
    const diagnosis = runDiagnosis({ series: [seriesDiagnosis('res_p', { target: 1e-6 }), seriesDiagnosis('res_u', { target: 1e-6 })] });
    const chart = buildViewModel(diagnosis, steadyStore(100).snapshot(), view(), pace(), size, 0, context).residuals;
    expect(chart.levels).toEqual([{ y: -6, kind: 'target', label: 'target 1e-6' }]);
    expect(chart.yMin).toBe(-6);
  });

  it('draws no target for a residual that is blowing up (a level derived from its peak would chase it)', () => {
    const diagnosis = runDiagnosis({ series: [
      seriesDiagnosis('res_p', { state: 'diverging', target: 3.6e10 }),
      seriesDiagnosis('res_u', { state: 'converging', target: 1e-6 }),
    ] });
    const chart = buildViewModel(diagnosis, steadyStore(100).snapshot(), view(), pace(), size, 0, context).residuals;
    expect(chart.levels).toEqual([{ y: -6, kind: 'target', label: 'target 1e-6' }]);
  });

  it('shows only the last N iterations in the recent span', () => {
    const chart = buildViewModel(runDiagnosis(), steadyStore(5000).snapshot(), view({ span: 'recent', recentIterations: 1000 }), pace(), size, 0, context).residuals;
    expect(chart.xMin).toBe(4000);
    expect(chart.xMax).toBe(5000);
    for (const line of chart.lines) expect(Math.min(...line.x)).toBeGreaterThanOrEqual(4000);
  });

  it('leaves hidden series out of the chart and counts them', () => {
    const chart = buildViewModel(runDiagnosis(), steadyStore(10).snapshot(), view({ hidden: new Set(['res_u']) }), pace(), size, 0, context).residuals;
    expect(chart.legend.map((entry) => entry.name)).toEqual(['res_p', 'res_T']);
    expect(chart.hiddenCount).toBe(1);
    const allHidden = buildViewModel(runDiagnosis(), steadyStore(10).snapshot(), view({ hidden: new Set(['res_p', 'res_u', 'res_T']) }), pace(), size, 0, context).residuals;
    expect(allHidden.empty).toBe('every residual is hidden (a: show all)');
  });

  it('says so when a log has no residuals', () => {
    const store = new SeriesStore();
    store.add({ iteration: 1, values: new Map([['lift', 0.3]]) }, (name) => ({ name, kind: 'quantity' }));
    expect(buildViewModel(runDiagnosis(), store.snapshot(), view(), pace(), size, 0, context).residuals.empty).toBe('no residuals in this log');
  });
});

describe('buildViewModel: quantity chart', () => {
  const diagnosis = runDiagnosis({ series: [seriesDiagnosis('nu_hot', { state: 'converged', mean: 4.519, halfWidth: 0.002, settledFrom: 300 })] });

  it('shows the selected quantity with its settled mean and 95 % band from the truncation point', () => {
    const chart = buildViewModel(diagnosis, steadyStore(900).snapshot(), view(), pace(), size, 0, context).quantity;
    expect(chart.title).toBe('nu_hot · 1 of 3');
    expect(chart.levels).toEqual([
      { y: 4.519, kind: 'mean', fromX: 300, label: 'mean 4.5190' },
      { y: 4.517, kind: 'band', fromX: 300, label: '95 %' },
      { y: 4.521, kind: 'band', fromX: 300, label: '95 %' },
    ].map((level) => ({ ...level, y: expect.closeTo(level.y, 12) as unknown as number })));
    expect(chart.yMin).toBeLessThan(1.019 + 1e-9); // nu_hot starts at 4.519 − 3.5 (fixture)
    expect(chart.yMax).toBeGreaterThan(4.521);
  });

  it('steps through quantities, wrapping both ways, and gives the unit', () => {
    const snapshot = steadyStore(10).snapshot();
    expect(buildViewModel(diagnosis, snapshot, view({ quantityIndex: 1 }), pace(), size, 0, context).quantity.title).toBe('dp [Pa] · 2 of 3');
    expect(buildViewModel(diagnosis, snapshot, view({ quantityIndex: 3 }), pace(), size, 0, context).quantity.title).toBe('nu_hot · 1 of 3');
    expect(buildViewModel(diagnosis, snapshot, view({ quantityIndex: -1 }), pace(), size, 0, context).quantity.title).toBe('cfl · 3 of 3');
  });

  it('gives a flat quantity a visible, non-empty range', () => {
    const chart = buildViewModel(diagnosis, steadyStore(10).snapshot(), view({ quantityIndex: 2 }), pace(), size, 0, context).quantity;
    expect(chart.yMax).toBeGreaterThan(chart.yMin);
    expect(chart.empty).toBeUndefined();
  });
});

describe('buildViewModel: timeline and the rest', () => {
  it('lists state changes newest first, coloured by the state reached', () => {
    const diagnosis = runDiagnosis({ timeline: [change(210, 'res_p', 'undecided', 'converging'), change(4210, 'res_p', 'converging', 'stalled')] });
    const model = buildViewModel(diagnosis, steadyStore(10).snapshot(), view(), pace(), size, 0, context);
    expect(model.timeline).toEqual([{ text: 'it 4210: res_p stalled', state: 'stalled' }, { text: 'it 210: res_p converging', state: 'converging' }]);
  });

  it('offers the overview key only when several runs are watched, and knows a terminal that is too small', () => {
    expect(buildViewModel(runDiagnosis(), steadyStore(1).snapshot(), view(), pace(), size, 0, context).footer).not.toContain('overview');
    expect(buildViewModel(runDiagnosis(), steadyStore(1).snapshot(), view(), pace(), size, 0, { ...context, runCount: 3 }).footer).toContain('o overview');
    expect(buildViewModel(runDiagnosis(), steadyStore(1).snapshot(), view(), pace(), { cols: 50, rows: 20 }, 0, context).tooSmall).toBe(true);
    expect(buildViewModel(runDiagnosis(), steadyStore(1).snapshot(), view(), pace(), { cols: 80, rows: 24 }, 0, context).tooSmall).toBe(false);
  });

  it('does not change its inputs', () => {
    const store = steadyStore(300);
    const snapshot = store.snapshot();
    const values = Array.from(snapshot.series[0].values.subarray(0, snapshot.series[0].length));
    const diagnosis = Object.freeze(runDiagnosis({ series: Object.freeze([Object.freeze(seriesDiagnosis('res_p'))]) }));
    const state = Object.freeze(view({ hidden: new Set(['res_u']) }));
    buildViewModel(diagnosis, snapshot, state, Object.freeze(pace()), size, 0, Object.freeze({ ...context }));
    expect(Array.from(snapshot.series[0].values.subarray(0, snapshot.series[0].length))).toEqual(values);
    expect([...state.hidden]).toEqual(['res_u']);
  });
});

describe('withoutLeadingName', () => {
  it.each([
    ['res_p falling 2 orders per 1000 iterations', 'res_p', 'falling 2 orders per 1000 iterations'],
    ['res_pressure falling', 'res_p', 'res_pressure falling'],
    ['res_p', 'res_p', 'res_p'],
    ['no steady part yet', 'nu_hot', 'no steady part yet'],
  ])('%j beside %s reads %j', (reason, name, expected) => {
    expect(withoutLeadingName(reason, name)).toBe(expected);
  });
});

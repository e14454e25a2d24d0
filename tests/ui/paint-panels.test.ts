import { describe, expect, it } from 'vitest';
import { paintDashboard, paintHeader, paintTable } from '../../src/ui/paint-panels.js';
import { buildViewModel } from '../../src/ui/build-view-model.js';
import { buildOverviewModel } from '../../src/ui/build-overview-model.js';
import { initialViewState, KEY_HELP } from '../../src/ui/view-state.js';
import { lineWidth, plainText } from '../../src/ui/styled-text.js';
import type { SeriesRow } from '../../src/ui/dashboard-model.js';
import { pace, runDiagnosis, seriesDiagnosis, steadyStore } from './run-fixture.js';

const diagnosis = runDiagnosis({ verdict: 'converging', series: [seriesDiagnosis('res_p', { ordersPerKilo: 3, eta: 400 }), seriesDiagnosis('nu_hot', { mean: 4.519, halfWidth: 0.002 })] });
const model = (cols: number, rows: number, help = false) =>
  buildViewModel(diagnosis, steadyStore(500).snapshot(), { ...initialViewState(1), help }, pace({ linesPerSecond: 50, lastGrowthAt: 0 }), { cols, rows }, 2000, { label: 'case/run.log', parser: 'settle-kv', runCount: 1 });

describe('paintDashboard', () => {
  it.each([[80, 24], [120, 40], [200, 60]])('at %i×%i gives every panel exactly its interior, line by line', (cols, rows) => {
    const panels = paintDashboard(model(cols, rows), true);
    for (const panel of Object.values(panels)) {
      const boxed = panel.title !== undefined ? 2 : 0;
      expect(panel.lines).toHaveLength(panel.rect.height - boxed);
      for (const line of panel.lines) expect(lineWidth(line)).toBe(panel.rect.width - boxed);
    }
  });

  it('at 80×24 still shows the verdict, the series names, the iteration and the state of each series', () => {
    const panels = paintDashboard(model(80, 24), true);
    const text = Object.values(panels).flatMap((panel) => panel.lines.map(plainText)).join('\n');
    for (const expected of ['CONVERGING', 'res_p', 'res_u', 'nu_hot', 'iteration 500', 'converging', 'keys']) expect(text).toContain(expected);
  });

  it('overlays the help listing every key', () => {
    const help = paintDashboard(model(120, 40, true), true).help;
    expect(help).toBeDefined();
    const text = (help?.lines ?? []).map(plainText).join('\n');
    for (const entry of KEY_HELP) expect(text).toContain(entry.action.slice(0, 20));
  });

  it('replaces everything with a notice when the terminal is too small', () => {
    const panels = paintDashboard(model(50, 15), true);
    expect(Object.keys(panels)).toEqual(['notice']);
    expect(plainText(panels.notice?.lines[0] ?? [])).toContain('needs at least 60×18');
  });

  it('paints the overview of several runs', () => {
    const runs = [0, 1].map((i) => ({ label: `run-${i}.log`, diagnosis: runDiagnosis({ verdict: i === 0 ? 'converged' : 'diverging' }), snapshot: steadyStore(10).snapshot(), pace: pace() }));
    const panels = paintDashboard(buildOverviewModel(runs, initialViewState(2), { cols: 100, rows: 30 }, 0), true);
    const rows = (panels.overview?.lines ?? []).map(plainText);
    expect(rows[1]).toContain('run-1.log');
    expect(rows[1]).toContain('diverging');
    expect(rows[2]).toContain('run-0.log');
  });
});

describe('paintHeader', () => {
  it('cuts a long file name from the left, keeping its end', () => {
    const header = model(80, 24).header;
    const line = plainText(paintHeader({ ...header, file: '/scratch/projects/wing/very/long/path/to/case-17/run.log' }, 80));
    expect(line.startsWith('…')).toBe(true);
    expect(line).toContain('case-17/run.log');
    expect(line).toContain('iteration 500');
  });
});

describe('paintTable', () => {
  const row = (i: number, changes: Partial<SeriesRow> = {}): SeriesRow => ({
    name: `res_${i}`, kind: 'residual', style: i, hidden: false, cursor: false, state: 'converging', stateText: 'converging',
    last: '1e-3', trend: '-2.0/1k', etaIterations: '~400', etaTime: '3 min', settled: '', reason: 'falling', ...changes,
  });

  it('drops the least important columns first when narrow', () => {
    expect(plainText(paintTable([row(0)], 78, 3)[0])).toContain('settled');
    const narrow = plainText(paintTable([row(0)], 60, 3)[0]);
    expect(narrow).toContain('trend');
    expect(narrow).not.toContain('settled');
    expect(plainText(paintTable([row(0)], 160, 3)[0])).toContain('why');
  });

  it('scrolls to keep the cursor row in view', () => {
    const rows = Array.from({ length: 12 }, (_, i) => row(i, { cursor: i === 10 }));
    const text = paintTable(rows, 78, 5).map(plainText);
    expect(text).toHaveLength(5);
    expect(text.some((line) => line.includes('res_10'))).toBe(true);
    expect(text.some((line) => line.includes('res_0 '))).toBe(false);
  });
});

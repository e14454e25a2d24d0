import { describe, expect, it } from 'vitest';
import { reportCharts } from '../../src/report/report-charts.js';
import { fixtureRun } from './report-fixture.js';

describe('report charts', () => {
  it('draw the target of a converging residual', () => {
    const [residuals] = reportCharts(fixtureRun(), 0);
    expect(residuals.svg).toContain('target 1.0e-5');
  });

  it('draw no target for a residual that is diverging (a level derived from its peak would only chase it up)', () => {
    const run = fixtureRun();
    const diverging = {
      ...run,
      diagnosis: {
        ...run.diagnosis,
        series: run.diagnosis.series.map((s) => (s.kind === 'residual' ? { ...s, state: 'diverging' as const, target: 3.6e10 } : s)),
      },
    };
    const [residuals] = reportCharts(diverging, 0);
    expect(residuals.svg).not.toContain('target');
  });
});

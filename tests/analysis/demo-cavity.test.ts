/**
 * The analysis on the demo's natural-convection cavity (src/demo: a real pseudo-time iteration), its
 * iterations written as a settle-kv log by the demo's own log writer (7 significant digits for the
 * quantities, as a solver prints them) and read back.
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import { diagnoseRun } from '../../src/analysis/diagnose-run.js';
import { demoRun } from './demo-records.js';
import { follow, storeOf } from './run-fixtures.js';

describe('demo cavity, Ra 2e4 on 16 cells, run to residuals below 1e-8', () => {
  const run = demoRun({ scenario: 'healthy', rayleigh: 2e4, cells: 16, target: 1e-8 });

  it('nu_hot, moving 3e-7 relative over its last 150 iterations with a geometric tail far below 0.1 %, is settled, and its interval holds the value the iteration reaches at 1e-11 (Ferziger & Perić 2002 §5.7; methods.md 0.1 % common practice)', () => {
    const nuHot = run.records.map((r) => r.values.get('nu_hot')!);
    const n = nuHot.length;
    const moved = Math.abs(nuHot[n - 1] - nuHot[n - 151]) / Math.abs(nuHot[n - 1]);
    expect(moved).toBeLessThan(1e-6);
    const d = diagnoseRun(storeOf(run.records, run.kinds).snapshot(), DEFAULT_CRITERIA);
    const q = d.series.find((s) => s.name === 'nu_hot')!;
    expect(q.state, q.reason).toBe('converged');
    expect(d.verdict).toBe('converged');
    // The same iteration run on to residuals below 1e-11: nu_hot there is the limit to within print.
    const longer = demoRun({ scenario: 'healthy', rayleigh: 2e4, cells: 16, target: 1e-11 });
    const limit = longer.records[longer.records.length - 1].values.get('nu_hot')!;
    // Interval plus half a print unit of the limit's own rounding (7 digits: 5e-7 at 3.25).
    expect(Math.abs(q.mean! - limit)).toBeLessThanOrEqual(q.halfWidth! + 5e-7);
    expect(q.halfWidth! / Math.abs(q.mean!)).toBeLessThan(DEFAULT_CRITERIA.qoiTol / 100);
  });

  it('followed evaluation by evaluation: never an alarm, and no series is ever raw-diverging', () => {
    for (const d of follow(run.records, run.kinds, DEFAULT_CRITERIA)) {
      expect(['stalled', 'oscillating', 'diverging', 'failed']).not.toContain(d.verdict);
      for (const s of d.series) expect(s.state, `${s.name} at ${d.iterations}: ${s.reason}`).not.toBe('diverging');
    }
  });
});

/**
 * Test data for the dashboard: a real SeriesStore filled with a synthetic run, and diagnoses written
 * by hand (the view model must show what the analysis decided, whatever that is).
 */
import { SeriesStore } from '../../src/series/series-store.js';
import type { SeriesInfo, SeriesKind } from '../../src/parse/log-record.js';
import type { RunDiagnosis, SeriesDiagnosis, StateChange } from '../../src/analysis/diagnosis.js';
import { EXIT_CODES } from '../../src/analysis/diagnosis.js';
import type { MonitorPace } from '../../src/monitor/run-monitor-types.js';

export const KINDS: Record<string, SeriesKind> = { res_p: 'residual', res_u: 'residual', res_T: 'residual', nu_hot: 'quantity', dp: 'quantity', cfl: 'other' };

/** A steady run of `iterations` records: residuals falling geometrically (res_p by 10^-0.003 per
 * iteration, i.e. 3 decades per 1000), quantities relaxing exponentially to 4.519 and 120. */
export function steadyStore(iterations: number, options: { capacity?: number; firstIteration?: number } = {}): SeriesStore {
  const store = new SeriesStore(options.capacity);
  const first = options.firstIteration ?? 1;
  const infoOf = (name: string): SeriesInfo => ({ name, kind: KINDS[name] ?? 'quantity', unit: name === 'dp' ? 'Pa' : undefined });
  for (let k = 0; k < iterations; k++) {
    const i = first + k;
    store.add({
      iteration: i,
      values: new Map([
        ['res_p', 10 ** (-0.003 * k)],
        ['res_u', 0.5 * 10 ** (-0.002 * k)],
        ['res_T', 10 ** (-0.004 * k)],
        ['nu_hot', 4.519 - 3.5 * Math.exp(-k / 50)],
        ['dp', 120 + 10 * Math.exp(-k / 80)],
        ['cfl', 0.8],
      ]),
    }, infoOf);
  }
  return store;
}

export function seriesDiagnosis(name: string, changes: Partial<SeriesDiagnosis> = {}): SeriesDiagnosis {
  return { name, kind: KINDS[name] ?? 'quantity', state: 'converging', last: Number.NaN, reason: `${name} is falling steadily`, ...changes };
}

export function runDiagnosis(changes: Partial<RunDiagnosis> = {}): RunDiagnosis {
  const verdict = changes.verdict ?? 'converging';
  return {
    verdict,
    exitCode: EXIT_CODES[verdict],
    iterations: 0,
    records: 0,
    advice: 'keep running: residuals are still falling',
    reasons: ['res_p is 2.4 of 3 decades down'],
    series: [],
    timeline: [],
    criteria: [],
    final: false,
    ...changes,
  };
}

export function change(iteration: number, series: string | null, from: StateChange['from'], to: StateChange['to']): StateChange {
  return { iteration, series, from, to, text: `it ${iteration}: ${series ?? 'run'} ${to}` };
}

export function pace(changes: Partial<MonitorPace> = {}): MonitorPace {
  return { lines: 0, linesPerSecond: 0, lastGrowthAt: Number.NaN, iterationsPerSecond: 0, ...changes };
}

/**
 * Build the overview of several runs: one row per run (verdict, iteration, worst residual, when the
 * log last grew), worst verdict first. Pure; O(runs × series + runs log runs).
 */
import { SEVERITY } from '../analysis/diagnosis.js';
import type { RunDiagnosis } from '../analysis/diagnosis.js';
import type { RunSnapshot } from '../series/series-column.js';
import type { MonitorPace } from '../monitor/run-monitor-types.js';
import type { OverviewModel, OverviewRow } from './dashboard-model.js';
import { dashboardLayout, layoutFits } from './dashboard-layout.js';
import type { ViewState } from './view-state.js';
import { cursorRun } from './view-state.js';
import { formatAge, formatCount, formatResidual } from './format-figures.js';
import { STALE_AFTER_MS } from './build-view-model.js';
import type { TerminalSize } from './build-view-model.js';

export interface RunSummary {
  readonly label: string;
  /** Latest diagnosis; its verdict is ignored while the snapshot has no records. */
  readonly diagnosis: RunDiagnosis;
  readonly snapshot: RunSnapshot;
  readonly pace: MonitorPace;
}

/** Run indices, worst verdict first (runs without records last), ties in the order given. */
export function overviewOrder(runs: readonly RunSummary[]): number[] {
  const severity = (run: RunSummary): number => (run.snapshot.records === 0 ? -1 : SEVERITY[run.diagnosis.verdict]);
  return runs.map((_, index) => index).sort((a, b) => severity(runs[b]) - severity(runs[a]) || a - b);
}

/** The residual with the largest last value (a non-finite one counts as the largest), as `res_p 2.1e-4`. */
export function worstResidual(snapshot: RunSnapshot): string {
  let worstName = '';
  let worstValue = Number.NEGATIVE_INFINITY;
  let worstKey = Number.NEGATIVE_INFINITY;
  for (const column of snapshot.series) {
    if (column.info.kind !== 'residual' || column.length === 0) continue;
    const value = column.values[column.length - 1];
    const key = Number.isFinite(value) ? value : Number.POSITIVE_INFINITY;
    if (key > worstKey) {
      worstKey = key;
      worstValue = value;
      worstName = column.info.label ?? column.info.name;
    }
  }
  return worstName === '' ? '' : `${worstName} ${formatResidual(worstValue, 2)}`;
}

export function buildOverviewModel(runs: readonly RunSummary[], view: ViewState, size: TerminalSize, now: number): OverviewModel {
  const order = overviewOrder(runs);
  const cursor = cursorRun(view, { overviewOrder: order });
  const rows: OverviewRow[] = order.map((runIndex) => {
    const run = runs[runIndex];
    const hasRecords = run.snapshot.records > 0;
    return {
      runIndex,
      label: run.label,
      verdict: hasRecords ? run.diagnosis.verdict : null,
      iteration: hasRecords ? formatCount(run.snapshot.lastIteration) : '',
      worstResidual: worstResidual(run.snapshot),
      lastGrowth: formatAge(run.pace.lastGrowthAt, now),
      stale: !Number.isNaN(run.pace.lastGrowthAt) && now - run.pace.lastGrowthAt > STALE_AFTER_MS,
      cursor: runIndex === cursor,
    };
  });
  const counts = new Map<string, number>();
  for (const row of rows) counts.set(row.verdict ?? 'waiting', (counts.get(row.verdict ?? 'waiting') ?? 0) + 1);
  const summary = [...counts].map(([verdict, count]) => `${count} ${verdict}`).join(', ');
  return {
    kind: 'overview',
    layout: dashboardLayout(size.cols, size.rows),
    title: `${runs.length} runs: ${summary}`,
    rows,
    footer: '? keys  up/down choose  enter open  space pause  q quit',
    help: view.help,
    tooSmall: !layoutFits(size.cols, size.rows),
  };
}

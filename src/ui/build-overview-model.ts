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

/** The folder every label lies in (`sample-logs/`, with its trailing slash), or '' when they share
 * none or there is only one label. Only whole path parts count. O(total label length). */
export function commonFolder(labels: readonly string[]): string {
  if (labels.length < 2) return '';
  let prefix = labels[0].slice(0, labels[0].lastIndexOf('/') + 1);
  for (const label of labels) {
    while (prefix !== '' && !label.startsWith(prefix)) {
      const shorter = prefix.slice(0, prefix.lastIndexOf('/', prefix.length - 2) + 1);
      prefix = shorter === prefix ? '' : shorter;
    }
  }
  return prefix;
}

export function buildOverviewModel(runs: readonly RunSummary[], view: ViewState, size: TerminalSize, now: number): OverviewModel {
  const order = overviewOrder(runs);
  const cursor = cursorRun(view, { overviewOrder: order });
  // Rows name each run by its path inside the common folder; the title names the folder.
  const folder = commonFolder(runs.map((run) => run.label));
  const rows: OverviewRow[] = order.map((runIndex) => {
    const run = runs[runIndex];
    const hasRecords = run.snapshot.records > 0;
    return {
      runIndex,
      label: run.label.slice(folder.length),
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
  // The longest title that fits: with the folder, without it, the verdict counts alone.
  const titles = [`${runs.length} runs in ${folder}: ${summary}`, `${runs.length} runs: ${summary}`, summary].filter((_, i) => i > 0 || folder !== '');
  const title = titles.find((text) => Array.from(text).length <= size.cols) ?? titles[titles.length - 1];
  return {
    kind: 'overview',
    layout: dashboardLayout(size.cols, size.rows),
    title,
    rows,
    footer: '? keys  up/down choose  enter open  space pause  q quit',
    help: view.help,
    tooSmall: !layoutFits(size.cols, size.rows),
  };
}

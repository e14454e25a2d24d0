/**
 * The charts of a run's report, as SVG strings: all residuals on one log-axis chart (with the target
 * and the restarts marked), and one linear chart per monitored quantity (with its settled mean and
 * 95 % band from the iteration it settled). Reads the store's snapshot for the points and the
 * diagnosis for the figures; decides nothing.
 */
import type { SeriesDiagnosis } from '../analysis/diagnosis.js';
import type { SeriesColumn } from '../series/series-column.js';
import type { ReportRun } from './report-input.js';
import { renderLineChartSvg, type ChartBand, type ChartRule } from './svg-line-chart.js';
import { formatNumber } from '../text/format-number.js';
import { formatCount } from '../text/format-count.js';

export interface ReportChart {
  readonly title: string;
  /** One sentence for alternative text. */
  readonly description: string;
  readonly svg: string;
}

/** A band thinner than this fraction of the whole history's range gets a chart of the settled part. */
export const ZOOM_BELOW = 0.05;

function finiteRange(c: SeriesColumn): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < c.length; i++) {
    const v = c.values[i];
    if (Number.isFinite(v)) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  return hi > lo ? hi - lo : 0;
}

/** At most this many quantities get charts per run (the table lists every quantity). */
export const MAX_QUANTITY_CHARTS = 12;

const seriesOf = (column: SeriesColumn) => ({ name: column.info.label ?? column.info.name, x: column.iterations, y: column.values, length: column.length });

export function reportCharts(run: ReportRun, runIndex: number, width = 760): ReportChart[] {
  const diagnoses = new Map(run.diagnosis.series.map((s) => [s.name, s]));
  const kindOf = (c: SeriesColumn): string => diagnoses.get(c.info.name)?.kind ?? c.info.kind;
  const restarts: ChartRule[] = run.snapshot.restarts.map((it) => ({ value: it, label: 'restart' }));
  const charts: ReportChart[] = [];

  const residuals = run.snapshot.series.filter((c) => kindOf(c) === 'residual' && c.length > 0);
  if (residuals.length > 0) {
    const targets = new Map<number, string[]>();
    for (const c of residuals) {
      const diagnosis = diagnoses.get(c.info.name);
      // A series blowing up has no meaningful target: a level derived from its peak only chases it up.
      const target = diagnosis?.state === 'diverging' || diagnosis?.state === 'failed' ? undefined : diagnosis?.target;
      if (target !== undefined && target > 0 && Number.isFinite(target)) targets.set(target, [...(targets.get(target) ?? []), c.info.name]);
    }
    const rules: ChartRule[] = [...targets].map(([value, names]) => ({
      value, label: targets.size === 1 ? `target ${formatNumber(value, 2)}` : `target ${formatNumber(value, 2)} (${names.join(', ')})`,
    }));
    const title = `Residuals — ${run.log}`;
    const description = `Residuals ${residuals.map((c) => c.info.name).join(', ')} against iteration on a logarithmic axis${rules.length ? ', with the target line' : ''}${restarts.length ? ` and ${restarts.length} restart${restarts.length === 1 ? '' : 's'} marked` : ''}.`;
    charts.push({
      title, description,
      svg: renderLineChartSvg({
        title, description, yScale: 'log', xLabel: 'iteration', yLabel: 'residual', width, height: 320,
        series: residuals.map(seriesOf), horizontalRules: rules, verticalRules: restarts, idPrefix: `run${runIndex}-residuals`,
      }),
    });
  }

  const quantities = run.snapshot.series.filter((c) => kindOf(c) === 'quantity' && c.length > 0).slice(0, MAX_QUANTITY_CHARTS);
  quantities.forEach((c, i) => {
    const s: SeriesDiagnosis | undefined = diagnoses.get(c.info.name);
    const bands: ChartBand[] = [];
    if (s?.mean !== undefined && s.halfWidth !== undefined && Number.isFinite(s.mean) && Number.isFinite(s.halfWidth)) {
      bands.push({
        name: `settled mean ${formatNumber(s.mean, 6)} ± ${formatNumber(s.halfWidth, 3)} (95 %)`,
        fromX: s.settledFrom ?? c.iterations[0], toX: c.iterations[c.length - 1], low: s.mean - s.halfWidth, high: s.mean + s.halfWidth, centre: s.mean,
      });
    }
    const name = c.info.label ?? c.info.name;
    const title = `${name} — ${run.log}`;
    const description = `${name} against iteration${bands.length ? `, with its settled mean and 95 % confidence band from iteration ${formatCount(bands[0].fromX)}` : ' (not settled: no band)'}.`;
    const yLabel = c.info.unit ? `${name} [${c.info.unit}]` : name;
    charts.push({
      title, description,
      svg: renderLineChartSvg({
        title, description, yScale: 'linear', xLabel: 'iteration', yLabel, width, height: 260,
        series: [seriesOf(c)], bands, verticalRules: restarts, idPrefix: `run${runIndex}-q${i}`,
      }),
    });
    // When the band is too thin to see against the whole history, add a chart of the settled part.
    const band = bands[0];
    if (band !== undefined && band.high - band.low < ZOOM_BELOW * finiteRange(c)) {
      let from = 0;
      while (from < c.length && c.iterations[from] < band.fromX) from++;
      if (c.length - from >= 2) {
        const zoomTitle = `${name}, settled part — ${run.log}`;
        const zoomDescription = `${name} from iteration ${formatCount(band.fromX)} on, with its settled mean and 95 % confidence band.`;
        charts.push({
          title: zoomTitle, description: zoomDescription,
          svg: renderLineChartSvg({
            title: zoomTitle, description: zoomDescription, yScale: 'linear', xLabel: 'iteration', yLabel, width, height: 260,
            series: [{ name, x: c.iterations.subarray(from, c.length), y: c.values.subarray(from, c.length) }],
            bands, verticalRules: restarts.filter((r) => r.value >= band.fromX), idPrefix: `run${runIndex}-q${i}-settled`,
          }),
        });
      }
    }
  });
  return charts;
}

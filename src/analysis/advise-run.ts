/**
 * Turns the per-series states into the run's verdict, its reasons, its stopping advice and the list of
 * criteria with where each stands. Pure; the wording is settle's own ("stop: …", "keep going: …").
 *
 * Verdict: a crash line or any failed series → failed; otherwise the worst alarm of any counted series
 * (diverging, then oscillating, then stalled); otherwise converged when every counted series is,
 * converging when any is still converging, undecided otherwise (including a run with nothing to judge).
 */
import type { CriterionResult, SeriesDiagnosis, State } from './diagnosis.js';
import { SEVERITY } from './diagnosis.js';
import type { SeriesRule } from './resolve-series-criteria.js';
import { formatCount, formatDecades, formatEstimate, formatMeanInterval, formatPercent, formatResidual } from './format-figures.js';

export interface CountedSeries {
  readonly diagnosis: SeriesDiagnosis;
  readonly rule: SeriesRule;
}

const ALARMS: readonly State[] = ['diverging', 'oscillating', 'stalled'];

export function rawVerdict(counted: readonly CountedSeries[], failure: string | undefined): State {
  if (failure !== undefined) return 'failed';
  const states = counted.map((c) => c.diagnosis.state);
  if (states.includes('failed')) return 'failed';
  for (const alarm of ALARMS) if (states.includes(alarm)) return alarm;
  if (states.length === 0) return 'undecided';
  if (states.every((s) => s === 'converged')) return 'converged';
  if (states.includes('converging')) return 'converging';
  return 'undecided';
}

export function isAlarm(state: State): boolean {
  return ALARMS.includes(state);
}

/** The latest reason seen for each alarm state (kept by the run judge), for advice on a verdict that is
 * held while no series currently shows that state. */
export type AlarmReasons = Readonly<Partial<Record<State, string>>>;

/**
 * Advice and reasons for the verdict shown. The verdict may be one held by the confirmation rule
 * (run-judge.ts) while no counted series shows that state any more (e.g. a run confirmed diverging
 * whose residual now reads stalled): the advice then quotes the reason that raised the alarm
 * (`held`), or says so plainly when none is known. Never assumes a series in the verdict's state exists.
 */
export function adviseRun(verdict: State, counted: readonly CountedSeries[], failure: string | undefined, startup: number,
  held: AlarmReasons = {}): { advice: string; reasons: string[] } {
  const of = (state: State) => counted.filter((c) => c.diagnosis.state === state).map((c) => c.diagnosis);
  /** Reason of the first series in `state`, else the remembered alarm reason, else a plain fallback. */
  const why = (state: State, fallback: string): string => of(state)[0]?.reason ?? held[state] ?? fallback;
  const byWorst = [...counted].sort((a, b) => SEVERITY[b.diagnosis.state] - SEVERITY[a.diagnosis.state]);
  const reasons = byWorst.map((c) => c.diagnosis.reason);
  if (failure !== undefined) reasons.unshift(`the solver reported a failure: ${failure}`);
  const heldReason = held[verdict];
  if (isAlarm(verdict) && of(verdict).length === 0 && heldReason !== undefined) reasons.unshift(`confirmed earlier: ${heldReason}`);
  const residuals = counted.filter((c) => c.diagnosis.kind === 'residual');
  const quantities = counted.filter((c) => c.diagnosis.kind === 'quantity');
  const settledText = (q: SeriesDiagnosis): string => q.reason.replace(/^\S+ /, `${q.name} `).replace(/ \(.*\)$/, '').replace(/; .*$/, '');
  /** One or two settled quantities by name and value, more as a count. */
  const settledSummary = (qs: readonly CountedSeries[]): string => qs.length <= 2
    ? qs.map((q) => settledText(q.diagnosis)).join(' and ')
    : `${qs.length} quantities settled to ${formatPercent(qs[0].rule.qoiTol)}`;

  switch (verdict) {
    case 'failed': {
      const first = of('failed')[0];
      return { advice: failure !== undefined ? `stop: the solver reported a failure (${failure})` : `stop: the run failed (${first?.reason ?? 'non-finite values'})`, reasons };
    }
    case 'diverging':
      return { advice: `stop now: ${why('diverging', 'a residual grew by decades')}`, reasons };
    case 'oscillating': {
      return { advice: `stop: ${why('oscillating', 'a series cycles without settling')}; more iterations will not settle it (try stronger under-relaxation, or a transient run if the flow is physically unsteady)`, reasons };
    }
    case 'stalled': {
      const first = of('stalled')[0] as SeriesDiagnosis | undefined;
      const settled = quantities.length > 0 && quantities.every((q) => q.diagnosis.state === 'converged');
      const where = first?.dropDecades !== undefined ? `, ${formatDecades(first.dropDecades)} decades down` : '';
      const reason = why('stalled', 'a residual stopped falling');
      return {
        advice: settled
          ? `stop: ${reason}${where}, but ${settledSummary(quantities)}; judge whether that is good enough`
          : `stop: ${reason}${where}; more iterations will not help without changing the set-up (under-relaxation, mesh, time step)`,
        reasons,
      };
    }
    case 'converged': {
      const parts: string[] = [];
      if (residuals.length > 0) {
        const allByDrop = residuals.every((r) => (r.diagnosis.dropDecades ?? 0) >= r.rule.drop);
        const least = Math.min(...residuals.map((r) => r.diagnosis.dropDecades ?? 0));
        const subject = residuals.length === 1 ? residuals[0].diagnosis.name : 'all residuals';
        parts.push(allByDrop ? `${subject} ${formatDecades(least)} decades down` : `${subject} at ${residuals.length === 1 ? 'its target' : 'their targets'}`);
      }
      if (quantities.length > 0) parts.push(settledSummary(quantities));
      return { advice: `stop: ${parts.join(' and ')}`, reasons };
    }
    case 'converging': {
      const going = of('converging');
      const limiting = going.filter((d) => d.kind === 'residual' && d.eta !== undefined && Number.isFinite(d.eta))
        .sort((a, b) => (b.eta ?? 0) - (a.eta ?? 0))[0];
      if (limiting !== undefined) return { advice: `keep going: about ${formatEstimate(limiting.eta ?? 0)} iterations to the target at the current rate (${limiting.name})`, reasons };
      const quantity = going.find((d) => d.kind === 'quantity');
      if (quantity !== undefined) return { advice: `keep going: ${quantity.reason}`, reasons };
      return { advice: `keep going: ${going[0]?.reason ?? 'still converging'}`, reasons };
    }
    case 'undecided':
    default: {
      if (counted.length === 0) return { advice: 'wait: no residuals or monitored quantities to judge yet', reasons: reasons.length > 0 ? reasons : ['no residuals or monitored quantities counted'] };
      const first = of('undecided')[0];
      return { advice: `wait: too little data to judge yet (${first?.reason ?? `start-up: ${formatCount(startup)} iterations`})`, reasons };
    }
  }
}

export function criteriaResults(counted: readonly CountedSeries[]): CriterionResult[] {
  return counted.map(({ diagnosis: d, rule }) => {
    if (d.kind === 'residual') {
      const goal = rule.target !== undefined ? ` or below ${formatResidual(rule.target)}` : '';
      const detail = d.dropDecades !== undefined && Number.isFinite(d.dropDecades)
        ? `${formatDecades(Math.max(0, d.dropDecades))} of ${formatDecades(rule.drop)} decades, now ${formatResidual(d.last)}`
        : d.reason;
      return { description: `${d.name} down ${formatDecades(rule.drop)} decades from peak${goal}`, met: d.state === 'converged', detail };
    }
    const detail = d.mean !== undefined && d.halfWidth !== undefined
      ? `${formatMeanInterval(d.mean, d.halfWidth)} (±${formatPercent(d.halfWidth / (d.mean !== 0 ? Math.abs(d.mean) : 1))})`
      : d.reason;
    return { description: `${d.name} settled to ${formatPercent(rule.qoiTol)} relative`, met: d.state === 'converged', detail };
  });
}

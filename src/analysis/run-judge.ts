/**
 * The run judge: the incremental analysis of one run. Feed it snapshots at scheduled evaluations
 * (`update`, see evaluation-schedule.ts) and read a diagnosis; `peek` evaluates the same way without
 * changing any state, for a live view between scheduled evaluations.
 *
 * What it keeps between evaluations (all pure data, no clock):
 * - per series, a segment memo (segment-tracker.ts): the peak and restart bookkeeping, advanced by the
 *   new points only, so an update costs O(new points + bounded windows);
 * - per series, the last cycle test that found no cycle (cycle-test-memo.ts), so the costly cycle
 *   test is not repeated on nearly the same data;
 * - per series and for the run, the raw state and for how many consecutive evaluations it has held.
 *   A stopping alarm (stalled, oscillating, diverging) is shown only once it has held for
 *   `criteria.confirm` evaluations; until then the previous state is shown with a note. `final` is
 *   true once a verdict in FINAL_STATES has held that long (failed: at once);
 * - the timeline of state changes (series and run), newest last, at most 500 entries.
 * Same snapshots at the same evaluations give the same diagnoses: the monitor evaluates at fixed
 * record counts, so the verdict does not depend on how the bytes were chunked.
 */
import type { RunSnapshot, SeriesColumn } from '../series/series-column.js';
import type { Criteria } from './criteria.js';
import type { RunDiagnosis, SeriesDiagnosis, State, StateChange } from './diagnosis.js';
import { EXIT_CODES, FINAL_STATES } from './diagnosis.js';
import { advanceSegment, firstIndexAtOrAfter, segmentStartIndex, type SegmentMemo } from './segment-tracker.js';
import { resolveSeriesCriteria, type SeriesRule } from './resolve-series-criteria.js';
import { judgeResidual } from './judge-residual.js';
import { judgeQuantity, QUANTITY_SPAN, type QuantitySamples } from './judge-quantity.js';
import { judgeTransientResidual, RECENT_STEPS, type StepRange } from './judge-transient-residual.js';
import { adviseRun, criteriaResults, isAlarm, rawVerdict, type AlarmReasons, type CountedSeries } from './advise-run.js';
import { formatCount, formatMeanInterval, formatResidual, formatValue } from './format-figures.js';
import { validateCriteria } from './validate-criteria.js';
import type { CycleTestClock, NoCycleMemo } from './cycle-test-memo.js';

export interface RunJudge {
  update(snapshot: RunSnapshot): RunDiagnosis;
  peek(snapshot: RunSnapshot): RunDiagnosis;
}

interface Held {
  readonly raw: State;
  readonly held: number;
  readonly shown: State;
}

interface JudgeState {
  readonly memos: ReadonlyMap<string, SegmentMemo>;
  /** Per series, the last cycle test that found no cycle (cycle-test-memo.ts). */
  readonly cycles: ReadonlyMap<string, NoCycleMemo>;
  readonly series: ReadonlyMap<string, Held>;
  readonly run: Held;
  readonly timeline: readonly StateChange[];
  /** Latest reason seen per alarm state (raw), for advice on a held verdict. */
  readonly alarmReasons: AlarmReasons;
}

const TIMELINE_LIMIT = 500;
const INITIAL: Held = { raw: 'undecided', held: 0, shown: 'undecided' };

export interface RunJudgeOptions {
  /** Judge the data as it stands: alarms count as confirmed (one-shot diagnosis of a finished log). */
  readonly confirmed?: boolean;
}

export function createRunJudge(criteria: Criteria, options: RunJudgeOptions = {}): RunJudge {
  const problems = validateCriteria(criteria);
  if (problems.length > 0) throw new RangeError(`invalid criteria: ${problems.join('; ')}`);
  let state: JudgeState = { memos: new Map(), cycles: new Map(), series: new Map(), run: INITIAL, timeline: [], alarmReasons: {} };
  const confirm = options.confirmed === true ? 1 : criteria.confirm;
  return {
    update(snapshot) {
      const { diagnosis, next } = evaluate(snapshot, criteria, state, confirm);
      state = next;
      return diagnosis;
    },
    peek(snapshot) {
      return evaluate(snapshot, criteria, state, confirm).diagnosis;
    },
  };
}

function hold(previous: Held, raw: State, confirm: number): Held {
  const held = raw === previous.raw ? previous.held + 1 : 1;
  const shown = !isAlarm(raw) || held >= confirm ? raw : previous.shown;
  return { raw, held, shown };
}

function evaluate(snapshot: RunSnapshot, criteria: Criteria, state: JudgeState, confirm: number): { diagnosis: RunDiagnosis; next: JudgeState } {
  const memos = new Map(state.memos);
  const cycles = new Map(state.cycles);
  const heldSeries = new Map(state.series);
  const changes: StateChange[] = [];
  const lastIteration = Number.isFinite(snapshot.lastIteration) ? snapshot.lastIteration : 0;
  const steps = snapshot.transient && snapshot.timeSteps !== undefined ? snapshot.timeSteps : undefined;
  const shownSeries: SeriesDiagnosis[] = [];
  const counted: CountedSeries[] = [];
  const countedRaw: CountedSeries[] = [];
  const pendingNotes: string[] = [];

  for (const column of snapshot.series) {
    const name = column.info.name;
    const memo = advanceSegment(state.memos.get(name), column, snapshot.restarts);
    memos.set(name, memo);
    const rule = resolveSeriesCriteria(criteria, name);
    const clock: CycleTestClock = { slot: { memo: state.cycles.get(name) }, points: column.totalAdded, segment: memo.segments };
    const raw = judgeSeries(column, memo, rule, criteria, snapshot, steps, clock);
    if (clock.slot.memo === undefined) cycles.delete(name);
    else cycles.set(name, clock.slot.memo);
    const previous = state.series.get(name) ?? INITIAL;
    const held = hold(previous, raw.state, confirm);
    heldSeries.set(name, held);
    let shown = raw;
    if (held.shown !== raw.state) {
      const note = `${name} looks ${raw.state} (${raw.reason}); confirming, ${held.held} of ${confirm} checks`;
      pendingNotes.push(note);
      shown = { ...raw, state: held.shown, reason: `${note}` };
    }
    if (held.shown !== previous.shown && !(previous.held === 0 && held.shown === 'undecided')) {
      changes.push({ iteration: lastIteration, series: name, from: previous.shown, to: held.shown, text: `it ${formatCount(lastIteration)}: ${changeText(shown)}` });
    }
    shownSeries.push(shown);
    if (rule.counted && (raw.kind === 'residual' || raw.kind === 'quantity')) {
      counted.push({ diagnosis: shown, rule });
      countedRaw.push({ diagnosis: raw, rule });
    }
  }

  const raw = snapshot.records === 0 && snapshot.failure === undefined ? 'undecided' : rawVerdict(countedRaw, snapshot.failure);
  let alarmReasons = state.alarmReasons;
  for (const alarm of ['failed', 'diverging', 'oscillating', 'stalled'] as const) {
    const reason = countedRaw.find((c) => c.diagnosis.state === alarm)?.diagnosis.reason;
    if (reason !== undefined && alarmReasons[alarm] !== reason) alarmReasons = { ...alarmReasons, [alarm]: reason };
  }
  const run = hold(state.run, raw, confirm);
  const verdict = run.shown;
  if (verdict !== state.run.shown) {
    changes.push({ iteration: lastIteration, series: null, from: state.run.shown, to: verdict, text: `it ${formatCount(lastIteration)}: run ${verdict}` });
  }
  // Advice follows the verdict shown: when a run alarm is still being confirmed, explain from the raw
  // states what is suspected, but advise according to the shown verdict.
  const basis = verdict === raw ? countedRaw : counted;
  const { advice, reasons } = adviseRun(verdict, basis, snapshot.failure, criteria.startup, alarmReasons);
  if (verdict !== raw) reasons.push(`looks ${raw}; confirming, ${run.held} of ${confirm} checks`);
  for (const note of pendingNotes) if (!reasons.includes(note)) reasons.push(note);
  const final = FINAL_STATES.has(verdict) && verdict === raw && (verdict === 'failed' || run.held >= confirm);

  const timeline = changes.length === 0 ? state.timeline : [...state.timeline, ...changes].slice(-TIMELINE_LIMIT);
  const diagnosis: RunDiagnosis = {
    verdict,
    exitCode: EXIT_CODES[verdict],
    iterations: lastIteration,
    records: snapshot.records,
    advice,
    reasons,
    series: shownSeries,
    timeline,
    criteria: criteriaResults(counted),
    final,
  };
  return { diagnosis, next: { memos, cycles, series: heldSeries, run, timeline, alarmReasons } };
}

function changeText(d: SeriesDiagnosis): string {
  if (d.kind === 'quantity' && d.state === 'converged' && d.mean !== undefined && d.halfWidth !== undefined) {
    return `${d.name} settled at ${formatMeanInterval(d.mean, d.halfWidth)}`;
  }
  const value = d.kind === 'residual' ? formatResidual(d.last) : formatValue(d.last);
  return `${d.name} ${d.state} at ${value}`;
}

function judgeSeries(column: SeriesColumn, memo: SegmentMemo, rule: SeriesRule, criteria: Criteria, snapshot: RunSnapshot,
  steps: RunSnapshot['timeSteps'], clock: CycleTestClock): SeriesDiagnosis {
  const { info } = column;
  if (info.kind === 'residual') {
    if (steps !== undefined) {
      const ranges = stepRanges(column, snapshot, steps, RECENT_STEPS + 1).slice(0, -1);
      if (ranges.length > 0 || steps.length > 1) return judgeTransientResidual(column, memo, rule, ranges, criteria.startup);
    }
    return judgeResidual(column, memo, rule, { window: criteria.window, startup: criteria.startup }, clock);
  }
  if (info.kind === 'quantity') return judgeQuantity(quantitySamples(column, memo, criteria, snapshot, steps), rule.qoiTol, criteria.window, clock);
  const last = column.length > 0 ? column.values[column.length - 1] : Number.NaN;
  return { name: info.name, kind: info.kind, label: info.label, unit: info.unit, last, state: 'undecided', reason: `${info.name} is shown, not judged` };
}

/** Column index of a record, when the series has a value in every record and the point is retained
 * at full resolution; -1 otherwise. */
function columnIndexOfRecord(column: SeriesColumn, records: number, record: number): number {
  if (column.totalAdded !== records) return -1;
  const index = record - (column.totalAdded - column.length);
  return index >= column.fullResolutionFrom && index < column.length ? index : -1;
}

/** The last `count` time steps that map onto this column, oldest first. */
function stepRanges(column: SeriesColumn, snapshot: RunSnapshot, steps: NonNullable<RunSnapshot['timeSteps']>, count: number): StepRange[] {
  const out: StepRange[] = [];
  for (let k = steps.length - 1; k >= 0 && out.length < count; k--) {
    const first = columnIndexOfRecord(column, snapshot.records, steps[k].firstRecord);
    const last = columnIndexOfRecord(column, snapshot.records, steps[k].lastRecord);
    if (first < 0 || last < 0) break;
    out.push({ step: steps[k].step, first, last });
  }
  return out.reverse();
}

function quantitySamples(column: SeriesColumn, memo: SegmentMemo, criteria: Criteria, snapshot: RunSnapshot,
  steps: RunSnapshot['timeSteps']): QuantitySamples {
  const last = column.length > 0 ? column.values[column.length - 1] : Number.NaN;
  const judgedFromIteration = memo.start + criteria.startup;
  const common = { info: column.info, last, firstNonFinite: memo.firstNonFinite, nonFiniteValue: memo.nonFiniteValue, judgedFromIteration };
  const segmentStart = column.length > 0 ? segmentStartIndex(memo, column) : 0;
  if (steps !== undefined && steps.length > 1) {
    // Over physical time: the value at the end of each complete time step.
    const ranges = stepRanges(column, snapshot, steps, QUANTITY_SPAN + 1).slice(0, -1)
      .filter((r) => r.first >= segmentStart && column.iterations[r.first] >= judgedFromIteration);
    if (ranges.length > 0) {
      const iterations = new Float64Array(ranges.length);
      const values = new Float64Array(ranges.length);
      ranges.forEach((r, i) => {
        iterations[i] = column.iterations[r.last];
        values[i] = column.values[r.last];
      });
      return { ...common, iterations, values, transient: true };
    }
  }
  const from = firstIndexAtOrAfter(column, segmentStart, column.length, judgedFromIteration);
  const start = Math.max(from, column.length - QUANTITY_SPAN);
  return {
    ...common,
    iterations: column.iterations.subarray(start, column.length),
    values: column.values.subarray(start, column.length),
    transient: snapshot.transient,
  };
}

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
import { compileSeriesCriteria, type SeriesRule, type SeriesRuleResolver } from './resolve-series-criteria.js';
import { createAnalysisScratch, type AnalysisScratch } from './analysis-scratch.js';
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
  /** The reason given when the shown state was last the raw one, and at which iteration. */
  readonly reason?: string;
  readonly reasonAt?: number;
}

interface JudgeState {
  readonly memos: ReadonlyMap<string, SegmentMemo>;
  /** Per series, the last cycle test that found no cycle (cycle-test-memo.ts). */
  readonly cycles: ReadonlyMap<string, NoCycleMemo>;
  readonly series: ReadonlyMap<string, Held>;
  readonly run: Held;
  readonly timeline: readonly StateChange[];
  /** Latest reason shown per alarm state, with its iteration, for advice on a held verdict. */
  readonly alarmReasons: AlarmReasons;
}

const TIMELINE_LIMIT = 500;
const INITIAL: Held = { raw: 'undecided', held: 0, shown: 'undecided' };

export interface RunJudgeOptions {
  /** Judge the data as it stands: alarms count as confirmed (one-shot diagnosis of a finished log). */
  readonly confirmed?: boolean;
}

/** What an evaluation needs besides the state: fixed when the judge is created. */
interface JudgeContext {
  readonly criteria: Criteria;
  readonly confirm: number;
  /** The criteria's globs, compiled once. */
  readonly ruleOf: SeriesRuleResolver;
  /** Working arrays owned by this judge (analysis-scratch.ts); no evaluation keeps a view past its end. */
  readonly scratch: AnalysisScratch;
}

export function createRunJudge(criteria: Criteria, options: RunJudgeOptions = {}): RunJudge {
  const problems = validateCriteria(criteria);
  if (problems.length > 0) throw new RangeError(`invalid criteria: ${problems.join('; ')}`);
  let state: JudgeState = { memos: new Map(), cycles: new Map(), series: new Map(), run: INITIAL, timeline: [], alarmReasons: {} };
  const context: JudgeContext = {
    criteria,
    confirm: options.confirmed === true ? 1 : criteria.confirm,
    ruleOf: compileSeriesCriteria(criteria),
    scratch: createAnalysisScratch(),
  };
  return {
    update(snapshot) {
      const { diagnosis, next } = evaluate(snapshot, context, state);
      state = next;
      return diagnosis;
    },
    peek(snapshot) {
      return evaluate(snapshot, context, state).diagnosis;
    },
  };
}

function hold(previous: Held, raw: State, confirm: number, reason?: string, at?: number): Held {
  const held = raw === previous.raw ? previous.held + 1 : 1;
  const shown = !isAlarm(raw) || held >= confirm ? raw : previous.shown;
  return shown === raw ? { raw, held, shown, reason, reasonAt: at } : { raw, held, shown, reason: previous.reason, reasonAt: previous.reasonAt };
}

interface Judged {
  readonly raw: SeriesDiagnosis;
  readonly previous: Held;
  held: Held;
  readonly rule: SeriesRule;
}

/**
 * One evaluation. The run verdict is confirmed on the raw states of the counted series; the series that
 * support a confirmed alarm (raw in that state now) are confirmed with it, so the table shows them in
 * the verdict's state. Advice and reasons then come from the states shown: a series shown in a state
 * it held earlier speaks with the reason it had then and its iteration; pending-alarm notes are added
 * only while the verdict is not final.
 */
function evaluate(snapshot: RunSnapshot, context: JudgeContext, state: JudgeState): { diagnosis: RunDiagnosis; next: JudgeState } {
  const { criteria, confirm, ruleOf, scratch } = context;
  const memos = new Map(state.memos);
  const cycles = new Map(state.cycles);
  const heldSeries = new Map(state.series);
  const changes: StateChange[] = [];
  const lastIteration = Number.isFinite(snapshot.lastIteration) ? snapshot.lastIteration : 0;
  const steps = snapshot.transient && snapshot.timeSteps !== undefined ? snapshot.timeSteps : undefined;
  const shownSeries: SeriesDiagnosis[] = [];
  const counted: CountedSeries[] = [];
  const pendingNotes: string[] = [];
  const judged: Judged[] = [];

  for (const column of snapshot.series) {
    const name = column.info.name;
    const memo = advanceSegment(state.memos.get(name), column, snapshot.restarts);
    memos.set(name, memo);
    const rule = ruleOf(name);
    const clock: CycleTestClock = { slot: { memo: state.cycles.get(name) }, points: column.totalAdded, segment: memo.segments };
    const raw = judgeSeries(column, memo, rule, criteria, snapshot, steps, clock, scratch);
    if (clock.slot.memo === undefined) cycles.delete(name);
    else cycles.set(name, clock.slot.memo);
    const previous = state.series.get(name) ?? INITIAL;
    judged.push({ raw, previous, held: hold(previous, raw.state, confirm, raw.reason, lastIteration), rule });
  }
  const isCounted = (j: Judged): boolean => j.rule.counted && (j.raw.kind === 'residual' || j.raw.kind === 'quantity');

  const raw = snapshot.records === 0 && snapshot.failure === undefined
    ? 'undecided'
    : rawVerdict(judged.filter(isCounted).map((j) => ({ diagnosis: j.raw, rule: j.rule })), snapshot.failure);
  const run = hold(state.run, raw, confirm);
  const verdict = run.shown;
  if (verdict !== state.run.shown) {
    changes.push({ iteration: lastIteration, series: null, from: state.run.shown, to: verdict, text: `it ${formatCount(lastIteration)}: run ${verdict}` });
  }
  // A confirmed run alarm confirms the series that raise it now (the run counts consecutive alarms,
  // possibly from different series, so a series may still be mid-confirmation on its own).
  if (isAlarm(verdict) && verdict === raw) {
    for (const j of judged) {
      if (isCounted(j) && j.raw.state === verdict && j.held.shown !== verdict) j.held = { ...j.held, shown: verdict, reason: j.raw.reason, reasonAt: lastIteration };
    }
  }

  for (const { raw: d, previous, held, rule } of judged) {
    const name = d.name;
    heldSeries.set(name, held);
    let shown = d;
    // The series as the verdict's advice and reasons see it: its shown state, with the reason it had
    // when that state was last its own (and when), never a pending-alarm note.
    let settled = d;
    if (held.shown !== d.state) {
      const note = `${name} looks ${d.state} (${d.reason}); confirming, ${held.held} of ${confirm} checks`;
      pendingNotes.push(note);
      shown = { ...d, state: held.shown, reason: note };
      const earlier = held.reason !== undefined && held.reasonAt !== undefined ? `${held.reason} (at it ${formatCount(held.reasonAt)})` : `${name} ${held.shown}`;
      settled = { ...d, state: held.shown, reason: earlier };
    }
    if (held.shown !== previous.shown && !(previous.held === 0 && held.shown === 'undecided')) {
      changes.push({ iteration: lastIteration, series: name, from: previous.shown, to: held.shown, text: `it ${formatCount(lastIteration)}: ${changeText(shown)}` });
    }
    shownSeries.push(shown);
    if (isCounted({ raw: d, previous, held, rule })) counted.push({ diagnosis: settled, rule });
  }

  // Remembered per alarm for a verdict held after every series has moved on: the reason a series
  // showed for it at this evaluation, and when.
  let alarmReasons = state.alarmReasons;
  for (const alarm of ['failed', 'diverging', 'oscillating', 'stalled'] as const) {
    const current = counted.find((c) => c.diagnosis.state === alarm && heldSeries.get(c.diagnosis.name)?.raw === alarm);
    const reason = current === undefined ? undefined : `${current.diagnosis.reason} (last seen at it ${formatCount(lastIteration)})`;
    if (reason !== undefined && alarmReasons[alarm] !== reason) alarmReasons = { ...alarmReasons, [alarm]: reason };
  }
  const final = FINAL_STATES.has(verdict) && verdict === raw && (verdict === 'failed' || run.held >= confirm);
  const { advice, reasons } = adviseRun(verdict, counted, snapshot.failure, criteria.startup, alarmReasons);
  if (!final) {
    if (verdict !== raw) reasons.push(`looks ${raw}; confirming, ${run.held} of ${confirm} checks`);
    for (const note of pendingNotes) if (!reasons.includes(note)) reasons.push(note);
  }

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
  steps: RunSnapshot['timeSteps'], clock: CycleTestClock, scratch: AnalysisScratch): SeriesDiagnosis {
  const { info } = column;
  if (info.kind === 'residual') {
    if (steps !== undefined) {
      const ranges = stepRanges(column, snapshot, steps, RECENT_STEPS + 1).slice(0, -1);
      if (ranges.length > 0 || steps.length > 1) return judgeTransientResidual(column, memo, rule, ranges, criteria.startup, scratch);
    }
    return judgeResidual(column, memo, rule, { window: criteria.window, startup: criteria.startup }, clock, scratch);
  }
  if (info.kind === 'quantity') return judgeQuantity(quantitySamples(column, memo, criteria, snapshot, steps), rule.qoiTol, criteria.window, clock, scratch);
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

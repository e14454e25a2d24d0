/** Test helpers: build a real SeriesStore from plain arrays, and follow it with a judge. */
import { SeriesStore } from '../../src/series/series-store.js';
import type { SeriesKind } from '../../src/parse/log-record.js';
import type { LogRecord } from '../../src/parse/log-record.js';
import type { Criteria } from '../../src/analysis/criteria.js';
import type { RunDiagnosis } from '../../src/analysis/diagnosis.js';
import { createRunJudge } from '../../src/analysis/run-judge.js';
import { isEvaluationPoint } from '../../src/analysis/evaluation-schedule.js';

export interface SeriesSpec {
  readonly name: string;
  readonly kind: SeriesKind;
  readonly values: readonly number[];
}

/** One record per index; iteration = index + 1 unless `iterations` is given. */
export function recordsOf(series: readonly SeriesSpec[], extra: (i: number) => Partial<LogRecord> = () => ({})): LogRecord[] {
  const n = Math.max(...series.map((s) => s.values.length));
  const out: LogRecord[] = [];
  for (let i = 0; i < n; i++) {
    const values = new Map<string, number>();
    for (const s of series) if (i < s.values.length) values.set(s.name, s.values[i]);
    out.push({ iteration: i + 1, values, ...extra(i) });
  }
  return out;
}

export function storeOf(records: readonly LogRecord[], kinds: Record<string, SeriesKind>, capacity?: number): SeriesStore {
  const store = new SeriesStore(capacity);
  for (const record of records) store.add(record, (name) => ({ name, kind: kinds[name] ?? 'quantity' }));
  return store;
}

export function kindsOf(series: readonly SeriesSpec[]): Record<string, SeriesKind> {
  return Object.fromEntries(series.map((s) => [s.name, s.kind]));
}

/** Follow records as the run monitor does: update at each scheduled evaluation and at the end. */
export function follow(records: readonly LogRecord[], kinds: Record<string, SeriesKind>, criteria: Criteria, capacity?: number): RunDiagnosis[] {
  const store = new SeriesStore(capacity);
  const judge = createRunJudge(criteria);
  const out: RunDiagnosis[] = [];
  for (const record of records) {
    store.add(record, (name) => ({ name, kind: kinds[name] ?? 'quantity' }));
    if (isEvaluationPoint(store.records)) out.push(judge.update(store.snapshot()));
  }
  if (!isEvaluationPoint(store.records)) out.push(judge.update(store.snapshot()));
  return out;
}

/** A small seeded generator (mulberry32) and standard normals (Box–Muller), for reproducible noise. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function seededNormal(seed: number): () => number {
  const uniform = seededRandom(seed);
  return () => {
    const u = 1 - uniform();
    const v = uniform();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
}

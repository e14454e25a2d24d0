/**
 * One-shot diagnosis of a run as it stands: a fresh run judge evaluated once. The data are judged as
 * they are (alarms need no confirmation over several evaluations, since there is only one), so a
 * finished log that ends diverging is reported diverging. Used by tests, tools and the report.
 * Cost: one full pass over each series (the segment memo) plus the bounded windows.
 */
import type { RunSnapshot } from '../series/series-column.js';
import type { Criteria } from './criteria.js';
import type { RunDiagnosis } from './diagnosis.js';
import { createRunJudge } from './run-judge.js';

export function diagnoseRun(snapshot: RunSnapshot, criteria: Criteria): RunDiagnosis {
  return createRunJudge(criteria, { confirmed: true }).update(snapshot);
}

/**
 * Cost of a full post-mortem: 1 000 000 iterations × 8 series (4 residuals, 4 quantities) followed
 * through every scheduled evaluation, as the run monitor does. Not a test: `npm run build` then
 * `node dist/src/bench/analysis-bench.js`.
 */
import { SeriesStore } from '../series/series-store.js';
import { createRunJudge } from '../analysis/run-judge.js';
import { isEvaluationPoint } from '../analysis/evaluation-schedule.js';
import { DEFAULT_CRITERIA } from '../analysis/criteria.js';

const N = Number(process.argv[2] ?? 1_000_000);
let seed = 42;
const uniform = (): number => {
  seed = (seed * 1103515245 + 12345) % 2147483648;
  return seed / 2147483648;
};
const names = ['res_p', 'res_u', 'res_v', 'res_T', 'drag', 'lift', 'dp', 'nu_hot'];
const store = new SeriesStore();
const judge = createRunJudge(DEFAULT_CRITERIA);
const values = new Map<string, number>();
let evaluations = 0;
let judgeMs = 0;
let judgeCpuUs = 0;
const start = performance.now();
for (let i = 1; i <= N; i++) {
  for (let s = 0; s < 4; s++) values.set(names[s], Math.max(1e-12, Math.exp(-i / (20000 * (s + 1)))) * (1 + 0.1 * uniform()));
  for (let s = 4; s < 8; s++) values.set(names[s], (s + 1) * (1 + Math.exp(-i / 300)) + 0.001 * uniform());
  store.add({ iteration: i, values }, (name) => ({ name, kind: name.startsWith('res_') ? 'residual' : 'quantity' }));
  if (isEvaluationPoint(store.records)) {
    const t = performance.now();
    const c = process.cpuUsage();
    judge.update(store.snapshot());
    judgeMs += performance.now() - t;
    judgeCpuUs += process.cpuUsage(c).user;
    evaluations++;
  }
}
const t = performance.now();
const final = judge.update(store.snapshot());
judgeMs += performance.now() - t;
console.log(`${N} iterations × 8 series: ${evaluations + 1} evaluations, analysis ${judgeMs.toFixed(0)} ms (CPU ${(judgeCpuUs / 1000).toFixed(0)} ms, includes GC threads), total with store ${(performance.now() - start).toFixed(0)} ms; verdict ${final.verdict}`);

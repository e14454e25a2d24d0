/**
 * MSER-5 truncation point: where the initial transient of an output series ends.
 *
 * Method (White 1997; MSER-5 as in White, Cobb & Spratt 2000): group the series into batch means of 5
 * values, Z_1..Z_k. For each candidate truncation d (batches dropped from the front), the marginal
 * standard error is MSER(d) = Σ_{j>d} (Z_j − Z̄_d)² / (k − d)², with Z̄_d the mean of the kept batches.
 * The truncation point is the d that minimises it. Only d in the first half is trusted: when the
 * global minimum lies in the second half, the series has not reached a steady state yet.
 * Sources: White (1997), "An effective truncation heuristic for bias reduction in simulation output",
 * Simulation 69(6):323–334; White, Cobb & Spratt (2000), "A comparison of five steady-state truncation
 * heuristics for simulation", Proc. Winter Simulation Conference.
 * Guard (ours): candidates that keep fewer than a quarter of the batches (at least 5) are not
 * considered. With very few batches kept, MSER(d) is the variance of a handful of values and is small
 * by chance often enough (about one time in five for two batches of white noise) to make a settled
 * series look unsettled at random.
 *
 * Cost: O(n) time (suffix sums, one backward pass), O(n/5) memory.
 *
 * @example mserTruncation(values, 0, values.length) // → { truncatePoints: 150, settled: true, … }
 */
import { scratchView, type AnalysisScratch } from './analysis-scratch.js';
export interface MserResult {
  /** Batches dropped (d). */
  readonly truncateBatches: number;
  /** Values dropped from `from` (d · batchSize). */
  readonly truncatePoints: number;
  /** Batches formed (k). */
  readonly batches: number;
  /** True when the minimum lies in the first half of the batches. */
  readonly settled: boolean;
}

export const MSER_BATCH = 5;

/** `scratch`: the caller's working arrays (analysis-scratch.ts); without it, a fresh array is used. */
export function mserTruncation(values: ArrayLike<number>, from: number, to: number, batchSize = MSER_BATCH,
  scratch?: AnalysisScratch): MserResult | null {
  const k = Math.floor((to - from) / batchSize);
  if (!(k >= 10)) return null;
  const z = scratchView(scratch?.batchMeans, k);
  for (let j = 0; j < k; j++) {
    let sum = 0;
    const start = from + j * batchSize;
    for (let i = 0; i < batchSize; i++) sum += values[start + i];
    z[j] = sum / batchSize;
  }
  // Centre on the last batch to keep the sums of squares accurate for large offsets.
  const shift = z[k - 1];
  const minKept = Math.max(5, Math.ceil(k / 4));
  let sum = 0;
  let sumSquares = 0;
  let bestD = k - 1;
  let best = Number.POSITIVE_INFINITY;
  // Backward pass: after adding batch d, the sums cover batches d..k−1 (the kept ones when dropping d).
  for (let d = k - 1; d >= 0; d--) {
    const v = z[d] - shift;
    sum += v;
    sumSquares += v * v;
    const kept = k - d;
    if (kept < minKept) continue;
    const ss = Math.max(0, sumSquares - (sum * sum) / kept);
    const mser = ss / (kept * kept);
    if (mser <= best) {
      best = mser;
      bestD = d;
    }
  }
  return {
    truncateBatches: bestD,
    truncatePoints: bestD * batchSize,
    batches: k,
    settled: bestD <= k / 2,
  };
}

/**
 * Quantile of Student's t distribution, from @stdlib (a reference implementation), loaded on first
 * use: its module tree takes about a tenth of a second to load, which commands that never compute
 * an interval (inspect, parsers) should not pay.
 *
 * Pure: loading a library is not I/O on the user's data; the function is deterministic.
 */
import { createRequire } from 'node:module';

type Quantile = (p: number, degreesOfFreedom: number) => number;

let quantile: Quantile | undefined;

/** t quantile: the value below which a fraction `p` of the t distribution with the given degrees
 * of freedom lies (e.g. tQuantile(0.975, 19) = 2.093). */
export function tQuantile(p: number, degreesOfFreedom: number): number {
  quantile ??= createRequire(import.meta.url)('@stdlib/stats-base-dists-t-quantile') as Quantile;
  return quantile(p, degreesOfFreedom);
}

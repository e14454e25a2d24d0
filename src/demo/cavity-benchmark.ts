/**
 * The benchmark the demo cavity is measured against, and how a grid study's result compares with it.
 *
 * de Vahl Davis (1983), "Natural convection of air in a square cavity: a bench mark numerical
 * solution", Int. J. Numer. Methods Fluids 3:249–264: mean Nusselt number on the hot wall for
 * Pr = 0.71, from memory: Ra = 1e3: 1.118; 1e4: 2.243; 1e5: 4.519; 1e6: 8.800. Those are the only
 * Rayleigh numbers it tabulates; at any other there is no benchmark value, and none is made up
 * (no interpolation between them).
 *
 * Pure. Cost: O(1).
 */

export const BENCHMARK_SOURCE = 'de Vahl Davis (1983)';
export const BENCHMARK_QUANTITY = 'hot-wall mean Nusselt number';

/** Rayleigh number → benchmark mean Nusselt number on the hot wall (from memory). */
export const BENCHMARK_NUSSELT: ReadonlyMap<number, number> = new Map([
  [1e3, 1.118],
  [1e4, 2.243],
  [1e5, 4.519],
  [1e6, 8.8],
]);

/** The benchmark value at this Rayleigh number, or undefined when the benchmark has none. */
export function benchmarkNusselt(rayleigh: number): number | undefined {
  for (const [ra, nu] of BENCHMARK_NUSSELT) {
    if (Math.abs(rayleigh - ra) <= 1e-9 * ra) return nu;
  }
  return undefined;
}

/** `1e4`, `2.5e4`: a Rayleigh number as the demo prints it. */
export function rayleighText(rayleigh: number): string {
  return rayleigh.toExponential().replace('e+', 'e');
}

export interface BenchmarkInput {
  readonly rayleigh: number;
  /** The fine grid's value. */
  readonly fine: number;
  /** The Richardson-extrapolated value (undefined when the study is degenerate). */
  readonly extrapolated?: number;
  /** Half-width of the fine grid's GCI band, in the quantity's units (undefined when degenerate). */
  readonly band?: number;
}

export interface BenchmarkComparison {
  readonly source: string;
  readonly quantity: string;
  readonly rayleigh: number;
  /** The benchmark value, or undefined when the benchmark has none at this Rayleigh number. */
  readonly value?: number;
  readonly extrapolated?: number;
  /** (extrapolated − benchmark) / benchmark. */
  readonly relativeDifference?: number;
  readonly fine: number;
  /** (fine − benchmark) / benchmark. */
  readonly fineRelativeDifference?: number;
  /** Half-width of the fine grid's GCI band (quantity units). */
  readonly band?: number;
  /** Whether the benchmark lies within fine ± band. */
  readonly withinFineGciBand?: boolean;
}

export function compareWithBenchmark(input: BenchmarkInput): BenchmarkComparison {
  const value = benchmarkNusselt(input.rayleigh);
  const base = { source: BENCHMARK_SOURCE, quantity: BENCHMARK_QUANTITY, rayleigh: input.rayleigh, fine: input.fine, extrapolated: input.extrapolated, band: input.band };
  if (value === undefined) return base;
  return {
    ...base,
    value,
    relativeDifference: input.extrapolated === undefined ? undefined : (input.extrapolated - value) / value,
    fineRelativeDifference: (input.fine - value) / value,
    withinFineGciBand: input.band === undefined ? undefined : Math.abs(input.fine - value) <= input.band,
  };
}

const signedPercent = (fraction: number): string => `${fraction >= 0 ? '+' : '−'}${Math.abs(fraction * 100).toFixed(2)} %`;
const digits = (x: number): string => String(Number(x.toPrecision(7)));

/** The comparison as text: one line, and a second on the fine grid's band when there is one. */
export function benchmarkText(c: BenchmarkComparison): string {
  const ra = rayleighText(c.rayleigh);
  if (c.value === undefined) {
    const tabulated = [...BENCHMARK_NUSSELT.keys()].map(rayleighText).join(', ');
    const ours = c.extrapolated === undefined ? `the fine grid gives ${digits(c.fine)}` : `the extrapolated value is ${digits(c.extrapolated)}`;
    return `Benchmark: ${c.source} has no ${c.quantity} at Ra ${ra} (it tabulates Ra ${tabulated}); ${ours}.\n`;
  }
  const head = `Benchmark: ${c.source}, ${c.quantity} at Ra ${ra} = ${c.value} (from memory)`;
  const lines = c.extrapolated === undefined || c.relativeDifference === undefined
    ? [`${head}; no extrapolated value (the study is degenerate); the fine grid's ${digits(c.fine)} differs by ${signedPercent(c.fineRelativeDifference as number)}.`]
    : [`${head}; the extrapolated ${digits(c.extrapolated)} differs by ${signedPercent(c.relativeDifference)}.`];
  if (c.withinFineGciBand !== undefined) {
    lines.push(`The benchmark lies ${c.withinFineGciBand ? 'inside' : 'OUTSIDE'} the fine grid's GCI band, ${digits(c.fine)} ± ${Number((c.band as number).toPrecision(3))} (the fine grid is ${signedPercent(c.fineRelativeDifference as number)} off).`);
  }
  return `${lines.join('\n')}\n`;
}

/** The comparison as a JSON object (settle's JSON has no undefined: absent numbers are null). */
export function benchmarkJson(c: BenchmarkComparison): Record<string, unknown> {
  const orNull = <T>(x: T | undefined): T | null => (x === undefined ? null : x);
  return {
    source: c.source,
    quantity: c.quantity,
    rayleigh: c.rayleigh,
    value: orNull(c.value),
    fromMemory: c.value !== undefined,
    extrapolated: orNull(c.extrapolated),
    relativeDifference: orNull(c.relativeDifference),
    fine: c.fine,
    fineRelativeDifference: orNull(c.fineRelativeDifference),
    fineGciBand: orNull(c.band),
    withinFineGciBand: orNull(c.withinFineGciBand),
    ...(c.value === undefined ? { reason: `${c.source} tabulates no value at Ra ${rayleighText(c.rayleigh)}` } : {}),
  };
}

/**
 * The sample logs in sample-logs/: what each file is, what produced it and the verdict settle should
 * give, with its bytes. Deterministic: no clock, no randomness, so `npm run samples` gives the same
 * bytes every time. Pure apart from gzip compression (node:zlib, itself deterministic: it writes no
 * time stamp).
 *
 * Producers: the demo cavity solver (cavity-solver.ts, each scenario), the model problems
 * (src/model-problems: 2-D Poisson by Jacobi, Gauss–Seidel and SOR; explicit 1-D heat stepping,
 * stable and unstable) and a transient 1-D heat run with inner iterations
 * (periodic-heat-transient.ts). Nothing is made up: every number is computed.
 */
import { gzipSync } from 'node:zlib';
import { createCavitySolver } from './cavity-solver.js';
import { SCENARIOS, type ScenarioName } from './cavity-scenarios.js';
import { createLogWriter, type LogFormat, type LogRow, type LogWriterOptions } from './log-writers.js';
import { cavityLogRow, DEMO_DEFAULTS, runCavityScenario } from './run-cavity-scenario.js';
import { writeCavityLog } from './write-cavity-log.js';
import { simulatePeriodicHeat } from './periodic-heat-transient.js';
import { solvePoisson2d, optimalSorOmega, type PoissonMethod } from '../model-problems/poisson-2d.js';
import { simulateHeatFtcs } from '../model-problems/heat-ftcs-1d.js';

export type ExpectedVerdict = 'converged' | 'converging' | 'stalled' | 'oscillating' | 'diverging' | 'failed';

export interface SampleLog {
  readonly file: string;
  /** Built-in parser spec that reads it. */
  readonly parser: string;
  /** What produced it, one or two sentences. */
  readonly producer: string;
  readonly expected: ExpectedVerdict;
  /** Why settle should say so. */
  readonly why: string;
  readonly bytes: Uint8Array;
}

const encoder = new TextEncoder();

function rowsToText(format: LogFormat, rows: Iterable<LogRow>, options: LogWriterOptions = {}): string {
  const writer = createLogWriter(format, options);
  let text = '';
  for (const row of rows) text += writer.row(row);
  return text;
}

function cavityText(scenario: ScenarioName, format: LogFormat, cells: number, every = 1): string {
  let text = '';
  writeCavityLog({ scenario, format, cells, rayleigh: DEMO_DEFAULTS.rayleigh, every }, (chunk) => {
    text += chunk;
  });
  return text;
}

function poissonRows(method: PoissonMethod, iterations: number, every: number): LogRow[] {
  const n = 31;
  const history = solvePoisson2d({ n, method, iterations, ...(method === 'sor' ? { omega: optimalSorOmega(n) } : {}) });
  return history
    .filter((it) => it.iteration % every === 0 || it.iteration === 1 || it.iteration === iterations)
    .map((it) => ({
      iter: it.iteration,
      fields: [
        { name: 'res_u', value: it.residualL2, kind: 'residual' as const },
        { name: 'res_u_max', value: it.residualMax, kind: 'residual' as const },
      ],
    }));
}

function heatRows(diffusionNumber: number, steps: number, every: number): LogRow[] {
  return simulateHeatFtcs({ n: 15, diffusionNumber, steps })
    .filter((s) => s.step % every === 0 || s.step === 1 || s.step === steps)
    .map((s) => ({ iter: s.step, fields: [{ name: 'res_u', value: s.residual, kind: 'residual' as const }] }));
}

/** Healthy run, then a restart from the checkpoint at `checkpoint` after running on to `stoppedAt`:
 * the solver is deterministic, so re-running to the checkpoint reproduces its state exactly. */
function restartText(cells: number, checkpoint: number, stoppedAt: number): string {
  const writer = createLogWriter('table', { headerEvery: 100 });
  let text = '';
  for (const it of runCavityScenario({ scenario: 'healthy', rayleigh: DEMO_DEFAULTS.rayleigh, cells, maxIterations: stoppedAt })) {
    text += writer.row(cavityLogRow(it));
  }
  writer.restart();
  for (const it of runCavityScenario({ scenario: 'healthy', rayleigh: DEMO_DEFAULTS.rayleigh, cells })) {
    if (it.iteration > checkpoint) text += writer.row(cavityLogRow(it));
  }
  return text;
}

/** The diverging cavity without the solver's guard, until a value is no longer finite, then the
 * crash line a solver prints. */
function crashText(cells: number): string {
  const solver = createCavitySolver({ ...SCENARIOS.diverging.solver, rayleigh: DEMO_DEFAULTS.rayleigh, cells });
  const writer = createLogWriter('kv');
  let text = '';
  for (let k = 0; k < 5000; k++) {
    const it = solver.step();
    text += writer.row(cavityLogRow(it));
    const values = [it.resPsi, it.resOmega, it.resT, it.nuHot, it.nuCold, it.uMax, it.vMax];
    if (values.some((v) => !Number.isFinite(v))) {
      return `${text}FATAL: non-finite value in the vorticity equation at iteration ${it.iteration}; run aborted\n`;
    }
  }
  throw new Error('the crash sample did not reach a non-finite value');
}

/** Build every sample log (a few seconds of computation). */
export function buildSampleLogs(): SampleLog[] {
  const logs: SampleLog[] = [];
  const add = (log: Omit<SampleLog, 'bytes'>, content: string | Uint8Array): void => {
    logs.push({ ...log, bytes: typeof content === 'string' ? encoder.encode(content) : content });
  };
  const g = DEMO_DEFAULTS.cells;
  const cavity = `demo cavity solver, Ra 1e4, grid ${g}×${g}`;

  add({ file: 'cavity-healthy.block.log', parser: 'settle-block', expected: 'converged',
    producer: `${cavity}, scenario healthy (every 2nd iteration written)`,
    why: 'residuals fall geometrically by six decades; Nusselt numbers settle to 2.31 on both walls' },
  cavityText('healthy', 'block', g, 2));
  add({ file: 'cavity-diverging.kv.log', parser: 'settle-kv', expected: 'diverging',
    producer: `${cavity}, scenario diverging (pseudo-time step 1.5 × the stability limit)`,
    why: 'the vorticity residual grows by decades until the solver\'s guard stops the run' },
  cavityText('diverging', 'kv', g));
  add({ file: 'cavity-oscillating.table.log', parser: 'settle-table', expected: 'oscillating',
    producer: `${cavity}, scenario oscillating (step 1.2 × the energy equation's limit, temperature bounded)`,
    why: 'the iteration locks into a period-2 cycle: Nusselt numbers and peak velocities alternate every iteration; residuals stay flat' },
  cavityText('oscillating', 'table', g));
  add({ file: 'cavity-stalled.csv', parser: 'settle-csv', expected: 'stalled',
    producer: `${cavity}, scenario stalled (wall heat fluxes that do not balance)`,
    why: 'res_T flattens about 1.3 decades below its start while res_psi and res_omega converge' },
  cavityText('stalled', 'csv', g));

  add({ file: 'poisson-jacobi.jsonl', parser: 'settle-jsonl', expected: 'converged',
    producer: 'model problem: 2-D Poisson, 31×31 interior points, Jacobi, 2000 iterations (every 5th written)',
    why: 'steady geometric fall at rho = cos(pi/32) = 0.9952, about 4 decades' },
  rowsToText('jsonl', poissonRows('jacobi', 2000, 5)));
  add({ file: 'poisson-gauss-seidel.kv.log', parser: 'settle-kv', expected: 'converged',
    producer: 'model problem: 2-D Poisson, 31×31 interior points, Gauss–Seidel, 1000 iterations (every 2nd written)',
    why: 'steady geometric fall at rho = cos²(pi/32) = 0.9904, about 4 decades' },
  rowsToText('kv', poissonRows('gauss-seidel', 1000, 2)));
  add({ file: 'poisson-sor.table.log', parser: 'settle-table', expected: 'converged',
    producer: 'model problem: 2-D Poisson, 31×31 interior points, SOR at the optimal factor, 120 iterations',
    why: 'fast fall (rho near omega_opt − 1 = 0.82) to about 1e-10' },
  rowsToText('table', poissonRows('sor', 120, 1)));
  add({ file: 'heat-ftcs-stable.csv', parser: 'settle-csv', expected: 'converged',
    producer: 'model problem: explicit 1-D heat stepping, 15 interior points, diffusion number 0.4 (stable), 1000 steps',
    why: 'every mode decays (d ≤ 1/2): the residual falls by about six decades' },
  rowsToText('csv', heatRows(0.4, 1000, 1)));
  add({ file: 'heat-ftcs-unstable-fortran.table.log', parser: 'settle-table', expected: 'diverging',
    producer: 'model problem: explicit 1-D heat stepping, 15 interior points, diffusion number 0.6 (unstable), 800 steps, numbers printed Fortran-style (0.1234D-02; three-digit exponents drop the letter: 0.1234+105)',
    why: 'the shortest wave grows by a factor 1.38 per step (d > 1/2), past 1e+100' },
  rowsToText('table', heatRows(0.6, 800, 1), { numberStyle: 'fortran' }));

  add({ file: 'periodic-heat-transient.kv.log', parser: 'settle-kv', expected: 'converged',
    producer: 'transient: 1-D heat equation with an oscillating end temperature 1 + ½ sin(2πt/0.25), backward Euler steps of 0.005 solved by Gauss–Seidel inner iterations to a 4-decade drop, 250 steps',
    why: 'each step\'s inner iterations reach their drop; t_mid and q_right settle into the forcing\'s periodic cycle (physical, not a fault)' },
  rowsToText('kv', simulatePeriodicHeat({ points: 15, dt: 0.005, period: 0.25, steps: 250 })));

  add({ file: 'cavity-healthy-crlf.csv', parser: 'settle-csv', expected: 'converged',
    producer: 'demo cavity solver, Ra 1e4, grid 16×16, healthy, with Windows line ends (CRLF)',
    why: 'the same healthy convergence; line ends must not matter' },
  cavityText('healthy', 'csv', 16).replace(/\n/g, '\r\n'));
  add({ file: 'cavity-healthy.jsonl.gz', parser: 'settle-jsonl', expected: 'converged',
    producer: 'demo cavity solver, Ra 1e4, grid 16×16, healthy, gzip-compressed',
    why: 'healthy convergence, read through gzip' },
  gzipSync(encoder.encode(cavityText('healthy', 'jsonl', 16)), { level: 9 }));
  add({ file: 'cavity-restart.table.log', parser: 'settle-table', expected: 'converged',
    producer: 'demo cavity solver, Ra 1e4, grid 16×16, healthy: stopped at iteration 300, restarted from the checkpoint at 200 (the counter goes back, the header is printed again) and run to the end',
    why: 'after the restart the run carries on converging to the target' },
  restartText(16, 200, 300));
  add({ file: 'cavity-cut-off.kv.log', parser: 'settle-kv', expected: 'converging',
    producer: `${cavity}, healthy, the solver killed during iteration 500: the last line is cut in the middle of a number and has no line end`,
    why: 'residuals are falling steadily but have not yet dropped three decades' },
  cutOffText(g, 500));
  add({ file: 'cavity-crash.kv.log', parser: 'settle-kv', expected: 'failed',
    producer: `${cavity}, the diverging step without the solver's guard: runs until values overflow to Inf and NaN, then a FATAL line`,
    why: 'the crash line and non-finite values' },
  crashText(g));
  return logs;
}

function cutOffText(cells: number, iterations: number): string {
  const text = rowsToText('kv', [...runCavityScenario({ scenario: 'healthy', rayleigh: DEMO_DEFAULTS.rayleigh, cells, maxIterations: iterations })].map(cavityLogRow));
  const lastLineStart = text.lastIndexOf('\n', text.length - 2) + 1;
  // Cut inside the last line's res_T value.
  const cut = text.indexOf('res_T=', lastLineStart) + 'res_T=1.23'.length;
  return text.slice(0, cut);
}

/** sample-logs/README.md, from the same catalogue. */
export function sampleLogsReadme(logs: readonly SampleLog[]): string {
  const lines = [
    '# Sample logs',
    '',
    'Logs for trying settle and for its end-to-end tests. Every number in them was computed by a real',
    'iteration; none is made up or perturbed. Regenerate them with `npm run samples` (deterministic: the',
    'same bytes every time); do not edit them by hand. `manifest.json` holds the same table for tests.',
    '',
    'Producers: the demo solver (`src/demo/cavity-solver.ts`: natural convection of air in a heated square',
    'cavity, de Vahl Davis 1983), the model problems (`src/model-problems/`) and a transient 1-D heat run',
    '(`src/demo/periodic-heat-transient.ts`). Scenario mechanisms are explained in `src/demo/cavity-scenarios.ts`.',
    '',
    '| file | parser | produced by | settle should say | because |',
    '| --- | --- | --- | --- | --- |',
    ...logs.map((log) => `| \`${log.file}\` | ${log.parser} | ${log.producer} | **${log.expected}** | ${log.why} |`),
    '',
  ];
  return lines.join('\n');
}

/** sample-logs/manifest.json: file, parser and expected verdict of each log. */
export function sampleLogsManifest(logs: readonly SampleLog[]): string {
  return `${JSON.stringify(logs.map(({ file, parser, expected }) => ({ file, parser, expected })), null, 2)}\n`;
}

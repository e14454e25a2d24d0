/**
 * A three-grid mesh study of one quantity, from the diagnoses of three runs: take each run's settled
 * value, compute the Grid Convergence Index (Celik et al. 2008, see grid-convergence-index.ts), and
 * say whether the iteration error of each run is small against the discretisation error.
 *
 * Iteration error against discretisation error (common practice, Eça & Hoekstra, several papers
 * 2006–2014, from memory): the iteration error should be two to three orders of magnitude smaller
 * than the discretisation error for it to be negligible. Here each run's iteration error is the
 * larger of the quantity's 95 % half-width and its estimated remaining iteration error (Ferziger &
 * Perić §5.7), and the discretisation error is the fine grid's GCI band in the quantity's units
 * (when the GCI is degenerate: the smallest non-zero difference between grids).
 *
 * Pure: diagnoses in, a study out. Refusals are UsageError (flags) or InputError (a run not fit for
 * the study), with a hint.
 */
import type { RunDiagnosis, SeriesDiagnosis, State } from '../analysis/diagnosis.js';
import { gridConvergenceIndex, type GciResult } from '../analysis/grid-convergence-index.js';
import { InputError, UsageError } from '../errors.js';

export interface MeshStudyRun {
  readonly log: string;
  readonly cells: number;
  readonly diagnosis: RunDiagnosis;
}

/** Where a grid's value came from. */
export type ValueSource = 'settled mean' | 'periodic mean' | 'last value';

export interface MeshStudyGrid {
  readonly role: 'fine' | 'medium' | 'coarse';
  readonly log: string;
  readonly cells: number;
  readonly value: number;
  readonly source: ValueSource;
  readonly state: State;
  /** max(halfWidth, |iterationError|) where the analysis gave them; undefined when it gave neither. */
  readonly iterationError?: number;
  /** iterationError / discretisation error. */
  readonly iterationToDiscretisation?: number;
  /** True when the ratio is at most 1/100 (two orders of magnitude). */
  readonly iterationErrorNegligible?: boolean;
}

export interface MeshStudy {
  readonly quantity: string;
  readonly dimensions: 1 | 2 | 3;
  readonly grids: readonly [MeshStudyGrid, MeshStudyGrid, MeshStudyGrid];
  readonly gci: GciResult;
  /** The discretisation error the iteration errors are compared with (quantity units). */
  readonly discretisationError: number;
  /** One sentence on iteration against discretisation error. */
  readonly iterationVerdict: string;
  /** Remarks on how values were taken (unsettled runs used anyway, periodic means). */
  readonly notes: readonly string[];
}

/** Iteration error at most this fraction of the discretisation error counts as negligible. */
export const NEGLIGIBLE_RATIO = 1e-2;

const ROLES = ['fine', 'medium', 'coarse'] as const;

/** Parse `--cells N1,N2,N3`: positive whole numbers, strictly decreasing from fine to coarse. */
export function parseCellCounts(text: string, logCount: number): number[] {
  const parts = text.split(',').map((p) => p.trim());
  const cells = parts.map((p) => (p === '' ? Number.NaN : Number(p.replace(/_/g, ''))));
  const bad = parts.find((p, i) => !(Number.isInteger(cells[i]) && cells[i] > 0));
  if (bad !== undefined) {
    throw new UsageError(`--cells needs positive whole numbers separated by commas, got '${bad}' in '${text}'`, 'for example --cells 64000,8000,1000 (fine, medium, coarse)');
  }
  if (cells.length !== logCount) {
    throw new UsageError(`--cells gives ${cells.length} cell count${cells.length === 1 ? '' : 's'} for ${logCount} log${logCount === 1 ? '' : 's'}`, 'give one count per log, in the same order (fine, medium, coarse)');
  }
  for (let i = 1; i < cells.length; i++) {
    if (!(cells[i] < cells[i - 1])) {
      throw new UsageError(`--cells must decrease from fine to coarse, got ${cells.join(', ')}`, 'list the logs and their cell counts finest first, e.g. fine.log medium.log coarse.log --cells 64000,8000,1000');
    }
  }
  return cells;
}

export function parseDimensions(text: string | undefined): 1 | 2 | 3 {
  if (text === undefined) return 3;
  const d = Number(text.trim());
  if (d !== 2 && d !== 3 && d !== 1) throw new UsageError(`--dims must be 2 or 3, got '${text}'`, 'use --dims 2 for a two-dimensional grid, --dims 3 (the default) for a three-dimensional one');
  return d;
}

function pickSeries(run: MeshStudyRun, quantity: string): SeriesDiagnosis {
  const series = run.diagnosis.series.find((s) => s.name === quantity) ?? run.diagnosis.series.find((s) => s.label === quantity);
  if (series !== undefined) return series;
  const quantities = run.diagnosis.series.filter((s) => s.kind === 'quantity').map((s) => s.name);
  const known = quantities.length > 0 ? quantities : run.diagnosis.series.map((s) => s.name);
  throw new UsageError(`${run.log} has no series named '${quantity}'`,
    known.length > 0 ? `known ${quantities.length > 0 ? 'quantities' : 'series'}: ${known.join(', ')}` : 'the log has no series at all: check it with settle inspect');
}

function valueOf(run: MeshStudyRun, series: SeriesDiagnosis, role: string, allowUnsettled: boolean, notes: string[]): { value: number; source: ValueSource } {
  if (series.kind !== 'quantity') {
    throw new UsageError(`${series.name} is a ${series.kind} series, not a monitored quantity`, `a mesh study compares quantities of interest; if ${series.name} is one, it is treated as such when named with --quantity`);
  }
  const finiteMean = series.mean !== undefined && Number.isFinite(series.mean);
  if (series.state === 'converged' && finiteMean) return { value: series.mean as number, source: 'settled mean' };
  if (series.state === 'oscillating' && finiteMean) {
    notes.push(`${role} (${run.log}): ${series.name} oscillates; its mean over whole periods was used`);
    return { value: series.mean as number, source: 'periodic mean' };
  }
  if (!allowUnsettled) {
    throw new InputError(`${role} run ${run.log}: ${series.name} has not settled (state ${series.state}: ${series.reason})`,
      'let the run settle, or pass --allow-unsettled to use its last value (the study is then less reliable)');
  }
  if (!Number.isFinite(series.last)) {
    throw new InputError(`${role} run ${run.log}: the last value of ${series.name} is ${series.last}`, 'a diverged or crashed run cannot enter a mesh study');
  }
  notes.push(`${role} (${run.log}): ${series.name} has not settled (state ${series.state}); its last value was used because of --allow-unsettled`);
  return { value: series.last, source: 'last value' };
}

export function meshStudy(runs: readonly MeshStudyRun[], quantity: string, dimensions: 1 | 2 | 3, allowUnsettled: boolean): MeshStudy {
  if (runs.length !== 3) throw new UsageError(`a mesh study takes three runs (fine, medium, coarse), got ${runs.length}`, 'give three logs, finest first, and --cells with three counts');
  const notes: string[] = [];
  const picked = runs.map((run, i) => {
    const series = pickSeries(run, quantity);
    const { value, source } = valueOf(run, series, ROLES[i], allowUnsettled, notes);
    const errors = [series.halfWidth, series.iterationError === undefined ? undefined : Math.abs(series.iterationError)]
      .filter((e): e is number => e !== undefined && Number.isFinite(e));
    return { run, series, value, source, iterationError: errors.length > 0 ? Math.max(...errors) : undefined };
  });
  let gci: GciResult;
  try {
    gci = gridConvergenceIndex({ grids: [0, 1, 2].map((i) => ({ cells: runs[i].cells, value: picked[i].value })) as never, dimensions });
  } catch (error) {
    if (error instanceof RangeError) throw new UsageError(error.message, 'check --cells and --dims');
    throw error;
  }
  const differences = [Math.abs(gci.epsilon21), Math.abs(gci.epsilon32)].filter((d) => d > 0);
  const discretisationError = gci.convergence !== 'degenerate' ? gci.gciFineAbsolute : differences.length > 0 ? Math.min(...differences) : 0;

  const grids = picked.map((p, i): MeshStudyGrid => {
    const ratio = p.iterationError !== undefined && discretisationError > 0 ? p.iterationError / discretisationError : undefined;
    return {
      role: ROLES[i], log: p.run.log, cells: p.run.cells, value: p.value, source: p.source, state: p.series.state,
      iterationError: p.iterationError, iterationToDiscretisation: ratio,
      iterationErrorNegligible: ratio === undefined ? undefined : ratio <= NEGLIGIBLE_RATIO,
    };
  }) as unknown as MeshStudy['grids'];

  return { quantity, dimensions, grids, gci, discretisationError, iterationVerdict: iterationVerdictOf(grids, discretisationError), notes };
}

function iterationVerdictOf(grids: readonly MeshStudyGrid[], discretisationError: number): string {
  const known = grids.filter((g) => g.iterationToDiscretisation !== undefined);
  if (discretisationError === 0) return 'no discretisation error could be estimated, so the iteration error cannot be compared with it';
  if (known.length === 0) return 'the analysis gave no iteration error for these runs, so it cannot be compared with the discretisation error';
  const worst = known.reduce((a, b) => ((a.iterationToDiscretisation as number) >= (b.iterationToDiscretisation as number) ? a : b));
  const ratio = worst.iterationToDiscretisation as number;
  const missing = grids.length - known.length;
  const tail = missing > 0 ? ` (${missing} run${missing === 1 ? '' : 's'} gave no iteration error)` : '';
  if (ratio <= NEGLIGIBLE_RATIO) {
    const share = ratio * 100 < 0.01 ? 'below 0.01 %' : `at most ${(ratio * 100).toPrecision(2)} %`;
    return `iteration error negligible: ${share} of the discretisation error (common practice asks for two to three orders of magnitude smaller)${tail}`;
  }
  if (ratio < 1) {
    return `iteration error NOT negligible: the ${worst.role} run's is ${(ratio * 100).toPrecision(2)} % of the discretisation error (common practice asks for two to three orders of magnitude smaller); converge the runs further before trusting the index${tail}`;
  }
  return `iteration error as large as the discretisation error or larger (${worst.role} run: ${ratio.toPrecision(2)} times): the study measures iteration error, not grid dependence; converge the runs further${tail}`;
}

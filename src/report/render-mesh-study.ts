/** A mesh study as text or JSON (settle compare). Pure. */
import { formatNumber, jsonNumber } from '../text/format-number.js';
import { formatCount } from '../text/format-count.js';
import type { MeshStudy } from './mesh-study.js';
import { textTable } from './render-text-report.js';

const pct = (fraction: number): string => `${formatNumber(fraction * 100, 3)} %`;

export const MESH_STUDY_CAUTION = 'The index assumes the grids are in the asymptotic range and similar in shape (systematically refined); it estimates discretisation uncertainty only, not modelling error.';

export function renderMeshStudyText(study: MeshStudy): string {
  const g = study.gci;
  const out = [`Mesh study of ${study.quantity} (${study.dimensions}-D grids; Celik et al. 2008)`, ''];
  out.push(...textTable(['grid', 'log', 'cells', 'h', 'value', 'taken from', 'state', 'iteration error'],
    study.grids.map((grid, i) => [grid.role, grid.log, formatCount(grid.cells), formatNumber(g.cellSizes[i]), formatNumber(grid.value, 7), grid.source, grid.state,
      grid.iterationError === undefined ? '—' : formatNumber(grid.iterationError, 3)])), '');
  const row = (label: string, value: string): string => `${label.padEnd(30)}${value}`;
  out.push(row('refinement ratios', `r21 = ${formatNumber(g.r21)}, r32 = ${formatNumber(g.r32)}`));
  out.push(row('differences', `e21 = ${formatNumber(g.epsilon21)}, e32 = ${formatNumber(g.epsilon32)}`));
  if (g.convergence === 'degenerate') {
    out.push(row('convergence', 'degenerate: no estimate'), row('why', g.reason));
  } else {
    out.push(row('convergence', `${g.convergence} (R = e21/e32 = ${formatNumber(g.convergenceRatio, 3)})`));
    out.push(row('apparent order p', `${formatNumber(g.order)} (${g.orderIterations} fixed-point step${g.orderIterations === 1 ? '' : 's'})`));
    out.push(row('extrapolated value', formatNumber(g.extrapolated, 7)));
    out.push(row('approximate relative error', `e21_a = ${pct(g.approximateRelativeError)}`));
    out.push(row('extrapolated relative error', `e21_ext = ${pct(g.extrapolatedRelativeError)}`));
    out.push(row('GCI of the fine grid', `${pct(g.gciFine)}, i.e. ${formatNumber(study.grids[0].value, 7)} ± ${formatNumber(g.gciFineAbsolute, 3)} (safety factor ${g.safetyFactor})`));
  }
  out.push(row('iteration vs discretisation', study.iterationVerdict));
  const notes = [...g.notes, ...study.notes];
  if (notes.length > 0) out.push('', 'Notes', ...notes.map((n) => `  - ${n}`));
  out.push('', `Caution: ${MESH_STUDY_CAUTION}`);
  return `${out.join('\n')}\n`;
}

export function meshStudyJson(study: MeshStudy): Record<string, unknown> {
  const g = study.gci;
  const n = (x: number | undefined): number | string | null => (x === undefined ? null : jsonNumber(x));
  return {
    quantity: study.quantity,
    dimensions: study.dimensions,
    grids: study.grids.map((grid, i) => ({
      role: grid.role, log: grid.log, cells: grid.cells, cellSize: n(g.cellSizes[i]), value: n(grid.value), source: grid.source, state: grid.state,
      iterationError: n(grid.iterationError), iterationToDiscretisation: n(grid.iterationToDiscretisation),
      iterationErrorNegligible: grid.iterationErrorNegligible ?? null,
    })),
    r21: n(g.r21),
    r32: n(g.r32),
    epsilon21: n(g.epsilon21),
    epsilon32: n(g.epsilon32),
    convergenceRatio: n(g.convergenceRatio),
    convergence: g.convergence,
    ...(g.convergence === 'degenerate'
      ? { reason: g.reason }
      : {
        order: n(g.order), extrapolated: n(g.extrapolated), approximateRelativeError: n(g.approximateRelativeError),
        extrapolatedRelativeError: n(g.extrapolatedRelativeError), gciFine: n(g.gciFine), gciFineAbsolute: n(g.gciFineAbsolute), safetyFactor: g.safetyFactor,
      }),
    discretisationError: n(study.discretisationError),
    iterationVerdict: study.iterationVerdict,
    notes: [...g.notes, ...study.notes],
  };
}

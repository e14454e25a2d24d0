/**
 * Decide, on each scheduled diagnosis while following, whether the gate has seen enough: the
 * verdict is final (a stopping verdict that held for the confirmation window, RunDiagnosis.final)
 * and at least `minIterations` iterations have been logged. Before that the gate keeps following,
 * so nothing acts on the first iterations of a run (safe by default). Pure; O(1).
 */
import type { RunDiagnosis } from '../analysis/diagnosis.js';

export function shouldStopFollowing(diagnosis: RunDiagnosis, minIterations: number): boolean {
  return diagnosis.final && diagnosis.iterations >= minIterations;
}

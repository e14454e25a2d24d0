/**
 * The worst of several verdicts by SEVERITY (failed > diverging > oscillating > stalled >
 * undecided > converging > converged): it decides the exit code of a check over several logs.
 * An empty list gives `undecided` (nothing was judged). Pure; O(n).
 */
import { SEVERITY, type State } from '../analysis/diagnosis.js';

export function worstVerdict(verdicts: readonly State[]): State {
  if (verdicts.length === 0) return 'undecided';
  return verdicts.reduce((worst, verdict) => (SEVERITY[verdict] > SEVERITY[worst] ? verdict : worst));
}

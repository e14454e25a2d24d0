/**
 * Parse the gate's `--on` value: a comma-separated list of verdicts (e.g. `converged,diverging`)
 * that trigger the gate's actions. Unknown or empty entries are refused with the list of valid
 * verdicts. Pure; O(length of the text).
 *
 * @example parseVerdictList('converged, diverging') // Set { 'converged', 'diverging' }
 */
import { EXIT_CODES, type State } from '../analysis/diagnosis.js';
import { UsageError, shorten } from '../errors.js';

export const VERDICTS: readonly State[] = Object.keys(EXIT_CODES) as State[];

export function parseVerdictList(text: string): ReadonlySet<State> {
  const hint = `choose from ${VERDICTS.join(', ')}, separated by commas, e.g. --on converged,diverging`;
  const parts = text.split(',').map((part) => part.trim().toLowerCase());
  if (parts.every((part) => part === '')) throw new UsageError('--on needs at least one verdict', hint);
  const chosen = new Set<State>();
  for (const part of parts) {
    if (part === '') continue;
    if (!(VERDICTS as readonly string[]).includes(part)) {
      throw new UsageError(`--on names an unknown verdict '${shorten(part, 20)}'`, hint);
    }
    chosen.add(part as State);
  }
  return chosen;
}

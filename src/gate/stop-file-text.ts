/**
 * The text settle writes into a stop file: `key: value` lines a person can read and a solver (or a
 * shell script) can grep. The first line is fixed, so a solver may also just test that the file
 * exists. Newlines inside values are flattened so every key stays on one line. Pure; O(length).
 *
 * @example
 * settle stop request
 * verdict: converged
 * exit-code: 0
 * iteration: 1840
 * log: runs/a/solver.log
 * ended-by: the verdict held for the confirmation window
 * reason: res_p down 3.1 decades from its peak
 * advice: stop: all residuals 3 orders down
 */
import type { State } from '../analysis/diagnosis.js';

export const STOP_FILE_FIRST_LINE = 'settle stop request';

export interface StopFileFacts {
  readonly verdict: State;
  readonly exitCode: number;
  readonly iteration: number;
  readonly log: string;
  readonly endedBy: string;
  readonly reason: string;
  readonly advice: string;
}

const flat = (text: string): string => text.replace(/[\r\n]+/g, ' ').trim();

export function stopFileText(facts: StopFileFacts): string {
  return [
    STOP_FILE_FIRST_LINE,
    `verdict: ${facts.verdict}`,
    `exit-code: ${facts.exitCode}`,
    `iteration: ${Number.isFinite(facts.iteration) ? facts.iteration : 'none'}`,
    `log: ${flat(facts.log)}`,
    `ended-by: ${flat(facts.endedBy)}`,
    `reason: ${flat(facts.reason)}`,
    `advice: ${flat(facts.advice)}`,
  ].join('\n') + '\n';
}

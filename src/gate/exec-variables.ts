/**
 * The environment variables settle sets for the `--exec` command of the gate: the one list that
 * both the plan (plan-gate-actions.ts) and the help text of `settle check` use, so they cannot
 * disagree. The values go into the command's environment, never into its command line.
 */

/** Names, in the order the help text lists them. */
export const EXEC_VARIABLES = ['SETTLE_VERDICT', 'SETTLE_REASON', 'SETTLE_ADVICE', 'SETTLE_LOG', 'SETTLE_EXIT_CODE', 'SETTLE_ITERATION'] as const;

export type ExecVariable = (typeof EXEC_VARIABLES)[number];

/** What each variable holds, for the help text and the README. */
export const EXEC_VARIABLE_MEANINGS: Readonly<Record<ExecVariable, string>> = {
  SETTLE_VERDICT: 'the verdict (converged, diverging, ...)',
  SETTLE_REASON: 'the verdict\'s reasons on one line',
  SETTLE_ADVICE: 'the advice',
  SETTLE_LOG: 'the log as named on the command line',
  SETTLE_EXIT_CODE: 'the exit code settle check will return',
  SETTLE_ITERATION: 'the last iteration read (empty when none)',
};

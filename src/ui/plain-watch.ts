/**
 * `settle watch` without a terminal (piped, in a batch job): no drawing, one plain line per state
 * change, and the final verdict of each run when its source ends.
 */
import type { RunDiagnosis } from '../analysis/diagnosis.js';
import { EXIT_CODES, SEVERITY } from '../analysis/diagnosis.js';
import type { WatchedRun } from './dashboard-screen.js';

export const NO_TTY_NOTICE = 'settle watch: standard output is not a terminal, so no dashboard is drawn; '
  + 'printing one line per state change instead (for scripts, `settle check --follow` gives verdicts as exit codes)\n';

/** Follow every run, writing `label: change` lines (no label for a single run). Resolves with the exit
 * code of the worst final verdict once every source has ended (or been stopped). */
export async function plainWatch(runs: readonly WatchedRun[], stdout: NodeJS.WritableStream, stderr: NodeJS.WritableStream): Promise<number> {
  stderr.write(NO_TTY_NOTICE);
  const prefix = (run: WatchedRun): string => (runs.length > 1 ? `${run.label}: ` : '');
  const finals = await Promise.all(runs.map(async (run): Promise<RunDiagnosis> => {
    run.monitor.on('state-change', (change) => {
      stdout.write(`${prefix(run)}${change.text}\n`);
    });
    const final = await run.monitor.run();
    stdout.write(`${prefix(run)}final verdict: ${final.verdict} at iteration ${final.iterations}: ${final.advice}\n`);
    return final;
  }));
  let worst = finals[0]?.verdict ?? 'undecided';
  for (const final of finals) if (SEVERITY[final.verdict] > SEVERITY[worst]) worst = final.verdict;
  return EXIT_CODES[worst];
}

/**
 * The batch gate: follow one run's log through the run monitor until the verdict is final (and the
 * minimum iterations have passed), the log has not grown for the idle time, or a watched process
 * has ended; then plan the actions from the diagnosis, carry them out (or only describe them on a
 * dry run), and return the `check` exit code of the verdict.
 *
 * Output: with `events`, standard output carries only NDJSON (gate-events.ts) and failures of actions
 * go to standard error. Otherwise the run's text block is printed to standard output followed by one
 * `gate:` line per decision and action (so a job log keeps them together); with `json`, standard
 * output carries only the run's JSON object and the `gate:` lines go to standard error.
 */
import type { RunDiagnosis } from '../analysis/diagnosis.js';
import type { RunMonitor, RunMonitorOptions } from '../monitor/run-monitor-types.js';
import { formatRunText } from './format-check-text.js';
import { runJson } from './check-json.js';
import { actionEvent, stateChangeEvent, verdictEvent } from './gate-events.js';
import type { GateEnding } from './gate-ending.js';
import { isProcessRunning } from './check-gate-inputs.js';
import { describeAction, planGateActions, type GateRequest } from './plan-gate-actions.js';
import { performGateActions, type ActionOutcome } from './perform-gate-actions.js';
import { shouldStopFollowing } from './should-stop-following.js';

export interface FollowGateOptions {
  /** Monitor options for the one run followed (`follow` is forced on). */
  readonly monitor: Omit<RunMonitorOptions, 'follow'>;
  readonly request: GateRequest;
  readonly idleMs?: number;
  readonly pid?: number;
  readonly dryRun: boolean;
  readonly events: boolean;
  readonly json: boolean;
  readonly stdout: NodeJS.WritableStream;
  readonly stderr: NodeJS.WritableStream;
  /** How often the watched process is probed, ms (default 250). */
  readonly pidPollMs?: number;
  /** Wait after the watched process ended before the last read, so its final lines land (default 300). */
  readonly pidGraceMs?: number;
  /** Factory of the monitor (tests may inject one). Default: the real run monitor, loaded lazily. */
  readonly createMonitor?: (options: RunMonitorOptions) => RunMonitor;
}

export async function followAndGate(options: FollowGateOptions): Promise<number> {
  const create = options.createMonitor ?? (await import('../monitor/run-monitor.js')).createRunMonitor;
  const monitor = create({ ...options.monitor, follow: true });
  const out = (line: string): void => void options.stdout.write(`${line}\n`);
  const note = (line: string): void => void options.stderr.write(`settle: ${line}\n`);

  let ending: GateEnding | undefined;
  let trigger: RunDiagnosis | undefined;
  const timers: NodeJS.Timeout[] = [];
  const end = (why: GateEnding): void => {
    if (ending !== undefined) return;
    ending = why;
    void monitor.stop();
  };

  if (options.events) monitor.on('state-change', (change) => out(stateChangeEvent(change)));
  monitor.on('diagnosis', (diagnosis) => {
    if (ending === undefined && shouldStopFollowing(diagnosis, options.request.minIterations)) {
      trigger = diagnosis;
      end({ kind: 'final' });
    }
  });
  let opened = false;
  monitor.on('source', (event) => {
    if (event.type === 'opened') opened = true;
    if (event.type === 'waiting') note(`waiting for ${event.path} to appear`);
    else if (event.type === 'warning') note(`warning: ${event.message}`);
  });

  if (options.idleMs !== undefined) {
    const idleMs = options.idleMs;
    let lastActivity = Date.now();
    monitor.on('records', () => { lastActivity = Date.now(); opened = true; });
    timers.push(setInterval(() => {
      const grewAt = monitor.pace().lastGrowthAt;
      const since = Math.max(lastActivity, Number.isFinite(grewAt) ? grewAt : 0);
      if (Date.now() - since >= idleMs) end(opened ? { kind: 'idle', idleMs } : { kind: 'idle', idleMs, neverAppeared: true });
    }, Math.min(1000, Math.max(20, Math.floor(idleMs / 5)))));
  }
  if (options.pid !== undefined) {
    const pid = options.pid;
    const probe = setInterval(() => {
      if (isProcessRunning(pid)) return;
      clearInterval(probe);
      timers.push(setTimeout(() => end({ kind: 'process-ended', pid }), options.pidGraceMs ?? 300));
    }, options.pidPollMs ?? 250);
    timers.push(probe);
  }

  let last: RunDiagnosis;
  try {
    last = await monitor.run();
  } finally {
    for (const timer of timers) clearTimeout(timer);
  }
  const diagnosis = trigger ?? last;
  const plan = planGateActions(diagnosis, ending ?? { kind: 'source-ended' }, options.request);
  const perform = (): Promise<ActionOutcome[]> => (plan.act
    ? performGateActions(plan.actions, { dryRun: options.dryRun, execStdout: options.events ? 'stderr' : 'inherit' })
    : Promise.resolve([]));

  if (options.events) {
    for (const outcome of await perform()) {
      out(actionEvent(outcome.action, { dryRun: options.dryRun, ok: outcome.ok, message: options.dryRun ? undefined : outcome.message }));
      if (!options.dryRun && !outcome.ok) note(`failed to ${describeAction(outcome.action)}: ${outcome.message ?? 'unknown reason'}`);
    }
    out(verdictEvent(plan, { final: diagnosis.final, advice: diagnosis.advice, log: options.request.log }));
    return plan.exitCode;
  }
  // The verdict first, then what the gate does about it (a command's own output follows).
  options.stdout.write(options.json ? `${JSON.stringify(runJson(diagnosis))}\n` : formatRunText(options.request.log, diagnosis));
  const say = options.json ? note : (line: string): void => out(line);
  say(`gate: stopped following because ${plan.endedBy}`);
  if (!plan.act) say(`gate: no action, ${plan.why}`);
  for (const outcome of await perform()) {
    const what = describeAction(outcome.action);
    if (options.dryRun) say(`gate: dry run, would ${what}`);
    else if (outcome.ok) say(`gate: did ${what}`);
    else say(`gate: failed to ${what}: ${outcome.message ?? 'unknown reason'}`);
  }
  return plan.exitCode;
}

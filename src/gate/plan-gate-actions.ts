/**
 * Gate action planning: from the diagnosis the gate ended on, decide whether to act and list the
 * actions (write a stop file, send a signal, run a command), each fully described so that carrying
 * it out needs no further decision. Pure (the changesets "plan, then apply" split): the I/O lives in
 * perform-gate-actions.ts, and `--dry-run` prints this plan instead of applying it. O(reasons).
 *
 * Rules (safe by default):
 * - nothing acts before `minIterations` iterations have been logged;
 * - only verdicts in `on` act (default: the final verdicts, FINAL_STATES);
 * - a stopping verdict (converged, stalled, oscillating, diverging, failed) acts only once it is
 *   final, i.e. it held for the confirmation window (criteria.confirm). A non-stopping verdict
 *   (converging, undecided) acts only when the user asked for it with `--on`, and then only when
 *   following ended for another reason (idle log, watched process ended).
 */
import { FINAL_STATES, type RunDiagnosis, type State } from '../analysis/diagnosis.js';
import { describeEnding, type GateEnding } from './gate-ending.js';
import type { SignalTarget } from './parse-signal-target.js';
import { stopFileText } from './stop-file-text.js';
import type { ExecVariable } from './exec-variables.js';
import { formatCount } from '../text/format-count.js';

export interface GateRequest {
  /** The log as the user named it (reported in the stop file and SETTLE_LOG). */
  readonly log: string;
  /** Verdicts that trigger the actions. */
  readonly on: ReadonlySet<State>;
  readonly minIterations: number;
  readonly stopFile?: string;
  readonly signal?: SignalTarget;
  readonly exec?: string;
}

export type GateAction =
  | { readonly kind: 'stop-file'; readonly path: string; readonly content: string }
  | { readonly kind: 'signal'; readonly pid: number; readonly signal: string }
  /** `env` holds only the variables settle adds; the command line is the user's, untouched. */
  | { readonly kind: 'exec'; readonly command: string; readonly env: Readonly<Record<string, string>> };

export interface GatePlan {
  readonly verdict: State;
  readonly exitCode: number;
  readonly iteration: number;
  /** Plain words: why following ended. */
  readonly endedBy: string;
  /** The verdict's reasons in one line (SETTLE_REASON, stop file). */
  readonly reason: string;
  readonly act: boolean;
  /** Plain words: why the gate acts or does not. */
  readonly why: string;
  /** Empty when `act` is false. */
  readonly actions: readonly GateAction[];
}

/** Words for the reasons of a diagnosis on one line: the reasons joined, else the advice. */
export function reasonLine(diagnosis: RunDiagnosis): string {
  const reasons = diagnosis.reasons.map((reason) => reason.replace(/[\r\n]+/g, ' ').trim()).filter((reason) => reason !== '');
  return reasons.length > 0 ? reasons.join('; ') : diagnosis.advice;
}

export function planGateActions(diagnosis: RunDiagnosis, ending: GateEnding, request: GateRequest): GatePlan {
  const verdict = diagnosis.verdict;
  const endedBy = describeEnding(ending);
  const reason = reasonLine(diagnosis);
  const base = { verdict, exitCode: diagnosis.exitCode, iteration: diagnosis.iterations, endedBy, reason };
  const wanted = request.stopFile !== undefined || request.signal !== undefined || request.exec !== undefined;
  const none = (why: string): GatePlan => ({ ...base, act: false, why, actions: [] });

  if (!wanted) return none('no action was asked for (--stop-file, --signal, --exec)');
  if (!(diagnosis.iterations >= request.minIterations)) {
    const seen = Number.isFinite(diagnosis.iterations) ? `${formatCount(diagnosis.iterations)} iterations` : 'no iterations';
    return none(`only ${seen} logged, fewer than --min-iterations ${request.minIterations}`);
  }
  if (!request.on.has(verdict)) return none(`the verdict ${verdict} is not one of --on ${[...request.on].join(',')}`);
  if (FINAL_STATES.has(verdict) && !diagnosis.final) {
    return none(`the verdict ${verdict} has not held for the confirmation window yet`);
  }

  const actions: GateAction[] = [];
  if (request.stopFile !== undefined) {
    actions.push({
      kind: 'stop-file',
      path: request.stopFile,
      content: stopFileText({ verdict, exitCode: diagnosis.exitCode, iteration: diagnosis.iterations, log: request.log, endedBy, reason, advice: diagnosis.advice }),
    });
  }
  if (request.signal !== undefined) actions.push({ kind: 'signal', pid: request.signal.pid, signal: request.signal.signal });
  if (request.exec !== undefined) {
    // Typed by the one list of names (exec-variables.ts) the help text shows: none missing, none extra.
    const env: Readonly<Record<ExecVariable, string>> = {
      SETTLE_VERDICT: verdict,
      SETTLE_REASON: reason,
      SETTLE_ADVICE: diagnosis.advice,
      SETTLE_LOG: request.log,
      SETTLE_EXIT_CODE: String(diagnosis.exitCode),
      SETTLE_ITERATION: Number.isFinite(diagnosis.iterations) ? String(diagnosis.iterations) : '',
    };
    actions.push({ kind: 'exec', command: request.exec, env });
  }
  return { ...base, act: true, why: `the verdict ${verdict} is one of --on ${[...request.on].join(',')}`, actions };
}

/** One line per action, for `--dry-run` and for the record of what was done. */
export function describeAction(action: GateAction): string {
  switch (action.kind) {
    case 'stop-file': return `write stop file ${action.path}`;
    case 'signal': return `send ${action.signal} to process ${action.pid}`;
    case 'exec': return `run '${action.command}' with ${Object.keys(action.env).join(', ')} set`;
  }
}

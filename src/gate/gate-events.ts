/**
 * The gate's event stream (`settle check --follow --events`): one JSON object per line (NDJSON) on
 * standard output, for scripts and other dashboards. Keep these shapes stable.
 *
 *   {"type":"state-change","iteration","series","from","to","text"}   series is null for the run
 *   {"type":"action","action":"stop-file"|"signal"|"exec","description","dryRun","ok","message"?}
 *   {"type":"verdict","iteration","verdict","exitCode","final","endedBy","reason","advice","acted","why","log"}
 *
 * The `verdict` event is always the last line. Non-finite numbers are strings, as in `--json`. Pure.
 */
import type { StateChange } from '../analysis/diagnosis.js';
import { jsonNumber } from '../text/format-number.js';
import type { GateAction, GatePlan } from './plan-gate-actions.js';
import { describeAction } from './plan-gate-actions.js';

export function stateChangeEvent(change: StateChange): string {
  return JSON.stringify({
    type: 'state-change',
    iteration: jsonNumber(change.iteration),
    series: change.series,
    from: change.from,
    to: change.to,
    text: change.text,
  });
}

export function actionEvent(action: GateAction, outcome: { dryRun: boolean; ok: boolean; message?: string }): string {
  return JSON.stringify({
    type: 'action',
    action: action.kind,
    description: describeAction(action),
    dryRun: outcome.dryRun,
    ok: outcome.ok,
    ...(outcome.message === undefined ? {} : { message: outcome.message }),
  });
}

export function verdictEvent(plan: GatePlan, extra: { final: boolean; advice: string; log: string }): string {
  return JSON.stringify({
    type: 'verdict',
    iteration: jsonNumber(plan.iteration),
    verdict: plan.verdict,
    exitCode: plan.exitCode,
    final: extra.final,
    endedBy: plan.endedBy,
    reason: plan.reason,
    advice: extra.advice,
    acted: plan.act,
    why: plan.why,
    log: extra.log,
  });
}

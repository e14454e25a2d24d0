/**
 * Why the gate stopped following a run, and how to say so in plain words. Pure.
 */
import { formatDuration } from './format-duration.js';

export type GateEnding =
  /** The verdict is final (it held for the confirmation window) and the minimum iterations passed. */
  | { readonly kind: 'final' }
  /** The log did not grow for the --idle duration. */
  | { readonly kind: 'idle'; readonly idleMs: number; readonly neverAppeared?: boolean }
  /** The process given with --pid ended. */
  | { readonly kind: 'process-ended'; readonly pid: number }
  /** The source itself ended (standard input closed). */
  | { readonly kind: 'source-ended' };

/** e.g. `the verdict held for the confirmation window`, `the log did not grow for 30s`. */
export function describeEnding(ending: GateEnding): string {
  switch (ending.kind) {
    case 'final': return 'the verdict held for the confirmation window';
    case 'idle': return ending.neverAppeared
      ? `the log did not appear within ${formatDuration(ending.idleMs)}`
      : `the log did not grow for ${formatDuration(ending.idleMs)}`;
    case 'process-ended': return `process ${ending.pid} ended`;
    case 'source-ended': return 'the log ended';
  }
}

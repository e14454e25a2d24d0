/**
 * What a report is made from: per run, the final diagnosis (what the analysis decided), the store's
 * snapshot (for charts only: the views never re-derive a verdict), and how the log was read.
 */
import type { Criteria } from '../analysis/criteria.js';
import type { RunDiagnosis } from '../analysis/diagnosis.js';
import type { RunSnapshot } from '../series/series-column.js';

export interface ReportRun {
  /** The log path(s) as the user gave them (a restart chain joined with ' + '). */
  readonly log: string;
  readonly diagnosis: RunDiagnosis;
  readonly snapshot: RunSnapshot;
  /** Chosen parser: spec id and the one-line explanation of the choice. */
  readonly parser?: { readonly id: string; readonly explanation: string };
  /** Source warnings met while reading (lines cut, invalid UTF-8...). */
  readonly warnings?: readonly string[];
}

export interface ReportInput {
  readonly runs: readonly ReportRun[];
  /** The criteria in force (shown once at the top). */
  readonly criteria: Criteria;
  /** settle's version, printed in the header. */
  readonly version?: string;
}

export type ReportFormat = 'text' | 'md' | 'html' | 'json';
export const REPORT_FORMATS: readonly ReportFormat[] = ['text', 'md', 'html', 'json'];

/**
 * The few errors settle reports to users. Each has a stable code, a one-line message that says what
 * was wrong, and a hint that says how to fix it. Only the CLI entry point turns them into exit codes.
 */

export abstract class SettleError extends Error {
  abstract readonly code: string;
  /** Process exit code for this failure (2 usage, 3 unreadable input, 4 output not written). */
  abstract readonly exitCode: number;
  constructor(message: string, readonly hint?: string) {
    super(message);
    this.name = new.target.name;
  }
}

/** The command line or a file the user wrote (spec, criteria) is wrong. Exit code 2. */
export class UsageError extends SettleError {
  readonly code = 'usage';
  readonly exitCode = 2;
}

/** A parser spec or criteria file failed validation: every problem as `file: path.to.field: message`. */
export class SpecError extends SettleError {
  readonly code = 'spec';
  readonly exitCode = 2;
  constructor(readonly file: string, readonly problems: readonly string[], hint?: string) {
    super(`${file}: ${problems.length} problem${problems.length === 1 ? '' : 's'}:\n  ${problems.join('\n  ')}`, hint);
  }
}

/** An input cannot be read (missing, unreadable, not a log). Exit code 3. */
export class InputError extends SettleError {
  readonly code = 'input';
  readonly exitCode = 3;
}

/** An output settle was asked to write (a report file) could not be written, after the input was
 * read and judged. Exit code 4: not 2, which promises that nothing was read, and clear of the
 * verdict codes (0, 10, 11, 20, 21, 30, 31), 3 (unreadable input) and 70 (internal error). */
export class OutputError extends SettleError {
  readonly code = 'output';
  readonly exitCode = 4;
}

/** Cut a user's text (a line, a value) short for an error message, on one line, with control
 * characters and undecodable bytes shown as `?` so binary garbage cannot disturb the terminal. */
export function shorten(text: string, max = 80): string {
  // eslint-disable-next-line no-control-regex
  const oneLine = text.replace(/[\r\n\t]+/g, ' ').replace(/[\u0000-\u001f\u007f-\u009f\ufffd]/g, '?');
  return oneLine.length <= max ? oneLine : `${oneLine.slice(0, max - 1)}…`;
}

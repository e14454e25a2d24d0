/**
 * Turn a failed file-system call on a log into the one-line InputError users see:
 * `cannot read run.log: no such file`, with a hint that says what to do about it.
 *
 * Cost: constant. Unknown error codes keep the system's own words so nothing is hidden.
 */
import { InputError } from '../errors.js';

interface Explanation {
  readonly what: string;
  readonly hint: string;
}

const EXPLANATIONS: Readonly<Record<string, Explanation>> = {
  ENOENT: { what: 'no such file', hint: 'check the path; to wait for a log that a solver has not created yet, use `settle watch` or `settle check --follow`' },
  ENOTDIR: { what: 'a part of the path is not a folder', hint: 'check the path' },
  EISDIR: { what: 'it is a folder, not a file', hint: 'name the log file inside the folder' },
  EACCES: { what: 'permission denied', hint: 'settle only needs read access: check the permissions of the file and its folders' },
  EPERM: { what: 'operation not permitted', hint: 'settle only needs read access: check the permissions of the file and its folders' },
  ELOOP: { what: 'too many symbolic links', hint: 'check for a symbolic link that points to itself' },
  EMFILE: { what: 'too many open files', hint: 'raise the limit (ulimit -n) or follow fewer logs at once' },
  ENFILE: { what: 'too many open files on this system', hint: 'close other programs or follow fewer logs at once' },
  EIO: { what: 'input/output error', hint: 'the disk or network file system reported a fault; try again' },
  ENAMETOOLONG: { what: 'the path is too long', hint: 'use a shorter (relative) path' },
};

/** The error code of a Node system error, if it has one. */
export function errorCodeOf(error: unknown): string | undefined {
  if (typeof error === 'object' && error !== null && 'code' in error) {
    const code = (error as { code: unknown }).code;
    return typeof code === 'string' ? code : undefined;
  }
  return undefined;
}

/** A failure of the file system (it has an errno code and a system call), not a bug downstream. */
export function isSystemError(error: unknown): boolean {
  return errorCodeOf(error) !== undefined && typeof (error as { syscall?: unknown }).syscall === 'string';
}

/** An InputError for `path` (as the user wrote it) explaining why it could not be read. */
export function readFailure(path: string, error: unknown): InputError {
  const code = errorCodeOf(error);
  const known = code === undefined ? undefined : EXPLANATIONS[code];
  if (known) return new InputError(`cannot read ${path}: ${known.what}`, known.hint);
  const reason = error instanceof Error ? error.message : String(error);
  return new InputError(`cannot read ${path}: ${reason.split('\n')[0]}`, 'check that the file exists and can be read');
}

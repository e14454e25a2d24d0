import { describe, expect, it } from 'vitest';
import { readFailure, errorCodeOf } from '../../src/ingest/read-failure.js';
import { InputError } from '../../src/errors.js';

/** A system error as Node's fs reports it (code and syscall set). */
const systemError = (code: string) => Object.assign(new Error(`${code}: failed, open 'x'`), { code, syscall: 'open' });

describe('readFailure', () => {
  it.each([
    ['ENOENT', 'no such file', /check the path/],
    ['EISDIR', 'it is a folder, not a file', /log file inside/],
    ['EACCES', 'permission denied', /read access/],
    ['EPERM', 'operation not permitted', /read access/],
    ['ENOTDIR', 'a part of the path is not a folder', /check the path/],
    ['ELOOP', 'too many symbolic links', /symbolic link/],
    ['EMFILE', 'too many open files', /ulimit -n/],
    ['EIO', 'input/output error', /try again/],
  ])('explains %s in one line with a hint', (code, what, hint) => {
    const error = readFailure('case/run.log', systemError(code));
    expect(error).toBeInstanceOf(InputError);
    expect(error.message).toBe(`cannot read case/run.log: ${what}`);
    expect(error.message).not.toMatch(/\n/);
    expect(error.hint).toMatch(hint);
  });

  it('keeps the first line of the system message for codes it does not know', () => {
    const error = readFailure('run.log', Object.assign(new Error('EWEIRD: strange\nsecond line'), { code: 'EWEIRD' }));
    expect(error.message).toBe('cannot read run.log: EWEIRD: strange');
    expect(error.hint).toBeTruthy();
  });

  it.each([
    [systemError('ENOENT'), 'ENOENT'],
    [new Error('plain'), undefined],
    [{ code: 42 }, undefined],
    ['text', undefined],
    [null, undefined],
  ])('reads the error code of %s', (error, code) => {
    expect(errorCodeOf(error)).toBe(code);
  });
});

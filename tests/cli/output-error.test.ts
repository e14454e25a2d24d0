/** OutputError: an output settle was asked to write could not be written, after the logs were read.
 * Its exit code must not collide with any documented one (README "Exit codes": the verdict codes,
 * 2 usage error, 3 unreadable input; report-failure.ts: 70 internal error, the BSD sysexits
 * EX_SOFTWARE value, from memory). */
import { describe, expect, it } from 'vitest';
import { EXIT_CODES } from '../../src/analysis/diagnosis.js';
import { InputError, OutputError, SettleError, SpecError, UsageError } from '../../src/errors.js';
import { reportFailure } from '../../src/cli/report-failure.js';

function stderrOf(error: unknown): { code: number; text: string } {
  let text = '';
  const sink = { write: (chunk: string) => { text += chunk; return true; } } as unknown as NodeJS.WritableStream;
  return { code: reportFailure(error, sink), text };
}

describe('OutputError', () => {
  it('is a SettleError with the stable code "output" and exit code 4', () => {
    const error = new OutputError('cannot write r.md (ENOSPC)', 'choose another path');
    expect(error).toBeInstanceOf(SettleError);
    expect(error.code).toBe('output');
    expect(error.exitCode).toBe(4);
    expect(error.name).toBe('OutputError');
  });

  it('reaches the user as one line and a hint, exit 4, no stack trace', () => {
    expect(stderrOf(new OutputError('cannot write r.md (ENOSPC)', 'free some disk space or choose another path'))).toEqual({
      code: 4,
      text: 'settle: cannot write r.md (ENOSPC)\n  hint: free some disk space or choose another path\n',
    });
  });

  it('has an exit code no other outcome uses', () => {
    const others = [...Object.values(EXIT_CODES), new UsageError('x').exitCode, new SpecError('f', ['p']).exitCode, new InputError('x').exitCode,
      stderrOf(new Error('a bug')).code];
    expect(others).toEqual(expect.arrayContaining([0, 10, 11, 20, 21, 30, 31, 2, 3, 70]));
    expect(others).not.toContain(new OutputError('x').exitCode);
  });
});

import { describe, expect, it } from 'vitest';
import { InputError, shorten, SpecError, UsageError } from '../src/errors.js';

describe('shorten', () => {
  it('keeps short text as it is and cuts long text with an ellipsis', () => {
    expect(shorten('iter=1 res_p=0.5')).toBe('iter=1 res_p=0.5');
    expect(shorten('x'.repeat(100), 10)).toBe(`${'x'.repeat(9)}…`);
  });

  it('puts a multi-line text on one line', () => {
    expect(shorten('a\r\nb\tc')).toBe('a b c');
  });

  it('shows control characters and undecodable bytes as ? so binary garbage cannot disturb the terminal', () => {
    expect(shorten('ab\u0000\u001b[2Jcd\ufffd\u0085')).toBe('ab??[2Jcd??');
  });
});

describe('errors', () => {
  it('carry the exit codes of the check contract: 2 for usage and spec problems, 3 for unreadable input', () => {
    expect(new UsageError('bad flag').exitCode).toBe(2);
    expect(new SpecError('a.json', ['x: is required']).exitCode).toBe(2);
    expect(new InputError('cannot read a.log').exitCode).toBe(3);
  });

  it('list every problem of a spec, one per line', () => {
    const error = new SpecError('a.json', ['a.json: id: is required', 'a.json: detect: is required']);
    expect(error.message).toBe('a.json: 2 problems:\n  a.json: id: is required\n  a.json: detect: is required');
  });
});

import { describe, expect, it } from 'vitest';
import { constants } from 'node:os';
import { parseSignalTarget, DEFAULT_SIGNAL } from '../../src/gate/parse-signal-target.js';
import { parseProcessId } from '../../src/gate/parse-process-id.js';
import { UsageError } from '../../src/errors.js';

// A small signal table for the pure parser (numbers as on Linux x86-64, signal(7), from memory);
// the last test uses the platform's own table, as the command does.
const SIGNALS = { SIGTERM: 15, SIGINT: 2, SIGUSR1: 10, SIGUSR2: 12, SIGHUP: 1, SIGKILL: 9 };

describe('parseSignalTarget', () => {
  it.each([
    ['4242', { pid: 4242, signal: 'SIGTERM' }],
    ['4242:SIGUSR1', { pid: 4242, signal: 'SIGUSR1' }],
    ['4242:usr2', { pid: 4242, signal: 'SIGUSR2' }],
    ['4242:sigint', { pid: 4242, signal: 'SIGINT' }],
    ['  77:HUP', { pid: 77, signal: 'SIGHUP' }],
  ])('reads %s', (text, expected) => {
    expect(parseSignalTarget(text, SIGNALS)).toEqual(expected);
  });

  it('defaults to SIGTERM, the polite request to end (POSIX kill(1) default, from memory)', () => {
    expect(DEFAULT_SIGNAL).toBe('SIGTERM');
  });

  it.each([
    ['4242:SIGFOO', /signal that does not exist/],
    ['4242:', /signal that does not exist/],
    ['4242:15', /signal that does not exist/],
    ['4242:toString', /signal that does not exist/],
    [':SIGTERM', /needs a process id/],
    ['abc', /needs a process id/],
    ['0', /above 1/],
    ['1:SIGTERM', /above 1/],
    ['-5', /needs a process id/],
    ['12.5', /needs a process id/],
    ['99999999999999999999', /above 1/],
  ])('refuses %j', (text, message) => {
    expect(() => parseSignalTarget(text, SIGNALS)).toThrow(UsageError);
    expect(() => parseSignalTarget(text, SIGNALS)).toThrow(message);
  });

  it('hints at real signal names when the name is unknown', () => {
    try {
      parseSignalTarget('4242:SIGFOO', SIGNALS);
      expect.unreachable();
    } catch (error) {
      expect((error as UsageError).hint).toMatch(/SIGTERM.*SIGUSR1/);
    }
  });

  it('knows the platform signals the command passes in', () => {
    expect(parseSignalTarget('10:SIGUSR1', constants.signals)).toEqual({ pid: 10, signal: 'SIGUSR1' });
    expect(() => parseSignalTarget('10:SIGNOPE', constants.signals)).toThrow(UsageError);
  });
});

describe('parseProcessId', () => {
  it('reads a whole number above 1', () => {
    expect(parseProcessId('--pid', '4242')).toBe(4242);
    expect(parseProcessId('--pid', ' 2 ')).toBe(2);
  });
  it.each(['', '0', '1', '-1', '+3', '3.0', '0x10', 'pid'])('refuses %j (process groups and init are never addressed)', (text) => {
    expect(() => parseProcessId('--pid', text)).toThrow(UsageError);
  });
});

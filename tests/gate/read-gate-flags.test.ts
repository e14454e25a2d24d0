import { describe, expect, it } from 'vitest';
import { readGateFlags, DEFAULT_MIN_ITERATIONS } from '../../src/gate/read-gate-flags.js';
import { FINAL_STATES } from '../../src/analysis/diagnosis.js';
import { UsageError } from '../../src/errors.js';

const SIGNALS = { SIGTERM: 15, SIGUSR1: 10 }; // Linux numbers, signal(7) (from memory)

describe('readGateFlags', () => {
  it('returns nothing for a plain post-mortem check', () => {
    expect(readGateFlags({ json: true }, ['a.log', 'b.log'], SIGNALS)).toBeUndefined();
  });

  it('reads a full gate with safe defaults', () => {
    expect(readGateFlags({ follow: true }, ['a.log'], SIGNALS)).toEqual({
      idleMs: undefined, pid: undefined, stopFile: undefined, signal: undefined, exec: undefined,
      on: FINAL_STATES, events: false, minIterations: DEFAULT_MIN_ITERATIONS, dryRun: false,
    });
    const gate = readGateFlags({ follow: true, idle: '5m', pid: '4242', stopFile: 'STOP', signal: '4242:usr1', exec: 'true', on: 'diverging', events: true, minIterations: '0', dryRun: true }, ['a.log'], SIGNALS);
    expect(gate).toMatchObject({ idleMs: 300_000, pid: 4242, stopFile: 'STOP', signal: { pid: 4242, signal: 'SIGUSR1' }, exec: 'true', events: true, minIterations: 0, dryRun: true });
    expect([...(gate?.on ?? [])]).toEqual(['diverging']);
  });

  it('uses 50 iterations as the default minimum (our choice: late enough to skip start-up, early enough to stop a fast blow-up; see DEVELOPERS.md decisions)', () => {
    expect(DEFAULT_MIN_ITERATIONS).toBe(50);
  });

  it.each([
    ['--stop-file without --follow', { stopFile: 'STOP' }, ['a.log'], /--stop-file works only with --follow/],
    ['--signal and --pid without --follow', { signal: '42', pid: '42' }, ['a.log'], /--pid, --signal work only with --follow/],
    ['--dry-run without --follow', { dryRun: true }, ['a.log'], /--dry-run works only with --follow/],
    ['--poll without --follow (a post-mortem read never polls)', { poll: true }, ['a.log'], /--poll works only with --follow/],
    ['--poll 500 without --follow', { poll: 500 }, ['a.log'], /--poll works only with --follow/],
    ['--follow on two logs', { follow: true }, ['a.log', 'b.log'], /one run, got 2 logs/],
    ['--events with --json', { follow: true, events: true, json: true }, ['a.log'], /--events and --json/],
    ['an empty --exec', { follow: true, exec: '  ' }, ['a.log'], /--exec needs a command/],
    ['an empty --stop-file', { follow: true, stopFile: '' }, ['a.log'], /--stop-file needs a path/],
    ['a bad --idle', { follow: true, idle: '30' }, ['a.log'], /--idle needs a unit/],
    ['a bad --pid', { follow: true, pid: 'solver' }, ['a.log'], /--pid needs a process id/],
    ['an unknown signal', { follow: true, signal: '42:SIGWHAT' }, ['a.log'], /signal that does not exist/],
    ['an unknown verdict', { follow: true, on: 'converged,finished' }, ['a.log'], /unknown verdict 'finished'/],
    ['a negative --min-iterations', { follow: true, minIterations: '-1' }, ['a.log'], /--min-iterations needs a whole number/],
    ['a fractional --min-iterations', { follow: true, minIterations: '2.5' }, ['a.log'], /--min-iterations needs a whole number/],
  ])('refuses %s', (_label, raw, logs, message) => {
    expect(() => readGateFlags(raw, logs, SIGNALS)).toThrow(UsageError);
    expect(() => readGateFlags(raw, logs, SIGNALS)).toThrow(message);
  });
});

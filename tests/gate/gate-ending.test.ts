import { describe, expect, it } from 'vitest';
import { describeEnding } from '../../src/gate/gate-ending.js';

describe('describeEnding', () => {
  it.each([
    [{ kind: 'final' } as const, 'the verdict held for the confirmation window'],
    [{ kind: 'idle', idleMs: 30_000 } as const, 'the log did not grow for 30s'],
    [{ kind: 'idle', idleMs: 300_000, neverAppeared: true } as const, 'the log did not appear within 5m'],
    [{ kind: 'process-ended', pid: 4242 } as const, 'process 4242 ended'],
    [{ kind: 'source-ended' } as const, 'the log ended'],
  ])('says %j as %s', (ending, text) => {
    expect(describeEnding(ending)).toBe(text);
  });
});

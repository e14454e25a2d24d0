/** Reusable scratch arrays (scratch-buffer.ts): views of the asked length, one backing array reused. */
import { describe, expect, it } from 'vitest';
import { ScratchBuffer } from '../../src/analysis/scratch-buffer.js';

describe('ScratchBuffer', () => {
  it('gives views of the asked length sharing one backing array while it is large enough', () => {
    const scratch = new ScratchBuffer();
    const a = scratch.view(100);
    a[0] = 42;
    const b = scratch.view(200);
    expect(a.length).toBe(100);
    expect(b.length).toBe(200);
    expect(b.buffer).toBe(a.buffer);
    expect(b[0]).toBe(42);
  });

  it.each([0, 1, 257, 5000, 100_000])('grows to hold %i elements', (length) => {
    const scratch = new ScratchBuffer();
    scratch.view(10);
    const v = scratch.view(length);
    expect(v.length).toBe(length);
    v.fill(1);
    expect(v.reduce((s, x) => s + x, 0)).toBe(length);
  });
});

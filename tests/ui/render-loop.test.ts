import { describe, expect, it } from 'vitest';
import { createRenderLoop } from '../../src/ui/render-loop.js';
import type { Timers } from '../../src/ui/render-loop.js';

/** Timers driven by hand: `advance(ms)` runs what falls due. */
function manualTimers(): Timers & { advance(ms: number): void; pending(): number } {
  let clock = 0;
  let next = 1;
  const queue = new Map<number, { at: number; callback: () => void }>();
  return {
    now: () => clock,
    setTimeout: (callback, ms) => {
      const id = next++;
      queue.set(id, { at: clock + ms, callback });
      return id;
    },
    clearTimeout: (handle) => {
      queue.delete(handle as number);
    },
    advance(ms: number): void {
      const end = clock + ms;
      for (;;) {
        const due = [...queue.entries()].filter(([, t]) => t.at <= end).sort((a, b) => a[1].at - b[1].at)[0];
        if (due === undefined) break;
        queue.delete(due[0]);
        clock = Math.max(clock, due[1].at);
        due[1].callback();
      }
      clock = end;
    },
    pending: () => queue.size,
  };
}

describe('createRenderLoop', () => {
  it('draws the first change at once and merges a burst of changes into frames at most every minIntervalMs', () => {
    const timers = manualTimers();
    let drawn = 0;
    const loop = createRenderLoop(() => drawn++, 100, timers);
    loop.invalidate();
    timers.advance(0);
    expect(drawn).toBe(1);
    // 1000 changes over one second (as from 1000 appended lines a second): at most 10 more frames.
    for (let ms = 0; ms < 1000; ms++) {
      loop.invalidate();
      timers.advance(1);
    }
    timers.advance(100);
    expect(drawn).toBeGreaterThanOrEqual(10);
    expect(drawn).toBeLessThanOrEqual(11);
  });

  it('draws nothing while nothing changes', () => {
    const timers = manualTimers();
    let drawn = 0;
    createRenderLoop(() => drawn++, 100, timers);
    timers.advance(10_000);
    expect(drawn).toBe(0);
    expect(timers.pending()).toBe(0);
  });

  it('flush draws a pending change now; stop ends drawing', () => {
    const timers = manualTimers();
    let drawn = 0;
    const loop = createRenderLoop(() => drawn++, 100, timers);
    loop.invalidate();
    timers.advance(0);
    loop.invalidate();
    loop.flush();
    expect(drawn).toBe(2);
    loop.flush();
    expect(drawn).toBe(2);
    loop.invalidate();
    loop.stop();
    timers.advance(1000);
    expect(drawn).toBe(2);
    expect(loop.frames).toBe(2);
  });
});

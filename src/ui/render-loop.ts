/**
 * One throttled render loop for the whole dashboard: anything that changes what the screen should
 * show calls `invalidate()`; the loop draws at most once per `minIntervalMs` and not at all while
 * nothing was invalidated. The first invalidation after a quiet spell draws at once (latency), later
 * ones in the same interval are merged into one frame (cost). Timers are injected so tests can
 * drive it without waiting.
 */

export interface Timers {
  now(): number;
  setTimeout(callback: () => void, ms: number): unknown;
  clearTimeout(handle: unknown): void;
}

export const SYSTEM_TIMERS: Timers = {
  now: () => performance.now(),
  setTimeout: (callback, ms) => setTimeout(callback, ms),
  clearTimeout: (handle) => clearTimeout(handle as NodeJS.Timeout),
};

export interface RenderLoop {
  /** Something changed: draw soon (within minIntervalMs). */
  invalidate(): void;
  /** Draw now if invalidated (e.g. on resize), regardless of the interval. */
  flush(): void;
  /** Stop: no more frames. */
  stop(): void;
  /** Frames drawn so far. */
  readonly frames: number;
}

export function createRenderLoop(render: () => void, minIntervalMs: number, timers: Timers = SYSTEM_TIMERS): RenderLoop {
  let dirty = false;
  let stopped = false;
  let timer: unknown;
  let lastFrameAt = Number.NEGATIVE_INFINITY;
  let frames = 0;

  function draw(): void {
    timer = undefined;
    if (stopped || !dirty) return;
    dirty = false;
    lastFrameAt = timers.now();
    frames++;
    render();
  }

  return {
    invalidate(): void {
      if (stopped) return;
      dirty = true;
      if (timer !== undefined) return;
      const wait = Math.max(0, lastFrameAt + minIntervalMs - timers.now());
      timer = timers.setTimeout(draw, wait);
    },
    flush(): void {
      if (timer !== undefined) timers.clearTimeout(timer);
      timer = undefined;
      draw();
    },
    stop(): void {
      stopped = true;
      if (timer !== undefined) timers.clearTimeout(timer);
      timer = undefined;
    },
    get frames(): number {
      return frames;
    },
  };
}

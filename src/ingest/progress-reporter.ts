/** Throttled `progress` events of a post-mortem read, for a progress bar. */
import type { SourceEvent } from './line-source.js';

/** Throttled `progress` events over the bytes of all files read from the start. */
export class ProgressReporter {
  private done = 0;
  private lastAt: number;
  private emitted = false;

  constructor(private readonly total: number, private readonly everyMs: number,
    private readonly event: (event: SourceEvent) => void) {
    this.lastAt = Date.now();
  }

  add(bytes: number): void {
    this.done += bytes;
    const now = Date.now();
    if (now - this.lastAt >= this.everyMs) {
      this.lastAt = now;
      this.emitted = true;
      this.event({ type: 'progress', bytesRead: this.done, totalBytes: Math.max(this.total, this.done) });
    }
  }

  /** A closing 100 % event, only when the read was long enough to report progress at all. */
  finish(): void {
    if (this.emitted) this.event({ type: 'progress', bytesRead: this.done, totalBytes: Math.max(this.total, this.done) });
    this.emitted = false;
  }
}

/**
 * How fast a log grows: lines per second over the last few seconds, iterations per second over the
 * last minute (for wall-clock time-to-target), and when it last grew. The clock is injected.
 */
import type { MonitorPace } from './run-monitor-types.js';

const LINE_WINDOW_MS = 5_000;
const RECORD_WINDOW_MS = 60_000;

interface Sample {
  readonly at: number;
  readonly total: number;
}

export class PaceMeter {
  private lines = 0;
  private lastGrowthAt = Number.NaN;
  private readonly lineSamples: Sample[] = [];
  private readonly recordSamples: Sample[] = [];

  constructor(private readonly now: () => number) {}

  addLines(count: number): void {
    if (count === 0) return;
    const at = this.now();
    this.lines += count;
    this.lastGrowthAt = at;
    push(this.lineSamples, { at, total: this.lines }, LINE_WINDOW_MS);
  }

  setRecords(total: number): void {
    const last = this.recordSamples[this.recordSamples.length - 1];
    if (last !== undefined && last.total === total) return;
    push(this.recordSamples, { at: this.now(), total }, RECORD_WINDOW_MS);
  }

  read(): MonitorPace {
    const at = this.now();
    return {
      lines: this.lines,
      linesPerSecond: rate(this.lineSamples, at, LINE_WINDOW_MS),
      lastGrowthAt: this.lastGrowthAt,
      iterationsPerSecond: rate(this.recordSamples, at, RECORD_WINDOW_MS),
    };
  }
}

function push(samples: Sample[], sample: Sample, windowMs: number): void {
  samples.push(sample);
  while (samples.length > 2 && samples[1].at < sample.at - windowMs) samples.shift();
  if (samples.length > 512) samples.splice(1, samples.length - 512);
}

/** Growth per second between the oldest sample inside the window and now. */
function rate(samples: readonly Sample[], at: number, windowMs: number): number {
  if (samples.length < 2) return 0;
  const newest = samples[samples.length - 1];
  if (newest.at < at - windowMs) return 0;
  let oldest = samples[0];
  for (const s of samples) {
    if (s.at >= at - windowMs) break;
    oldest = s;
  }
  const seconds = (at - oldest.at) / 1000;
  return seconds > 0 ? (newest.total - oldest.total) / seconds : 0;
}

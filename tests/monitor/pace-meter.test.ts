import { describe, expect, it } from 'vitest';
import { PaceMeter } from '../../src/monitor/pace-meter.js';

describe('PaceMeter', () => {
  it('reports lines per second over the recent window and when the log last grew', () => {
    let now = 0;
    const meter = new PaceMeter(() => now);
    expect(meter.read().linesPerSecond).toBe(0);
    expect(Number.isNaN(meter.read().lastGrowthAt)).toBe(true);
    for (let t = 0; t <= 4000; t += 500) {
      now = t;
      meter.addLines(50); // 100 lines per second
    }
    const pace = meter.read();
    expect(pace.lines).toBe(450);
    expect(pace.linesPerSecond).toBeCloseTo(100, 6);
    expect(pace.lastGrowthAt).toBe(4000);
  });

  it('falls to zero when the log has been quiet for longer than the window', () => {
    let now = 0;
    const meter = new PaceMeter(() => now);
    meter.addLines(10);
    now = 1000;
    meter.addLines(10);
    now = 60_000;
    expect(meter.read().linesPerSecond).toBe(0);
    expect(meter.read().lastGrowthAt).toBe(1000);
  });

  it('measures iterations per second from the record count', () => {
    let now = 0;
    const meter = new PaceMeter(() => now);
    for (let t = 0; t <= 10_000; t += 1000) {
      now = t;
      meter.setRecords(t / 100); // 10 records per second
    }
    expect(meter.read().iterationsPerSecond).toBeCloseTo(10, 6);
  });
});

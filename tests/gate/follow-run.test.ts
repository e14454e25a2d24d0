/** The follow loop on a scripted monitor (the real one is driven end to end in
 * tests/cli/check-follow.test.ts): when it stops, what it prints, and what it hands to the actions. */
import { afterAll, describe, expect, it, vi } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { followAndGate, type FollowGateOptions } from '../../src/gate/follow-run.js';
import type { RunDiagnosis, StateChange } from '../../src/analysis/diagnosis.js';
import { FINAL_STATES } from '../../src/analysis/diagnosis.js';
import type { RunMonitor, RunMonitorEvents } from '../../src/monitor/run-monitor-types.js';
import { SeriesStore } from '../../src/series/series-store.js';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import { makeDiagnosis } from './make-diagnosis.js';

const dir = mkdtempSync(join(tmpdir(), 'settle-follow-run-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A monitor that emits a scripted list of diagnoses (one per tick) and then waits for stop(). */
function scriptedMonitor(script: readonly RunDiagnosis[], changes: readonly StateChange[] = []): { monitor: RunMonitor; stopped: () => boolean } {
  const listeners = new Map<string, ((...args: unknown[]) => void)[]>();
  const emit = (event: string, ...args: unknown[]): void => { for (const listener of listeners.get(event) ?? []) listener(...args); };
  let stop: (() => void) | undefined;
  let stopped = false;
  let current = script[0];
  const monitor: RunMonitor = {
    label: 'scripted.log',
    store: new SeriesStore(),
    async run() {
      const ended = new Promise<void>((resolve) => { stop = resolve; });
      for (const change of changes) emit('state-change', change);
      for (const diagnosis of script) {
        if (stopped) break;
        current = diagnosis;
        emit('records', 10);
        emit('diagnosis', diagnosis);
        await new Promise((resolve) => setTimeout(resolve, 5));
      }
      await ended;
      return current;
    },
    async read() { await monitor.run(); },
    async stop() { stopped = true; stop?.(); },
    parserChoice: () => undefined,
    parseStats: () => undefined,
    diagnosis: () => current,
    pace: () => ({ lines: 0, linesPerSecond: 0, lastGrowthAt: Number.NaN, iterationsPerSecond: 0 }),
    on<E extends keyof RunMonitorEvents>(event: E, listener: RunMonitorEvents[E]) {
      const list = listeners.get(event) ?? [];
      list.push(listener as (...args: unknown[]) => void);
      listeners.set(event, list);
      return () => undefined;
    },
  };
  return { monitor, stopped: () => stopped };
}

function sink(): { stream: NodeJS.WritableStream; text: () => string } {
  let text = '';
  return { stream: { write: (chunk: string) => { text += chunk; return true; } } as unknown as NodeJS.WritableStream, text: () => text };
}

function options(monitor: RunMonitor, overrides: Partial<FollowGateOptions> = {}): FollowGateOptions & { out: ReturnType<typeof sink>; err: ReturnType<typeof sink> } {
  const out = sink();
  const err = sink();
  return {
    monitor: { paths: ['scripted.log'], parserFiles: [], kindOverrides: { residual: [], quantity: [] }, criteria: DEFAULT_CRITERIA },
    request: { log: 'scripted.log', on: FINAL_STATES, minIterations: 100 },
    dryRun: false, events: false, json: false, stdout: out.stream, stderr: err.stream,
    createMonitor: () => monitor,
    out, err,
    ...overrides,
  };
}

describe('followAndGate', () => {
  it('stops at the first final verdict past the minimum iterations, and acts on that diagnosis', async () => {
    const stopFile = join(dir, 'STOP-final');
    const { monitor, stopped } = scriptedMonitor([
      makeDiagnosis({ verdict: 'converging', final: false, iterations: 50 }),
      makeDiagnosis({ verdict: 'converged', final: true, iterations: 80 }), // final, but too young
      makeDiagnosis({ verdict: 'converged', final: true, iterations: 120 }),
      makeDiagnosis({ verdict: 'diverging', final: true, iterations: 130 }), // never reached
    ]);
    const o = options(monitor, { request: { log: 'scripted.log', on: FINAL_STATES, minIterations: 100, stopFile } });
    expect(await followAndGate(o)).toBe(0);
    expect(stopped()).toBe(true);
    expect(readFileSync(stopFile, 'utf8')).toContain('iteration: 120');
    expect(o.out.text()).toContain('gate: stopped following because the verdict held for the confirmation window');
  });

  it('stops once the log has not grown for the idle time, counted from the last records (on a fake clock)', async () => {
    // Fake timers drive both the clock (Date.now) and the idle check, so this holds on any machine.
    vi.useFakeTimers({ now: 0 });
    try {
      // Records arrive at 0, 5 and 10 ms (one scripted diagnosis every 5 ms), then nothing more.
      const { monitor, stopped } = scriptedMonitor([
        makeDiagnosis({ verdict: 'converging', final: false, iterations: 280 }),
        makeDiagnosis({ verdict: 'converging', final: false, iterations: 290 }),
        makeDiagnosis({ verdict: 'converging', final: false, iterations: 300 }),
      ]);
      const o = options(monitor, { idleMs: 150 });
      const result = followAndGate(o);
      await vi.advanceTimersByTimeAsync(159);
      // 150 ms after the first records, but not after the last ones (at 10 ms): still following.
      expect(stopped()).toBe(false);
      // The idle check runs every idle/5 = 30 ms: the first one at or after 160 ms ends it.
      await vi.advanceTimersByTimeAsync(180 - 159);
      expect(stopped()).toBe(true);
      expect(await result).toBe(10);
      expect(o.out.text()).toContain('at iteration 300');
      expect(o.out.text()).toContain('gate: stopped following because the log did not grow for 150ms');
    } finally {
      vi.useRealTimers();
    }
  });

  it('stops when the watched process is gone', async () => {
    const { monitor } = scriptedMonitor([makeDiagnosis({ verdict: 'stalled', final: true, iterations: 50 })]);
    // A pid far above any pid_max (Linux allows at most 2^22; proc(5), from memory): never running.
    const o = options(monitor, { pid: 2 ** 30, pidPollMs: 10, pidGraceMs: 0 });
    expect(await followAndGate(o)).toBe(20);
    expect(o.out.text()).toContain(`gate: stopped following because process ${2 ** 30} ended`);
    expect(o.out.text()).toContain('gate: no action, no action was asked for');
  });

  it('writes NDJSON only with --events: state changes as they come, actions, then the verdict', async () => {
    const { monitor } = scriptedMonitor(
      [makeDiagnosis({ verdict: 'diverging', final: true, iterations: 260 })],
      [{ iteration: 240, series: 'res_p', from: 'converging', to: 'diverging', text: 'it 240: res_p diverging' }],
    );
    const o = options(monitor, { events: true, dryRun: true, request: { log: 'scripted.log', on: FINAL_STATES, minIterations: 100, stopFile: join(dir, 'never') } });
    expect(await followAndGate(o)).toBe(30);
    const lines = o.out.text().trimEnd().split('\n').map((line) => JSON.parse(line));
    expect(lines.map((line) => line.type)).toEqual(['state-change', 'action', 'verdict']);
    expect(lines[1]).toMatchObject({ action: 'stop-file', dryRun: true, ok: true });
    expect(lines[2]).toMatchObject({ verdict: 'diverging', exitCode: 30, acted: true });
    expect(existsSync(join(dir, 'never'))).toBe(false);
  });

  it('prints the run as JSON with --json and keeps the gate lines on stderr', async () => {
    const { monitor } = scriptedMonitor([makeDiagnosis({ verdict: 'converged', final: true, iterations: 500 })]);
    const o = options(monitor, { json: true });
    expect(await followAndGate(o)).toBe(0);
    expect(JSON.parse(o.out.text())).toMatchObject({ verdict: 'converged', exitCode: 0, iterations: 500 });
    expect(o.err.text()).toContain('settle: gate: stopped following because the verdict held for the confirmation window');
  });
});

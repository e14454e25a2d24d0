/**
 * A terminal for dashboard tests without a real one: key input through a PassThrough, output to a
 * Writable that looks like a TTY (columns, rows, isTTY) and keeps what was written. blessed reads the
 * size from the output and redraws on its `resize` event (chjj/blessed#138 describes the approach).
 */
import { PassThrough, Writable } from 'node:stream';
import { SeriesStore } from '../../src/series/series-store.js';
import type { RunDiagnosis } from '../../src/analysis/diagnosis.js';
import type { MonitorPace, RunMonitor, RunMonitorEvents } from '../../src/monitor/run-monitor-types.js';
import type { ParserChoice } from '../../src/parse/record-parser.js';
import { TypedEmitter } from '../../src/monitor/typed-emitter.js';
import { pace as makePace, runDiagnosis } from './run-fixture.js';

export interface FakeTerminal {
  readonly input: PassThrough & { isTTY: boolean; setRawMode: (mode: boolean) => void; isRaw: boolean };
  readonly output: Writable & { columns: number; rows: number; isTTY: boolean };
  written(): string;
  resize(cols: number, rows: number): void;
  press(keys: string): void;
}

export function fakeTerminal(cols = 120, rows = 40): FakeTerminal {
  const chunks: string[] = [];
  const input = Object.assign(new PassThrough(), { isTTY: true, isRaw: false, setRawMode(mode: boolean) { input.isRaw = mode; } });
  const output = Object.assign(new Writable({ write(chunk: Buffer | string, _encoding, callback) { chunks.push(chunk.toString()); callback(); } }), { columns: cols, rows, isTTY: true });
  return {
    input,
    output,
    written: () => chunks.join(''),
    resize(newCols, newRows) {
      output.columns = newCols;
      output.rows = newRows;
      output.emit('resize');
    },
    press(keys) {
      input.write(keys);
    },
  };
}

/** A run monitor driven by the test: a real SeriesStore, events emitted on request. */
export interface FakeMonitor extends RunMonitor {
  emitter: TypedEmitter<RunMonitorEvents>;
  setDiagnosis(diagnosis: RunDiagnosis): void;
  paceNow: MonitorPace;
  snapshotFailure?: Error;
}

export function fakeMonitor(label: string, store = new SeriesStore()): FakeMonitor {
  const emitter = new TypedEmitter<RunMonitorEvents>();
  let latest = runDiagnosis();
  const choice: ParserChoice = {
    id: 'settle-kv', explanation: 'test', create: () => { throw new Error('not used'); },
    spec: { id: 'settle-kv', description: 'test', detect: { patterns: ['.'] } }, overrides: { residual: [], quantity: [] },
  };
  const monitor: FakeMonitor = {
    label,
    get store() {
      if (monitor.snapshotFailure !== undefined) throw monitor.snapshotFailure;
      return store;
    },
    emitter,
    paceNow: makePace(),
    run: () => Promise.resolve(latest),
    read: () => Promise.resolve(),
    stop: () => Promise.resolve(),
    parserChoice: () => choice,
    parseStats: () => undefined,
    diagnosis: () => latest,
    pace: () => monitor.paceNow,
    on: (event, listener) => emitter.on(event, listener),
    setDiagnosis(diagnosis) {
      latest = diagnosis;
      emitter.emit('diagnosis', diagnosis);
    },
  };
  return monitor;
}

/** Poll `condition` every 10 ms until it holds (or fail after `timeoutMs`). */
export async function until(condition: () => boolean, what: string, timeoutMs = 5000): Promise<void> {
  const start = Date.now();
  while (!condition()) {
    if (Date.now() - start > timeoutMs) throw new Error(`timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}

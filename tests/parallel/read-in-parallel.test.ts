/**
 * A log read in ranges by workers and joined must hold exactly what one sequential read gives:
 * the same series (names, kinds, units, every retained point), records, restarts, failure, parse
 * statistics, warnings and verdict. The reference is the sequential read of the same file.
 * Workers run parseRange in this thread here (the join logic is the same; the built CLI runs real
 * worker threads in tests/e2e/parallel-read.test.ts); ranges are made tiny so that every log is
 * cut in many places, boundaries included.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { EventEmitter } from 'node:events';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRunMonitor } from '../../src/monitor/run-monitor.js';
import type { RunMonitorOptions } from '../../src/monitor/run-monitor-types.js';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import { parseRange } from '../../src/parallel/parse-range.js';
import type { RangeWorker, WorkerMessage } from '../../src/parallel/read-in-parallel.js';
import type { RangeJob } from '../../src/parallel/parse-range.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'sample-logs');
const folder = mkdtempSync(join(tmpdir(), 'settle-parallel-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** A "worker" that runs parseRange in this thread, with messages cloned as a thread would get them. */
function inThreadWorker(log: string[]): RangeWorker {
  const emitter = new EventEmitter();
  let stopped = false;
  return {
    postMessage: (message) => {
      const { id, job } = message as { id: number; job: RangeJob };
      setImmediate(() => {
        if (stopped) return;
        const send = (m: WorkerMessage): void => { if (!stopped) emitter.emit('message', structuredClone(m)); };
        const end = parseRange(job, (chunk) => send({ type: 'chunk', id, chunk }));
        log.push(`${id}:${end.start}-${end.end}${end.handover ? ' handover' : ''}`);
        send({ type: 'end', id, end });
      });
    },
    on: (event: string, listener: Parameters<EventEmitter["on"]>[1]) => emitter.on(event, listener),
    terminate: async () => { stopped = true; return 0; },
  } as RangeWorker;
}

async function read(path: string, parallel: RunMonitorOptions['parallel'], parserFiles: readonly string[] = []) {
  const monitor = createRunMonitor({
    paths: [path], follow: false, parserFiles, kindOverrides: { residual: [], quantity: [] }, criteria: DEFAULT_CRITERIA, parallel,
  });
  const warnings: string[] = [];
  monitor.on('source', (event) => { if (event.type === 'warning') warnings.push(event.message); });
  const diagnosis = await monitor.run();
  const snapshot = monitor.store.snapshot();
  return {
    parser: monitor.parserChoice()?.id,
    explanation: monitor.parserChoice()?.explanation,
    stats: monitor.parseStats(),
    records: snapshot.records,
    lastIteration: snapshot.lastIteration,
    restarts: [...snapshot.restarts],
    failure: snapshot.failure,
    transient: snapshot.transient,
    timeSteps: snapshot.timeSteps?.map((step) => ({ ...step })),
    series: snapshot.series.map((column) => ({
      info: column.info,
      totalAdded: column.totalAdded,
      iterations: [...column.iterations.subarray(0, column.length)],
      values: [...column.values.subarray(0, column.length)],
    })),
    warnings: warnings.sort(),
    verdict: diagnosis.verdict,
    timeline: diagnosis.timeline,
  };
}

/** Read `path` both ways and compare; returns the ranges the workers parsed. */
async function expectSameBothWays(path: string, rangeBytes: number, parserFiles: readonly string[] = []): Promise<string[]> {
  const ranges: string[] = [];
  const reference = await read(path, false, parserFiles);
  const joined = await read(path, { minBytes: 0, workers: 2, rangeBytes, oneLineRecords: true, spawn: () => inThreadWorker(ranges) }, parserFiles);
  expect(joined).toEqual(reference);
  return ranges;
}

function write(name: string, text: string | Buffer): string {
  const path = join(folder, name);
  writeFileSync(path, text);
  return path;
}

const manifest = JSON.parse(readFileSync(join(SAMPLES, 'manifest.json'), 'utf8')) as { file: string; parser: string }[];

describe('parallel read = sequential read', () => {
  it.each(manifest.filter((entry) => !entry.file.endsWith('.gz')).map((entry) => entry.file))('sample log %s', async (file) => {
    await expectSameBothWays(join(SAMPLES, file), 2000);
  });

  it('parses many ranges of a block log and joins them (the ranges are really used)', async () => {
    const blocks = Array.from({ length: 400 }, (_, k) => `=== iteration ${k + 1} ===\n  residual  res_p  ${(0.9 ** k).toExponential(4)}\n  monitor   drag   ${(1 + 1 / (k + 1)).toFixed(6)}  [N]\n`);
    const ranges = await expectSameBothWays(write('many.block.log', blocks.join('')), 1500);
    expect(ranges.filter((r) => !r.includes(':-1')).length).toBeGreaterThan(5);
  });

  it('a counter going back exactly where a range starts is a restart, as read in one piece', async () => {
    const block = (k: number): string => `=== iteration ${k} ===\n  residual  res_p  ${(1 / k).toExponential(3)}\n`;
    const text = [...Array.from({ length: 60 }, (_, k) => block(k + 1)), ...Array.from({ length: 60 }, (_, k) => block(k + 1))].join('');
    for (const rangeBytes of [300, 517, 1100, 2048]) await expectSameBothWays(write(`restart-${rangeBytes}.block.log`, text), rangeBytes);
  });

  it('a crash line in a later range hands over to a sequential read from that range', async () => {
    const blocks = Array.from({ length: 200 }, (_, k) => `=== iteration ${k + 1} ===\n  residual  res_p  ${(0.95 ** k).toExponential(4)}\n`);
    blocks.splice(150, 0, 'FATAL solver stopped: matrix singular\n  residual  res_p  1e-3\n');
    const ranges = await expectSameBothWays(write('crash.block.log', blocks.join('')), 700);
    expect(ranges.some((r) => r.endsWith('handover'))).toBe(true);
  });

  it('name = value lines without an iteration counter (numbered by count) hand over and still agree', async () => {
    const lines = Array.from({ length: 300 }, (_, k) => `res_p = ${(0.97 ** k).toExponential(3)}  drag = ${(2 + 1 / (k + 1)).toFixed(5)}`);
    await expectSameBothWays(write('uncounted.kv.log', `${lines.join('\n')}\n`), 900);
  });

  it('units that appear late, unmatched lines, CRLF, invalid UTF-8 and a cut line give the same series, samples and warnings', async () => {
    const parts: (string | Buffer)[] = [];
    for (let k = 1; k <= 150; k++) {
      parts.push(`=== iteration ${k} ===\r\n  residual  res_p  ${(1 / k).toExponential(3)}\r\n`);
      parts.push(k < 90 ? `  monitor   q  ${k}\r\n` : `  monitor   q  ${k}  [W]\r\n`);
      if (k % 37 === 0) parts.push(`unexpected chatter ${k}\r\n`);
      if (k === 70) parts.push(Buffer.from([0x20, 0xff, 0xfe, 0x0a]));
      if (k === 100) parts.push(`# ${'x'.repeat(3000)}\n`);
    }
    const path = write('mixed.block.log', Buffer.concat(parts.map((p) => (typeof p === 'string' ? Buffer.from(p) : p))));
    const ranges: string[] = [];
    const reference = await read(path, false);
    const joined = await read(path, { minBytes: 0, workers: 2, rangeBytes: 800, oneLineRecords: true, spawn: () => inThreadWorker(ranges) });
    expect(joined).toEqual(reference);
    expect(reference.series.find((s) => s.info.name === 'q')?.info.unit).toBe('W');
    expect(reference.stats?.unmatched).toBeGreaterThan(0);
  });

  it('valid UTF-8 cut by range edges in the middle of a character raises no warning, as read in one piece', async () => {
    const blocks = Array.from({ length: 300 }, (_, k) => `=== iteration ${k + 1} ===\n  residual  Δp_res  ${(0.97 ** k).toExponential(4)}\n  monitor   T_wall  ${(300 + 1 / (k + 1)).toFixed(5)}  [°C]\n`);
    const path = write('utf8.block.log', blocks.join(''));
    // Range sizes that are not multiples of the line lengths, so some edges fall inside Δ or °.
    for (const rangeBytes of [997, 1301]) {
      const ranges: string[] = [];
      const reference = await read(path, false);
      const joined = await read(path, { minBytes: 0, workers: 2, rangeBytes, spawn: () => inThreadWorker(ranges) });
      expect(joined).toEqual(reference);
      expect(joined.warnings).toEqual([]);
      expect(ranges.length).toBeGreaterThan(5);
    }
  });

  it('a line that both adds to the record and opens the next one is never a range edge (the record it closes would lose that value)', async () => {
    // Rule order matters: the pair rule comes first, so on "step N res=..." the value goes into the
    // record being closed, then the step rule opens a new one.
    const spec = {
      id: 'test-close-after-value', description: 'value before the record opener', detect: { patterns: ['^step '] },
      lines: { rules: [
        { match: '(?<name>res)=(?<value>\\S+)', pairs: { kind: 'residual' } },
        { match: '^step (?<iteration>[0-9]+)', startsRecord: true },
        { match: '^\\s+(?<name>[a-z]+) (?<value>\\S+)', pairs: {} },
      ] },
    };
    const specFile = write('close-after-value.json', JSON.stringify(spec));
    const lines: string[] = [];
    for (let k = 1; k <= 300; k++) lines.push(`step ${k} res=${(0.9 ** k).toExponential(3)}`, `  drag ${(1 + 1 / k).toFixed(5)}`);
    const path = write('close-after-value.log', `${lines.join('\n')}\n`);
    const readWith = async (parallel: RunMonitorOptions['parallel']) => {
      const monitor = createRunMonitor({ paths: [path], follow: false, parserFiles: [specFile], kindOverrides: { residual: [], quantity: [] }, criteria: DEFAULT_CRITERIA, parallel });
      await monitor.run();
      return monitor.store.snapshot().series.map((column) => [column.info.name, [...column.iterations.subarray(0, column.length)], [...column.values.subarray(0, column.length)]]);
    };
    const ranges: string[] = [];
    const reference = await readWith(false);
    expect(await readWith({ minBytes: 0, workers: 2, rangeBytes: 700, spawn: () => inThreadWorker(ranges) })).toEqual(reference);
  });

  /** A user spec on the byte path whose record-opening line may carry a time step. */
  function stepSpec(): string {
    return write('steps.spec.json', JSON.stringify({
      id: 'test-steps', description: 'iterations, sometimes with a time step', detect: { patterns: ['^it [0-9]+'] },
      lines: { rules: [
        { match: '^it (?<iteration>[0-9]+)(?: step (?<step>[0-9]+))?', startsRecord: true },
        { match: '^\\s+(?<name>[a-z_]+) (?<value>\\S+)', pairs: {} },
      ] },
    }));
  }

  it('time steps that appear only late in the log hand over to a sequential read from that range, and agree', async () => {
    const lines: string[] = [];
    for (let k = 1; k <= 600; k++) lines.push(k <= 300 ? `it ${k}` : `it ${k} step ${Math.ceil((k - 300) / 5)}`, `  res_p ${(0.97 ** (k % 40)).toExponential(3)}`);
    const ranges = await expectSameBothWays(write('late-steps.log', `${lines.join('\n')}\n`), 900, [stepSpec()]);
    expect(ranges.some((r) => r.endsWith('handover'))).toBe(true);
  });

  it('a log with time steps from the start is read in one piece (inner iterations counted across range edges), with the same result', async () => {
    const lines: string[] = [];
    for (let k = 1; k <= 700; k++) lines.push(`it ${k} step ${Math.ceil(k / 7)}`, `  res_p ${(0.8 ** (k % 7)).toExponential(3)}`);
    const ranges = await expectSameBothWays(write('steps.log', `${lines.join('\n')}\n`), 1000, [stepSpec()]);
    expect(ranges.length).toBeGreaterThan(0);
    await expectSameBothWays(join(SAMPLES, 'periodic-heat-transient.kv.log'), 1500);
  });

  it('a log no spec fits is inferred from the same lines as read in one piece (a kind decided past the first 200 lines)', async () => {
    // `res` stays flat for 300 lines and then falls over decades: a residual only to an inference
    // that sees the lines past the first 200 (the whole first batch, as the sequential read does).
    const rows = Array.from({ length: 600 }, (_, k) => `step: ${k + 1}  res: ${(k < 300 ? 1 + (k % 3) / 10 : 10 ** (-(k - 300) / 40)).toExponential(3)}  lift: ${(0.5 + 1 / (k + 2)).toFixed(4)}`);
    const path = write('inferred.log', `${rows.join('\n')}\n`);
    const reference = await read(path, false);
    expect(reference.parser).toBe('inferred');
    expect(reference.series.find((s) => s.info.name === 'res')?.info.kind).toBe('residual');
    const ranges: string[] = [];
    expect(await read(path, { minBytes: 0, workers: 2, rangeBytes: 4000, oneLineRecords: true, spawn: () => inThreadWorker(ranges) })).toEqual(reference);
  });

  it('formats on the text path (here a table) are read in one piece, with the same result', async () => {
    const rows = Array.from({ length: 300 }, (_, k) => `${k + 1} ${(0.9 ** k).toExponential(3)} ${(1 + 1 / (k + 1)).toFixed(4)}`);
    expect(await expectSameBothWays(write('t.table.log', `iter res_p drag\n${rows.join('\n')}\n`), 500)).toEqual([]);
  });

  it('formats of one record per line are read in one piece unless asked (the default on two cores)', async () => {
    const pairs = Array.from({ length: 300 }, (_, k) => `iter=${k + 1} res_p=${(0.97 ** k).toExponential(3)}`);
    const path = write('p.kv.log', `${pairs.join('\n')}\n`);
    const ranges: string[] = [];
    expect(await read(path, { minBytes: 0, workers: 2, rangeBytes: 500, spawn: () => inThreadWorker(ranges) })).toEqual(await read(path, false));
    expect(ranges).toEqual([]);
    expect((await expectSameBothWays(path, 500)).length).toBeGreaterThan(3);
  });
});

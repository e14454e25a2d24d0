/**
 * The run monitor end to end (real ingest, parser, store and judge): the same bytes must give the
 * same records and the same verdicts whether read at once, fed in arbitrary chunks, or followed live
 * while the file grows (architecture.md, "Rules of the house").
 */
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { PassThrough } from 'node:stream';
import { appendFileSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRunMonitor } from '../../src/monitor/run-monitor.js';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import type { RunDiagnosis } from '../../src/analysis/diagnosis.js';
import type { RunMonitorOptions } from '../../src/monitor/run-monitor-types.js';
import { solvePoisson2d } from '../../src/model-problems/poisson-2d.js';

const dir = mkdtempSync(join(tmpdir(), 'settle-monitor-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A settle-kv log of a real Gauss–Seidel iteration on the 2-D Poisson model problem (N = 15),
 * with a monitored quantity that settles geometrically. */
function gaussSeidelLog(iterations: number): string {
  const steps = solvePoisson2d({ n: 15, method: 'gauss-seidel', iterations });
  return steps
    .map((s) => `iter=${s.iteration} res_u=${s.residualL2.toExponential(6)} res_max=${s.residualMax.toExponential(6)} flux=${(2.5 - Math.pow(0.97, s.iteration)).toFixed(9)}\n`)
    .join('');
}

const baseOptions = (paths: string[]): RunMonitorOptions => ({
  paths,
  follow: false,
  parserFiles: [],
  kindOverrides: { residual: [], quantity: [] },
  criteria: DEFAULT_CRITERIA,
});

/** What must not depend on how the bytes arrived. */
const essence = (d: RunDiagnosis) => ({
  verdict: d.verdict,
  records: d.records,
  iterations: d.iterations,
  timeline: d.timeline,
  series: d.series.map((s) => ({ name: s.name, state: s.state, last: s.last })),
});

async function readFromStdin(text: string, cuts: number[]): Promise<RunDiagnosis> {
  const stdin = new PassThrough();
  const monitor = createRunMonitor({ ...baseOptions(['-']), stdin });
  const done = monitor.run();
  const bytes = Buffer.from(text);
  const points = [...new Set(cuts.map((c) => c % (bytes.length + 1)))].sort((a, b) => a - b);
  let from = 0;
  for (const to of [...points, bytes.length]) {
    if (to > from) stdin.write(bytes.subarray(from, to));
    from = to;
    await new Promise((resolve) => setImmediate(resolve));
  }
  stdin.end();
  return done;
}

describe('run monitor', () => {
  const text = gaussSeidelLog(1500);
  const file = join(dir, 'gs.log');
  writeFileSync(file, text);

  it('reads a finished log, picks the kv spec and judges the run', async () => {
    const monitor = createRunMonitor(baseOptions([file]));
    const diagnosis = await monitor.run();
    expect(monitor.parserChoice()?.id).toBe('settle-kv');
    expect(diagnosis.records).toBe(1500);
    expect(diagnosis.iterations).toBe(1500);
    expect(monitor.store.names()).toEqual(['res_u', 'res_max', 'flux']);
    expect(monitor.store.column('res_u')!.info.kind).toBe('residual');
    expect(monitor.store.column('flux')!.info.kind).toBe('quantity');
  });

  it('gives the same records and verdicts for any chunking of the same bytes', async () => {
    const atOnce = essence(await createRunMonitor(baseOptions([file])).run());
    await fc.assert(
      fc.asyncProperty(fc.array(fc.nat(), { maxLength: 40 }), async (cuts) => {
        expect(essence(await readFromStdin(text, cuts))).toEqual(atOnce);
      }),
      { numRuns: 15, seed: 20261201 },
    );
  });

  it('gives the same verdicts when the log is followed live while it grows', async () => {
    const atOnce = essence(await createRunMonitor(baseOptions([file])).run());
    const live = join(dir, 'live.log');
    writeFileSync(live, '');
    const monitor = createRunMonitor({ ...baseOptions([live]), follow: true, pollMs: 50 });
    const done = monitor.run();
    const lines = text.split(/(?<=\n)/);
    for (let k = 0; k < lines.length; k += 250) {
      // Cut mid-line on purpose: the partial line must wait for its newline.
      const piece = lines.slice(k, k + 250).join('');
      const cut = Math.floor(piece.length / 2);
      appendFileSync(live, piece.slice(0, cut));
      await new Promise((resolve) => setTimeout(resolve, 30));
      appendFileSync(live, piece.slice(cut));
    }
    const deadline = Date.now() + 10_000;
    while (monitor.store.records < 1500 && Date.now() < deadline) await new Promise((resolve) => setTimeout(resolve, 25));
    await monitor.stop();
    expect(essence(await done)).toEqual(atOnce);
  });

  it('judges the records after the last evaluation point once a followed log goes quiet, without advancing the judge', async () => {
    const quiet = join(dir, 'quiet.log');
    // 25 iterations: evaluation points fall every 10 records early on, so 5 records are left over.
    writeFileSync(quiet, text.split(/(?<=\n)/).slice(0, 25).join(''));
    const monitor = createRunMonitor({ ...baseOptions([quiet]), follow: true, pollMs: 50 });
    const scheduled: number[] = [];
    const previews: number[] = [];
    monitor.on('diagnosis', (d) => scheduled.push(d.records));
    monitor.on('preview', (d) => previews.push(d.records));
    const done = monitor.run();
    const deadline = Date.now() + 5_000;
    while (previews.length === 0 && Date.now() < deadline) await new Promise((resolve) => setTimeout(resolve, 25));
    await monitor.stop();
    await done;
    expect(scheduled).toEqual([10, 20, 25]); // the last one is the final evaluation at stop()
    expect(previews).toEqual([25]);
  });

  it('says which input cannot be read', async () => {
    const monitor = createRunMonitor(baseOptions([join(dir, 'missing.log')]));
    await expect(monitor.run()).rejects.toThrow(/missing\.log/);
  });
});

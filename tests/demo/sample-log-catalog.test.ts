import { readFileSync } from 'node:fs';
import path from 'node:path';
import { gunzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { buildSampleLogs, sampleLogsManifest, sampleLogsReadme, type SampleLog } from '../../src/demo/sample-log-catalog.js';

const first = buildSampleLogs();
const byName = new Map(first.map((log) => [log.file, log]));
const text = (file: string): string => new TextDecoder().decode((byName.get(file) as SampleLog).bytes);
const sampleDir = path.resolve(import.meta.dirname, '..', '..', 'sample-logs');

describe('buildSampleLogs', () => {
  it('is deterministic: a second build gives the same files, byte for byte', () => {
    const second = buildSampleLogs();
    expect(second.map((l) => l.file)).toEqual(first.map((l) => l.file));
    second.forEach((log, k) => expect(Buffer.compare(Buffer.from(log.bytes), Buffer.from(first[k].bytes))).toBe(0));
  });

  it('matches the committed sample-logs/ folder (regenerate with npm run samples after changing a producer)', () => {
    for (const log of first) expect(Buffer.compare(readFileSync(path.join(sampleDir, log.file)), Buffer.from(log.bytes)), log.file).toBe(0);
    expect(readFileSync(path.join(sampleDir, 'README.md'), 'utf8')).toBe(sampleLogsReadme(first));
    expect(readFileSync(path.join(sampleDir, 'manifest.json'), 'utf8')).toBe(sampleLogsManifest(first));
  });

  it('covers every built-in format and every verdict, in under 3 MB', () => {
    expect(new Set(first.map((l) => l.parser))).toEqual(new Set(['settle-kv', 'settle-block', 'settle-table', 'settle-csv', 'settle-jsonl']));
    expect(new Set(first.map((l) => l.expected))).toEqual(new Set(['converged', 'converging', 'stalled', 'oscillating', 'diverging', 'failed']));
    expect(first.reduce((sum, l) => sum + l.bytes.length, 0)).toBeLessThan(3 * 1024 * 1024);
  });

  it('writes the CRLF log with CRLF line ends only', () => {
    const crlf = text('cavity-healthy-crlf.csv');
    expect(crlf.split('\r\n').length).toBeGreaterThan(100);
    expect(/[^\r]\n/.test(crlf)).toBe(false);
  });

  it('writes a gzip file that inflates to a jsonl log', () => {
    const lines = gunzipSync((byName.get('cavity-healthy.jsonl.gz') as SampleLog).bytes).toString('utf8').trimEnd().split('\n');
    expect(JSON.parse(lines[0])).toMatchObject({ iter: 1, res_psi: 1, res_omega: 1, res_T: 1 });
  });

  it('writes a restart: the counter goes back from 300 to 201 right after a repeated header', () => {
    const iters = text('cavity-restart.table.log').trimEnd().split('\n').filter((l) => /^\s+\d/.test(l)).map((l) => Number(l.trim().split(/\s+/)[0]));
    const back = iters.findIndex((v, k) => k > 0 && v < iters[k - 1]);
    expect([iters[back - 1], iters[back]]).toEqual([300, 201]);
    const lines = text('cavity-restart.table.log').split('\n');
    const at = lines.findIndex((l) => /^\s+300\s/.test(l));
    expect(lines[at + 1].trim().startsWith('iter')).toBe(true);
  });

  it('cuts the last line of the cut-off log in the middle of a number, with no line end', () => {
    const cut = text('cavity-cut-off.kv.log');
    expect(cut.endsWith('\n')).toBe(false);
    expect(cut.slice(cut.lastIndexOf('\n') + 1)).toMatch(/^iter=500 .* res_T=\d\.\d\d$/);
  });

  it('spells Fortran numbers with D exponents and letterless three-digit exponents', () => {
    const fortran = text('heat-ftcs-unstable-fortran.table.log');
    expect(fortran).toMatch(/ 0\.\d{5}D[+-]\d\d\n/);
    expect(fortran).toMatch(/ 0\.\d{5}\+1\d\d\n/);
  });

  it('ends the crash log with non-finite values and a FATAL line', () => {
    const lines = text('cavity-crash.kv.log').trimEnd().split('\n');
    expect(lines[lines.length - 1]).toMatch(/^FATAL: /);
    expect(lines[lines.length - 2]).toMatch(/=(NaN|Inf|-Inf)( |$)/);
  });

  it('writes the transient log with step, time and inner keys, inner counting from 1 in each step', () => {
    const lines = text('periodic-heat-transient.kv.log').trimEnd().split('\n');
    expect(lines[0]).toMatch(/^step=1 time=5\.000e-03 inner=1 res_T=\S+ t_mid=\S+ q_right=\S+$/);
    const secondStep = lines.find((l) => l.startsWith('step=2 '));
    expect(secondStep).toMatch(/ inner=1 /);
  });
});

/** `settle check` end to end: the built CLI on settle-kv logs written to a temp folder. Exit codes
 * are the contract of issue 3 ("settle check": 0 converged, 10 converging, 11 undecided, 20 stalled,
 * 21 oscillating, 30 diverging, 31 failed; 2 usage error, 3 unreadable input). */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { HISTORIES, historyLog, runSettle } from './check-helpers.js';

const dir = mkdtempSync(join(tmpdir(), 'settle-check-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const ISSUE_3_EXIT_CODES = { converged: 0, converging: 10, undecided: 11, stalled: 20, oscillating: 21, diverging: 30, failed: 31 } as const;
type Verdict = keyof typeof ISSUE_3_EXIT_CODES;

const logs = {} as Record<Verdict, string>;
for (const name of Object.keys(HISTORIES) as Verdict[]) {
  logs[name] = join(dir, `${name}.log`);
  writeFileSync(logs[name], historyLog(name));
}

/** The contract's keys (issue 3, "settle check", --json). */
const RUN_KEYS = ['verdict', 'exitCode', 'iterations', 'advice', 'reasons', 'series'];
const SERIES_REQUIRED = ['name', 'kind', 'state', 'last'];
const SERIES_OPTIONAL = ['rho', 'ordersPerKilo', 'eta', 'period', 'amplitudeDecades', 'mean', 'halfWidth', 'iterationError'];
const isJsonNumber = (value: unknown): boolean => typeof value === 'number' || value === 'NaN' || value === 'Infinity' || value === '-Infinity';

function expectRunShape(run: Record<string, unknown>): void {
  expect(Object.keys(run)).toEqual(RUN_KEYS);
  expect(Object.keys(ISSUE_3_EXIT_CODES)).toContain(run.verdict);
  expect(run.exitCode).toBe(ISSUE_3_EXIT_CODES[run.verdict as Verdict]);
  expect(isJsonNumber(run.iterations)).toBe(true);
  expect(typeof run.advice).toBe('string');
  expect(Array.isArray(run.reasons) && run.reasons.every((r) => typeof r === 'string')).toBe(true);
  for (const series of run.series as Record<string, unknown>[]) {
    const keys = Object.keys(series);
    expect(keys.slice(0, 4)).toEqual(SERIES_REQUIRED);
    for (const key of keys.slice(4)) expect(SERIES_OPTIONAL).toContain(key);
    expect(keys.slice(4)).toEqual(SERIES_OPTIONAL.filter((key) => keys.includes(key)));
    expect(['residual', 'quantity', 'other']).toContain(series.kind);
    for (const key of ['last', ...keys.slice(4)]) expect(isJsonNumber(series[key])).toBe(true);
  }
}

/** The last iteration of each history as the header prints it: digits grouped by a space, the
 * style of the analysis's reasons (src/text/format-count.ts). */
const LAST_SHOWN: Record<Verdict, string> = {
  converged: '400', converging: '250', stalled: '500', oscillating: '1 000', diverging: '300', failed: '100', undecided: '5',
};

describe('settle check (post-mortem)', () => {
  it.each(Object.keys(ISSUE_3_EXIT_CODES) as Verdict[])('calls the %s history by its name and exits with its code', async (verdict) => {
    const result = await runSettle(['check', logs[verdict]]);
    expect(result.stdout.split('\n')[0]).toBe(`${logs[verdict]}: ${verdict} (exit ${ISSUE_3_EXIT_CODES[verdict]}) at iteration ${LAST_SHOWN[verdict]}`);
    expect(result.stdout).toMatch(/\n {2}advice: \S/);
    expect(result.code).toBe(ISSUE_3_EXIT_CODES[verdict]);
    expect(result.stderr).toBe('');
  });

  it('prints the --json contract for one log, with NaN as a string', async () => {
    const result = await runSettle(['check', '--json', logs.failed]);
    expect(result.code).toBe(31);
    const json = JSON.parse(result.stdout);
    expectRunShape(json);
    expect(json).toMatchObject({ verdict: 'failed', exitCode: 31, iterations: 100 });
    expect(json.series[0]).toMatchObject({ name: 'res_p', kind: 'residual', state: 'failed', last: 'NaN' });
  });

  it('gives a converging residual its rate in --json (rho 0.99 per iteration by construction, ±1e-3)', async () => {
    const json = JSON.parse((await runSettle(['check', '--json', logs.converging])).stdout);
    expectRunShape(json);
    expect(json.series[0].rho).toBeCloseTo(0.99, 3);
    // orders per 1000 iterations = -1000·log10(0.99) = 4.365 (methods.md, "Residual trend").
    expect(json.series[0].ordersPerKilo).toBeCloseTo(4.365, 1);
  });

  it('lets the worst verdict decide over several logs, each reported', async () => {
    const result = await runSettle(['check', logs.converged, logs.stalled, logs.converging]);
    expect(result.code).toBe(20);
    expect(result.stdout).toContain(`${logs.converged}: converged (exit 0)`);
    expect(result.stdout).toContain(`${logs.stalled}: stalled (exit 20)`);
    expect(result.stdout).toContain(`${logs.converging}: converging (exit 10)`);
    expect(result.stdout.trimEnd().split('\n').at(-1)).toBe('worst of 3 logs: stalled (exit 20)');
  });

  it('prints the several-logs --json shape: {verdict, exitCode, runs:[{log, ...}]}', async () => {
    const result = await runSettle(['check', '--json', logs.converged, logs.diverging, logs.oscillating]);
    expect(result.code).toBe(30);
    const json = JSON.parse(result.stdout);
    expect(Object.keys(json)).toEqual(['verdict', 'exitCode', 'runs']);
    expect(json).toMatchObject({ verdict: 'diverging', exitCode: 30 });
    expect(json.runs.map((run: { log: string }) => run.log)).toEqual([logs.converged, logs.diverging, logs.oscillating]);
    for (const run of json.runs) {
      expect(Object.keys(run)[0]).toBe('log');
      const { log: _log, ...rest } = run;
      expectRunShape(rest);
    }
    expect(json.runs.map((run: { verdict: string }) => run.verdict)).toEqual(['converged', 'diverging', 'oscillating']);
  });

  it('writes nothing next to the logs', async () => {
    const alone = join(dir, 'alone');
    mkdirSync(alone);
    writeFileSync(join(alone, 'run.log'), historyLog('converged'));
    await runSettle(['check', '--json', join(alone, 'run.log')]);
    await runSettle(['check', join(alone, 'run.log'), logs.stalled]);
    expect(readdirSync(alone)).toEqual(['run.log']);
  });

  it.each([
    ['a missing log', () => [join(dir, 'nope.log')], 3, /cannot read .*nope\.log: no such file/],
    ['a missing log among good ones', () => [logs.converged, join(dir, 'nope.log')], 3, /no such file/],
  // More cases run in-process in check-bad-input.test.ts.
  ])('refuses %s with one line and a hint', async (_label, args, code, message) => {
    const result = await runSettle(['check', ...args()]);
    expect(result.code).toBe(code);
    expect(result.stdout).toBe('');
    expect(result.stderr).toMatch(message);
    expect(result.stderr).toMatch(/\n {2}hint: /);
    expect(result.stderr).not.toMatch(/\n\s+at /); // no stack trace
  });
});

/** `settle report` end to end: the built CLI on settle-kv logs written to a temp folder. */
import { afterAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli, steadyRunLog } from '../report/run-cli.js';
import { xmlProblems } from '../report/xml-well-formed.js';

const dir = mkdtempSync(join(tmpdir(), 'settle-report-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const logA = join(dir, 'a.log');
const logB = join(dir, 'b.log');
writeFileSync(logA, steadyRunLog(2.243, 1, 1200, 700));
writeFileSync(logB, 'iter=1 res_p=1.0e+00 nu_hot=1.0\niter=2 res_p=2.0e+00 nu_hot=1.1\niter=3 res_p=NaN nu_hot=NaN\nFATAL solver blew up\n');

describe('settle report', () => {
  it('writes a text report of each log to stdout, exits 0 whatever the verdict, and ends with the cautions', async () => {
    const result = await runCli(['report', logA, logB]);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    expect(result.stdout).toContain(`== ${logA} ==`);
    expect(result.stdout).toContain(`== ${logB} ==`);
    expect(result.stdout).toMatch(/parser: +spec settle-kv/);
    expect(result.stdout).toMatch(/restarts: +1 \(at iteration 650\)/);
    // Counts as the reasons print them (src/text/format-count.ts): grouped by a space, not a comma.
    expect(result.stdout).toMatch(/verdict: +converging \(not final\) after 1 200 iterations \(1 250 records\)/);
    expect(result.stdout).toMatch(/nu_hot +converged +2\.243/);
    expect(result.stdout.trimEnd()).toMatch(/licensed professional practice\.$/);
  });

  it('writes Markdown with data-URI SVG charts to -o (format from the extension), and nothing else in the folder', async () => {
    const out = join(dir, 'report.md');
    const before = readdirSync(dir).sort();
    const result = await runCli(['report', logA, '-o', out]);
    expect(result.code).toBe(0);
    expect(result.stdout).toBe('');
    expect(readdirSync(dir).sort()).toEqual([...before, 'report.md'].sort());
    const md = readFileSync(out, 'utf8');
    const images = [...md.matchAll(/!\[[^\]]+\]\(data:image\/svg\+xml;base64,([A-Za-z0-9+/=]+)\)/g)];
    expect(images).toHaveLength(3); // residuals, nu_hot, nu_hot's settled part
    const residualChart = Buffer.from(images[0][1], 'base64').toString('utf8');
    expect(xmlProblems(residualChart)).toEqual([]);
    expect(residualChart).toContain('>restart</text>');
    rmSync(out);
  });

  it('writes a self-contained HTML page with --format html', async () => {
    const result = await runCli(['report', logA, '--format', 'html']);
    expect(result.code).toBe(0);
    expect(result.stdout.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(result.stdout.match(/<svg /g)).toHaveLength(3);
    expect(result.stdout).not.toMatch(/<script|src="http|href="http/);
  });

  it('writes JSON with check\'s series field names, the timeline and the criteria, honouring criteria flags', async () => {
    const result = await runCli(['report', logA, '--format', 'json', '--drop', '2']);
    expect(result.code).toBe(0);
    const doc = JSON.parse(result.stdout);
    expect(doc.criteria.drop).toBe(2);
    const run = doc.runs[0];
    expect(run).toMatchObject({ log: logA, parser: 'settle-kv', restarts: [650] });
    const nu = run.series.find((s: { name: string }) => s.name === 'nu_hot');
    expect(nu).toMatchObject({ kind: 'quantity', state: 'converged' });
    expect(Math.abs(nu.mean - 2.243)).toBeLessThan(1e-3); // the value the log was written to settle at
    expect(run.timeline.length).toBeGreaterThan(0);
    expect(run.criteria.length).toBeGreaterThan(0);
  });

  it.each([
    ['an unknown format', ['--format', 'pdf'], 2, /--format must be one of text, md, html, json, got 'pdf'/],
    ['-o onto the log itself', ['-o', 'LOG'], 2, /is one of the logs being read; settle never writes over its input/],
    ['-o in a folder that does not exist', ['-o', 'MISSING/r.md'], 2, /the folder .* does not exist/],
    ['-o onto a folder', ['-o', 'DIR'], 2, /is a folder/],
    ['a log that does not exist', ['NOLOG'], 3, /cannot read .*nope\.log: no such file/],
    ['a bad criteria flag', ['--drop', 'lots'], 2, /--drop needs a positive number of decades/],
  ] as const)('refuses %s with a one-line message and a hint', { concurrent: true }, async (_label, extra, code, message) => {
    const places: Record<string, string> = { LOG: logA, MISSING: join(dir, 'missing'), DIR: dir, NOLOG: join(dir, 'nope.log') };
    const args = extra.map((a) => a.replace(/^(NOLOG|LOG|MISSING|DIR)/, (m) => places[m]));
    const logs = args.includes(join(dir, 'nope.log')) ? [] : [logA];
    const before = readFileSync(logA, 'utf8');
    const result = await runCli(['report', ...logs, ...args]);
    expect(result.code).toBe(code);
    expect(result.stderr).toMatch(message);
    expect(result.stderr).toMatch(/hint:/);
    expect(result.stderr).not.toMatch(/\n\s+at /); // no stack trace
    expect(readFileSync(logA, 'utf8')).toBe(before);
  });

  // /dev/full accepts the open and fails every write with ENOSPC (Linux null(4)/full(4) man page,
  // from memory): a write failure after the logs were read, which is not a usage error.
  it.skipIf(!existsSync('/dev/full'))('says so with exit 4 when the report cannot be written after reading', async () => {
    const result = await runCli(['report', logA, '-o', '/dev/full']);
    expect(result.code).toBe(4);
    expect(result.stderr).toBe('settle: cannot write /dev/full (ENOSPC); the logs were read, the report is not saved\n  hint: free some disk space or choose another path\n');
    expect(result.stdout).toBe('');
  });
});

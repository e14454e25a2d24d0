// End-to-end tests of `settle demo --study` through the built CLI (run `npx tsc -p tsconfig.json`
// first): three grids of the healthy cavity, the real `settle compare` path, the benchmark line.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { demoStudyOptionsOf } from '../../src/cli/demo-command.js';

const root = path.resolve(import.meta.dirname, '..', '..');
const cli = path.join(root, 'dist', 'src', 'cli', 'main.js');
const scratch = mkdtempSync(path.join(tmpdir(), 'settle-demo-study-test-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

/** Run `settle demo --study ...` with its own empty TMPDIR, so leftovers can be seen. */
function study(args: string[]): { code: number | null; stdout: string; stderr: string; tmp: string } {
  const tmp = mkdtempSync(path.join(scratch, 'tmp-'));
  const result = spawnSync(process.execPath, [cli, 'demo', '--study', ...args], { encoding: 'utf8', env: { ...process.env, TMPDIR: tmp }, timeout: 60_000 });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr, tmp };
}

function field(text: string, label: string): string {
  const line = text.split('\n').find((l) => l.startsWith(label));
  expect(line, `no '${label}' line in:\n${text}`).toBeDefined();
  return (line as string).slice(label.length).trim();
}

// de Vahl Davis (1983), "Natural convection of air in a square cavity: a bench mark numerical
// solution", mean Nusselt number on the hot wall (from memory).
const BENCHMARK = { 1e3: 1.118, 1e4: 2.243 } as const;
// Tolerances: the extrapolated value must be within 1 % of the benchmark (measured: +0.17 % at Ra 1e4,
// −0.01 % at Ra 1e3, while the fine grid itself is 1.8 % and 0.25 % off); the apparent order of this
// second-order scheme must be between 1.5 and 3 (measured 2.31 and 2.10; Celik et al. 2008 expect
// it near the formal order in the asymptotic range).
const EXTRAPOLATION_TOLERANCE = 0.01;

describe('settle demo --study (built CLI)', () => {
  it('runs 16, 24, 36 cells at Ra 1e4, prints the compare result for nu_hot and the benchmark line, and leaves no temporary files', () => {
    const result = study([]);
    expect(result.code, result.stderr).toBe(0);
    // Progress on stderr, coarse grid first.
    const progress = result.stderr.trimEnd().split('\n');
    expect(progress[0]).toBe('settle demo --study: healthy cavity at Ra 1e4 on grids 16, 24, 36 (refinement ratio 1.5)');
    expect(progress.slice(1).map((l) => /^grid (\d+): \d{1,3}(?: \d{3})* iterations, nu_hot \d\.\d{4}$/.exec(l)?.[1])).toEqual(['16', '24', '36']);

    const out = result.stdout;
    expect(out).toMatch(/^Mesh study of nu_hot \(2-D grids; Celik et al\. 2008\)/);
    // Cells = grid², fine first; every run settled.
    expect(out).toMatch(/\n {2}fine +\S+grid36\.log +1 296 .* settled mean +converged /);
    expect(out).toMatch(/\n {2}medium +\S+grid24\.log +576 .* settled mean +converged /);
    expect(out).toMatch(/\n {2}coarse +\S+grid16\.log +256 .* settled mean +converged /);
    expect(field(out, 'refinement ratios')).toBe('r21 = 1.5, r32 = 1.5');
    expect(field(out, 'convergence')).toMatch(/^monotone /);
    const order = Number(/^(\S+)/.exec(field(out, 'apparent order p'))?.[1]);
    expect(order).toBeGreaterThan(1.5);
    expect(order).toBeLessThan(3);
    const extrapolated = Number(field(out, 'extrapolated value'));
    expect(Math.abs(extrapolated - BENCHMARK[1e4]) / BENCHMARK[1e4]).toBeLessThan(EXTRAPOLATION_TOLERANCE);
    expect(field(out, 'GCI of the fine grid')).toMatch(/^\d+(\.\d+)? %, i\.e\. 2\.\d+ ± 0\.\d+ \(safety factor 1\.25\)$/);
    expect(field(out, 'iteration vs discretisation')).toMatch(/^iteration error negligible/);
    // The benchmark line names the source, the value and the signed relative difference of the
    // extrapolated value, which must agree with the extrapolated value printed above (0.005 % points:
    // both are rounded for print).
    const line = /\nBenchmark: de Vahl Davis \(1983\), hot-wall mean Nusselt number at Ra 1e4 = 2\.243 \(from memory\); the extrapolated (\S+) differs by ([+−])(\d+\.\d\d) %\.\n/.exec(out);
    expect(line, out).not.toBeNull();
    const [, shown, sign, percent] = line as RegExpExecArray;
    expect(Number(shown)).toBe(extrapolated);
    expect(Math.abs((sign === '−' ? -1 : 1) * Number(percent) - ((extrapolated - 2.243) / 2.243) * 100)).toBeLessThan(0.005);
    expect(out).toMatch(/\nThe benchmark lies inside the fine grid's GCI band, /);
    expect(out.endsWith('The logs were in a temporary folder, now removed (keep them with --out DIR).\n')).toBe(true);
    expect(readdirSync(result.tmp)).toEqual([]);
  });

  it('--ra 1e3 --json prints the compare JSON with a benchmark field', () => {
    const result = study(['--ra', '1e3', '--json']);
    expect(result.code, result.stderr).toBe(0);
    const json = JSON.parse(result.stdout) as Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
    expect(json.quantity).toBe('nu_hot');
    expect(json.dimensions).toBe(2);
    expect(json.grids.map((g: { cells: number }) => g.cells)).toEqual([1296, 576, 256]);
    expect(json.grids.map((g: { state: string }) => g.state)).toEqual(['converged', 'converged', 'converged']);
    expect(json.convergence).toBe('monotone');
    expect(json.order).toBeGreaterThan(1.5);
    expect(json.order).toBeLessThan(3);
    const b = json.benchmark;
    expect(b).toMatchObject({ source: 'de Vahl Davis (1983)', rayleigh: 1000, value: BENCHMARK[1e3], fromMemory: true, extrapolated: json.extrapolated, withinFineGciBand: true });
    expect(b.relativeDifference).toBeCloseTo((json.extrapolated - 1.118) / 1.118, 12);
    expect(Math.abs(b.relativeDifference)).toBeLessThan(EXTRAPOLATION_TOLERANCE);
    expect(json.demo).toEqual({ rayleigh: 1000, cellsPerSide: [36, 24, 16], refinementRatio: 1.5, logsKeptIn: null });
    expect(readdirSync(result.tmp)).toEqual([]);
  });

  it('--out DIR keeps the three logs in a new folder; at a Rayleigh number without a benchmark value it says so', () => {
    const dir = path.join(scratch, 'kept');
    const result = study(['--ra', '2e4', '--grid', '12', '--out', dir]);
    expect(result.code, result.stderr).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(['cavity-ra2e4-grid12.log', 'cavity-ra2e4-grid18.log', 'cavity-ra2e4-grid27.log']);
    expect(readFileSync(path.join(dir, 'cavity-ra2e4-grid27.log'), 'utf8')).toMatch(/^iter=1 res_psi=/);
    expect(result.stdout).toMatch(/\nBenchmark: de Vahl Davis \(1983\) has no hot-wall mean Nusselt number at Ra 2e4 \(it tabulates Ra 1e3, 1e4, 1e5, 1e6\); the extrapolated value is \d\.\d+\.\n/);
    expect(result.stdout.endsWith(`The logs are in ${dir}.\n`)).toBe(true);
    expect(readdirSync(result.tmp)).toEqual([]);
  });

  it('refuses an existing --out folder, exit 2, and writes nothing into it', () => {
    const dir = path.join(scratch, 'existing');
    mkdirSync(dir);
    const result = study(['--out', dir]);
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(/already exists; settle demo --study keeps its three logs in a new folder/);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('stops with exit 3 when a run does not converge (Ra 1e6 blows up on the coarse grid) and still removes its temporary folder', () => {
    const result = study(['--ra', '1e6']);
    expect(result.code).toBe(3);
    expect(result.stderr).toMatch(/\nsettle: the healthy case at Ra 1e6 on grid 24 was stopped by the solver's divergence guard, so it cannot enter a grid study\n {2}hint: /);
    expect(result.stdout).toBe('');
    expect(readdirSync(result.tmp)).toEqual([]);
  });
});

describe('demoStudyOptionsOf', () => {
  const raw = { scenario: 'healthy', ra: '1e4', ui: true, format: 'kv', study: true };

  it('takes the default grids by Rayleigh number, or --grid as the coarse grid', () => {
    expect(demoStudyOptionsOf(raw)).toEqual({ rayleigh: 1e4, grids: [36, 24, 16], format: 'kv', json: false, out: undefined });
    expect(demoStudyOptionsOf({ ...raw, ra: '1e5' }).grids).toEqual([54, 36, 24]);
    expect(demoStudyOptionsOf({ ...raw, grid: '8' }).grids).toEqual([18, 12, 8]);
    expect(demoStudyOptionsOf({ ...raw, grid: '56' }).grids).toEqual([126, 84, 56]);
  });

  it.each([
    [{ scenario: 'stalled' }, /--study runs the healthy case only/],
    [{ grid: '18' }, /must be a multiple of 4 from 8 to 56, got 18/],
    [{ grid: '4' }, /must be a multiple of 4 from 8 to 56, got 4/],
    [{ grid: '60' }, /must be a multiple of 4 from 8 to 56, got 60/],
    [{ grid: 'fine' }, /--grid needs a positive whole number/],
    [{ ra: '1e9' }, /above 1e\+6/],
    [{ format: 'xml' }, /unknown log format 'xml'/],
    [{ out: scratch }, /already exists/],
  ])('rejects %o', (change, message) => {
    expect(() => demoStudyOptionsOf({ ...raw, ...change })).toThrow(message);
  });
});

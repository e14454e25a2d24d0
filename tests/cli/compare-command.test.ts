/** `settle compare` end to end: three settle-kv runs written to settle at the values of the worked
 * example of Celik et al. (2008) (methods.md, from memory), through the built CLI. */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli, steadyRunLog } from '../report/run-cli.js';

const dir = mkdtempSync(join(tmpdir(), 'settle-compare-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const fine = join(dir, 'fine.log');
const medium = join(dir, 'medium.log');
const coarse = join(dir, 'coarse.log');
const short = join(dir, 'short.log');
writeFileSync(fine, steadyRunLog(6.063, 11));
writeFileSync(medium, steadyRunLog(5.972, 12));
writeFileSync(coarse, steadyRunLog(5.863, 13));
writeFileSync(short, steadyRunLog(5.972, 14, 90)); // still relaxing: nu_hot has not settled

const study = ['compare', fine, medium, coarse, '--quantity', 'nu_hot', '--cells', '18000,8000,4500', '--dims', '2'];

describe('settle compare', () => {
  it('computes the GCI of the worked example from the runs\' settled means (p ≈ 1.53, φ_ext ≈ 6.168, GCI ≈ 2.2 %; the settled means carry noise of ~1e-5, so tolerances are wider than in the pure tests)', async () => {
    const result = await runCli([...study, '--json']);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    const doc = JSON.parse(result.stdout);
    expect(doc.grids.map((g: { source: string }) => g.source)).toEqual(['settled mean', 'settled mean', 'settled mean']);
    expect(doc.convergence).toBe('monotone');
    expect(Math.abs(doc.order - 1.53)).toBeLessThan(0.02);
    expect(Math.abs(doc.extrapolated - 6.168)).toBeLessThan(0.003);
    expect(Math.abs(doc.gciFine * 100 - 2.2)).toBeLessThan(0.1);
    expect(doc.iterationVerdict).toMatch(/^iteration error negligible/);
  });

  it('refuses an unsettled run by name and state, and takes its last value with --allow-unsettled', async () => {
    const refused = await runCli(['compare', fine, short, coarse, '--quantity', 'nu_hot', '--cells', '18000,8000,4500', '--dims', '2']);
    expect(refused.code).toBe(3);
    expect(refused.stderr).toMatch(new RegExp(`medium run ${short.replace(/[/.]/g, '\\$&')}: nu_hot has not settled \\(state `));
    expect(refused.stderr).toMatch(/hint: .*--allow-unsettled/);
    const allowed = await runCli(['compare', fine, short, coarse, '--quantity', 'nu_hot', '--cells', '18000,8000,4500', '--dims', '2', '--allow-unsettled']);
    expect(allowed.code).toBe(0);
    expect(allowed.stdout).toMatch(/its last value was used because of --allow-unsettled/);
  });

  it.each([
    ['two logs for three cell counts', [fine, medium, '--quantity', 'nu_hot', '--cells', '18000,8000,4500'], /--cells gives 3 cell counts for 2 logs/],
    ['two logs and two counts', [fine, medium, '--quantity', 'nu_hot', '--cells', '18000,8000'], /compare takes three logs \(fine, medium, coarse\), got 2/],
    ['non-numeric cells', [fine, medium, coarse, '--quantity', 'nu_hot', '--cells', '18000,lots,4500'], /--cells needs positive whole numbers.*'lots'/],
    ['cells not decreasing', [fine, medium, coarse, '--quantity', 'nu_hot', '--cells', '4500,8000,18000'], /--cells must decrease from fine to coarse/],
    ['no --cells', [fine, medium, coarse, '--quantity', 'nu_hot'], /compare needs --cells/],
    ['no --quantity', [fine, medium, coarse, '--cells', '18000,8000,4500'], /compare needs --quantity NAME/],
    ['two --quantity', [fine, medium, coarse, '--quantity', 'a', '--quantity', 'b', '--cells', '3,2,1'], /compare studies one quantity/],
    ['--dims 4', [fine, medium, coarse, '--quantity', 'nu_hot', '--cells', '18000,8000,4500', '--dims', '4'], /--dims must be 2 or 3/],
    ['an unknown quantity (lists the known ones)', [fine, medium, coarse, '--quantity', 'drag', '--cells', '18000,8000,4500'], /has no series named 'drag'\n {2}hint: known quantities: nu_hot/],
  ] as const)('refuses %s (exit 2, message and hint)', { concurrent: true }, async (_label, args, message) => {
    const result = await runCli(['compare', ...args]);
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(message);
    expect(result.stderr).toMatch(/hint:/);
  });
});

// End to end: the built CLI (run `npx tsc -p tsconfig.json` first; CI builds before testing).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const CLI = resolve('dist/src/cli/main.js');
let dir: string;
let env: NodeJS.ProcessEnv;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'settle-parsers-cli-'));
  // An empty config home, so the user's own specs do not leak into the test.
  env = { ...process.env, XDG_CONFIG_HOME: join(dir, 'config') };
});
afterAll(() => { rmSync(dir, { recursive: true, force: true }); });

function settle(...args: string[]) {
  const result = spawnSync(process.execPath, [CLI, ...args], { env, encoding: 'utf8', timeout: 20_000 });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

describe('settle parsers list', () => {
  it('lists the built-in specs with their descriptions, then where user specs go', () => {
    const { code, stdout } = settle('parsers', 'list');
    expect(code).toBe(0);
    const lines = stdout.trimEnd().split('\n');
    expect(lines[0]).toMatch(/^id\s+source\s+description$/);
    expect(lines.slice(1, 6).map((l) => l.split(/\s+/).slice(0, 2).join(' '))).toEqual([
      'settle-block built-in', 'settle-csv built-in', 'settle-jsonl built-in', 'settle-kv built-in', 'settle-table built-in',
    ]);
    expect(stdout).toContain(`*.json files in ${join(dir, 'config', 'settle', 'parsers')}`);
  });

  it('shows specs from the config folder and from --parser with their file', () => {
    mkdirSync(join(dir, 'config', 'settle', 'parsers'), { recursive: true });
    const spec = { id: 'from-config', description: 'a user spec', detect: { patterns: ['^x'] }, lines: { rules: [{ keyValues: {} }] } };
    writeFileSync(join(dir, 'config', 'settle', 'parsers', 'mine.json'), JSON.stringify(spec));
    const extra = join(dir, 'extra.json');
    writeFileSync(extra, JSON.stringify({ ...spec, id: 'extra' }));
    const { code, stdout } = settle('parsers', 'list', '--parser', extra);
    expect(code).toBe(0);
    expect(stdout).toMatch(new RegExp(`^extra\\s+${extra.replace(/[.]/g, '\\.')}\\s+a user spec$`, 'm'));
    expect(stdout).toMatch(/^from-config\s+\S+mine\.json\s+a user spec$/m);
    rmSync(join(dir, 'config'), { recursive: true, force: true });
  });

  it('a broken spec file stops with every problem listed and exit code 2', () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ id: 'x', detect: { patterns: ['('] }, jsonl: {}, table: { header: 'a', separator: ',' } }));
    const { code, stderr } = settle('parsers', 'list', '--parser', bad);
    expect(code).toBe(2);
    expect(stderr).toContain(`settle: ${bad}: 2 problems:`);
    expect(stderr).toContain(`${bad}: description: is required`);
    expect(stderr).toContain(`${bad}: (top level): give exactly one of lines, table or jsonl`);
    expect(stderr).not.toMatch(/\n\s+at /);
  });
});

describe('settle parsers test', () => {
  it('reports lines, records, restarts, the failure, series with kinds and counts, first records and unmatched lines', () => {
    const log = join(dir, 'run.log');
    writeFileSync(log, [
      'iter=1 res_p=1.000e+00 nu_hot=1.0000',
      'iter=2 res_p=1.000e-01 nu_hot=1.0500',
      'solver: writing checkpoint',
      'iter=1 res_p=5.000e-01 nu_hot=*******',
      'FATAL: out of memory',
      '',
    ].join('\n'));
    const { code, stdout } = settle('parsers', 'test', 'settle-kv', log);
    expect(code).toBe(0);
    expect(stdout).toContain('spec:      settle-kv (built-in)');
    expect(stdout).toContain('lines:     5 read, 1 not matched');
    expect(stdout).toMatch(/records:\s+3 \(first iteration 1, last 1\), 1 restart/);
    expect(stdout).toContain('failure:   FATAL: out of memory');
    expect(stdout).toMatch(/^\s+res_p\s+residual\s+3\s+0\s+1\s+0\.5$/m);
    expect(stdout).toMatch(/^\s+nu_hot\s+quantity\s+3\s+1\s+1\s+Inf$/m);
    expect(stdout).toContain('iteration 1, restart: res_p=0.5 nu_hot=Inf');
    expect(stdout).toMatch(/lines not matched \(first 1 of 1\):\n\s+solver: writing checkpoint/);
  });

  it('takes a spec file and shows units from block lines', () => {
    const spec = join(dir, 'blocks.json');
    writeFileSync(spec, JSON.stringify({
      id: 'my-blocks', description: 'x', detect: { patterns: ['^# step'] },
      lines: { rules: [
        { match: '^# step (?<step>\\d+)', startsRecord: true },
        { match: '^(?<name>\\w+) (?<value>\\S+) (?<unit>\\w+)$', pairs: { unitGroup: 'unit' } },
      ] },
    }));
    const log = join(dir, 'blocks.log');
    writeFileSync(log, '# step 1\nlift 2.5 N\nflux 3e2 W\n# step 2\nlift 2.6 N\n');
    const { code, stdout } = settle('parsers', 'test', spec, log);
    expect(code).toBe(0);
    expect(stdout).toContain(`spec:      my-blocks (${spec})`);
    expect(stdout).toMatch(/^\s+lift\s+quantity\s+2\s+0\s+2\.5\s+2\.6\s+N$/m);
    expect(stdout).toMatch(/^\s+flux\s+quantity\s+1\s+0\s+300\s+300\s+W$/m);
    expect(stdout).toContain('iteration 2, step 2, inner 1: lift=2.6');
  });

  it('an unknown spec id is a usage error (exit 2) listing the known ids; a missing log exits 3', () => {
    const log = join(dir, 'run.log');
    const unknown = settle('parsers', 'test', 'no-such-spec', log);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/no parser spec has the id 'no-such-spec'\n\s+hint: known ids: settle-block, /);
    const missing = settle('parsers', 'test', 'settle-kv', join(dir, 'absent.log'));
    expect(missing.code).toBe(3);
    expect(missing.stderr).toContain('absent.log');
  });
});

describe('settle parsers test reads logs like every other command', () => {
  it('recognises gzip by its magic bytes, not its name (RFC 1952: 1f 8b)', () => {
    const renamed = join(dir, 'healthy-without-extension');
    writeFileSync(renamed, readFileSync(resolve('sample-logs/cavity-healthy.jsonl.gz')));
    const { code, stdout } = settle('parsers', 'test', 'settle-jsonl', renamed);
    expect(code).toBe(0);
    const inspected = JSON.parse(settle('inspect', '--json', resolve('sample-logs/cavity-healthy.jsonl.gz')).stdout) as { records: number };
    expect(stdout).toMatch(new RegExp(`records: +${inspected.records} `));
    expect(stdout).toMatch(/lines: +\d+ read, 0 not matched/);
  });
});

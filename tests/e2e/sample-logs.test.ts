/**
 * End to end on every file in sample-logs/: the built `settle` binary reads each with the expected
 * parser and gives the expected verdict (sample-logs/manifest.json, produced with the logs by
 * `npm run samples`), and healthy runs never raise a false alarm at any point while they are
 * followed (issue "Judge a run").
 */
import { describe, expect, it } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { createRunMonitor } from '../../src/monitor/run-monitor.js';
import { DEFAULT_CRITERIA } from '../../src/analysis/criteria.js';
import { EXIT_CODES, type State, type StateChange } from '../../src/analysis/diagnosis.js';

const root = join(import.meta.dirname, '..', '..');
const cli = join(root, 'dist', 'src', 'cli', 'main.js');
const samples = join(root, 'sample-logs');

interface ManifestEntry {
  readonly file: string;
  readonly parser: string;
  readonly expected: State;
}
const manifest = JSON.parse(readFileSync(join(samples, 'manifest.json'), 'utf8')) as ManifestEntry[];

describe('every sample log through the built binary', () => {
  it('lists at least one log per built-in format', () => {
    const parsers = new Set(manifest.map((entry) => entry.parser));
    for (const id of ['settle-kv', 'settle-block', 'settle-table', 'settle-csv', 'settle-jsonl']) expect(parsers).toContain(id);
  });

  it.each(manifest)('$file: parser $parser, verdict $expected', ({ file, parser, expected }) => {
    const path = join(samples, file);
    const inspected = JSON.parse(execFileSync(process.execPath, [cli, 'inspect', '--json', path], { encoding: 'utf8' })) as { parser: string; records: number };
    expect(inspected.parser).toBe(parser);
    expect(inspected.records).toBeGreaterThan(0);

    const checked = spawnSync(process.execPath, [cli, 'check', '--json', path], { encoding: 'utf8' });
    expect(checked.stderr).toBe('');
    const verdict = JSON.parse(checked.stdout) as { verdict: State; exitCode: number };
    expect(verdict.verdict).toBe(expected);
    expect(verdict.exitCode).toBe(EXIT_CODES[expected]);
    expect(checked.status).toBe(EXIT_CODES[expected]);
  });
});

describe('no false alarms on healthy runs', () => {
  const healthy = manifest.filter((entry) => entry.expected === 'converged' || entry.expected === 'converging');
  const alarms = new Set<State>(['stalled', 'oscillating', 'diverging', 'failed']);

  it.each(healthy)('$file is never called stalled, oscillating, diverging or failed while followed', async ({ file }) => {
    const monitor = createRunMonitor({
      paths: [join(samples, file)],
      follow: false,
      parserFiles: [],
      kindOverrides: { residual: [], quantity: [] },
      criteria: DEFAULT_CRITERIA,
    });
    const runChanges: StateChange[] = [];
    let evaluations = 0;
    monitor.on('diagnosis', (diagnosis) => {
      evaluations++;
      expect(alarms.has(diagnosis.verdict), `verdict ${diagnosis.verdict} at iteration ${diagnosis.iterations}: ${diagnosis.reasons.join('; ')}`).toBe(false);
    });
    monitor.on('state-change', (change) => {
      if (change.series === null) runChanges.push(change);
    });
    await monitor.run();
    // The judge was consulted all along the run, not only at its end.
    expect(evaluations).toBeGreaterThan(10);
    for (const change of runChanges) expect(alarms.has(change.to), change.text).toBe(false);
  });
});

/**
 * `npm run samples`: (re)write sample-logs/ from the catalogue (sample-log-catalog.ts).
 * Usage: node dist/src/demo/generate-sample-logs.js [output folder, default sample-logs/ of the repo]
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildSampleLogs, sampleLogsManifest, sampleLogsReadme } from './sample-log-catalog.js';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', '..');
const outDir = path.resolve(process.argv[2] ?? path.join(repoRoot, 'sample-logs'));
mkdirSync(outDir, { recursive: true });
const logs = buildSampleLogs();
let total = 0;
for (const log of logs) {
  writeFileSync(path.join(outDir, log.file), log.bytes);
  total += log.bytes.length;
}
writeFileSync(path.join(outDir, 'README.md'), sampleLogsReadme(logs));
writeFileSync(path.join(outDir, 'manifest.json'), sampleLogsManifest(logs));
process.stdout.write(`wrote ${logs.length} sample logs (${(total / 1024).toFixed(0)} KiB) and README.md, manifest.json to ${outDir}\n`);

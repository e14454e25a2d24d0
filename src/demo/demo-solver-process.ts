/**
 * The demo solver as a process of its own, the way a real solver runs beside settle: `settle demo`
 * starts it with node's fork, it appends its log to a file at a steady pace, and it stops when
 * the run ends, when told to (SIGTERM), or when its parent goes away (IPC channel closed).
 *
 * Argument: one JSON object (DemoProcessArguments) as argv[2].
 */
import { closeSync, openSync, writeSync } from 'node:fs';
import { isScenarioName } from './cavity-scenarios.js';
import { isLogFormat } from './log-writers.js';
import { writeCavityLogPaced, type DemoProcessArguments } from './write-cavity-log.js';

function parseArguments(text: string | undefined): DemoProcessArguments {
  const parsed = JSON.parse(text ?? '') as Partial<DemoProcessArguments>;
  if (typeof parsed.scenario !== 'string' || !isScenarioName(parsed.scenario)) throw new Error('scenario missing or unknown');
  if (typeof parsed.format !== 'string' || !isLogFormat(parsed.format)) throw new Error('format missing or unknown');
  if (typeof parsed.out !== 'string') throw new Error('out missing');
  if (typeof parsed.rayleigh !== 'number' || typeof parsed.cells !== 'number' || typeof parsed.rate !== 'number') throw new Error('numbers missing');
  return parsed as DemoProcessArguments;
}

async function main(): Promise<void> {
  const args = parseArguments(process.argv[2]);
  // Append only: the file was created (empty) by `settle demo`, which checked it was ours to write.
  const fd = openSync(args.out, 'a');
  const stop = { requested: false };
  const requestStop = (): void => {
    stop.requested = true;
  };
  process.on('SIGTERM', requestStop);
  process.on('SIGINT', requestStop);
  process.on('disconnect', requestStop);
  try {
    await writeCavityLogPaced(args, (text) => writeSync(fd, text), stop);
  } finally {
    closeSync(fd);
  }
  process.disconnect?.();
}

main().catch((error: unknown) => {
  process.stderr.write(`settle demo solver: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exitCode = 1;
});

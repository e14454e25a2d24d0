/** Test helpers for line sources: a sink that records everything, polling waits, temp folders. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { LineSink, SourceEvent } from '../../src/ingest/line-source.js';
import type { LineBatch } from '../../src/ingest/line-batch.js';

export class CollectingSink implements LineSink {
  readonly lines: string[] = [];
  readonly events: SourceEvent[] = [];
  /** Every delivery in order: a batch of lines or an event, to check ordering. */
  readonly log: Array<{ lines: readonly string[] } | { event: SourceEvent }> = [];
  batches = 0;

  onLines(lines: LineBatch): void {
    if (lines.length === 0) throw new Error('onLines called with no lines');
    this.batches += 1;
    this.lines.push(...lines);
    this.log.push({ lines: [...lines] });
  }

  onEvent(event: SourceEvent): void {
    this.events.push(event);
    this.log.push({ event });
  }

  eventTypes(): string[] {
    return this.events.filter((e) => e.type !== 'progress').map((e) => e.type);
  }

  warnings(): string[] {
    return this.events.flatMap((e) => (e.type === 'warning' ? [e.message] : []));
  }
}

/** Poll until `condition` holds (every 10 ms), or fail after `timeoutMs` saying what was awaited. */
export async function waitUntil(what: string, condition: () => boolean, timeoutMs = 4000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!condition()) {
    if (Date.now() > deadline) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}

/** A fresh folder under the system temp folder; call the returned function to delete it. */
export function tempFolder(prefix = 'settle-ingest-'): { dir: string; path: (name: string) => string; remove: () => void } {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return { dir, path: (name) => join(dir, name), remove: () => rmSync(dir, { recursive: true, force: true }) };
}

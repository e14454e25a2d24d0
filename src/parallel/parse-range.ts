/**
 * Parse one byte range of a finished log (the job of a worker thread; synchronous, so it can also
 * run in the calling thread, as the tests do).
 *
 * The range [from, to) is nominal. Where it really starts and ends is fixed so that ranges meet
 * without a gap or an overlap and each can be parsed by a fresh parser (see range-parsing.ts):
 * - a range with from > 0 starts at the first boundary line that starts at or after `from` (the
 *   lines before it finish the previous range's last record);
 * - a range ends just before the first boundary line that starts at or after `to`, or at the end
 *   of the file; the next range starts there, by the same rule.
 * A range after the first whose records depend on earlier ones (see RangeParsing) stops and says
 * so (`handover`): the caller parses the rest of the log sequentially from the range's start.
 *
 * Cost: one pass over the range's bytes plus the few lines up to the next boundary line; memory:
 * one 1 MiB read buffer and the records of one chunk.
 */
import { closeSync, openSync, readSync } from 'node:fs';
import { LineSplitter, type SplitterWarning } from '../ingest/line-splitter.js';
import type { LineBatch } from '../ingest/line-batch.js';
import { CHUNK_BYTES } from '../ingest/read-file-chunks.js';
import { compileSpec, type RecordParserFactory } from '../parse/compile-spec.js';
import type { ParserSpec } from '../parse/parser-spec.js';
import type { KindOverrides } from '../parse/record-parser.js';
import type { RangeParsing, RangeTotals } from '../parse/range-parsing.js';
import { RecordChunkBuilder, type RecordChunk } from './record-chunk.js';

export interface RangeJob {
  readonly path: string;
  readonly spec: ParserSpec;
  readonly overrides: KindOverrides;
  /** Nominal start (0: the top of the file). */
  readonly from: number;
  /** Nominal end (the file's size or more: to the end of the file). */
  readonly to: number;
  readonly maxLineBytes?: number;
  /** Records per chunk handed to `onChunk`. */
  readonly chunkRecords?: number;
}

export interface RangeEnd {
  /** Offset of the range's first line, or -1 when no boundary line starts in it (the range
   * before covers its lines). */
  readonly start: number;
  /** Offset just after the range's last line. */
  readonly end: number;
  /** The range's records depend on earlier ones: its chunks must be dropped and the log parsed
   * sequentially from `start`. */
  readonly handover: boolean;
  readonly totals: RangeTotals;
  readonly warnings: readonly SplitterWarning['kind'][];
}

/** Records per chunk: small chunks keep the process's peak memory down (measured on the benchmark
 * log: 16 384 records a chunk peaked at 288 MB, 4 096 at 237 MB, same speed), as buffers of a few
 * hundred kilobytes are recycled by the allocator instead of fragmenting it. */
const DEFAULT_CHUNK_RECORDS = 4_096;

/** The compiled spec of the last job: a worker parses several ranges of one log, and a parser
 * made from the same compiled spec runs the matchers the engine has already optimised (compiling
 * the spec again for each range was measured to cost about 15 ms a range). */
let compiled: { readonly key: string; readonly factory: RecordParserFactory } | undefined;

function parserFactoryFor(job: RangeJob): RecordParserFactory {
  const key = JSON.stringify([job.spec, job.overrides]);
  if (compiled?.key !== key) compiled = { key, factory: compileSpec(job.spec, job.overrides) };
  return compiled.factory;
}

export function parseRange(job: RangeJob, onChunk: (chunk: RecordChunk) => void): RangeEnd {
  const builder = new RecordChunkBuilder();
  const parser = parserFactoryFor(job)((record) => builder.add(record), { copies: true });
  const ranges = parser.rangeParsing() as RangeParsing;
  const registrations = ranges.recordRegistrations();
  let registrationsSent = 0;
  const warnings: SplitterWarning['kind'][] = [];
  const splitter = new LineSplitter({ maxLineBytes: job.maxLineBytes, onWarning: (w) => warnings.push(w.kind) });
  const chunkRecords = job.chunkRecords ?? DEFAULT_CHUNK_RECORDS;
  const first = job.from === 0;

  let start = first ? 0 : -1;
  let end = -1;
  let handover = false;
  let lastOffset = 0;

  const flush = (): void => {
    const chunk = builder.take(registrations.slice(registrationsSent), lastOffset);
    registrationsSent = registrations.length;
    if (chunk.count > 0 || chunk.registrations.length > 0) onChunk(chunk);
  };

  /** The lines of a batch, line i starting at byte `base + starts[i]` (or at `carried` for a batch
   * of one line begun in an earlier chunk); false once the range is over. */
  const take = (batch: LineBatch, base: number, carried: number): boolean => {
    const count = batch.count;
    const at = (i: number): number => (carried >= 0 ? carried : base + batch.starts[i]);
    let run = 0;
    if (start >= 0 && at(count - 1) < job.to) {
      // The usual case: the whole batch lies inside the range.
      parser.pushBatch(batch, 0, count);
    } else {
      for (let i = 0; i < count; i++) {
        if (start < 0) {
          // Looking for the range's first line.
          if (at(i) >= job.to) { end = at(i); return false; }
          if (!ranges.isBoundaryLine(batch, i)) { run = i + 1; continue; }
          start = at(i);
          run = i;
        } else if (at(i) >= job.to && ranges.isBoundaryLine(batch, i)) {
          parser.pushBatch(batch, run, i);
          end = at(i);
          return false;
        }
      }
      if (start >= 0) parser.pushBatch(batch, run, count);
    }
    if (!first && ranges.dependsOnEarlierRecords()) { handover = true; return false; }
    if (builder.records >= chunkRecords) flush();
    return true;
  };

  const fd = openSync(job.path, 'r');
  try {
    const buffer = Buffer.allocUnsafe(CHUNK_BYTES);
    // The range's lines start at the first line start at or after `from`: skip the end of a line
    // begun before it (never handed to the splitter, which would see a character cut in two).
    let position = first ? 0 : firstLineStart(fd, buffer, job.from);
    let pendingStart = position;
    let going = position >= 0;
    if (!going) position = job.from;
    while (going) {
      const bytesRead = readSync(fd, buffer, 0, CHUNK_BYTES, position);
      if (bytesRead === 0) break;
      const chunk = buffer.subarray(0, bytesRead);
      const base = position;
      const carriedStart = pendingStart;
      splitter.pushBatches(chunk, (batch) => {
        if (!going) return;
        // A batch of one line that began in an earlier chunk, or the lines inside this chunk.
        const carried = batch.bytes !== chunk;
        going = take(batch, base, carried ? carriedStart : -1);
      });
      const lastNewline = chunk.lastIndexOf(10);
      if (lastNewline >= 0) pendingStart = base + lastNewline + 1;
      position += bytesRead;
      lastOffset = pendingStart;
    }
    if (going) {
      splitter.endBatches((batch) => { if (going) going = take(batch, 0, pendingStart); });
      if (end < 0) end = position;
    }
  } finally {
    closeSync(fd);
  }
  if (!handover) {
    parser.finish();
    if (!first && ranges.dependsOnEarlierRecords()) handover = true;
  }
  if (end < 0) end = lastOffset;
  if (!handover) {
    lastOffset = end;
    flush();
  }
  return { start, end, handover, totals: ranges.totals(), warnings };
}

/** The offset of the first line that starts at or after `from` (> 0), or -1 at the end of file. */
function firstLineStart(fd: number, buffer: Buffer, from: number): number {
  for (let position = from - 1; ;) {
    const bytesRead = readSync(fd, buffer, 0, buffer.length, position);
    if (bytesRead === 0) return -1;
    const newline = buffer.subarray(0, bytesRead).indexOf(10);
    if (newline >= 0) return position + newline + 1;
    position += bytesRead;
  }
}

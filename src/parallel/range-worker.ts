/**
 * Worker thread entry: parses the byte ranges it is sent (parseRange) and posts their records back
 * in compact chunks (typed-array buffers transferred, not copied), then the range's end.
 *
 * Messages in: `{ id, job }`. Messages out: `{ type: 'chunk', id, chunk }`, then
 * `{ type: 'end', id, end }`, or `{ type: 'error', id, message }`.
 */
import { parentPort } from 'node:worker_threads';
import { parseRange, type RangeJob } from './parse-range.js';
import { transferablesOf } from './record-chunk.js';

const port = parentPort;
if (port === null) throw new Error('range-worker.js runs only as a worker thread');

port.on('message', ({ id, job }: { id: number; job: RangeJob }) => {
  try {
    const end = parseRange(job, (chunk) => port.postMessage({ type: 'chunk', id, chunk }, transferablesOf(chunk)));
    port.postMessage({ type: 'end', id, end });
  } catch (error) {
    port.postMessage({ type: 'error', id, message: error instanceof Error ? error.message : String(error) });
  }
});

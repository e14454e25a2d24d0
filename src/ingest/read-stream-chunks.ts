/**
 * Read a byte stream (standard input, a pipe, a gzip decoder) to its end, handing each chunk on.
 *
 * Listeners rather than async iteration, so that stopping early (an abort) leaves a stream we do
 * not own, such as process.stdin, paused but not destroyed.
 *
 * Cost: O(bytes); no buffering of its own beyond the stream's.
 */

export interface ReadStreamChunksOptions {
  /** Stop reading early: resolves at once, leaving the rest of the stream unread. */
  readonly signal?: AbortSignal;
}

/** Resolves when the stream ends, closes or the signal aborts; rejects on a stream error or when
 * `onChunk` throws. */
export function readStreamChunks(
  stream: NodeJS.ReadableStream,
  onChunk: (chunk: Buffer) => void,
  options: ReadStreamChunksOptions = {},
): Promise<void> {
  const { signal } = options;
  return new Promise<void>((resolve, reject) => {
    let settled = false;
    const finish = (error?: unknown): void => {
      if (settled) return;
      settled = true;
      stream.removeListener('data', onData);
      stream.removeListener('end', onEnd);
      stream.removeListener('close', onEnd);
      stream.removeListener('error', onError);
      signal?.removeEventListener('abort', onAbort);
      if (error === undefined) resolve();
      else reject(error);
    };
    const onData = (data: Buffer | string): void => {
      if (settled) return;
      try {
        onChunk(typeof data === 'string' ? Buffer.from(data, 'utf8') : data);
      } catch (error) {
        stream.pause();
        finish(error);
      }
    };
    const onEnd = (): void => finish();
    const onError = (error: unknown): void => finish(error ?? new Error('stream failed'));
    const onAbort = (): void => {
      stream.pause();
      finish();
    };
    if (signal?.aborted) {
      finish();
      return;
    }
    signal?.addEventListener('abort', onAbort);
    stream.on('data', onData);
    stream.on('end', onEnd);
    stream.on('close', onEnd);
    stream.on('error', onError);
    stream.resume();
  });
}

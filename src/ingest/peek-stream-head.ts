/**
 * Look at the first bytes of a stream without taking them: what arrives is read and pushed back
 * (`unshift`), so whoever reads the stream next sees every byte, the peeked ones first. When the
 * stream ends (or closes) before `bytes` bytes came, they are not pushed back (`ended`: the head is
 * all there is, and the stream has nothing more to give).
 *
 * Purpose: telling gzip data on standard input by its magic number before choosing how to read it.
 */
export interface StreamHead {
  readonly head: Buffer;
  readonly ended: boolean;
}

export function peekStreamHead(stream: NodeJS.ReadableStream, bytes: number, signal?: AbortSignal): Promise<StreamHead> {
  return new Promise<StreamHead>((resolve, reject) => {
    const seen: Buffer[] = [];
    let length = 0;
    let settled = false;
    const finish = (error?: unknown, ended = false): void => {
      if (settled) return;
      settled = true;
      stream.removeListener('readable', onReadable);
      stream.removeListener('end', onEnd);
      stream.removeListener('close', onEnd);
      stream.removeListener('error', onError);
      signal?.removeEventListener('abort', onAbort);
      const head = Buffer.concat(seen, length);
      if (length > 0 && !ended) stream.unshift(head);
      if (error === undefined) resolve({ head, ended });
      else reject(error);
    };
    const onReadable = (): void => {
      for (let chunk = stream.read(); chunk !== null; chunk = stream.read()) {
        const buffer = typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : chunk;
        seen.push(buffer);
        length += buffer.length;
        if (length >= bytes) { finish(); return; }
      }
    };
    const onEnd = (): void => finish(undefined, true);
    const onAbort = (): void => finish();
    const onError = (error: unknown): void => finish(error ?? new Error('stream failed'));
    if (signal?.aborted) { finish(); return; }
    signal?.addEventListener('abort', onAbort);
    stream.on('readable', onReadable);
    stream.on('end', onEnd);
    stream.on('close', onEnd);
    stream.on('error', onError);
  });
}

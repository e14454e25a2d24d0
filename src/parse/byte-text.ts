/**
 * Small helpers for the byte path (ASCII lines held in buffers): text of a byte range, and a
 * bounded search for a literal.
 */

/** bytes[start, end) as a latin1 string (the characters of an ASCII line). */
export function latin1(bytes: Uint8Array, start: number, end: number): string {
  return Buffer.isBuffer(bytes) ? bytes.toString('latin1', start, end) : Buffer.from(bytes.buffer, bytes.byteOffset + start, end - start).toString('latin1');
}

/** First index of `needle` in bytes[from, end), or -1 (never looks past `end`, unlike
 * Buffer#indexOf, which would search the rest of the read buffer). Cost: O((end - from) × needle). */
export function indexOfBytes(bytes: Uint8Array, needle: Uint8Array, from: number, end: number): number {
  const first = needle[0];
  const last = end - needle.length;
  for (let i = from; i <= last; i++) {
    if (bytes[i] !== first) continue;
    let k = 1;
    while (k < needle.length && bytes[i + k] === needle[k]) k++;
    if (k === needle.length) return i;
  }
  return -1;
}

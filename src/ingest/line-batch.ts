/**
 * A batch of complete lines, as byte ranges of one buffer: what a line source delivers.
 *
 * Purpose: the read path stays on bytes. A parser that can match bytes (ASCII lines, compiled
 * patterns) reads `bytes[starts[i], ends[i])` directly and never builds a string for the line;
 * anything else asks for `text(i)` (or iterates the batch), which decodes that one line: as latin1
 * when the batch is pure ASCII (the same characters, the cheaper decoder), as UTF-8 otherwise
 * (invalid sequences become U+FFFD).
 *
 * Lifetime: a batch is a view into buffers its producer reuses. It is valid only during the call
 * that receives it; keep `text(i)` strings, never the batch.
 *
 * Terminators are already stripped (LF and CRLF); a line cut at the length limit ends at the cut.
 */
export class LineBatch implements Iterable<string> {
  constructor(
    /** The bytes the lines are ranges of. */
    readonly bytes: Buffer,
    /** Start of line i (inclusive), for i < count. */
    readonly starts: Int32Array,
    /** End of line i (exclusive, terminator stripped), for i < count. */
    readonly ends: Int32Array,
    /** Number of lines. */
    readonly count: number,
    /** Every byte of every line is below 0x80. */
    readonly ascii: boolean,
  ) {}

  private cachedView: DataView | undefined;

  /** A DataView of `bytes` (same offsets), made on first use: byte matchers read blanks through
   * it eight at a time. */
  get view(): DataView {
    return this.cachedView ??= new DataView(this.bytes.buffer, this.bytes.byteOffset, this.bytes.byteLength);
  }

  /** Number of lines (so a batch reads like an array of lines). */
  get length(): number {
    return this.count;
  }

  /** Line i as text. */
  text(i: number): string {
    return this.bytes.toString(this.ascii ? 'latin1' : 'utf8', this.starts[i], this.ends[i]);
  }

  /** Every line as text (for consumers that keep lines). */
  texts(): string[] {
    const lines = new Array<string>(this.count);
    for (let i = 0; i < this.count; i++) lines[i] = this.text(i);
    return lines;
  }

  *[Symbol.iterator](): Iterator<string> {
    for (let i = 0; i < this.count; i++) yield this.text(i);
  }

  /** A batch holding the given lines (tests, and producers that have text, not bytes). */
  static of(lines: readonly string[]): LineBatch {
    const parts = lines.map((line) => Buffer.from(line, 'utf8'));
    const starts = new Int32Array(lines.length);
    const ends = new Int32Array(lines.length);
    let offset = 0;
    let ascii = true;
    parts.forEach((part, i) => {
      starts[i] = offset;
      offset += part.length;
      ends[i] = offset;
      if (ascii && part.some((byte) => byte >= 0x80)) ascii = false;
    });
    return new LineBatch(Buffer.concat(parts, offset), starts, ends, lines.length, ascii);
  }
}

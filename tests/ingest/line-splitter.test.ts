import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { LineSplitter, type SplitterWarning } from '../../src/ingest/line-splitter.js';

/** Feed `bytes` cut at the given positions; return all lines including the final partial one. */
function splitAt(bytes: Buffer, cuts: readonly number[], maxLineBytes?: number): { lines: string[]; warnings: SplitterWarning[] } {
  const warnings: SplitterWarning[] = [];
  const splitter = new LineSplitter({ maxLineBytes, onWarning: (w) => warnings.push(w) });
  const lines: string[] = [];
  let from = 0;
  for (const cut of [...cuts].sort((a, b) => a - b)) {
    lines.push(...splitter.push(bytes.subarray(from, cut)));
    from = cut;
  }
  lines.push(...splitter.push(bytes.subarray(from)));
  lines.push(...splitter.end());
  return { lines, warnings };
}

const whole = (text: string | Buffer, maxLineBytes?: number) =>
  splitAt(typeof text === 'string' ? Buffer.from(text, 'utf8') : text, [], maxLineBytes);

describe('LineSplitter', () => {
  it('splits on LF and on CRLF, strips both terminators and keeps empty lines', () => {
    expect(whole('a\nb\r\n\n\r\nc\n').lines).toEqual(['a', 'b', '', '', 'c']);
  });

  it('holds the unfinished last line back until its newline, and gives it up only at end()', () => {
    const splitter = new LineSplitter();
    expect(splitter.push(Buffer.from('iter=1\niter='))).toEqual(['iter=1']);
    expect(splitter.pendingBytes).toBe(5);
    expect(splitter.push(Buffer.from('2'))).toEqual([]);
    expect(splitter.push(Buffer.from('\niter=3'))).toEqual(['iter=2']);
    expect(splitter.end()).toEqual(['iter=3']);
    expect(splitter.end()).toEqual([]);
    expect(splitter.hasPartialLine).toBe(false);
  });

  it('strips a CR that arrived in the chunk before its LF', () => {
    const splitter = new LineSplitter();
    expect(splitter.push(Buffer.from('x=1\r'))).toEqual([]);
    expect(splitter.push(Buffer.from('\ny=2\r'))).toEqual(['x=1']);
    expect(splitter.end()).toEqual(['y=2']);
  });

  it('keeps a lone CR inside a line (only CR directly before LF is a terminator)', () => {
    expect(whole('a\rb\n').lines).toEqual(['a\rb']);
  });

  it('decodes UTF-8 split across chunks at every byte position', () => {
    // "é" is C3 A9, "€" is E2 82 AC, "𝄞" is F0 9D 84 9E (Unicode Standard, UTF-8 encoding form).
    const text = 'temp=20 °C é € 𝄞\nnext\n';
    const bytes = Buffer.from(text, 'utf8');
    for (let cut = 0; cut <= bytes.length; cut += 1) {
      expect(splitAt(bytes, [cut]).lines).toEqual(['temp=20 °C é € 𝄞', 'next']);
    }
  });

  it('replaces invalid UTF-8 with U+FFFD and warns once', () => {
    // 0xFF never occurs in UTF-8; 0xC3 followed by "(" is a broken two-byte sequence (RFC 3629).
    const bytes = Buffer.concat([Buffer.from('a='), Buffer.from([0xff]), Buffer.from('\nb='), Buffer.from([0xc3, 0x28]), Buffer.from('\n')]);
    const { lines, warnings } = whole(bytes);
    expect(lines).toEqual(['a=\uFFFD', 'b=\uFFFD(']);
    expect(warnings).toEqual([{ kind: 'invalid-utf8' }]);
  });

  it('passes binary garbage through as lines without throwing', () => {
    const garbage = Buffer.from([0, 1, 2, 10, 0xfe, 0xfd, 13, 10, 0x80, 0x1b, 0x5b]);
    const { lines } = whole(garbage);
    expect(lines).toEqual(['\u0000\u0001\u0002', '\uFFFD\uFFFD', '\uFFFD\u001b[']);
  });

  it('cuts a line over the limit, skips the rest up to its newline, and warns once', () => {
    const long = 'x'.repeat(25);
    const { lines, warnings } = whole(`short\n${long}\n${long}\nafter\n`, 10);
    expect(lines).toEqual(['short', 'x'.repeat(10), 'x'.repeat(10), 'after']);
    expect(warnings).toEqual([{ kind: 'line-cut', maxLineBytes: 10 }]);
  });

  it('pure-ASCII chunk (decoded once, then cut): CRLF, empty lines, an over-limit line and a carry, in one push', () => {
    const splitter = new LineSplitter({ maxLineBytes: 8 });
    const lines = splitter.push(Buffer.from('a=1\r\n\n\r\nlonger than eight\r\nb=2\npart', 'latin1'));
    expect(lines).toEqual(['a=1', '', '', 'longer t', 'b=2']);
    expect(splitter.push(Buffer.from('ial\r\nz\n', 'latin1'))).toEqual(['partial', 'z']);
    expect(splitter.end()).toEqual([]);
  });

  it('does not cut a line of exactly the limit, with or without CR', () => {
    expect(whole(`${'y'.repeat(10)}\r\n${'z'.repeat(10)}\n`, 10)).toEqual({ lines: ['y'.repeat(10), 'z'.repeat(10)], warnings: [] });
  });

  it('cuts a long line at a character boundary, never inside a multi-byte character', () => {
    // 'aé' is 61 C3 A9: a cut after 2 bytes would fall inside 'é', so the line keeps 'a' only.
    const { lines, warnings } = whole('aéé\n', 2);
    expect(lines).toEqual(['a']);
    expect(warnings).toEqual([{ kind: 'line-cut', maxLineBytes: 2 }]);
  });

  it('keeps memory bounded on a 10 MB line fed in 64 KiB pieces', () => {
    const splitter = new LineSplitter({ maxLineBytes: 1024 * 1024 });
    const piece = Buffer.alloc(64 * 1024, 0x41);
    let maxPending = 0;
    for (let i = 0; i < 160; i += 1) {
      expect(splitter.push(piece)).toEqual([]);
      maxPending = Math.max(maxPending, splitter.pendingBytes);
    }
    const lines = splitter.push(Buffer.from('\nnext\n'));
    expect(maxPending).toBeLessThanOrEqual(1024 * 1024 + 1);
    expect(lines.map((l) => l.length)).toEqual([1024 * 1024, 4]);
  });

  it('gives the same lines for any split of the same bytes into chunks (property)', () => {
    const byteArb = fc.oneof(
      { weight: 6, arbitrary: fc.constantFrom(...Buffer.from('ab=1.5e-3 ')) },
      { weight: 2, arbitrary: fc.constantFrom(10, 13) },
      { weight: 1, arbitrary: fc.integer({ min: 0, max: 255 }) },
      { weight: 1, arbitrary: fc.constantFrom(0xc3, 0xa9, 0xe2, 0x82, 0xac) },
    );
    fc.assert(
      fc.property(
        fc.array(byteArb, { maxLength: 200 }),
        fc.array(fc.nat(), { maxLength: 12 }),
        fc.integer({ min: 1, max: 40 }),
        (byteList, rawCuts, limit) => {
          const bytes = Buffer.from(byteList);
          const cuts = rawCuts.map((c) => (bytes.length === 0 ? 0 : c % (bytes.length + 1)));
          const reference = splitAt(bytes, [], limit).lines;
          expect(splitAt(bytes, cuts, limit).lines).toEqual(reference);
          // And one byte at a time, the most extreme split.
          expect(splitAt(bytes, bytes.map((_, i) => i) as unknown as number[], limit).lines).toEqual(reference);
        },
      ),
      { numRuns: 400, seed: 20261201 },
    );
  });

  it('agrees with a plain reference split when no line is over the limit (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ unit: 'grapheme', maxLength: 30 }).map((s) => s.replace(/[\r\n]/g, '')), { maxLength: 20 }), fc.boolean(), (lines, crlf) => {
        const text = lines.map((l) => l + (crlf ? '\r\n' : '\n')).join('');
        expect(whole(text).lines).toEqual(lines);
      }),
      { numRuns: 200, seed: 7 },
    );
  });

  it.each([
    [0, 'zero'],
    [-5, 'negative'],
    [1.5, 'fractional'],
    [Number.NaN, 'NaN'],
  ])('rejects maxLineBytes %s (%s)', (value) => {
    expect(() => new LineSplitter({ maxLineBytes: value })).toThrow(RangeError);
  });
});

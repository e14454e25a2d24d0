import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ByteNames } from '../../src/parse/byte-names.js';
import { latin1 } from '../../src/parse/byte-text.js';

// Reference: a plain Map from the decoded text to the order of first sight, and Buffer's own
// latin1 decoding (Node.js Buffer docs, 'latin1' encoding: one byte, one character U+0000..U+00FF).
// Note: strings are primitives in JavaScript, so `toBe` on two strings checks equal text; whether
// the engine shares one heap string (the module's internalising) is not observable from a test.

const bytesOf = (text: string): Buffer => Buffer.from(text, 'latin1');

/** `text` placed inside a larger buffer between filler bytes, as a name sits inside a line. */
function inLine(text: string, before = 'x = ', after = ' 1.0e-3'): { bytes: Buffer; start: number; end: number } {
  const bytes = bytesOf(before + text + after);
  return { bytes, start: before.length, end: before.length + text.length };
}

/** Names of one length that agree at the byte positions the cheap hash reads (first, last,
 * middle, and end - 1 - length/4, per the module's hashOf) and differ elsewhere: every one of them
 * lands on the same hash, so telling them apart rests on the byte comparison. */
function collidingNames(length: number, count: number): string[] {
  const read = new Set([0, length - 1, length >> 1, length - 1 - (length >> 2)]);
  const free = Array.from({ length }, (_, i) => i).filter((i) => !read.has(i));
  if (count > 26 ** free.length) throw new Error('not enough free positions');
  const names: string[] = [];
  for (let n = 0; n < count; n++) {
    const chars: string[] = Array.from({ length }, (_, i) => (read.has(i) ? 'q' : 'A'));
    let rest = n;
    for (const position of free) { chars[position] = String.fromCharCode(97 + (rest % 26)); rest = Math.floor(rest / 26); }
    names.push(chars.join(''));
  }
  return names;
}

describe('ByteNames', () => {
  it('gives the same name for the same bytes wherever they sit, and numbers names 0, 1, 2... in order of first sight', () => {
    const table = new ByteNames();
    const p = inLine('res_p');
    const u = inLine('res_u', 'ITER 12  ', '=0.5');
    expect(table.indexOf(p.bytes, p.start, p.end)).toBe(0);
    expect(table.indexOf(u.bytes, u.start, u.end)).toBe(1);
    const again = inLine('res_p', '', '');
    expect(table.indexOf(again.bytes, again.start, again.end)).toBe(0);
    expect(table.get(again.bytes, again.start, again.end)).toBe('res_p');
    expect(table.get(u.bytes, u.start, u.end)).toBe('res_u');
    expect(table.nameAt(0)).toBe('res_p');
    expect(table.nameAt(1)).toBe('res_u');
    // A name seen only through get is numbered too.
    const k = inLine('k');
    expect(table.get(k.bytes, k.start, k.end)).toBe('k');
    expect(table.indexOf(k.bytes, k.start, k.end)).toBe(2);
  });

  it('spells: true exactly when the bytes spell the name at that index (a guess is checked, never trusted)', () => {
    const table = new ByteNames();
    const names = ['res_p', 'res_q', 'res_pp', 'Res_p', 'res', ''];
    for (const name of names) { const at = inLine(name); table.indexOf(at.bytes, at.start, at.end); }
    for (const [i, name] of names.entries()) {
      for (const other of [...names, 'res_', 'x']) {
        const at = inLine(other, 'mon ', ' 1.5');
        expect(table.spells(i, at.bytes, at.start, at.end)).toBe(other === name);
      }
    }
  });

  it('tells apart names that differ in one byte, in length, or only in case; the empty name is a name', () => {
    const table = new ByteNames();
    const names = ['res_p', 'res_q', 'res_pp', 'Res_p', 'res_P', 'res', '', ' res_p'];
    names.forEach((name, i) => {
      const at = inLine(name);
      expect(table.indexOf(at.bytes, at.start, at.end)).toBe(i);
    });
    names.forEach((name, i) => {
      const at = inLine(name, 'pad', 'pad');
      expect(table.get(at.bytes, at.start, at.end)).toBe(name);
      expect(table.nameAt(i)).toBe(name);
    });
  });

  it('still answers right after the caller overwrites its buffer (regression: it kept views into the reused read buffer)', () => {
    const table = new ByteNames();
    const buffer = bytesOf('res_p');
    expect(table.get(buffer, 0, 5)).toBe('res_p');
    buffer.write('xyz_q', 0, 'latin1');
    expect(table.get(bytesOf('res_p'), 0, 5)).toBe('res_p');
    expect(table.get(buffer, 0, 5)).toBe('xyz_q');
    expect(table.indexOf(bytesOf('res_p'), 0, 5)).toBe(0);
    expect(table.indexOf(buffer, 0, 5)).toBe(1);
  });

  it('tells apart names that collide in the cheap hash (aXbYc / aZbYc; 600 names of length 8 on one hash, through several table growths)', () => {
    // Length 5 reads positions 0, 4, 2, 3: 'aXbYc' and 'aZbYc' share them.
    const table = new ByteNames();
    const a = inLine('aXbYc');
    const b = inLine('aZbYc');
    expect(table.indexOf(a.bytes, a.start, a.end)).toBe(0);
    expect(table.indexOf(b.bytes, b.start, b.end)).toBe(1);
    expect(table.get(a.bytes, a.start, a.end)).toBe('aXbYc');
    expect(table.get(b.bytes, b.start, b.end)).toBe('aZbYc');

    const colliding = collidingNames(8, 600);
    expect(new Set(colliding).size).toBe(600);
    const many = new ByteNames();
    colliding.forEach((name, i) => {
      const at = inLine(name);
      expect(many.indexOf(at.bytes, at.start, at.end)).toBe(i);
    });
    // Asked again in another order, from fresh buffers: each is found, none is mistaken for another.
    for (let i = colliding.length - 1; i >= 0; i -= 7) {
      const at = inLine(colliding[i], '', ';');
      expect(many.indexOf(at.bytes, at.start, at.end)).toBe(i);
      expect(many.get(at.bytes, at.start, at.end)).toBe(colliding[i]);
      expect(many.nameAt(i)).toBe(colliding[i]);
    }
  });

  it('past 4 096 names: later names still read right but get no number (-1); the first 4 096 keep theirs', () => {
    const table = new ByteNames();
    const names = Array.from({ length: 5000 }, (_, i) => `q${i}_${(i * 7919) % 5000}`);
    names.forEach((name, i) => {
      const at = inLine(name);
      expect(table.indexOf(at.bytes, at.start, at.end)).toBe(i < 4096 ? i : -1);
    });
    for (let i = 0; i < names.length; i += 13) {
      const at = inLine(names[i], '#', '#');
      expect(table.get(at.bytes, at.start, at.end)).toBe(names[i]);
      expect(table.indexOf(at.bytes, at.start, at.end)).toBe(i < 4096 ? i : -1);
      if (i < 4096) expect(table.nameAt(i)).toBe(names[i]);
    }
  });

  it('agrees with a Map of decoded text on random ASCII names at random places in Buffers and plain Uint8Arrays (property)', () => {
    const name = fc.string({ unit: fc.constantFrom('r', 'e', 's', '_', 'p', 'u', 'R', '1', ' ', '.'), maxLength: 9 });
    const filler = fc.string({ unit: fc.constantFrom('x', '=', ' ', '9'), maxLength: 4 });
    const step = fc.tuple(name, filler, filler, fc.boolean());
    fc.assert(fc.property(fc.array(step, { maxLength: 120 }), (sequence) => {
      const table = new ByteNames();
      const reference = new Map<string, number>();
      for (const [text, before, after, plain] of sequence) {
        const at = inLine(text, before, after);
        // A plain Uint8Array that is a window into a bigger ArrayBuffer (non-zero byteOffset).
        const bytes = plain ? new Uint8Array(new Uint8Array([7, 7, ...at.bytes]).buffer, 2) : at.bytes;
        if (!reference.has(text)) reference.set(text, reference.size);
        expect(table.get(bytes, at.start, at.end)).toBe(text);
        expect(table.indexOf(bytes, at.start, at.end)).toBe(reference.get(text));
        expect(table.nameAt(reference.get(text) as number)).toBe(text);
        // The caller reuses its buffer: scribbling over it must not change what the table holds.
        bytes.fill(0x7a);
      }
    }), { numRuns: 300, seed: 5_012_026 });
  });
});

describe('latin1', () => {
  // Reference: Buffer.prototype.toString('latin1') (Node.js Buffer docs).
  const text = 'x res_p=1.5e-3 é\u00ff';
  const cases: [string, number, number][] = [['whole', 0, text.length], ['a name', 2, 7], ['empty range', 4, 4], ['high bytes', 15, 17], ['one byte', 0, 1]];

  it.each(cases)('decodes a range of a Buffer: %s', (_, start, end) => {
    expect(latin1(bytesOf(text), start, end)).toBe(text.slice(start, end));
  });

  it.each(cases)('decodes a range of a plain Uint8Array, also one with a byte offset: %s', (_, start, end) => {
    const plain = new Uint8Array(bytesOf(text));
    expect(Buffer.isBuffer(plain)).toBe(false);
    expect(latin1(plain, start, end)).toBe(text.slice(start, end));
    const padded = new Uint8Array([1, 2, 3, ...bytesOf(text), 4]);
    const window = padded.subarray(3, 3 + text.length);
    expect(latin1(window, start, end)).toBe(text.slice(start, end));
  });
});

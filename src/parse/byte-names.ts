/**
 * Series names read from the bytes of a line, as strings, without building a string per line:
 * the byte read path's name table.
 *
 * Method: open addressing on a cheap hash of the name (its length and four of its bytes); a hit
 * compares the stored bytes and returns the string made the first time, so the same name is always the
 * same string object (later stages may compare names by identity). Names are ASCII (the byte path
 * runs on ASCII lines only), decoded as latin1.
 *
 * Bounded: after MAX_BYTE_NAMES distinct names (a pattern capturing free text, not names), further
 * names are decoded on every call instead of being kept.
 *
 * Cost: O(name length) per lookup; no allocation for a name seen before.
 */
import { latin1 } from './byte-text.js';

/** Distinct names kept (indexOf returns indices below this). */
export const MAX_BYTE_NAMES = 4096;

export class ByteNames {
  private readonly keys: Uint8Array[] = [];
  private readonly names: string[] = [];
  /** Slot → 1 + index into keys/names; 0 = empty. Size a power of two, at most half full. */
  private table = new Int32Array(64);

  /** The name spelled by bytes[start, end). */
  get(bytes: Uint8Array, start: number, end: number): string {
    const index = this.indexOf(bytes, start, end);
    return index >= 0 ? this.names[index] : latin1(bytes, start, end);
  }

  /** Does bytes[start, end) spell the name at `index` (an index given by indexOf)? A caller that
   * can guess the name (the same names come in the same order in every record) checks its guess
   * with this and skips the hash lookup. */
  spells(index: number, bytes: Uint8Array, start: number, end: number): boolean {
    const key = this.keys[index];
    return key.length === end - start && sameBytes(key, bytes, start);
  }

  /** The name at an index given by indexOf. */
  nameAt(index: number): string {
    return this.names[index];
  }

  /** A small number standing for the name spelled by bytes[start, end) (0, 1, 2... in order of
   * first sight), or -1 once the table is full (then use `get`). */
  indexOf(bytes: Uint8Array, start: number, end: number): number {
    const hash = hashOf(bytes, start, end);
    const table = this.table;
    const mask = table.length - 1;
    const length = end - start;
    let slot = hash & mask;
    for (let entry = table[slot]; entry !== 0; entry = table[slot]) {
      const key = this.keys[entry - 1];
      if (key.length === length && sameBytes(key, bytes, start)) return entry - 1;
      slot = (slot + 1) & mask;
    }
    if (this.names.length >= MAX_BYTE_NAMES) return -1;
    const name = internalized(latin1(bytes, start, end));
    // A copy (the line's buffer is reused by the reader).
    const key = new Uint8Array(end - start);
    for (let i = start; i < end; i++) key[i - start] = bytes[i];
    this.keys.push(key);
    this.names.push(name);
    table[slot] = this.names.length;
    if (this.names.length * 2 > table.length) this.rehash();
    return this.names.length - 1;
  }

  private rehash(): void {
    const table = new Int32Array(this.table.length * 2);
    const mask = table.length - 1;
    this.keys.forEach((key, index) => {
      let slot = hashOf(key, 0, key.length) & mask;
      while (table[slot] !== 0) slot = (slot + 1) & mask;
      table[slot] = index + 1;
    });
    this.table = table;
  }
}

/** A cheap hash of a name: its length and three of its bytes (names in one log differ there far
 * more often than not; a collision costs one more probe, never a wrong answer). */
function hashOf(bytes: Uint8Array, start: number, end: number): number {
  const length = end - start;
  if (length === 0) return 0;
  return Math.imul(length, 0x9e3779b1) ^ (bytes[start] << 7) ^ (bytes[end - 1] << 13) ^ (bytes[start + (length >> 1)] << 19) ^ bytes[end - 1 - (length >> 2)];
}

/** The engine's single copy of a string (property keys are kept once): two such strings are
 * equal exactly when they are the same object, which makes comparing names a pointer test. */
function internalized(text: string): string {
  const holder: Record<string, true> = { [text]: true };
  return Object.keys(holder)[0];
}

function sameBytes(key: Uint8Array, bytes: Uint8Array, start: number): boolean {
  for (let i = 0; i < key.length; i++) if (key[i] !== bytes[start + i]) return false;
  return true;
}

/**
 * Series names read from the bytes of a line, as strings, without building a string per line:
 * the byte read path's name table.
 *
 * Method: open addressing on an FNV-1a hash of the name's bytes (Fowler, Noll, Vo); a hit compares
 * the stored bytes and returns the string made the first time, so the same name is always the
 * same string object (later stages may compare names by identity). Names are ASCII (the byte path
 * runs on ASCII lines only), decoded as latin1.
 *
 * Bounded: after MAX_NAMES distinct names (a pattern capturing free text, not names), further
 * names are decoded on every call instead of being kept.
 *
 * Cost: O(name length) per lookup; no allocation for a name seen before.
 */
const MAX_NAMES = 4096;

export class ByteNames {
  private readonly keys: Uint8Array[] = [];
  private readonly names: string[] = [];
  /** Slot → 1 + index into keys/names; 0 = empty. Size a power of two, at most half full. */
  private table = new Int32Array(64);

  /** The name spelled by bytes[start, end). */
  get(bytes: Uint8Array, start: number, end: number): string {
    let hash = 0x811c9dc5;
    for (let i = start; i < end; i++) hash = Math.imul(hash ^ bytes[i], 16777619);
    const table = this.table;
    const mask = table.length - 1;
    const length = end - start;
    let slot = hash & mask;
    for (let entry = table[slot]; entry !== 0; entry = table[slot]) {
      const key = this.keys[entry - 1];
      if (key.length === length && sameBytes(key, bytes, start)) return this.names[entry - 1];
      slot = (slot + 1) & mask;
    }
    const name = latin1(bytes, start, end);
    if (this.names.length >= MAX_NAMES) return name;
    this.keys.push(bytes.slice(start, end));
    this.names.push(name);
    table[slot] = this.names.length;
    if (this.names.length * 2 > table.length) this.rehash();
    return name;
  }

  private rehash(): void {
    const table = new Int32Array(this.table.length * 2);
    const mask = table.length - 1;
    this.keys.forEach((key, index) => {
      let hash = 0x811c9dc5;
      for (let i = 0; i < key.length; i++) hash = Math.imul(hash ^ key[i], 16777619);
      let slot = hash & mask;
      while (table[slot] !== 0) slot = (slot + 1) & mask;
      table[slot] = index + 1;
    });
    this.table = table;
  }
}

function sameBytes(key: Uint8Array, bytes: Uint8Array, start: number): boolean {
  for (let i = 0; i < key.length; i++) if (key[i] !== bytes[start + i]) return false;
  return true;
}

/** bytes[start, end) as a latin1 string (the characters of an ASCII line). */
export function latin1(bytes: Uint8Array, start: number, end: number): string {
  return Buffer.isBuffer(bytes) ? bytes.toString('latin1', start, end) : Buffer.from(bytes.buffer, bytes.byteOffset + start, end - start).toString('latin1');
}

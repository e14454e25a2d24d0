/**
 * The values of one record: a ReadonlyMap from series name to value, kept as two arrays in the
 * order the names were first set.
 *
 * Purpose: the read path builds one of these per iteration (millions per log) and every consumer
 * walks it once; arrays cost less to fill and to walk than a Map. Semantics are the Map's: setting
 * a name again replaces its value and keeps its place. Names are found by a scan from the end
 * (records hold a few values); a record with many values (a wide table) also keeps a Map index.
 *
 * Cost: set O(1) amortised for names already indexed or with few values, O(values) otherwise.
 */
const INDEX_FROM = 24;

export class RecordValues implements ReadonlyMap<string, number> {
  /** Names in order of first setting: entries 0..size-1 (read-only for callers; entries past
   * `size` are left over from before a `clear`). */
  readonly names: string[] = [];
  /** Values, parallel to `names` (read-only for callers; the same bounds). */
  readonly numbers: number[] = [];
  private count = 0;
  private index: Map<string, number> | undefined;

  set(name: string, value: number): this {
    const at = this.indexOf(name);
    if (at >= 0) {
      this.numbers[at] = value;
      return this;
    }
    const k = this.count++;
    if (k < this.names.length) {
      this.names[k] = name;
      this.numbers[k] = value;
    } else {
      this.names.push(name);
      this.numbers.push(value);
    }
    if (this.index !== undefined) this.index.set(name, k);
    else if (this.count >= INDEX_FROM) this.index = new Map(this.names.slice(0, this.count).map((n, i) => [n, i]));
    return this;
  }

  /** Empty it, keeping the arrays and their room (a parser reusing one values object per record;
   * truncating the arrays was measured to cost a runtime call per record). */
  clear(): void {
    this.count = 0;
    this.index = undefined;
  }

  get size(): number {
    return this.count;
  }

  get(name: string): number | undefined {
    const at = this.indexOf(name);
    return at >= 0 ? this.numbers[at] : undefined;
  }

  has(name: string): boolean {
    return this.indexOf(name) >= 0;
  }

  forEach(callback: (value: number, name: string, map: ReadonlyMap<string, number>) => void, thisArg?: unknown): void {
    for (let i = 0; i < this.count; i++) callback.call(thisArg, this.numbers[i], this.names[i], this);
  }

  *entries(): MapIterator<[string, number]> {
    for (let i = 0; i < this.count; i++) yield [this.names[i], this.numbers[i]];
  }

  *keys(): MapIterator<string> {
    for (let i = 0; i < this.count; i++) yield this.names[i];
  }

  *values(): MapIterator<number> {
    for (let i = 0; i < this.count; i++) yield this.numbers[i];
  }

  [Symbol.iterator](): MapIterator<[string, number]> {
    return this.entries();
  }

  private indexOf(name: string): number {
    if (this.index !== undefined) return this.index.get(name) ?? -1;
    const names = this.names;
    for (let i = this.count - 1; i >= 0; i--) if (names[i] === name) return i;
    return -1;
  }
}

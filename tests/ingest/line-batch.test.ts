import { describe, expect, it } from 'vitest';
import { LineBatch } from '../../src/ingest/line-batch.js';
import { LineSplitter } from '../../src/ingest/line-splitter.js';

describe('LineBatch: lines as byte ranges, decoded on demand', () => {
  it('holds given lines and gives them back as text, ASCII or not', () => {
    const ascii = LineBatch.of(['iter 1', '', 'res 2e-3']);
    expect(ascii.ascii).toBe(true);
    expect(ascii.length).toBe(3);
    expect([...ascii]).toEqual(['iter 1', '', 'res 2e-3']);
    const utf8 = LineBatch.of(['Δp = 12 Pa', 'T = 300 °C']);
    expect(utf8.ascii).toBe(false);
    expect(utf8.texts()).toEqual(['Δp = 12 Pa', 'T = 300 °C']);
    expect(utf8.bytes.toString('utf8', utf8.starts[1], utf8.ends[1])).toBe('T = 300 °C');
  });

  it('splitter batches are ranges of the chunk itself, terminators stripped, cut lines ending at the cut', () => {
    const warnings: string[] = [];
    const splitter = new LineSplitter({ maxLineBytes: 8, onWarning: (w) => warnings.push(w.kind) });
    const chunk = Buffer.from('a=1\r\nbb=22\n0123456789abc\nend', 'latin1');
    const seen: { bytes: Buffer; ranges: number[][]; ascii: boolean }[] = [];
    splitter.pushBatches(chunk, (batch) => {
      const ranges: number[][] = [];
      for (let i = 0; i < batch.count; i++) ranges.push([batch.starts[i], batch.ends[i]]);
      seen.push({ bytes: batch.bytes, ranges, ascii: batch.ascii });
    });
    expect(seen).toHaveLength(1);
    expect(seen[0].bytes).toBe(chunk);
    expect(seen[0].ranges).toEqual([[0, 3], [5, 10], [11, 19]]);
    expect(seen[0].ascii).toBe(true);
    expect(warnings).toEqual(['line-cut']);
    // The unfinished last line waits, and comes as a batch of one at the end.
    const last: string[] = [];
    splitter.endBatches((batch) => last.push(...batch));
    expect(last).toEqual(['end']);
  });
});

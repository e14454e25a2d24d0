import { describe, expect, it } from 'vitest';
import { drawSegment, paintChart } from '../../src/ui/braille-chart.js';
import type { ChartModel } from '../../src/ui/dashboard-model.js';
import { lineWidth, plainText } from '../../src/ui/styled-text.js';

const chart = (changes: Partial<ChartModel> = {}): ChartModel => ({
  title: 't', xMin: 0, xMax: 10, yMin: 0, yMax: 1, yTicks: [], xTicks: [], lines: [], levels: [], legend: [], hiddenCount: 0, ...changes,
});
/** The plot cells of a painted chart (rows 1..h-2, after the label columns). */
const plotCells = (lines: ReturnType<typeof paintChart>, labelWidth: number): string[] => lines.slice(1, -1).map((line) => plainText(line).slice(labelWidth));

// Braille dot numbering and code points: Unicode Standard, "Braille Patterns" block U+2800–U+28FF
// (dot 1 = bit 0 top left, dot 4 = bit 3 top right, dot 7 = bit 6 bottom left, dot 8 = bit 7 bottom right).
describe('paintChart', () => {
  it('fills exactly height lines of exactly width cells', () => {
    const lines = paintChart(chart({ lines: [{ name: 'a', style: 0, x: [0, 10], y: [0, 1] }], legend: [{ name: 'a', style: 0 }] }), 30, 8, 6, true);
    expect(lines).toHaveLength(8);
    for (const line of lines) expect(lineWidth(line)).toBe(30);
  });

  it('maps the top edge to dots 1 and 4 and the bottom edge to dots 7 and 8, and marks the last point', () => {
    const lines = paintChart(chart({ lines: [{ name: 'a', style: 0, x: [0, 10], y: [1, 1] }, { name: 'b', style: 1, x: [0, 10], y: [0, 0] }] }), 16, 6, 6, true);
    const cells = plotCells(lines, 6);
    expect(cells).toHaveLength(4);
    expect(cells[0].slice(0, 9)).toBe(String.fromCharCode(0x2800 | 0x01 | 0x08).repeat(9));
    expect(cells[3].slice(0, 9)).toBe(String.fromCharCode(0x2800 | 0x40 | 0x80).repeat(9));
    expect(cells[0][9]).toBe('o'); // series style 0 marker at its last point
    expect(cells[3][9]).toBe('+'); // series style 1 marker
  });

  it('leaves a gap where a value is not finite', () => {
    const lines = paintChart(chart({ lines: [{ name: 'a', style: 0, x: [0, 1, 5, 9, 10], y: [0.5, 0.5, Number.NaN, 0.5, 0.5] }] }), 16, 6, 6, true);
    const row = plotCells(lines, 6).find((r) => r.trim() !== '') ?? '';
    // Dot columns 0..19 over x 0..10: x=1 → dot 2 (cell 1), x=9 → dot 17 (cell 8); cells 2..7 stay empty.
    expect(row.slice(2, 8)).toBe('      ');
    expect(row[0]).not.toBe(' ');
    expect(row[8]).not.toBe(' ');
  });

  it('draws a target level as a dotted line and data over it wins the cell', () => {
    const lines = paintChart(chart({ levels: [{ y: 0, kind: 'target', label: 'target 1e-3' }] }), 16, 6, 6, true);
    const bottom = plotCells(lines, 6)[3];
    // Every second dot column in the bottom dot row: dot 7 (0x40) in each cell.
    expect(bottom).toBe(String.fromCharCode(0x2840).repeat(10));
    expect(plainText(lines[0])).toContain('·· target 1e-3');
  });

  it('marks a restart with a dotted vertical line and says so in the legend', () => {
    const lines = paintChart(chart({ restarts: [0] }), 16, 6, 6, true);
    // Dot column 0, every second dot row: dots 1 and 3 (0x01 | 0x04) in each cell of column 0.
    expect(plotCells(lines, 6).map((row) => row[0])).toEqual(Array(4).fill(String.fromCharCode(0x2800 | 0x01 | 0x04)));
    expect(plainText(lines[0])).toContain('┊ restart');
  });

  it('labels ticks on the rows where they fall and puts x labels under the plot', () => {
    const lines = paintChart(chart({ yMin: -3, yMax: 0, yTicks: [{ at: 0, label: '1e0' }, { at: -3, label: '1e-3' }], xTicks: [{ at: 5, label: '500' }], lines: [{ name: 'a', style: 0, x: [0, 10], y: [0, -3] }] }), 30, 8, 6, true);
    const text = lines.map(plainText);
    expect(text[1].slice(0, 6)).toBe('  1e0┤');
    expect(text[6].slice(0, 6)).toBe(' 1e-3┤');
    expect(text[7]).toContain('500');
    expect(text[7][5]).toBe('└');
  });

  it('never puts two labels on one row, nor on touching rows, keeping the top one', () => {
    const yTicks = Array.from({ length: 15 }, (_, i) => ({ at: -i, label: `1e${-i}` }));
    const text = paintChart(chart({ yMin: -14, yMax: 0, yTicks, lines: [{ name: 'a', style: 0, x: [0, 10], y: [0, -14] }] }), 30, 8, 6, true).map(plainText);
    const labelled = text.slice(1, -1).map((line, row) => (line.slice(0, 5).trim() === '' ? -1 : row)).filter((row) => row >= 0);
    expect(labelled[0]).toBe(0);
    expect(text[1].slice(0, 5).trim()).toBe('1e0');
    for (let i = 1; i < labelled.length; i++) expect(labelled[i] - labelled[i - 1]).toBeGreaterThanOrEqual(2);
  });

  it('shows the empty text in the middle when there is nothing to draw', () => {
    const lines = paintChart(chart({ empty: 'waiting for data' }), 40, 9, 6, true);
    expect(lines.map(plainText).some((line) => line.includes('waiting for data'))).toBe(true);
  });

  it('without colour, repeats each series marker along its line', () => {
    const x = Array.from({ length: 200 }, (_, i) => i / 20);
    const mono = paintChart(chart({ lines: [{ name: 'a', style: 0, x, y: x.map(() => 0.5) }] }), 70, 6, 6, false);
    const colour = paintChart(chart({ lines: [{ name: 'a', style: 0, x, y: x.map(() => 0.5) }] }), 70, 6, 6, true);
    const count = (lines: ReturnType<typeof paintChart>): number => plotCells(lines, 6).join('').split('o').length - 1;
    expect(count(colour)).toBe(1);
    expect(count(mono)).toBeGreaterThanOrEqual(4);
  });
});

describe('drawSegment (Bresenham 1965)', () => {
  it.each([
    [0, 0, 4, 0, 5],
    [0, 0, 0, -3, 4],
    [0, 0, 5, 5, 6],
    [2, 1, -3, 3, 6],
  ])('from (%i,%i) to (%i,%i) plots %i dots, endpoints included, each step moving one cell at most', (x0, y0, x1, y1, count) => {
    const dots: [number, number][] = [];
    drawSegment(x0, y0, x1, y1, (x, y) => dots.push([x, y]));
    expect(dots).toHaveLength(count); // max(|dx|, |dy|) + 1 for a Bresenham line
    expect(dots[0]).toEqual([x0, y0]);
    expect(dots[dots.length - 1]).toEqual([x1, y1]);
    for (let i = 1; i < dots.length; i++) {
      expect(Math.abs(dots[i][0] - dots[i - 1][0])).toBeLessThanOrEqual(1);
      expect(Math.abs(dots[i][1] - dots[i - 1][1])).toBeLessThanOrEqual(1);
    }
  });
});

describe('paintChart legend', () => {
  const legend = [{ name: 'res_psi', style: 0 }, { name: 'res_omega', style: 1 }, { name: 'res_T', style: 2 }];
  const levels = [{ y: 0.5, kind: 'target' as const, label: 'target 1e-3' }];
  it('names series and levels in full when there is room', () => {
    expect(plainText(paintChart(chart({ legend, levels }), 60, 6, 6, true)[0])).toBe(`${'o res_psi  + res_omega  x res_T  ·· target 1e-3'.padEnd(60)}`);
  });
  it('packs the legend (one space, levels by value) rather than cut it, when it is too wide', () => {
    expect(plainText(paintChart(chart({ legend, levels }), 38, 6, 6, true)[0])).toBe(`${'o res_psi + res_omega x res_T ·· 1e-3'.padEnd(38)}`);
  });
});

import { describe, expect, it } from 'vitest';
import { dashboardLayout, layoutFits } from '../../src/ui/dashboard-layout.js';
import type { Rect } from '../../src/ui/dashboard-layout.js';

const runPanels = ['header', 'verdict', 'residuals', 'quantity', 'table', 'timeline', 'footer'] as const;
const overlaps = (a: Rect, b: Rect): boolean => a.left < b.left + b.width && b.left < a.left + a.width && a.top < b.top + b.height && b.top < a.top + a.height;

describe('dashboardLayout', () => {
  it.each([[80, 24], [100, 30], [120, 40], [160, 50], [240, 70]])('at %i×%i tiles the screen: panels inside, no overlaps, every row and column used', (cols, rows) => {
    const layout = dashboardLayout(cols, rows);
    const covered = Array.from({ length: rows }, () => new Array<number>(cols).fill(0));
    for (const name of runPanels) {
      const rect = layout[name];
      expect(rect.left).toBeGreaterThanOrEqual(0);
      expect(rect.top).toBeGreaterThanOrEqual(0);
      expect(rect.left + rect.width).toBeLessThanOrEqual(cols);
      expect(rect.top + rect.height).toBeLessThanOrEqual(rows);
      for (let y = rect.top; y < rect.top + rect.height; y++) for (let x = rect.left; x < rect.left + rect.width; x++) covered[y][x]++;
    }
    expect(covered.flat().every((count) => count === 1)).toBe(true);
    for (const a of runPanels) for (const b of runPanels) if (a !== b) expect(overlaps(layout[a], layout[b])).toBe(false);
  });

  it('at 80×24 keeps every boxed panel readable: charts at least 6 rows, the table a header and 3 series, the timeline 2 entries', () => {
    const layout = dashboardLayout(80, 24);
    expect(layout.residuals.height).toBeGreaterThanOrEqual(6);
    expect(layout.residuals.width).toBeGreaterThanOrEqual(38);
    expect(layout.table.height - 2).toBeGreaterThanOrEqual(4);
    expect(layout.timeline.height - 2).toBeGreaterThanOrEqual(2);
  });

  it('puts the table and timeline side by side on wide terminals, stacked on narrow ones', () => {
    expect(dashboardLayout(200, 50).timeline.top).toBe(dashboardLayout(200, 50).table.top);
    expect(dashboardLayout(100, 40).timeline.top).toBeGreaterThan(dashboardLayout(100, 40).table.top);
  });

  it('centres the help overlay and knows the smallest size it lays out', () => {
    const help = dashboardLayout(120, 40).help;
    expect(help.left * 2 + help.width).toBeGreaterThanOrEqual(119);
    expect(layoutFits(80, 24)).toBe(true);
    expect(layoutFits(59, 24)).toBe(false);
    expect(layoutFits(80, 17)).toBe(false);
  });
});

describe('dashboardLayout with a series count', () => {
  it('shrinks a stacked table to its series and gives the rows it frees to the timeline', () => {
    const plain = dashboardLayout(120, 40);
    const fitted = dashboardLayout(120, 40, 7);
    // Border (2) + column titles (1) + 7 series.
    expect(fitted.table.height).toBe(10);
    expect(fitted.timeline.top).toBe(fitted.table.top + 10);
    expect(fitted.table.height + fitted.timeline.height).toBe(plain.table.height + plain.timeline.height);
    expect(fitted.timeline.height).toBeGreaterThan(plain.timeline.height);
  });

  it('never shrinks the timeline below its minimum, however many series there are', () => {
    expect(dashboardLayout(80, 24, 40)).toEqual(dashboardLayout(80, 24));
    expect(dashboardLayout(80, 24, 40).timeline.height - 2).toBeGreaterThanOrEqual(2);
  });

  it.each([[80, 24, 0], [80, 24, 3], [120, 40, 1], [100, 30, 12]])('at %i×%i with %i series still tiles the screen', (cols, rows, count) => {
    const layout = dashboardLayout(cols, rows, count);
    const area = runPanels.reduce((sum, name) => sum + layout[name].width * layout[name].height, 0);
    expect(area).toBe(cols * rows);
    for (const a of runPanels) for (const b of runPanels) if (a !== b) expect(overlaps(layout[a], layout[b])).toBe(false);
  });
});

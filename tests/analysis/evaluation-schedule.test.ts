import { describe, expect, it } from 'vitest';
import { evaluationSpacing, isEvaluationPoint } from '../../src/analysis/evaluation-schedule.js';

describe('isEvaluationPoint', () => {
  it('is dense early: every 10 records up to 1 280', () => {
    const points = Array.from({ length: 100 }, (_, i) => i + 1).filter(isEvaluationPoint);
    expect(points).toEqual([10, 20, 30, 40, 50, 60, 70, 80, 90, 100]);
  });

  it('then evaluates every 0.8 %–1.6 % of the records so far', () => {
    for (const records of [2000, 10_000, 123_456, 1_000_000]) {
      const spacing = evaluationSpacing(records);
      expect(spacing / records).toBeGreaterThanOrEqual(1 / 128);
      expect(spacing / records).toBeLessThanOrEqual(1 / 64);
    }
  });

  it('gives 746 evaluations over one million records (128 dense, then about 64 per doubling)', () => {
    let count = 0;
    for (let r = 1; r <= 1_000_000; r++) if (isEvaluationPoint(r)) count++;
    expect(count).toBe(746);
  });

  it.each([0, -10, 10.5, Number.NaN, Number.POSITIVE_INFINITY])('is false for %s records', (records) => {
    expect(isEvaluationPoint(records)).toBe(false);
  });
});

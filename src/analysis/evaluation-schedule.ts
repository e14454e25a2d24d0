/**
 * When the incremental analysis runs: a fixed schedule in record count, so the same bytes give the
 * same verdicts whatever the chunking in which they arrive.
 *
 * Every 10 records up to 1 280, then every 2^k records where 2^k is the largest power of two not
 * above records/64 (between 0.8 % and 1.6 % of the records so far). A run of N records is therefore
 * evaluated about 128 + 64·log2(N/1280) times: 746 evaluations for one million records.
 * Cost O(1).
 */
export const DENSE_UNTIL = 1280;
export const DENSE_EVERY = 10;

export function isEvaluationPoint(records: number): boolean {
  if (!Number.isInteger(records) || records <= 0) return false;
  if (records <= DENSE_UNTIL) return records % DENSE_EVERY === 0;
  return records % evaluationSpacing(records) === 0;
}

/** Records between scheduled evaluations around `records` (10 early, then a power of two). */
export function evaluationSpacing(records: number): number {
  if (records <= DENSE_UNTIL) return DENSE_EVERY;
  const quotient = Math.floor(records / 64);
  // The largest power of two not above records/64: from the leading bit (cheap, called per record).
  if (quotient < 2 ** 30) return 1 << (31 - Math.clz32(quotient));
  return 2 ** Math.floor(Math.log2(records / 64));
}

import { describe, expect, it } from 'vitest';
import { BatchInputError, evaluateBatch, sweepBatchSize } from './batch';
import type { CalibrationPoint } from './points';

/**
 * Constructed case: six cells with the linear characteristic readout = (1 + gain) * 1e-4 V/Pa * p + offset
 * at 0, 5, ..., 60 kPa. A, B and C are nominal; D reads 60 mV high (600 Pa = 1 %FS of 60 kPa);
 * E has 2 % more gain (1200 Pa = 2 %FS at 60 kPa); F has 1 % more gain and 30 mV of offset
 * (after an offset trim: 1 %FS at 60 kPa).
 */
const cells = { A: [0, 0], B: [0, 0], C: [0, 0], D: [0, 0.06], E: [0.02, 0], F: [0.01, 0.03] } as const;
const points: CalibrationPoint[] = Object.entries(cells).flatMap(([cell, [gain, offset]]) =>
  Array.from({ length: 13 }, (_, i) => {
    const reference = 5000 * i;
    return { reference, readout: (1 + gain) * 1e-4 * reference + offset, cell, run: 'r1', direction: 'up' as const };
  }),
);

function worst(result: ReturnType<typeof evaluateBatch>): Record<string, number> {
  return Object.fromEntries(result.cells.map((verdict) => [verdict.cell, verdict.worstErrorPercentFullScale]));
}

describe('batch calibration (constructed case)', () => {
  const options = { degree: 1, targetPercentFullScale: 0.6 };

  it('applies the curve of cell A untrimmed: D 1 %FS, E 2 %FS, F 2 %FS', () => {
    const result = evaluateBatch(points, ['A'], { ...options, trim: 'none' });
    expect(result.fullScale).toBe(60000);
    const errors = worst(result);
    expect(errors.B).toBeCloseTo(0, 9);
    expect(errors.D).toBeCloseTo(1, 9);
    expect(errors.E).toBeCloseTo(2, 9);
    // F: 1 % of 60 kPa from the gain plus 300 Pa from the offset = 900 Pa, 1.5 %FS.
    expect(errors.F).toBeCloseTo(1.5, 9);
    expect(result.cells.map((verdict) => verdict.passed)).toEqual([true, true, false, false, false]);
    expect(result.passShare).toBeCloseTo(2 / 5, 12);
  });

  it('removes the offset with a one-point trim and leaves the gain error', () => {
    const errors = worst(evaluateBatch(points, ['A'], { ...options, trim: 'offset' }));
    expect(errors.D).toBeCloseTo(0, 9);
    expect(errors.E).toBeCloseTo(2, 9);
    expect(errors.F).toBeCloseTo(1, 9);
  });

  it('removes both with a two-point trim', () => {
    const result = evaluateBatch(points, ['A'], { ...options, trim: 'gain-offset' });
    for (const verdict of result.cells) expect(verdict.worstErrorPercentFullScale).toBeLessThan(1e-9);
    expect(result.passShare).toBe(1);
  });

  it('tries every k with every reference set of that size', () => {
    const rows = sweepBatchSize(points, { ...options, trim: 'gain-offset' });
    expect(rows.map((row) => [row.k, row.sets])).toEqual([
      [1, 6],
      [2, 15],
      [3, 20],
      [4, 15],
      [5, 6],
    ]);
    for (const row of rows) expect(row.worstPassShare).toBe(1);
    const untrimmed = sweepBatchSize(points, { ...options, trim: 'none' });
    // k = 1, target 0.6 %FS (computed by hand): the curve of A, B or C passes the other two nominal
    // cells; D's passes only F (0.5 %FS); E's only F (0.49 %FS); F's passes D and E (0.495 %FS each).
    expect(untrimmed[0].bestPassShare).toBeCloseTo(2 / 5, 12);
    expect(untrimmed[0].worstPassShare).toBeCloseTo(1 / 5, 12);
    expect(untrimmed[0].meanPassShare).toBeCloseTo(1 / 3, 12);
  });

  it('falls back to the windows of consecutive cells when the subsets are too many', () => {
    const rows = sweepBatchSize(points, { ...options, trim: 'none' }, 10);
    expect(rows.find((row) => row.k === 3)?.sets).toBe(6);
    expect(rows.find((row) => row.k === 1)?.sets).toBe(6);
  });

  it('refuses an unknown or empty reference set', () => {
    expect(() => evaluateBatch(points, ['Z'], { ...options, trim: 'none' })).toThrow(BatchInputError);
    expect(() => evaluateBatch(points, [], { ...options, trim: 'none' })).toThrow(/at least one reference cell/);
  });
});

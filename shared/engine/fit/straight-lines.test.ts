import { describe, expect, it } from 'vitest';
import { minimaxLine, terminalLine } from './straight-lines';

describe('straight lines', () => {
  it('puts the minimax line of y = x^2 on [0, 1] at x - 1/8 with a largest deviation of 1/8 (Chebyshev equioscillation; ENGINE.md section 8 check case)', () => {
    const x = Array.from({ length: 201 }, (_, i) => i / 200);
    const line = minimaxLine(
      x,
      x.map((value) => value * value),
    );
    expect(line.slope).toBeCloseTo(1, 12);
    expect(line.intercept).toBeCloseTo(-0.125, 12);
    expect(line.maxDeviation).toBeCloseTo(0.125, 12);
  });

  it('finds the minimax line of a hand-computed set: (0,0), (1,1), (2,0) is best met by y = 0.5 with deviation 0.5 (computed)', () => {
    const line = minimaxLine([0, 1, 2], [0, 1, 0]);
    expect(line.slope).toBeCloseTo(0, 12);
    expect(line.intercept).toBeCloseTo(0.5, 12);
    expect(line.maxDeviation).toBeCloseTo(0.5, 12);
  });

  it('passes a minimax line exactly through collinear points (computed)', () => {
    const line = minimaxLine([3, 1, 2, 4], [7, 3, 5, 9]);
    expect(line.slope).toBeCloseTo(2, 12);
    expect(line.intercept).toBeCloseTo(1, 12);
    expect(line.maxDeviation).toBeCloseTo(0, 12);
  });

  it('refuses a point set with a single x value', () => {
    expect(() => minimaxLine([1, 1], [0, 2])).toThrow(/two different x values/);
  });

  it('draws the terminal line through both end points (computed)', () => {
    expect(terminalLine(1, 2, 3, 8)).toEqual({ slope: 3, intercept: -1 });
    expect(() => terminalLine(1, 2, 1, 3)).toThrow(RangeError);
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluatePolynomial } from './polynomial';
import { evaluateFit, FitInputError, fitPolynomial, fitSlope } from './polynomial-fit';

describe('polynomial fit', () => {
  it('recovers an exact polynomial of every degree 1-5 on any x range (property, computed)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5 }),
        fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: 6, maxLength: 6 }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.double({ min: 1e-3, max: 1e4, noNaN: true }),
        (degree, raw, start, width) => {
          const coefficients = raw.slice(0, degree + 1).map((value, k) => value / width ** k);
          const x = Array.from({ length: 3 * degree + 4 }, (_, i) => start + (width * i) / (3 * degree + 3));
          const y = x.map((value) => evaluatePolynomial(coefficients, value));
          const fit = fitPolynomial(x, y, { degree });
          const scale = Math.max(...y.map(Math.abs), 1e-300);
          for (const value of x) expect(Math.abs(evaluateFit(fit, value) - evaluatePolynomial(coefficients, value))).toBeLessThanOrEqual(1e-9 * scale);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('keeps a fit through the origin at zero and reports the absent constant as 0 (computed)', () => {
    const x = [1, 2, 3, 4];
    const fit = fitPolynomial(x, [2.1, 3.9, 6.2, 7.8], { degree: 1, throughOrigin: true });
    expect(fit.coefficients[0]).toBe(0);
    expect(fit.standardErrors[0]).toBe(0);
    expect(evaluateFit(fit, 0)).toBe(0);
    // b1 = sum xy / sum x^2 = 59.7 / 30 (computed by hand)
    expect(fit.coefficients[1]).toBeCloseTo(59.7 / 30, 14);
  });

  it('gives the slope of the fitted curve (computed: d/dx of 1 + 2x + 3x^2 at x = 2 is 14)', () => {
    const x = [0, 1, 2, 3, 4];
    const fit = fitPolynomial(
      x,
      x.map((value) => 1 + 2 * value + 3 * value * value),
      { degree: 2 },
    );
    expect(fitSlope(fit, 2)).toBeCloseTo(14, 10);
  });

  it('says what is missing when the data cannot carry the degree', () => {
    expect(() => fitPolynomial([1, 2, 3], [1, 2, 3], { degree: 2 })).toThrow(/needs at least 4 points, got 3/);
    expect(() => fitPolynomial([1, 1, 1, 1], [1, 2, 3, 4], { degree: 1 })).toThrow(/All x values are equal/);
    expect(() => fitPolynomial([0, 0, 1, 1, 1], [1, 2, 3, 4, 5], { degree: 2 })).toThrow(FitInputError);
    expect(() => fitPolynomial([1, 2, Number.NaN], [1, 2, 3], { degree: 1 })).toThrow(/Point 3 is not a finite number/);
    expect(() => fitPolynomial([1, 2, 3], [1, 2, 3], { degree: 0 })).toThrow(/at least 1/);
  });

  it('reports R^2 as null when the dependent values do not vary', () => {
    expect(fitPolynomial([1, 2, 3, 4], [5, 5, 5, 5], { degree: 1 }).r2).toBeNull();
  });
});

import { describe, expect, it } from 'vitest';
import { type Complex, type FilterResponse, lowPassPrototypePoles } from './prototype';

// reference: scipy.signal.buttap(n) and scipy.signal.besselap(n, norm='mag'), scipy 1.17.1,
// values printed with repr() and reordered to the pairs-adjacent convention.
const scipyPoles: Record<'butterworth' | 'bessel', Complex[][]> = {
  butterworth: [
    [{ re: -1, im: 0 }],
    [
      { re: -0.7071067811865476, im: 0.7071067811865475 },
      { re: -0.7071067811865476, im: -0.7071067811865475 },
    ],
    [
      { re: -0.5000000000000001, im: 0.8660254037844386 },
      { re: -0.5000000000000001, im: -0.8660254037844386 },
      { re: -1, im: 0 },
    ],
    [
      { re: -0.38268343236508984, im: 0.9238795325112867 },
      { re: -0.38268343236508984, im: -0.9238795325112867 },
      { re: -0.9238795325112867, im: 0.3826834323650898 },
      { re: -0.9238795325112867, im: -0.3826834323650898 },
    ],
  ],
  bessel: [
    [{ re: -0.9999999999999993, im: 0 }],
    [
      { re: -1.1016013305921608, im: 0.636009824757034 },
      { re: -1.1016013305921608, im: -0.636009824757034 },
    ],
    [
      { re: -1.0474091610089349, im: 0.9992644362806369 },
      { re: -1.0474091610089349, im: -0.9992644362806369 },
      { re: -1.3226757999104441, im: 0 },
    ],
    [
      { re: -0.995208764350272, im: 1.257105739454664 },
      { re: -0.995208764350272, im: -1.257105739454664 },
      { re: -1.3700678305514422, im: 0.41024971749375155 },
      { re: -1.3700678305514422, im: -0.41024971749375155 },
    ],
  ],
};

function magnitudeAt(poles: Complex[], w: number): number {
  let squared = 1;
  for (const p of poles) squared *= (p.re * p.re + p.im * p.im) / (p.re * p.re + (w - p.im) * (w - p.im));
  return Math.sqrt(squared);
}

describe('lowPassPrototypePoles', () => {
  for (const response of ['butterworth', 'bessel'] as const) {
    for (let order = 1; order <= 4; order++) {
      it(`matches scipy's ${response} prototype of order ${order} to 1e-12`, () => {
        const poles = lowPassPrototypePoles(response, order);
        const expected = scipyPoles[response][order - 1];
        expect(poles).toHaveLength(order);
        poles.forEach((p, i) => {
          expect(Math.abs(p.re - expected[i].re)).toBeLessThan(1e-12);
          expect(Math.abs(p.im - expected[i].im)).toBeLessThan(1e-12);
        });
      });
    }
  }

  for (const response of ['butterworth', 'bessel', 'critical'] as FilterResponse[]) {
    for (let order = 1; order <= 4; order++) {
      it(`puts the -3 dB point of the ${response} order ${order} at 1 rad/s with unit DC gain`, () => {
        // reference: definition of the prototype's corner, |H(j1)| = 1/sqrt(2).
        const poles = lowPassPrototypePoles(response, order);
        expect(magnitudeAt(poles, 0)).toBeCloseTo(1, 14);
        expect(magnitudeAt(poles, 1)).toBeCloseTo(Math.SQRT1_2, 12);
        poles.forEach((p) => expect(p.re).toBeLessThan(0));
      });
    }
  }

  it('lists conjugate pairs adjacent, positive imaginary part first, the real pole last', () => {
    for (const response of ['butterworth', 'bessel'] as FilterResponse[]) {
      const poles = lowPassPrototypePoles(response, 3);
      expect(poles[0].im).toBeGreaterThan(0);
      expect(poles[1]).toEqual({ re: poles[0].re, im: -poles[0].im });
      expect(poles[2].im).toBe(0);
    }
  });

  it('gives the critically damped second order two equal real poles at -1/sqrt(sqrt(2) - 1)', () => {
    // reference: (1 + 1/a^2)^n = 2 for n equal poles at -a (common practice).
    const poles = lowPassPrototypePoles('critical', 2);
    const a = 1 / Math.sqrt(Math.SQRT2 - 1);
    expect(poles).toEqual([
      { re: -a, im: 0 },
      { re: -a, im: 0 },
    ]);
  });

  it('rejects orders outside 1..4 and non-integer orders', () => {
    expect(() => lowPassPrototypePoles('butterworth', 0)).toThrow(/order must be an integer from 1 to 4/);
    expect(() => lowPassPrototypePoles('bessel', 5)).toThrow(RangeError);
    expect(() => lowPassPrototypePoles('critical', 2.5)).toThrow(RangeError);
  });
});

import { lowPassPrototypePoles, type Complex, type FilterResponse } from './prototype';
import { TWO_PI } from '../constants';

export type FilterType = 'lowPass' | 'highPass';

/** An analog filter of the chain, evaluated from its prototype poles with plain numbers. */
export interface AnalogFilter {
  /** Multiplies `value` in place by H(f) (DC gain 1 for a low-pass, high-frequency gain 1 for a high-pass). */
  multiply(frequency: number, value: Complex): void;
  /** |H(f)|^2. */
  power(frequency: number): number;
  /** Poles [rad/s] of the low-pass; empty for a high-pass (its zeros make it no all-pole filter). */
  poles: Complex[];
}

/**
 * Low-pass: each prototype pole p gives the factor p / (p - j f/fc).
 * High-pass (s -> 1/s of the same prototype): each pole gives p / (p + j fc/f).
 */
export function analogFilter(type: FilterType, response: FilterResponse, order: number, corner: number): AnalogFilter {
  const prototype = lowPassPrototypePoles(response, order);
  const count = prototype.length;
  const re = Float64Array.from(prototype, (p) => p.re);
  const im = Float64Array.from(prototype, (p) => p.im);
  const magnitude2 = Float64Array.from(prototype, (p) => p.re * p.re + p.im * p.im);
  const highPass = type === 'highPass';
  // y is the normalised frequency the factor sees, signed so that both types share one loop.
  const normalised = (frequency: number): number => (highPass ? -corner / Math.max(frequency, 1e-300) : frequency / corner);
  return {
    multiply(frequency, value) {
      const y = normalised(frequency);
      for (let i = 0; i < count; i++) {
        const dRe = re[i];
        const dIm = im[i] - y;
        const scale = 1 / (dRe * dRe + dIm * dIm);
        // factor = p * conj(d) / |d|^2
        const fRe = (re[i] * dRe + im[i] * dIm) * scale;
        const fIm = (im[i] * dRe - re[i] * dIm) * scale;
        const vRe = value.re * fRe - value.im * fIm;
        value.im = value.re * fIm + value.im * fRe;
        value.re = vRe;
      }
    },
    power(frequency) {
      const y = normalised(frequency);
      let product = 1;
      for (let i = 0; i < count; i++) {
        const dIm = im[i] - y;
        product *= magnitude2[i] / (re[i] * re[i] + dIm * dIm);
      }
      return product;
    },
    poles: highPass ? [] : prototype.map((p) => ({ re: p.re * TWO_PI * corner, im: p.im * TWO_PI * corner })),
  };
}

/**
 * The corner [Hz] at which the filter's |H| at `frequency` equals `magnitude` (bisection on the
 * corner; |H| is monotonic in it). Used to suggest a corner that clears a finding.
 */
export function cornerForMagnitude(type: FilterType, response: FilterResponse, order: number, frequency: number, magnitude: number): number {
  const target = magnitude * magnitude;
  let low = Math.log(frequency) - 30;
  let high = Math.log(frequency) + 30;
  for (let i = 0; i < 100; i++) {
    const middle = 0.5 * (low + high);
    const power = analogFilter(type, response, order, Math.exp(middle)).power(frequency);
    // A low-pass passes more as its corner rises, a high-pass less.
    const cornerTooHigh = type === 'lowPass' ? power > target : power < target;
    if (cornerTooHigh) high = middle;
    else low = middle;
  }
  return Math.exp(0.5 * (low + high));
}

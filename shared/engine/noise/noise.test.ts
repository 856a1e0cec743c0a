import { describe, expect, it } from 'vitest';
import { welchPsd } from '../spectral/welch';
import { FlickerNoise } from './flicker-noise';
import { GaussianSource } from './gaussian';
import { WhiteNoise } from './white-noise';
import { Xoshiro128StarStar } from './xoshiro128';

function moments(x: Float64Array): { mean: number; variance: number; kurtosis: number } {
  let mean = 0;
  for (const v of x) mean += v;
  mean /= x.length;
  let m2 = 0;
  let m4 = 0;
  for (const v of x) {
    const d = (v - mean) * (v - mean);
    m2 += d;
    m4 += d * d;
  }
  m2 /= x.length;
  m4 /= x.length;
  return { mean, variance: m2, kurtosis: m4 / (m2 * m2) };
}

describe('Xoshiro128StarStar', () => {
  it('gives the same stream for the same seed, bit for bit, and a different one for another seed', () => {
    // reference: determinism requirement of the simulator (ENGINE.md section 5).
    const a = new Xoshiro128StarStar(42);
    const b = new Xoshiro128StarStar(42);
    const c = new Xoshiro128StarStar(43);
    const streamA = Array.from({ length: 64 }, () => a.nextUint32());
    const streamB = Array.from({ length: 64 }, () => b.nextUint32());
    const streamC = Array.from({ length: 64 }, () => c.nextUint32());
    expect(streamA).toEqual(streamB);
    expect(streamC.filter((v, i) => v === streamA[i]).length).toBeLessThan(2);
    streamA.forEach((v) => expect(v >= 0 && v < 2 ** 32 && Number.isInteger(v)).toBe(true));
  });

  it('spreads uniform doubles over [0, 1) with mean 1/2 and variance 1/12', () => {
    // reference: moments of the uniform distribution (common practice); 2^16 draws, 5 sigma bounds.
    const random = new Xoshiro128StarStar(7);
    const x = Float64Array.from({ length: 65536 }, () => random.nextDouble());
    const { mean, variance } = moments(x);
    expect(Math.abs(mean - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / 65536));
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(0.005);
    expect(Math.min(...x)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...x)).toBeLessThan(1);
  });

  it('rejects seeds that are not non-negative safe integers', () => {
    expect(() => new Xoshiro128StarStar(-1)).toThrow(/Seed/);
    expect(() => new Xoshiro128StarStar(1.5)).toThrow(RangeError);
  });
});

describe('GaussianSource', () => {
  it('draws standard normal deviates (mean 0, variance 1, kurtosis 3)', () => {
    // reference: moments of the normal distribution; 2^20 draws, bounds at about 5 sigma.
    const x = new Float64Array(1 << 20);
    new GaussianSource(new Xoshiro128StarStar(1)).fill(x);
    const { mean, variance, kurtosis } = moments(x);
    expect(Math.abs(mean)).toBeLessThan(0.005);
    expect(Math.abs(variance - 1)).toBeLessThan(0.007);
    expect(Math.abs(kurtosis - 3)).toBeLessThan(0.025);
  });

  it('gives the same stream whatever the block sizes, and single draws continue it', () => {
    // reference: determinism requirement (same seed, same output bit for bit).
    const whole = new Float64Array(1001);
    new GaussianSource(new Xoshiro128StarStar(9)).fill(whole);
    const source = new GaussianSource(new Xoshiro128StarStar(9));
    const parts = new Float64Array(1001);
    source.fill(parts.subarray(0, 3));
    source.fill(parts.subarray(3, 500));
    parts[500] = source.next();
    source.fill(parts.subarray(501));
    expect(parts).toEqual(whole);
  });
});

describe('WhiteNoise', () => {
  it('has variance e^2 fs / 2 per sample', () => {
    // reference: one-sided density e over [0, fs/2] integrates to e^2 fs / 2 (Parseval).
    const density = 8e-9;
    const sampleRate = 3.2e6;
    const noise = new WhiteNoise({ density, sampleRate }, new Xoshiro128StarStar(5));
    const x = new Float64Array(1 << 19);
    noise.fill(x);
    const expected = (density * density * sampleRate) / 2;
    expect(noise.standardDeviation).toBeCloseTo(Math.sqrt(expected), 20);
    expect(Math.abs(moments(x).variance / expected - 1)).toBeLessThan(0.01);
  });

  it('has a flat Welch PSD at e^2 and adds onto a signal', () => {
    // reference: white-noise PSD is the density squared; Welch average of 255 segments of 1024, 3 % per band.
    const noise = new WhiteNoise({ density: 2, sampleRate: 1000 }, new Xoshiro128StarStar(11));
    const x = new Float64Array(1 << 17).fill(1);
    noise.addTo(x);
    const { psd } = welchPsd(x, 1000, 1024);
    for (let start = 8; start + 64 <= 512; start += 63) {
      const band = psd.subarray(start, start + 64).reduce((a, v) => a + v, 0) / 64;
      expect(Math.abs(band / 4 - 1)).toBeLessThan(0.03);
    }
  });

  it('rejects a negative density and a zero sample rate', () => {
    const random = new Xoshiro128StarStar(0);
    expect(() => new WhiteNoise({ density: -1, sampleRate: 1 }, random)).toThrow(/density/);
    expect(() => new WhiteNoise({ density: 1, sampleRate: 0 }, random)).toThrow(/Sample rate/);
  });
});

describe('FlickerNoise', () => {
  it('follows e^2 (1 + fc / f) within 1 dB from f0 / 1000 to fs / 2 (fs = 16 f0)', () => {
    // reference: target density of the specification (ENGINE.md section 5), measured with this
    // engine's Welch PSD (2^23 samples, segment 2^17, half-octave bands). The corner is set at fs so
    // that the 1/f part dominates the whole band and its shape is what is tested.
    const carrier = 50e3;
    const sampleRate = 16 * carrier;
    const density = 1e-8;
    const corner = sampleRate;
    const lowest = carrier / 1000;
    const noise = new FlickerNoise({ density, corner, sampleRate, lowestFrequency: lowest }, new Xoshiro128StarStar(2024));
    const x = new Float64Array(1 << 23);
    for (let start = 0; start < x.length; start += 1 << 16) noise.fill(x.subarray(start, start + (1 << 16)));
    const { frequencies, psd } = welchPsd(x, sampleRate, 1 << 17);
    const target = (f: number): number => density * density * (1 + corner / f);
    const errors: number[] = [];
    for (let low = lowest; low < sampleRate / 2; low *= Math.SQRT2) {
      const high = Math.min(low * Math.SQRT2, sampleRate / 2);
      let measured = 0;
      let expected = 0;
      for (let k = 0; k < frequencies.length; k++) {
        if (frequencies[k] >= low && frequencies[k] <= high) {
          measured += psd[k];
          expected += target(frequencies[k]);
        }
      }
      errors.push(10 * Math.log10(measured / expected));
    }
    expect(errors.length).toBeGreaterThan(25);
    for (const error of errors) expect(Math.abs(error)).toBeLessThan(1);
  });

  it('is white noise of density e when the corner is 0, and repeats bit for bit for a seed', () => {
    // reference: e^2 (1 + 0 / f) = e^2; variance e^2 fs / 2 (Parseval).
    const spec = { density: 3e-9, corner: 0, sampleRate: 1e6, lowestFrequency: 10 };
    const x = new Float64Array(1 << 18);
    new FlickerNoise(spec, new Xoshiro128StarStar(3)).fill(x);
    expect(Math.abs(moments(x).variance / ((9e-18 * 1e6) / 2) - 1)).toBeLessThan(0.01);
    const y = new Float64Array(1 << 18);
    new FlickerNoise({ ...spec, corner: 2e3 }, new Xoshiro128StarStar(3)).fill(y);
    const z = new Float64Array(1 << 18);
    new FlickerNoise({ ...spec, corner: 2e3 }, new Xoshiro128StarStar(3)).fill(z);
    const w = new Float64Array(1 << 18);
    new FlickerNoise({ ...spec, corner: 2e3 }, new Xoshiro128StarStar(4)).fill(w);
    expect(z).toEqual(y);
    expect(w).not.toEqual(y);
  });

  it('rejects a lowest frequency at or above half the sample rate and a negative corner', () => {
    const random = new Xoshiro128StarStar(0);
    expect(() => new FlickerNoise({ density: 1, corner: 1, sampleRate: 100, lowestFrequency: 50 }, random)).toThrow(/Lowest frequency/);
    expect(() => new FlickerNoise({ density: 1, corner: -1, sampleRate: 100, lowestFrequency: 1 }, random)).toThrow(/corner/);
  });
});

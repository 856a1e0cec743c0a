import { describe, expect, it } from 'vitest';
import toneFixture from '../../../test/fixtures/scipy/tone.json';
import welchFixture from '../../../test/fixtures/scipy/welch.json';
import { directDft } from './dft';
import { complexFft, realFft } from './fft';
import { amplitudeSpectrum, welch, welchPsd } from './welch';
import { hannWindow } from './window';

/** A fixed, irregular test sequence (no PRNG needed): fractional parts of n * golden ratio. */
function sequence(length: number, offset: number): Float64Array {
  const golden = (1 + Math.sqrt(5)) / 2;
  return Float64Array.from({ length }, (_, n) => (((n + offset) * golden) % 1) - 0.5 + 0.3 * Math.sin(n + offset));
}

function maxAbs(values: ArrayLike<number>): number {
  let peak = 0;
  for (let i = 0; i < values.length; i++) peak = Math.max(peak, Math.abs(values[i]));
  return peak;
}

describe('complexFft and realFft', () => {
  for (const n of [1, 2, 4, 8, 16, 32, 64, 128]) {
    it(`agree with the direct DFT for length ${n}`, () => {
      // reference: definition of the DFT, evaluated directly (dft.ts).
      const re = sequence(n, 1);
      const im = sequence(n, 100);
      const fast = complexFft(re, im);
      const slow = directDft(re, im);
      const tolerance = 1e-12 * n * Math.max(1, maxAbs(slow.re), maxAbs(slow.im));
      for (let k = 0; k < n; k++) {
        expect(Math.abs(fast.re[k] - slow.re[k])).toBeLessThan(tolerance);
        expect(Math.abs(fast.im[k] - slow.im[k])).toBeLessThan(tolerance);
      }
      const real = realFft(re);
      const slowReal = directDft(re, new Float64Array(n));
      expect(real.re).toHaveLength(n === 1 ? 1 : n / 2 + 1);
      for (let k = 0; k < real.re.length; k++) {
        expect(Math.abs(real.re[k] - slowReal.re[k])).toBeLessThan(tolerance);
        expect(Math.abs(real.im[k] - slowReal.im[k])).toBeLessThan(tolerance);
      }
    });
  }

  it('returns a length-1 sequence unchanged and transforms length 2 to sum and difference', () => {
    // reference: DFT definition for N = 1 and N = 2.
    expect(Array.from(complexFft(Float64Array.of(3), Float64Array.of(-2)).re)).toEqual([3]);
    expect(Array.from(realFft(Float64Array.of(3)).re)).toEqual([3]);
    const two = realFft(Float64Array.of(3, 5));
    expect(Array.from(two.re)).toEqual([8, -2]);
    expect(Array.from(two.im)).toEqual([0, 0]);
  });

  it('satisfies Parseval: sum |x|^2 = (1/N) sum |X|^2', () => {
    // reference: Parseval's theorem for the unscaled DFT.
    const x = sequence(1024, 7);
    const { re, im } = complexFft(x, new Float64Array(1024));
    let time = 0;
    let frequency = 0;
    for (let i = 0; i < 1024; i++) {
      time += x[i] * x[i];
      frequency += re[i] * re[i] + im[i] * im[i];
    }
    expect(frequency / 1024).toBeCloseTo(time, 9);
  });

  it('rejects lengths that are not powers of two with a clear error', () => {
    expect(() => realFft(new Float64Array(3))).toThrow('FFT length must be a power of two (1, 2, 4, ...), got 3');
    expect(() => complexFft(new Float64Array(6), new Float64Array(6))).toThrow(/power of two/);
    expect(() => realFft(new Float64Array(0))).toThrow(/got 0/);
    expect(() => complexFft(new Float64Array(4), new Float64Array(2))).toThrow(/differs/);
  });
});

describe('hannWindow', () => {
  it('is the periodic Hann window', () => {
    // reference: scipy.signal.get_window('hann', 4) = [0, 0.5, 1, 0.5].
    hannWindow(4).forEach((v, i) => expect(v).toBeCloseTo([0, 0.5, 1, 0.5][i], 15));
    expect(Array.from(hannWindow(1))).toEqual([1]);
  });
});

describe('welch', () => {
  it(`reproduces scipy.signal.welch density (scipy ${welchFixture.scipy}) to 1e-10`, () => {
    // reference: scipy.signal.welch(x, fs, window='hann', nperseg=256, noverlap=128, scaling='density'),
    // scipy 1.17.1, fixture test/fixtures/scipy/welch.json
    const { frequencies, psd } = welchPsd(Float64Array.from(welchFixture.input), welchFixture.sampleRate, welchFixture.segmentLength);
    expect(psd).toHaveLength(welchFixture.psd.length);
    const peak = maxAbs(welchFixture.psd);
    welchFixture.psd.forEach((value, k) => {
      expect(Math.abs(psd[k] - value)).toBeLessThan(1e-10 * peak);
      expect(frequencies[k]).toBeCloseTo(welchFixture.frequencies[k], 12);
    });
  });

  it('reproduces scipy.signal.welch power spectrum of two tones and reads the on-bin amplitude', () => {
    // reference: scipy.signal.welch(..., scaling='spectrum'), scipy 1.17.1, fixture test/fixtures/scipy/tone.json
    const x = Float64Array.from(toneFixture.input);
    const { values } = welch(x, toneFixture.sampleRate, toneFixture.segmentLength, { scaling: 'spectrum' });
    const peak = maxAbs(toneFixture.power);
    toneFixture.power.forEach((value, k) => expect(Math.abs(values[k] - value)).toBeLessThan(1e-10 * peak));
    const { frequencies, amplitude } = amplitudeSpectrum(x, toneFixture.sampleRate, toneFixture.segmentLength);
    const bin = frequencies.indexOf(toneFixture.tones[0].frequency);
    // Within 1e-6: the Hann sidelobes of the off-bin tone leak about 1e-8 into this bin.
    expect(amplitude[bin]).toBeCloseTo(toneFixture.tones[0].amplitude, 6);
  });

  it('reads a constant as its value in the DC bin without detrending', () => {
    // reference: DFT of a constant (common practice).
    const { amplitude } = amplitudeSpectrum(new Float64Array(64).fill(0.4), 1000, 16, 'none');
    expect(amplitude[0]).toBeCloseTo(0.4, 12);
    expect(amplitude[3]).toBeLessThan(1e-12);
  });

  it('integrates to the mean windowed variance exactly (Parseval)', () => {
    // reference: Parseval's theorem applied to each Hann-windowed, mean-removed segment.
    const x = sequence(5000, 3);
    const n = 512;
    const fs = 2000;
    const { psd } = welchPsd(x, fs, n);
    const w = hannWindow(n);
    const windowSquares = w.reduce((s, v) => s + v * v, 0);
    const segments = Math.floor((x.length - n) / (n / 2)) + 1;
    let expected = 0;
    for (let s = 0; s < segments; s++) {
      const part = x.subarray(s * (n / 2), s * (n / 2) + n);
      const mean = part.reduce((a, v) => a + v, 0) / n;
      expected += part.reduce((a, v, i) => a + (v - mean) * (v - mean) * w[i] * w[i], 0) / windowSquares;
    }
    expected /= segments;
    const integral = psd.reduce((a, v) => a + v, 0) * (fs / n);
    expect(Math.abs(integral - expected) / expected).toBeLessThan(1e-12);
  });

  it('rejects a segment that is not a power of two, or longer than the data', () => {
    expect(() => welchPsd(new Float64Array(100), 1, 48)).toThrow(/segment length must be a power of two/);
    expect(() => welchPsd(new Float64Array(100), 1, 128)).toThrow(/at least one segment of 128/);
    expect(() => welchPsd(new Float64Array(100), 0, 16)).toThrow(/Sample rate/);
    expect(() => welchPsd(new Float64Array(100), 1, 1)).toThrow(/at least 2/);
  });
});

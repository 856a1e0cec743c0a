import { describe, expect, it } from 'vitest';
import { parseInputSpec, parsePiecewiseLinearCsv, type InputProfile } from '../../contracts/simulation';
import { lowPassSos } from '../filters/digital';
import { SosFilter } from '../filters/sos-filter';
import { GaussianSource } from '../noise/gaussian';
import { Xoshiro128StarStar } from '../noise/xoshiro128';
import { stageRegistry } from '../stages/registry';
import type { StageContext } from '../stages/stage';
import { processorFactories } from './processors';
import { minMaxEnvelope, EnvelopeRecorder } from './envelope';
import { bandRms, ripplePeak, stepMetrics } from './measure';
import { createProfileSampler, profileValue } from './profile';
import { AdcProcessor } from './processors/adc';
import { ChargeAmplifierProcessor } from './processors/charge-amplifier';
import { referencePeriod } from './processors/demodulator';
import { nodeSpectrum } from './spectrum';

const context: StageContext = {
  index: 0,
  path: 'chain[0]',
  domain: 'carrier',
  carrierFrequency: 5e4,
  excitationAmplitude: 2,
  supply: 5,
  temperature: 300,
  inputCapacitanceA: 8e-12,
  inputCapacitanceB: 8e-12,
};

describe('input profiles', () => {
  // reference: the profile definitions of ENGINE.md section 5; the block samplers must follow the
  // pointwise definition at every sample, whatever the block boundaries.
  const profiles: InputProfile[] = [
    { kind: 'constant', value: 3e4 },
    { kind: 'sine', offset: 1e4, amplitude: 5e3, frequency: 37, phase: 30 },
    { kind: 'step', time: 0.0123, height: 6e4, base: 1e3 },
    { kind: 'ramp', start: 0.01, end: 0.03, from: 0, to: 6e4 },
    { kind: 'piecewiseLinear', points: [[0.005, 0], [0.01, 2e4], [0.02, 2e4], [0.035, -1e4]] },
  ];
  for (const profile of profiles) {
    it(`samples the ${profile.kind} profile as its definition, block by block`, () => {
      const sampleRate = 1e4;
      const sampler = createProfileSampler(profile, sampleRate);
      const out = new Float64Array(500);
      for (let first = 0; first < 500; first += 77) sampler.fill(first, out.subarray(first, Math.min(500, first + 77)));
      out.forEach((v, n) => expect(v).toBeCloseTo(profileValue(profile, n / sampleRate), 6));
    });
  }

  it('holds the shapes it is named for', () => {
    // reference: closed forms (a sine at its quarter period, a ramp's midpoint, a step on both sides).
    expect(profileValue({ kind: 'sine', offset: 1, amplitude: 2, frequency: 5, phase: 0 }, 0.05)).toBeCloseTo(3, 12);
    expect(profileValue({ kind: 'ramp', start: 1, end: 3, from: 10, to: 20 }, 2)).toBe(15);
    expect(profileValue({ kind: 'step', time: 1, height: 5, base: 2 }, 0.999)).toBe(2);
    expect(profileValue({ kind: 'step', time: 1, height: 5, base: 2 }, 1)).toBe(7);
    expect(profileValue({ kind: 'piecewiseLinear', points: [[1, 4], [2, 8]] }, 5)).toBe(8);
  });

  it('parses the CLI --input syntax and says what is wrong', () => {
    expect(parseInputSpec('constant:3e4')).toEqual({ ok: true, profile: { kind: 'constant', value: 3e4 } });
    expect(parseInputSpec('sine:amplitude=1e4,frequency=20')).toEqual({ ok: true, profile: { kind: 'sine', offset: 0, amplitude: 1e4, frequency: 20, phase: 0 } });
    expect(parseInputSpec('step:time=0.05,height=6e4')).toEqual({ ok: true, profile: { kind: 'step', time: 0.05, height: 6e4, base: 0 } });
    expect(parseInputSpec('ramp:start=0.1,end=0.3,from=0,to=6e4')).toEqual({ ok: true, profile: { kind: 'ramp', start: 0.1, end: 0.3, from: 0, to: 6e4 } });
    expect(parseInputSpec('pwl:0=0,0.1=3e4')).toEqual({ ok: true, profile: { kind: 'piecewiseLinear', points: [[0, 0], [0.1, 3e4]] } });
    const bad = (spec: string, pattern: RegExp) => {
      const parsed = parseInputSpec(spec);
      expect(parsed.ok).toBe(false);
      if (!parsed.ok) expect(parsed.message).toMatch(pattern);
    };
    bad('square:1', /unknown/);
    bad('sine:amplitude=1', /frequency/);
    bad('ramp:start=1,end=0.5,from=0,to=1', /after its start/);
    bad('pwl:0=0,0=1', /increase/);
    bad('step:time', /KEY=VALUE/);
  });

  it('reads a piecewise-linear profile from CSV with a header', () => {
    expect(parsePiecewiseLinearCsv('time,pressure\n0,0\n0.1;3e4\n\n0.2\t0\n')).toEqual({
      ok: true,
      profile: { kind: 'piecewiseLinear', points: [[0, 0], [0.1, 3e4], [0.2, 0]] },
    });
    expect(parsePiecewiseLinearCsv('0,0\n0.1,x\n').ok).toBe(false);
  });
});

describe('step metrics', () => {
  // reference: closed form of a second-order low-pass step response (any control text):
  // y = 1 - exp(-zeta w t) (cos(wd t) + zeta / sqrt(1 - zeta^2) sin(wd t)); Butterworth zeta = 1/sqrt 2
  // gives the overshoot exp(-pi zeta / sqrt(1 - zeta^2)) = exp(-pi) = 4.32 %.
  const corner = 100;
  const w = 2 * Math.PI * corner;
  const zeta = Math.SQRT1_2;
  const wd = w * Math.sqrt(1 - zeta * zeta);
  const exact = (t: number) => 1 - Math.exp(-zeta * w * t) * (Math.cos(wd * t) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * t));
  const solve = (f: (t: number) => number, low: number, high: number) => {
    for (let i = 0; i < 100; i++) {
      const middle = (low + high) / 2;
      if (Math.sign(f(middle)) === Math.sign(f(low))) low = middle;
      else high = middle;
    }
    return (low + high) / 2;
  };
  // The last time the envelope-bounded response leaves the band: scan the closed form backwards.
  const settling = (band: number, until: number) => {
    for (let t = until; t > 0; t -= 1e-7) if (Math.abs(exact(t) - 1) > band) return t;
    return 0;
  };

  it('reads rise, overshoot and settling of a sampled 2nd-order Butterworth response', () => {
    const sampleRate = 1e6;
    const stepIndex = 1000;
    const x = Float64Array.from({ length: 60000 }, (_, n) => (n < stepIndex ? 0 : exact((n - stepIndex) / sampleRate)));
    const metrics = stepMetrics(x, sampleRate, stepIndex, 0, 1);
    const peakTime = Math.PI / wd;
    const rise = solve((t) => exact(t) - 0.9, 0, peakTime) - solve((t) => exact(t) - 0.1, 0, peakTime);
    expect(metrics?.overshoot).toBeCloseTo(Math.exp(-Math.PI), 5);
    expect(Math.abs((metrics?.rise as number) - rise)).toBeLessThan(1.5 / sampleRate);
    expect(Math.abs((metrics?.settle1 as number) - settling(0.01, 0.05))).toBeLessThan(2 / sampleRate);
    expect(Math.abs((metrics?.settle01 as number) - settling(0.001, 0.05))).toBeLessThan(2 / sampleRate);
  });

  it('reads the same from the SOS filter designed for that corner, and null for a step of zero', () => {
    // reference: the bilinear Butterworth at fs = 10^4 corner reproduces the analog step closely.
    const sampleRate = 1e6;
    const filter = new SosFilter(lowPassSos('butterworth', 2, corner, sampleRate));
    const x = new Float64Array(60000).fill(1);
    filter.process(x);
    const metrics = stepMetrics(x, sampleRate, 0, 0, 1);
    expect(metrics?.overshoot).toBeCloseTo(0.0432, 3);
    expect(stepMetrics(x, sampleRate, 0, 1, 1)).toBeNull();
  });
});

describe('ripple and band noise', () => {
  it('finds the peak of a carrier-synchronous ripple under a ramp and white noise', () => {
    // reference: a known periodic shape (peak 1e-3 by construction) added to a linear trend and noise.
    const period = 64;
    const x = new Float64Array(period * 400);
    const noise = new Float64Array(x.length);
    new GaussianSource(new Xoshiro128StarStar(5)).fill(noise);
    for (let n = 0; n < x.length; n++) x[n] = 0.5 + 1e-4 * n + 1e-3 * Math.cos((4 * Math.PI * n) / period) + 1e-4 * noise[n];
    expect(Math.abs(ripplePeak(x, period, 0) / 1e-3 - 1)).toBeLessThan(0.02);
  });

  it('integrates white noise over a band to its share of the variance', () => {
    // reference: one-sided white density e^2 over [low, high] holds e^2 (high - low); here the
    // variance 1 spread over [0, fs/2] with fs = 1000 gives 0.2 between 100 and 200 Hz.
    const x = new Float64Array(1 << 18);
    new GaussianSource(new Xoshiro128StarStar(8)).fill(x);
    expect(Math.abs(bandRms(x, 1000, 100, 200).rms ** 2 / 0.2 - 1)).toBeLessThan(0.03);
    expect(Math.abs(bandRms(x, 1000, 0.1, 1e6).rms ** 2 - 1)).toBeLessThan(0.02);
  });

  it('gives the PSD whose integral is the variance (Parseval) and the amplitude of a tone', () => {
    // reference: Parseval for Welch's density scaling; a bin-centred sine of amplitude 0.3 reads 0.3.
    const sampleRate = 1024;
    const x = Float64Array.from({ length: 1 << 16 }, (_, n) => 0.3 * Math.sin((2 * Math.PI * 64 * n) / sampleRate));
    const density = nodeSpectrum(x, sampleRate, 1024);
    if (density.kind !== 'density') throw new Error('expected a density');
    const integral = density.psd.reduce((sum, v) => sum + v, 0) * (sampleRate / 1024);
    expect(integral).toBeCloseTo(0.045, 4);
    expect(density.asd[64]).toBeCloseTo(Math.sqrt(density.psd[64]), 12);
    const amplitude = nodeSpectrum(x, sampleRate, 1024, 'amplitude');
    if (amplitude.kind !== 'amplitude') throw new Error('expected an amplitude spectrum');
    expect(amplitude.amplitude[64]).toBeCloseTo(0.3, 6);
  });
});

describe('envelope', () => {
  it('keeps each column\'s extremes, block by block as in one go', () => {
    const x = Float64Array.from({ length: 1000 }, (_, n) => Math.sin(n / 7) + (n === 333 ? 5 : 0));
    const whole = minMaxEnvelope(x, 10);
    expect(whole.samplesPerColumn).toBe(100);
    expect(whole.max[3]).toBeCloseTo(5 + Math.sin(333 / 7), 5);
    const recorder = new EnvelopeRecorder(1000, 10);
    for (let i = 0; i < 1000; i += 37) recorder.add(x.subarray(i, Math.min(1000, i + 37)));
    expect(recorder.result()).toEqual(whole);
    const partial = minMaxEnvelope(x.subarray(0, 950), 10);
    expect(partial.min.length).toBe(10);
  });
});

describe('processors', () => {
  it('puts -q/Cf on each side for a charge step, read differentially as B - A', () => {
    // reference: charge amplifier output for a charge step q is -q/Cf (ENGINE.md section 3).
    const ca = new ChargeAmplifierProcessor(
      { id: 'ca', kind: 'chargeAmplifier', feedbackCapacitance: 1e-12, feedbackResistance: 1e12, gainBandwidth: 1e7, voltageNoise: 0, flickerCorner: 0, currentNoise: 0, inputCapacitance: 4e-12, outputSwing: [0.1, 4.9], slewRate: 5e6 },
      context,
      3.2e6,
    );
    const n = 200;
    const qA = new Float64Array(n);
    const qB = new Float64Array(n);
    qA[10] = 1e-13;
    const outA = new Float64Array(n);
    const outB = new Float64Array(n);
    const differential = new Float64Array(n);
    ca.processSides(qA, qB, outA, outB, differential);
    expect(outA[n - 1]).toBeCloseTo(2.5 - 0.1, 4);
    expect(outB[n - 1]).toBe(2.5);
    expect(differential[n - 1]).toBeCloseTo(0.1, 4);
    expect(ca.clippedSamples).toBe(0);
  });

  it('makes a +/-1 reference whose phase moves its edge by fractions of a sample', () => {
    // reference: the mean of a square wave over each sample interval; a period sums to 0.
    const zero = referencePeriod(64, 0);
    expect(Array.from(zero.subarray(0, 32)).every((v) => v === 1)).toBe(true);
    expect(Array.from(zero.subarray(32)).every((v) => v === -1)).toBe(true);
    const shifted = referencePeriod(64, (0.25 / 64) * 360);
    expect(shifted[0]).toBeCloseTo(0.5, 12);
    expect(shifted.reduce((s, v) => s + v, 0)).toBeCloseTo(0, 12);
  });

  it('converts at its own rate, rounds to the LSB and clips to the range', () => {
    // reference: mid-tread quantizer with q = range / 2^bits (W. R. Bennett 1948 for the step).
    const adc = new AdcProcessor({ id: 'adc', kind: 'adc', bits: 8, inputRange: [0, 5], sampleRate: 1000 }, context, 8000);
    const q = 5 / 256;
    const input = Float64Array.from({ length: 80 }, (_, n) => (n < 40 ? 0.3 * q + n * 1e-3 : 10));
    const samples = new Float64Array(adc.maximumConversions(80));
    const count = adc.convert(input, samples);
    expect(count).toBe(10);
    expect(samples[0]).toBe(0);
    expect(samples[1]).toBeCloseTo(Math.round((0.3 * q + 8e-3) / q) * q, 12);
    expect(samples[9]).toBeCloseTo(2.5 - q, 12);
    expect(adc.clippedSamples).toBe(5);
  });
});

describe('stage module hooks', () => {
  it('build the same block processor as the simulator map, for every kind', () => {
    // reference: ENGINE.md section 3 (each stage module provides its block processor).
    const input = Float64Array.from({ length: 512 }, (_, n) => Math.sin(n / 5) * 1e-13);
    for (const stageModule of stageRegistry.modules) {
      const parameters = stageModule.defaults('s');
      const fromHook = stageModule.createProcessor?.(parameters, context, 3.2e6);
      const fromMap = (processorFactories as Record<string, (p: unknown, c: StageContext, fs: number, noise: null) => { process(i: Float64Array, o: Float64Array): void }>)[stageModule.kind](parameters, context, 3.2e6, null);
      const a = new Float64Array(512);
      const b = new Float64Array(512);
      fromHook?.process(input, a);
      fromMap.process(input, b);
      expect(fromHook).toBeDefined();
      expect(a).toEqual(b);
    }
  });
});

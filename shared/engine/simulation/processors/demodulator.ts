/**
 * Switching demodulator: multiplies by the +/-1 reference at the carrier, delayed by its phase.
 * The reference of sample n is its mean over the sample's interval [n - 1/2, n + 1/2], so a phase
 * that falls between samples keeps its exact area (the value is +/-1 everywhere but at an edge).
 * The excitation's edges sit on the same grid (the front end switches at samples 0 and N/2), so
 * phase 0 switches with them.
 */
import type { DemodulatorStage } from '../../stages/demodulator';
import type { StageContext } from '../../stages/stage';
import type { NodeProcessor } from './processor';

/** Samples per carrier period N = fs / f0; the simulation runs at whole multiples of f0 only. */
export function samplesPerPeriod(sampleRate: number, carrierFrequency: number): number {
  const ratio = sampleRate / carrierFrequency;
  const whole = Math.round(ratio);
  if (whole < 2 || Math.abs(ratio - whole) > 1e-9 * ratio) {
    throw new RangeError(`The sample rate must be a whole multiple of the carrier frequency, got ${ratio} samples per period`);
  }
  return whole;
}

/**
 * One period of the reference, delayed by `phase` [deg], each entry the mean of the square wave
 * over that sample's interval. At phase 0 it is +1 for n = 0 .. N/2 - 1 and -1 after.
 */
export function referencePeriod(samples: number, phase: number): Float64Array {
  const edge = -0.5 + (phase / 360) * samples;
  // Running integral of the square wave: a triangle, rising over the + half period.
  const integral = (t: number): number => {
    const u = (((t - edge) % samples) + samples) % samples;
    return u < samples / 2 ? u : samples - u;
  };
  return Float64Array.from({ length: samples }, (_, n) => integral(n + 0.5) - integral(n - 0.5));
}

export class DemodulatorProcessor implements NodeProcessor {
  readonly timeConstant = 0;
  readonly clippedSamples = 0;
  private readonly reference: Float64Array;
  private position = 0;

  constructor(parameters: DemodulatorStage, context: StageContext, sampleRate: number) {
    this.reference = referencePeriod(samplesPerPeriod(sampleRate, context.carrierFrequency), parameters.phase);
  }

  process(input: Float64Array, output: Float64Array): void {
    const reference = this.reference;
    const period = reference.length;
    let k = this.position;
    for (let n = 0; n < input.length; n++) {
      output[n] = input[n] * reference[k];
      if (++k === period) k = 0;
    }
    this.position = k;
  }

  reset(): void {
    this.position = 0;
  }
}

export function createDemodulatorProcessor(parameters: DemodulatorStage, context: StageContext, sampleRate: number): DemodulatorProcessor {
  return new DemodulatorProcessor(parameters, context, sampleRate);
}

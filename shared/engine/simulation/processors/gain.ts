/**
 * Gain stage: G times a single pole at GBW / G (bilinear, see firstOrderLowPass), limited to the
 * differential swing of its two outputs. Its voltage noise (white and 1/f) enters at the input,
 * one generator for both sides' amplifiers at sqrt(2) times the density (they reach the
 * differential output through the same transfer and add in power).
 */
import type { GainStage } from '../../stages/gain';
import type { StageContext } from '../../stages/stage';
import { differentialLimit, firstOrderLowPass, voltageNoise, type NodeProcessor, type NoiseBlock, type ProcessorNoise } from './processor';

export class GainProcessor implements NodeProcessor {
  readonly timeConstant: number;
  private clipped = 0;
  private readonly gain: number;
  private readonly feedback: number;
  private readonly limit: number;
  private readonly noise: NoiseBlock | null;
  private x = 0;
  private w = 0;

  constructor(parameters: GainStage, context: StageContext, sampleRate: number, noise: ProcessorNoise | null = null) {
    const pole = firstOrderLowPass(parameters.gainBandwidth / parameters.gain, sampleRate);
    this.gain = pole.gain * parameters.gain;
    this.feedback = pole.feedback;
    this.limit = differentialLimit(parameters.outputSwing[0], parameters.outputSwing[1], context.supply / 2);
    this.timeConstant = -1 / (Math.log(Math.abs(pole.feedback)) * sampleRate);
    this.noise = noise === null ? null : voltageNoise(Math.SQRT2 * parameters.voltageNoise, parameters.flickerCorner, sampleRate, noise.lowestFrequency, noise.random(0));
  }

  get clippedSamples(): number {
    return this.clipped;
  }

  process(input: Float64Array, output: Float64Array): void {
    const length = input.length;
    let source = input;
    if (this.noise !== null) {
      // Input plus noise in the output block, then the pole in place (it reads each sample before writing it).
      output.set(input);
      this.noise.addTo(output);
      source = output;
    }
    const { gain, feedback, limit } = this;
    let { x, w } = this;
    let clipped = 0;
    for (let n = 0; n < length; n++) {
      const xn = source[n];
      w = gain * (xn + x) + feedback * w;
      x = xn;
      let y = w;
      if (y > limit) {
        y = limit;
        clipped++;
      } else if (y < -limit) {
        y = -limit;
        clipped++;
      }
      output[n] = y;
    }
    this.x = x;
    this.w = w;
    this.clipped += clipped;
  }

  reset(): void {
    this.x = 0;
    this.w = 0;
    this.clipped = 0;
  }
}

export function createGainProcessor(parameters: GainStage, context: StageContext, sampleRate: number, noise: ProcessorNoise | null = null): GainProcessor {
  return new GainProcessor(parameters, context, sampleRate, noise);
}

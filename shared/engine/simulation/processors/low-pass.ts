/**
 * Active low-pass: second-order sections by the bilinear transform with the corner pre-warped
 * (filters/digital.ts), limited to the differential swing. Its voltage noise (white and 1/f, not
 * chopped: it sits after the demodulator) enters at its input, one generator at sqrt(2) times the
 * density for the two sides, so the output sees it shaped by the filter as in the budget.
 */
import { lowPassSos } from '../../filters/digital';
import { SosFilter } from '../../filters/sos-filter';
import type { LowPassStage } from '../../stages/low-pass';
import type { StageContext } from '../../stages/stage';
import { differentialLimit, sosTimeConstant, voltageNoise, type NodeProcessor, type NoiseBlock, type ProcessorNoise } from './processor';

export class LowPassProcessor implements NodeProcessor {
  readonly timeConstant: number;
  private clipped = 0;
  private readonly filter: SosFilter;
  private readonly limit: number;
  private readonly noise: NoiseBlock | null;

  constructor(parameters: LowPassStage, context: StageContext, sampleRate: number, noise: ProcessorNoise | null = null) {
    const sos = lowPassSos(parameters.response, parameters.order, parameters.corner, sampleRate);
    this.filter = new SosFilter(sos);
    this.timeConstant = sosTimeConstant(sos, sampleRate);
    this.limit = differentialLimit(parameters.outputSwing[0], parameters.outputSwing[1], context.supply / 2);
    this.noise = noise === null ? null : voltageNoise(Math.SQRT2 * parameters.voltageNoise, parameters.flickerCorner, sampleRate, noise.lowestFrequency, noise.random(0));
  }

  get clippedSamples(): number {
    return this.clipped;
  }

  process(input: Float64Array, output: Float64Array): void {
    const length = input.length;
    if (this.noise !== null) {
      output.set(input);
      this.noise.addTo(output);
      this.filter.process(output, output);
    } else {
      this.filter.process(input, output);
    }
    const limit = this.limit;
    let clipped = 0;
    for (let n = 0; n < length; n++) {
      const y = output[n];
      if (y > limit) {
        output[n] = limit;
        clipped++;
      } else if (y < -limit) {
        output[n] = -limit;
        clipped++;
      }
    }
    this.clipped += clipped;
  }

  reset(): void {
    this.filter.reset();
    this.clipped = 0;
  }
}

export function createLowPassProcessor(parameters: LowPassStage, context: StageContext, sampleRate: number, noise: ProcessorNoise | null = null): LowPassProcessor {
  return new LowPassProcessor(parameters, context, sampleRate, noise);
}

/**
 * Passive high-pass: the design's Butterworth, Bessel or critically damped response as
 * second-order sections, bilinear transform with the corner pre-warped (filters/digital.ts).
 * No noise of its own and no swing, as in the analytic budget.
 */
import { highPassSos } from '../../filters/digital';
import { SosFilter } from '../../filters/sos-filter';
import type { HighPassStage } from '../../stages/high-pass';
import type { StageContext } from '../../stages/stage';
import { sosTimeConstant, type NodeProcessor } from './processor';

export class HighPassProcessor implements NodeProcessor {
  readonly timeConstant: number;
  readonly clippedSamples = 0;
  private readonly filter: SosFilter;

  constructor(parameters: HighPassStage, _context: StageContext, sampleRate: number) {
    const sos = highPassSos(parameters.response, parameters.order, parameters.corner, sampleRate);
    this.filter = new SosFilter(sos);
    this.timeConstant = sosTimeConstant(sos, sampleRate);
  }

  process(input: Float64Array, output: Float64Array): void {
    this.filter.process(input, output);
  }

  reset(): void {
    this.filter.reset();
  }
}

export function createHighPassProcessor(parameters: HighPassStage, context: StageContext, sampleRate: number): HighPassProcessor {
  return new HighPassProcessor(parameters, context, sampleRate);
}

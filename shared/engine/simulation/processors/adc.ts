/**
 * ADC: samples the differential input at its own rate (the first simulation sample at or after
 * each conversion instant m / fs_adc; no filtering, so noise above its Nyquist frequency folds in
 * as it does in the converter), quantizes it mid-tread with step q = range / 2^bits around the
 * range's middle, and clips to the codes 0 .. 2^bits - 1. Its quantization noise is the rounding
 * itself.
 */
import type { AdcStage } from '../../stages/adc';
import type { StageContext } from '../../stages/stage';
import type { NodeProcessor } from './processor';

export class AdcProcessor implements NodeProcessor {
  readonly timeConstant = 0;
  /** Conversion rate [Hz] and simulation samples per conversion. */
  readonly sampleRate: number;
  readonly ratio: number;
  /** Step q [V]. */
  readonly step: number;
  private clipped = 0;
  private readonly low: number;
  private readonly centre: number;
  private readonly topCode: number;
  /** Conversions made so far, and the index of the next input sample (in simulation samples from the start). */
  private conversions = 0;
  private position = 0;
  private held = 0;
  private scratch = new Float64Array(0);

  constructor(parameters: AdcStage, _context: StageContext, sampleRate: number) {
    const [low, high] = parameters.inputRange;
    this.sampleRate = parameters.sampleRate;
    this.ratio = sampleRate / parameters.sampleRate;
    this.step = (high - low) / 2 ** parameters.bits;
    this.low = low;
    this.centre = (low + high) / 2;
    this.topCode = 2 ** parameters.bits - 1;
  }

  get clippedSamples(): number {
    return this.clipped;
  }

  /** Most conversions a block of `length` input samples can hold (for sizing the output). */
  maximumConversions(length: number): number {
    return Math.ceil(length / this.ratio) + 1;
  }

  /**
   * Converts one block of the differential input [V].
   * @param samples receives the converted values [V, differential, a multiple of q]; at least maximumConversions(input.length) long.
   * @returns the number of conversions written.
   */
  convert(input: Float64Array, samples: Float64Array): number {
    const start = this.position;
    const end = start + input.length;
    const { step, topCode } = this;
    const offset = this.centre - this.low;
    let count = 0;
    let clipped = 0;
    let m = this.conversions;
    for (let index = this.instant(m); index < end; index = this.instant(++m)) {
      let code = Math.round((input[index - start] + offset) / step);
      if (code > topCode) {
        code = topCode;
        clipped++;
      } else if (code < 0) {
        code = 0;
        clipped++;
      }
      samples[count++] = code * step - offset;
    }
    this.conversions = m;
    this.position = end;
    this.clipped += clipped;
    if (count > 0) this.held = samples[count - 1];
    return count;
  }

  /** The BlockProcessor form: each converted value held until the next conversion, at the simulation rate [V]. */
  process(input: Float64Array, output: Float64Array): void {
    if (this.scratch.length < this.maximumConversions(input.length)) this.scratch = new Float64Array(this.maximumConversions(input.length));
    const start = this.position;
    let m = this.conversions;
    let held = this.held;
    const count = this.convert(input, this.scratch);
    let k = 0;
    for (let n = 0; n < input.length; n++) {
      if (k < count && start + n >= this.instant(m)) {
        held = this.scratch[k++];
        m++;
      }
      output[n] = held;
    }
  }

  reset(): void {
    this.conversions = 0;
    this.position = 0;
    this.held = 0;
    this.clipped = 0;
  }

  /** Simulation sample of conversion m: the first at or after m / fs_adc. */
  private instant(m: number): number {
    return Math.ceil(m * this.ratio - 1e-9);
  }
}

export function createAdcProcessor(parameters: AdcStage, context: StageContext, sampleRate: number): AdcProcessor {
  return new AdcProcessor(parameters, context, sampleRate);
}

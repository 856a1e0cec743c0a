/**
 * The block processor of each stage kind. A new kind is one processor file plus one entry here
 * (and its stage module's createProcessor hook may point at the same factory).
 */
import type { ChainStage } from '../../../contracts/design';
import type { StageContext } from '../../stages/stage';
import { createAdcProcessor, type AdcProcessor } from './adc';
import { createChargeAmplifierProcessor, type ChargeAmplifierProcessor } from './charge-amplifier';
import { createDemodulatorProcessor } from './demodulator';
import { createGainProcessor } from './gain';
import { createHighPassProcessor } from './high-pass';
import { createLowPassProcessor } from './low-pass';
import type { NodeProcessor, ProcessorNoise } from './processor';

export type { NodeProcessor, ProcessorNoise } from './processor';
export { AdcProcessor } from './adc';
export { ChargeAmplifierProcessor } from './charge-amplifier';

type Factory<S extends ChainStage> = (parameters: S, context: StageContext, sampleRate: number, noise: ProcessorNoise | null) => NodeProcessor;
type FactoryMap = { [K in ChainStage['kind']]: Factory<Extract<ChainStage, { kind: K }>> };

export const processorFactories: FactoryMap = {
  chargeAmplifier: createChargeAmplifierProcessor,
  gain: createGainProcessor,
  highPass: createHighPassProcessor,
  demodulator: createDemodulatorProcessor,
  lowPass: createLowPassProcessor,
  adc: createAdcProcessor,
};

/** The processor for one chain entry; noise null for a noise-free run. */
export function createStageProcessor(stage: ChainStage, context: StageContext, sampleRate: number, noise: ProcessorNoise | null): NodeProcessor {
  const factory = processorFactories[stage.kind] as Factory<ChainStage> | undefined;
  if (factory === undefined) throw new Error(`No block processor for stage kind "${stage.kind}"`);
  return factory(stage, context, sampleRate, noise);
}

export function isChargeAmplifier(processor: NodeProcessor): processor is ChargeAmplifierProcessor {
  return 'processSides' in processor;
}

export function isConverter(processor: NodeProcessor): processor is AdcProcessor {
  return 'convert' in processor;
}

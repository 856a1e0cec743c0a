import { z } from 'zod';
import { quantity, stageIdSchema, voltageRange, wholeNumber } from '../../contracts/fields';
import { digits, finding, number } from '../findings';
import type { Finding } from '../../contracts/findings';
import { formatQuantity } from '../../units/format';
import type { StageModule } from './stage';
import { createAdcProcessor } from '../simulation/processors/adc';

export const adcSchema = z
  .object({
    id: stageIdSchema,
    kind: z.literal('adc'),
    bits: wholeNumber('Resolution', 4, 32, 'Bits of the converter'),
    inputRange: voltageRange('Input range', 'the differential output is centred on its middle and may swing half the range either way'),
    sampleRate: quantity('Sample rate', 'Hz', { above: 0 }),
  })
  .describe('Analog-to-digital converter at the end of the chain');

export type AdcStage = z.infer<typeof adcSchema>;

/** Noise folded down from above Nyquist may add at most 10 % to the in-band noise power. */
const FOLDED_NOISE_LIMIT = 0.1;

export const adcModule: StageModule<AdcStage> = {
  kind: 'adc',
  label: 'ADC',
  placement: 'baseband',
  mustBeLast: true,
  schema: adcSchema,
  defaults: (id) => ({ id, kind: 'adc', bits: 16, inputRange: [0, 5], sampleRate: 4000 }),
  createProcessor: createAdcProcessor,
  prepare(p, context) {
    const [low, high] = p.inputRange;
    const lsb = (high - low) / 2 ** p.bits;
    const nyquist = p.sampleRate / 2;
    const quantizationPower = (lsb * lsb) / 12;
    const target = { stage: p.id, path: context.path };
    const carrier = context.carrierFrequency;
    // 2 f0 seen after sampling: its distance to the nearest multiple of fs.
    const aliasOf = (f: number) => Math.abs(f - Math.round(f / p.sampleRate) * p.sampleRate);
    return {
      id: p.id,
      kind: p.kind,
      path: context.path,
      domain: context.domain,
      flatGain: 1,
      poles: [],
      noiseSources: [
        {
          source: 'quantization noise',
          // q^2/12 spread evenly over [0, fs/2]: the band gets its share.
          bandPower: (bandLow, bandHigh) => (quantizationPower * Math.max(0, Math.min(bandHigh, nyquist) - Math.min(bandLow, nyquist))) / nyquist,
        },
      ],
      swing: { low, high, centre: (low + high) / 2 },
      levelKind: 'converter',
      demodulatorPhase: null,
      converter: { low, high, bits: p.bits, sampleRate: p.sampleRate },
      multiplyResponse: () => undefined,
      responsePower: () => 1,
      findings(view) {
        const out: Finding[] = [];
        if (view.rippleOutputPeak > lsb) {
          const alias = aliasOf(2 * carrier);
          out.push(finding('warning', 'ripple-aliases', target, 'sampleRate', `Carrier ripple of ${formatQuantity(view.rippleOutputPeak, 'voltage')} peak (${digits(view.rippleOutputPeak / lsb)} LSB) aliases to ${formatQuantity(alias, 'frequency')}`, [number('ripple', view.rippleOutputPeak, 'V'), number('LSB', lsb, 'V'), number('alias frequency', alias, 'Hz')], 'lower the low-pass corner or raise its order until the ripple is below one LSB'));
        }
        if (view.noiseAboveNyquist > FOLDED_NOISE_LIMIT * view.noiseBelowNyquist) {
          out.push(finding('warning', 'noise-aliases', target, 'sampleRate', `Noise above half the sample rate (${formatQuantity(nyquist, 'frequency')}) folds in and adds ${digits((view.noiseAboveNyquist / view.noiseBelowNyquist) * 100)} % to the in-band noise power`, [number('noise power above fs/2', view.noiseAboveNyquist, 'V^2'), number('noise power below fs/2', view.noiseBelowNyquist, 'V^2')], 'raise the sample rate or lower the low-pass corner'));
        }
        return out;
      },
    };
  },
};

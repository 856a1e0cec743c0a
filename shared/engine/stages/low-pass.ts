import { z } from 'zod';
import { filterResponseSchema, quantity, stageIdSchema, voltageRange, wholeNumber } from '../../contracts/fields';
import { analogFilter, cornerForMagnitude } from '../filters/analog-response';
import { FREQUENCY_FLOOR } from '../constants';
import { digits, finding, number } from '../findings';
import { formatQuantity } from '../../units/format';
import type { StageModule } from './stage';
import { createLowPassProcessor } from '../simulation/processors/low-pass';

export const lowPassSchema = z
  .object({
    id: stageIdSchema,
    kind: z.literal('lowPass'),
    order: wholeNumber('Filter order', 1, 4),
    corner: quantity('Corner frequency', 'Hz', { above: 0 }, '-3 dB point; DC gain 1'),
    response: filterResponseSchema().default('butterworth'),
    voltageNoise: quantity('Voltage noise density', 'V/rtHz', { atLeast: 0 }, 'Input-referred noise of the active filter, white part, per side'),
    flickerCorner: quantity('Flicker corner', 'Hz', { atLeast: 0 }),
    outputSwing: voltageRange('Output swing', 'the range each output can reach'),
  })
  .describe('Active low-pass after the demodulator: removes the carrier ripple and sets the noise bandwidth');

export type LowPassStage = z.infer<typeof lowPassSchema>;

export const lowPassModule: StageModule<LowPassStage> = {
  kind: 'lowPass',
  label: 'low-pass filter',
  placement: 'either',
  mustBeLast: false,
  schema: lowPassSchema,
  defaults: (id) => ({ id, kind: 'lowPass', order: 2, corner: 500, response: 'butterworth', voltageNoise: 8e-9, flickerCorner: 2e3, outputSwing: [0.1, 4.9] }),
  createProcessor: createLowPassProcessor,
  prepare(p, context) {
    const filter = analogFilter('lowPass', p.response, p.order, p.corner);
    const white = p.voltageNoise * p.voltageNoise;
    const ripplePower = filter.power(2 * context.carrierFrequency);
    const target = { stage: p.id, path: context.path };
    return {
      id: p.id,
      kind: p.kind,
      path: context.path,
      domain: context.domain,
      flatGain: 1,
      poles: filter.poles,
      noiseSources: [
        // One filter per side: their noise adds in power.
        { source: 'voltage noise', density: (f) => 2 * white * filter.power(f) },
        { source: 'voltage flicker noise (1/f)', density: (f) => ((2 * white * p.flickerCorner) / Math.max(f, FREQUENCY_FLOOR)) * filter.power(f) },
      ],
      swing: { low: p.outputSwing[0], high: p.outputSwing[1], centre: context.supply / 2 },
      levelKind: 'differential',
      demodulatorPhase: null,
      converter: null,
      multiplyResponse: filter.multiply,
      responsePower: filter.power,
      findings(view) {
        if (context.domain !== 'baseband' || view.rippleOutputPeak <= view.outputNoiseRms || view.rippleOutputPeak === 0) return [];
        // The ripple scales with |H(2 f0)|: the corner that brings it down to the noise.
        const needed = Math.sqrt(ripplePower) * (view.outputNoiseRms / view.rippleOutputPeak);
        const corner = cornerForMagnitude('lowPass', p.response, p.order, 2 * context.carrierFrequency, needed);
        const orderHint = p.order < 4 ? `raise the order to ${p.order + 1} or ` : '';
        return [
          finding('warning', 'carrier-ripple', target, 'corner', `Carrier ripple of ${formatQuantity(view.rippleOutputPeak, 'voltage')} peak after the low-pass exceeds the output noise of ${formatQuantity(view.outputNoiseRms, 'voltage')} rms`, [number('ripple', view.rippleOutputPeak, 'V'), number('output noise', view.outputNoiseRms, 'V'), number('gain at twice the carrier', Math.sqrt(ripplePower), '')], `${orderHint}lower the corner below ${formatQuantity(corner, 'frequency')} (ratio ${digits(view.rippleOutputPeak / view.outputNoiseRms)})`),
        ];
      },
    };
  },
};

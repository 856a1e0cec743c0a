import { z } from 'zod';
import { filterResponseSchema, quantity, stageIdSchema, wholeNumber } from '../../contracts/fields';
import { analogFilter, cornerForMagnitude } from '../filters/analog-response';
import { digits, finding, number } from '../findings';
import { formatQuantity } from '../../units/format';
import type { StageModule } from './stage';
import { createHighPassProcessor } from '../simulation/processors/high-pass';

export const highPassSchema = z
  .object({
    id: stageIdSchema,
    kind: z.literal('highPass'),
    order: wholeNumber('Filter order', 1, 4),
    corner: quantity('Corner frequency', 'Hz', { above: 0 }, '-3 dB point'),
    response: filterResponseSchema().default('butterworth'),
  })
  .describe('Passive high-pass ahead of the demodulator: removes amplifier offset and flicker noise from the carrier path');

export type HighPassStage = z.infer<typeof highPassSchema>;

/** The carrier may lose at most 1 % to the high-pass. */
const CARRIER_PASS = 0.99;

export const highPassModule: StageModule<HighPassStage> = {
  kind: 'highPass',
  label: 'high-pass filter',
  placement: 'carrier',
  mustBeLast: false,
  schema: highPassSchema,
  defaults: (id) => ({ id, kind: 'highPass', order: 2, corner: 5e3, response: 'butterworth' }),
  createProcessor: createHighPassProcessor,
  prepare(p, context) {
    const filter = analogFilter('highPass', p.response, p.order, p.corner);
    const carrier = context.carrierFrequency;
    const carrierGain = Math.sqrt(filter.power(carrier));
    const target = { stage: p.id, path: context.path };
    return {
      id: p.id,
      kind: p.kind,
      path: context.path,
      domain: context.domain,
      flatGain: 1,
      poles: [],
      noiseSources: [],
      swing: null,
      levelKind: 'differential',
      demodulatorPhase: null,
      converter: null,
      multiplyResponse: filter.multiply,
      responsePower: filter.power,
      findings() {
        if (carrierGain >= CARRIER_PASS) return [];
        const corner = cornerForMagnitude('highPass', p.response, p.order, carrier, CARRIER_PASS);
        return [
          finding('warning', 'high-pass-attenuates-carrier', target, 'corner', `The high-pass takes ${digits((1 - carrierGain) * 100)} % off the carrier at ${formatQuantity(carrier, 'frequency')}`, [number('gain at the carrier', carrierGain, ''), number('corner', p.corner, 'Hz')], `lower the corner below ${formatQuantity(corner, 'frequency')}`),
        ];
      },
    };
  },
};

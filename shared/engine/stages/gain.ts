import { z } from 'zod';
import { quantity, stageIdSchema, voltageRange } from '../../contracts/fields';
import { FREQUENCY_FLOOR, TWO_PI } from '../constants';
import type { StageModule } from './stage';
import { createGainProcessor } from '../simulation/processors/gain';

export const gainSchema = z
  .object({
    id: stageIdSchema,
    kind: z.literal('gain'),
    gain: quantity('Gain', '', { atLeast: 1 }, 'Non-inverting voltage gain G [V/V]'),
    gainBandwidth: quantity('Gain-bandwidth product', 'Hz', { above: 0 }, 'Of the op-amp; the stage pole sits at GBW / G'),
    voltageNoise: quantity('Voltage noise density', 'V/rtHz', { atLeast: 0 }, 'Op-amp input voltage noise, white part; appears times G at the output'),
    flickerCorner: quantity('Flicker corner', 'Hz', { atLeast: 0 }),
    outputSwing: voltageRange('Output swing', 'the range each output can reach'),
  })
  .describe('Non-inverting gain stage');

export type GainStage = z.infer<typeof gainSchema>;

export const gainModule: StageModule<GainStage> = {
  kind: 'gain',
  label: 'gain stage',
  placement: 'either',
  mustBeLast: false,
  schema: gainSchema,
  defaults: (id) => ({ id, kind: 'gain', gain: 4, gainBandwidth: 1e7, voltageNoise: 8e-9, flickerCorner: 2e3, outputSwing: [0.1, 4.9] }),
  createProcessor: createGainProcessor,
  prepare(p, context) {
    const pole = p.gainBandwidth / p.gain;
    const white = p.voltageNoise * p.voltageNoise * p.gain * p.gain;
    const shapePower = (f: number) => 1 / (1 + (f / pole) ** 2);
    return {
      id: p.id,
      kind: p.kind,
      path: context.path,
      domain: context.domain,
      flatGain: p.gain,
      poles: [{ re: -TWO_PI * pole, im: 0 }],
      noiseSources: [
        // Two amplifiers, one per side: their noise adds in power.
        { source: 'voltage noise', density: (f) => 2 * white * shapePower(f) },
        { source: 'voltage flicker noise (1/f)', density: (f) => ((2 * white * p.flickerCorner) / Math.max(f, FREQUENCY_FLOOR)) * shapePower(f) },
      ],
      swing: { low: p.outputSwing[0], high: p.outputSwing[1], centre: context.supply / 2 },
      levelKind: 'differential',
      demodulatorPhase: null,
      converter: null,
      multiplyResponse(f, value) {
        const y = f / pole;
        const s = 1 / (1 + y * y);
        const re = (value.re + value.im * y) * s;
        value.im = (value.im - value.re * y) * s;
        value.re = re;
      },
      responsePower: shapePower,
      findings: () => [],
    };
  },
};

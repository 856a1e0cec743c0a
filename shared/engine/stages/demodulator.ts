import { z } from 'zod';
import { quantity, stageIdSchema } from '../../contracts/fields';
import { digits, finding, number } from '../findings';
import type { Finding } from '../../contracts/findings';
import type { StageModule } from './stage';
import { createDemodulatorProcessor } from '../simulation/processors/demodulator';

export const demodulatorSchema = z
  .object({
    id: stageIdSchema,
    kind: z.literal('demodulator'),
    phase: quantity('Reference phase', 'deg', { atLeast: -360, atMost: 360 }, 'Of the +/-1 switching reference against the excitation, in degrees'),
  })
  .describe('Switching demodulator: multiplies by a +/-1 square wave at the carrier frequency');

export type DemodulatorStage = z.infer<typeof demodulatorSchema>;

/** A reference phase costing more than 2 % of the best gain is worth a note. */
const PHASE_LOSS = 0.98;
/** Below 5 % of the best gain the chain has practically no sensitivity. */
const NO_GAIN = 0.05;

export const demodulatorModule: StageModule<DemodulatorStage> = {
  kind: 'demodulator',
  label: 'demodulator',
  placement: 'either',
  mustBeLast: false,
  schema: demodulatorSchema,
  defaults: (id) => ({ id, kind: 'demodulator', phase: 0 }),
  createProcessor: createDemodulatorProcessor,
  prepare(p, context) {
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
      demodulatorPhase: (p.phase * Math.PI) / 180,
      converter: null,
      multiplyResponse: () => undefined,
      responsePower: () => 1,
      findings(view) {
        const out: Finding[] = [];
        const numbers = [number('demodulator gain', view.demodulatorGain, ''), number('best gain', view.bestDemodulatorGain, ''), number('best phase', view.bestPhase, 'deg')];
        if (Math.abs(view.demodulatorGain) < NO_GAIN * view.bestDemodulatorGain) {
          out.push(finding('error', 'demodulator-no-gain', target, 'phase', `At this reference phase the demodulator keeps under ${NO_GAIN * 100} % of its best gain: the signal is all but lost`, numbers, `set the phase to ${digits(view.bestPhase)} deg`));
        } else if (Math.abs(view.demodulatorGain) < PHASE_LOSS * view.bestDemodulatorGain) {
          out.push(finding('note', 'demodulator-phase', target, 'phase', `The reference phase keeps ${digits((Math.abs(view.demodulatorGain) / view.bestDemodulatorGain) * 100)} % of the best demodulator gain`, numbers, `set the phase to ${digits(view.bestPhase)} deg`));
        }
        return out;
      },
    };
  },
};

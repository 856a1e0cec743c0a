import { z } from 'zod';
import { quantity } from './fields';
import { fieldErrorsFromZod, type FieldError } from './problem';
import { excitationSchema } from '../engine/stages/excitation';
import { sensorSchema } from '../engine/stages/sensor';
import { stageRegistry, type StageRegistry } from '../engine/stages/registry';
import type { AdcStage } from '../engine/stages/adc';
import type { ChargeAmplifierStage } from '../engine/stages/charge-amplifier';
import type { DemodulatorStage } from '../engine/stages/demodulator';
import type { GainStage } from '../engine/stages/gain';
import type { HighPassStage } from '../engine/stages/high-pass';
import type { LowPassStage } from '../engine/stages/low-pass';

/** A chain entry of the built-in kinds (a custom registry's kinds travel through the same array). */
export type ChainStage = ChargeAmplifierStage | GainStage | HighPassStage | DemodulatorStage | LowPassStage | AdcStage;

/** Identifies a Quietbridge design document and the format version this code writes. */
export const DESIGN_FORMAT = 'quietbridge.design';
export const DESIGN_FORMAT_VERSION = 1;

export const environmentSchema = z
  .object({ temperature: quantity('Temperature', 'K', { above: 0 }, 'Of the electronics, for thermal noise').default(300) })
  .describe('Operating conditions');

export const analysisSchema = z
  .object({
    bandLow: quantity('Noise band low end', 'Hz', { above: 0 }).default(0.1),
    bandHigh: quantity('Noise band high end', 'Hz', { above: 0 }, 'null: where the baseband response has fallen by 60 dB (the whole output noise)').nullable().default(null),
    operatingPoint: quantity('Operating point', 'Pa or m^3/s', { atLeast: 0 }, 'Measurand value at which slopes and resolution are taken').default(0),
  })
  .superRefine((analysis, context) => {
    if (analysis.bandHigh !== null && analysis.bandHigh <= analysis.bandLow) {
      context.addIssue({ code: 'custom', path: ['bandHigh'], message: 'Noise band high end must be above its low end' });
    }
  })
  .describe('What the budget integrates over and where it takes slopes');

/** One chain entry of any registered kind, checked by that kind's own schema. */
function stageSchema(registry: StageRegistry) {
  const kinds = registry.kinds.join(', ');
  const options = registry.modules.map((m) => m.schema) as unknown as [z.ZodObject<{ kind: z.ZodLiteral<string> }>, ...z.ZodObject<{ kind: z.ZodLiteral<string> }>[]];
  return z.discriminatedUnion('kind', options, {
    error: (issue) => {
      if (issue.code === 'invalid_union') return `Stage kind must be one of ${kinds}`;
      if (issue.code === 'invalid_type') return 'Stage must be an object with a kind';
      return undefined;
    },
  });
}

function chainSchema(registry: StageRegistry) {
  return z
    .array(stageSchema(registry), { error: 'Chain must be a list of stages' })
    .min(3, 'Chain needs at least a charge amplifier, a demodulator and one more stage')
    .max(32, 'Chain holds at most 32 stages')
    .transform((stages) => stages as unknown as ChainStage[])
    .superRefine((chain, context) => {
      const issue = (index: number, field: string, message: string) => context.addIssue({ code: 'custom', path: [index, field], message });
      if (chain[0].kind !== 'chargeAmplifier') issue(0, 'kind', 'The chain must start with a charge amplifier');
      const demodulators = chain.flatMap((stage, index) => (stage.kind === 'demodulator' ? [index] : []));
      if (demodulators.length !== 1) {
        context.addIssue({ code: 'custom', path: [], message: `The chain needs exactly one demodulator, it has ${demodulators.length}` });
      }
      const split = demodulators[0] ?? chain.length;
      const seen = new Set<string>();
      chain.forEach((stage, index) => {
        if (seen.has(stage.id)) issue(index, 'id', `Stage id "${stage.id}" is used twice; ids must be unique`);
        seen.add(stage.id);
        const stageModule = registry.get(stage.kind);
        if (stageModule === undefined) return;
        if (stage.kind === 'chargeAmplifier' && index !== 0) issue(index, 'kind', 'Only one charge amplifier, first in the chain');
        if (stageModule.placement === 'carrier' && index > split) issue(index, 'kind', `A ${stageModule.label} must sit before the demodulator`);
        if (stageModule.placement === 'baseband' && index < split) issue(index, 'kind', `A ${stageModule.label} must sit after the demodulator`);
        if (stageModule.mustBeLast && index !== chain.length - 1) issue(index, 'kind', `A ${stageModule.label} must end the chain`);
      });
    })
    .describe('Ordered readout chain: a charge amplifier first, exactly one demodulator, an ADC (if any) last');
}

export function createDesignSchema(registry: StageRegistry) {
  return z
    .object({
      format: z.literal(DESIGN_FORMAT, { error: `Format must be "${DESIGN_FORMAT}"` }).describe('Identifies a Quietbridge design document'),
      version: z.literal(DESIGN_FORMAT_VERSION, { error: `Version must be ${DESIGN_FORMAT_VERSION}` }).describe('Format version of this document; older versions are upgraded on load'),
      name: z.string({ error: 'Name must be text' }).trim().min(1, 'Name is required').max(200, 'Name must be at most 200 characters'),
      notes: z.string({ error: 'Notes must be text' }).max(20000, 'Notes must be at most 20000 characters').default(''),
      environment: environmentSchema.default({ temperature: 300 }),
      sensor: sensorSchema,
      excitation: excitationSchema,
      chain: chainSchema(registry),
      analysis: analysisSchema.default({ bandLow: 0.1, bandHigh: null, operatingPoint: 0 }),
    })
    .superRefine((design, context) => {
      if (design.analysis.operatingPoint > design.sensor.fullScale) {
        context.addIssue({ code: 'custom', path: ['analysis', 'operatingPoint'], message: 'Operating point must lie within the full scale' });
      }
    })
    .meta({ id: 'Design' });
}

/** The design document, format version 1 (ENGINE.md section 2), with every registered stage kind. */
export const designSchema = createDesignSchema(stageRegistry);

export type Design = z.infer<typeof designSchema>;
export type DesignInput = z.input<typeof designSchema>;

export type DesignValidation = { ok: true; design: Design } | { ok: false; errors: FieldError[] };

/** Checks a current-version document; the errors carry paths like `chain[2].corner`. */
export function validateDesign(document: unknown, schema = designSchema): DesignValidation {
  const result = schema.safeParse(document);
  return result.success ? { ok: true, design: result.data } : { ok: false, errors: fieldErrorsFromZod(result.error) };
}

import { z } from 'zod';

export const findingSeverities = ['error', 'warning', 'note'] as const;

/** One number behind a finding, in SI units. */
export const findingNumberSchema = z.object({
  name: z.string().describe('What the number is, e.g. "carrier ripple"'),
  value: z.number().describe('The value in the SI unit given beside it'),
  unit: z.string().describe('SI unit of the value, e.g. "V", "Hz", "F"; empty for a ratio'),
});

/** A check of the design that did not pass cleanly (ENGINE.md section 7): data the UI lists and versions keep. */
export const findingSchema = z
  .object({
    severity: z.enum(findingSeverities).describe('error: the design does not work as meant; warning: it works with a penalty; note: worth knowing'),
    code: z.string().describe('Stable identifier of the check, e.g. "carrier-ripple"'),
    stage: z.string().describe('Stage id from the chain, or "sensor", "excitation", "environment", "analysis"'),
    field: z.string().describe('Field inside that stage the finding is about, e.g. "corner"'),
    path: z.string().describe('Path of that field in the design document, e.g. "chain[4].corner"'),
    message: z.string().describe('One line in the trade\'s words'),
    numbers: z.array(findingNumberSchema).describe('The numbers behind the finding'),
    suggestion: z.string().nullable().describe('A change that would clear it, or null when none is known'),
  })
  .meta({ id: 'Finding' });

export type FindingSeverity = (typeof findingSeverities)[number];
export type FindingNumber = z.infer<typeof findingNumberSchema>;
export type Finding = z.infer<typeof findingSchema>;

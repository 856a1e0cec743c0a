import { z } from 'zod';

/**
 * Builders for the numeric fields of a design document: each field carries its SI unit in its
 * description and says what is wrong in a designer's words ("Feedback capacitance must be above 0 F").
 */
export interface QuantityBounds {
  /** Strict lower bound: the value must be above it. */
  above?: number;
  /** Inclusive lower bound. */
  atLeast?: number;
  /** Inclusive upper bound. */
  atMost?: number;
}

export function quantity(label: string, unit: string, bounds: QuantityBounds, description = ''): z.ZodNumber {
  const unitText = unit === '' ? '' : ` ${unit}`;
  let schema = z.number({ error: `${label} must be a number${unit === '' ? '' : ` in ${unit}`}` });
  if (bounds.above !== undefined) schema = schema.gt(bounds.above, `${label} must be above ${bounds.above}${unitText}`);
  if (bounds.atLeast !== undefined) schema = schema.gte(bounds.atLeast, `${label} must be at least ${bounds.atLeast}${unitText}`);
  if (bounds.atMost !== undefined) schema = schema.lte(bounds.atMost, `${label} must be at most ${bounds.atMost}${unitText}`);
  const unitNote = unit === '' ? '' : ` [${unit}]`;
  return schema.describe(`${label}${unitNote}${description === '' ? '' : `. ${description}`}`);
}

export function wholeNumber(label: string, atLeast: number, atMost: number, description = ''): z.ZodNumber {
  return z
    .number({ error: `${label} must be a whole number` })
    .int(`${label} must be a whole number`)
    .gte(atLeast, `${label} must be at least ${atLeast}`)
    .lte(atMost, `${label} must be at most ${atMost}`)
    .describe(`${label}${description === '' ? '' : `. ${description}`}`);
}

/** A [low, high] voltage range, low below high. */
export function voltageRange(label: string, description: string) {
  return z
    .tuple([quantity(`${label} low end`, 'V', {}), quantity(`${label} high end`, 'V', {})], {
      error: `${label} must be two voltages [low, high] in V`,
    })
    .refine(([low, high]) => high > low, { message: `${label} must have its high end above its low end` })
    .describe(`${label} [V, V]: ${description}`);
}

/** Stage identifier: short, unique in the chain, used in findings and paths. */
export const stageIdSchema = z
  .string({ error: 'Stage id must be text' })
  .regex(/^[A-Za-z][A-Za-z0-9_-]{0,31}$/, 'Stage id must start with a letter and hold up to 32 letters, digits, "-" or "_"')
  .describe('Stage identifier, unique in the chain (e.g. "ca", "lp")');

export function filterResponseSchema() {
  return z
    .enum(['butterworth', 'bessel', 'critical'], { error: 'Response must be butterworth, bessel or critical' })
    .describe('Filter response: butterworth (flat), bessel (linear phase, by magnitude at the corner) or critical (equal real poles)');
}

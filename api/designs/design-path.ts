import { z } from 'zod';

/** `:id` of a design in a route path. */
export const designPathSchema = z.object({ id: z.string().uuid('Design id must be a UUID') });

/** `:id/versions/:number` of a design version in a route path. */
export const versionPathSchema = designPathSchema.extend({
  number: z.coerce.number({ error: 'Version number must be a number' }).int('Version number must be a whole number').min(1, 'Version number must be at least 1'),
});

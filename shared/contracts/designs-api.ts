import { z } from 'zod';
import { DESIGN_NAME_MAX_LENGTH } from './constants';

/** The figures kept with every saved version, computed by the shared engine on save (SI units). */
export const keyFiguresSchema = z
  .object({
    voltsPerFarad: z.number().nullable().describe('Output sensitivity to differential capacitance [V/F]'),
    resolution: z.object({
      farad: z.number().nullable().describe('Resolution in differential capacitance [F]'),
      pascal: z.number().nullable().describe('Resolution in pressure [Pa]'),
      cubicMetrePerSecond: z.number().nullable().describe('Resolution in flow [m^3/s]; flow mode only'),
      bandLow: z.number().describe('Band of the resolution, low end [Hz]'),
      bandHigh: z.number().describe('Band of the resolution, high end [Hz]'),
    }),
    outputNoiseRms: z.number().describe('Total output noise over the band [V rms]'),
    worstHeadroom: z
      .object({ node: z.string(), usedFraction: z.number().describe('Peak over the room to the nearer limit [1]') })
      .nullable()
      .describe('The node closest to clipping'),
    ripplePeak: z.number().describe('Carrier ripple at the output [V peak]'),
    findings: z.object({ error: z.number().int(), warning: z.number().int(), note: z.number().int() }).describe('Counts of findings by severity'),
  })
  .meta({ id: 'KeyFigures' });
export type KeyFigures = z.infer<typeof keyFiguresSchema>;

const personSchema = z.object({ id: z.string().uuid(), displayName: z.string(), email: z.string() });

export const versionSummarySchema = z
  .object({
    number: z.number().int().describe('Version number, 1 for the first; gapless per design'),
    message: z.string().describe('What changed, as the author wrote it'),
    author: personSchema,
    createdAt: z.string().describe('ISO 8601 time'),
    formatVersion: z.number().int().describe('Design format version of the stored document'),
    engineVersion: z.string().describe('Version of the engine that computed the figures'),
    figures: keyFiguresSchema,
  })
  .meta({ id: 'VersionSummary' });
export type VersionSummary = z.infer<typeof versionSummarySchema>;

export const versionSchema = versionSummarySchema
  .extend({ designId: z.string().uuid(), document: z.record(z.string(), z.unknown()).describe('The design document, format version 1') })
  .meta({ id: 'Version' });
export type Version = z.infer<typeof versionSchema>;

export const designSummarySchema = z
  .object({
    id: z.string().uuid(),
    name: z.string(),
    owner: personSchema,
    archived: z.boolean(),
    latestVersion: z.number().int(),
    createdAt: z.string(),
    updatedAt: z.string().describe('Time of the latest change (version saved, renamed, archived)'),
    latest: versionSummarySchema.describe('The latest version'),
    latestReview: z
      .object({
        state: z.enum(['pending', 'approved', 'changes_requested']),
        versionNumber: z.number().int(),
      })
      .nullable()
      .describe('The most recent review request of any of its versions, with its state; null when none was shared'),
  })
  .meta({ id: 'DesignSummary' });
export type DesignSummary = z.infer<typeof designSummarySchema>;

const designNameSchema = z
  .string({ error: (issue) => (issue.input === undefined ? 'Name is required' : 'Name must be text') })
  .trim()
  .min(1, 'Name is required')
  .max(DESIGN_NAME_MAX_LENGTH, `Name must be at most ${DESIGN_NAME_MAX_LENGTH} characters`);

const messageSchema = z
  .string({ error: 'Message must be text' })
  .trim()
  .max(2000, 'Message must be at most 2000 characters');

export const createDesignSchema = z
  .object({
    name: designNameSchema,
    document: z.unknown().describe('A design document (format version 1, or an older one that is upgraded)'),
    message: messageSchema.default('First version'),
  })
  .strict()
  .meta({ id: 'CreateDesign' });
export type CreateDesign = z.input<typeof createDesignSchema>;

export const updateDesignSchema = z
  .object({
    name: designNameSchema.optional(),
    archived: z.boolean({ error: 'Archived must be true or false' }).optional(),
  })
  .strict()
  .refine((value) => value.name !== undefined || value.archived !== undefined, { message: 'Give a name or archived' })
  .meta({ id: 'UpdateDesign' });
export type UpdateDesign = z.input<typeof updateDesignSchema>;

export const saveVersionSchema = z
  .object({
    document: z.unknown().describe('The design document to save'),
    message: messageSchema.min(1, 'Message is required: say what changed'),
    baseVersion: z
      .number({ error: 'Base version must be the number of the version you edited' })
      .int('Base version must be a whole number')
      .min(1, 'Base version must be at least 1'),
  })
  .strict()
  .meta({ id: 'SaveVersion' });
export type SaveVersion = z.input<typeof saveVersionSchema>;

export const designSortKeys = ['name', 'updatedAt', 'createdAt', 'latestVersion'] as const;

export const listDesignsQuerySchema = z.object({
  page: z.coerce.number({ error: 'Page must be a number' }).int('Page must be a whole number').min(0, 'Page must be 0 or more').default(0),
  pageSize: z.coerce.number({ error: 'Page size must be a number' }).int().min(1, 'Page size must be at least 1').max(200, 'Page size must be at most 200').default(50),
  sort: z.enum(designSortKeys, { error: `Sort must be one of ${designSortKeys.join(', ')}` }).default('updatedAt'),
  order: z.enum(['asc', 'desc'], { error: 'Order must be asc or desc' }).default('desc'),
  q: z.string().max(200, 'Search must be at most 200 characters').optional(),
  archived: z.enum(['false', 'true', 'all'], { error: 'Archived must be false, true or all' }).default('false'),
});

export const designListSchema = z
  .object({ items: z.array(designSummarySchema), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() })
  .meta({ id: 'DesignList' });
export type DesignList = z.infer<typeof designListSchema>;

/** The 409 answer to a save on a stale base: nothing was written; the newer version is named. */
export const versionConflictSchema = z
  .object({
    status: z.literal(409),
    title: z.string(),
    detail: z.string(),
    errors: z.array(z.object({ path: z.string(), message: z.string() })),
    latestVersion: z.number().int().describe('The newest version, which the client should compare against'),
  })
  .meta({ id: 'VersionConflict' });

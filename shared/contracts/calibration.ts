import { z } from 'zod';

/**
 * Bench-data uploads for calibration (ENGINE.md section 6). Values are stored in SI units; the
 * units below are what a bench file may be written in, each with its factor to SI.
 */

export interface BenchUnit {
  /** The SI unit the value is stored in. */
  readonly si: 'Pa' | 'm^3/s' | 'V' | 'F' | 'count';
  /** SI value = file value * scale. */
  readonly scale: number;
}

/** Units a reference instrument reports in: pressure or volume flow. */
export const referenceUnits = {
  Pa: { si: 'Pa', scale: 1 },
  kPa: { si: 'Pa', scale: 1e3 },
  MPa: { si: 'Pa', scale: 1e6 },
  mbar: { si: 'Pa', scale: 1e2 },
  bar: { si: 'Pa', scale: 1e5 },
  'm^3/s': { si: 'm^3/s', scale: 1 },
  'mL/min': { si: 'm^3/s', scale: 1e-6 / 60 },
  'uL/s': { si: 'm^3/s', scale: 1e-9 },
  'nL/s': { si: 'm^3/s', scale: 1e-12 },
} as const satisfies Record<string, BenchUnit>;

/** Units a device under test reports in: a voltage, a capacitance or ADC counts. */
export const readoutUnits = {
  V: { si: 'V', scale: 1 },
  mV: { si: 'V', scale: 1e-3 },
  uV: { si: 'V', scale: 1e-6 },
  pF: { si: 'F', scale: 1e-12 },
  fF: { si: 'F', scale: 1e-15 },
  aF: { si: 'F', scale: 1e-18 },
  count: { si: 'count', scale: 1 },
} as const satisfies Record<string, BenchUnit>;

export type ReferenceUnit = keyof typeof referenceUnits;
export type ReadoutUnit = keyof typeof readoutUnits;

/** Largest bench file the API accepts [bytes]. */
export const MAX_DATASET_BYTES = 2 * 1024 * 1024;
/** Most data rows in one file. */
export const MAX_DATASET_ROWS = 50_000;

const referenceUnitNames = Object.keys(referenceUnits) as [ReferenceUnit, ...ReferenceUnit[]];
const readoutUnitNames = Object.keys(readoutUnits) as [ReadoutUnit, ...ReadoutUnit[]];

const columnName = (what: string) =>
  z
    .string({ error: `Choose the ${what} column` })
    .trim()
    .min(1, `Choose the ${what} column`)
    .max(200, 'Column names are at most 200 characters');

/** An optional form field: an empty string means "not given". */
const optionalText = (max: number, message: string) =>
  z
    .string()
    .trim()
    .max(max, message)
    .optional()
    .transform((value) => (value === '' ? undefined : value));

/** Which file column holds what; sent as multipart form fields beside the file. */
export const columnMappingSchema = z
  .object({
    name: optionalText(200, 'Name must be at most 200 characters').describe('Dataset name; default: the file name'),
    notes: optionalText(2000, 'Notes must be at most 2000 characters').describe('Free text kept with the dataset'),
    referenceColumn: columnName('reference'),
    referenceUnit: z.enum(referenceUnitNames, { error: `Reference unit must be one of ${referenceUnitNames.join(', ')}` }),
    readoutColumn: columnName('readout'),
    readoutUnit: z.enum(readoutUnitNames, { error: `Readout unit must be one of ${readoutUnitNames.join(', ')}` }),
    cellColumn: columnName('cell id'),
    runColumn: columnName('run id'),
    directionColumn: columnName('direction'),
    timeColumn: optionalText(200, 'Column names are at most 200 characters').describe('Column of the time in seconds, optional'),
  })
  .strict()
  .meta({ id: 'ColumnMapping' });
export type ColumnMapping = z.output<typeof columnMappingSchema>;
export type ColumnMappingInput = z.input<typeof columnMappingSchema>;

/** The preview accepts any part of the mapping: the rows are checked for the columns that are mapped. */
export const previewMappingSchema = columnMappingSchema.partial().meta({ id: 'PreviewMapping' });

export const benchPointSchema = z
  .object({
    reference: z.number().describe('Reference value [SI: Pa or m^3/s]'),
    readout: z.number().describe('Readout [SI: V, F or count]'),
    cell: z.string(),
    run: z.string(),
    direction: z.enum(['up', 'down']),
    time: z.number().nullable().describe('Time [s], null when the file has none'),
    row: z.number().int().describe('Row of the file the point came from (the header is row 1)'),
  })
  .meta({ id: 'BenchPoint' });
export type BenchPoint = z.infer<typeof benchPointSchema>;

const unitsSchema = z.object({
  reference: z.string().describe('SI unit the reference values are stored in'),
  referenceDisplay: z.string().describe('Unit the file was written in, for display'),
  readout: z.string().describe('SI unit the readouts are stored in'),
  readoutDisplay: z.string().describe('Unit the file was written in, for display'),
});

export const datasetSummarySchema = z
  .object({
    id: z.string().uuid(),
    designId: z.string().uuid(),
    name: z.string(),
    notes: z.string(),
    fileName: z.string(),
    fileSize: z.number().int().describe('Size of the original file [bytes]'),
    pointCount: z.number().int(),
    cells: z.array(z.string()).describe('Cell ids in natural order'),
    runs: z.array(z.string()),
    units: unitsSchema,
    referenceRange: z.object({ min: z.number(), max: z.number() }).describe('Range of the reference values [SI]'),
    mapping: z.record(z.string(), z.string()).describe('The column mapping the file was read with'),
    createdBy: z.object({ id: z.string().uuid(), displayName: z.string() }),
    createdAt: z.string(),
  })
  .meta({ id: 'DatasetSummary' });
export type DatasetSummary = z.infer<typeof datasetSummarySchema>;

export const datasetSchema = datasetSummarySchema.extend({ points: z.array(benchPointSchema) }).meta({ id: 'Dataset' });
export type Dataset = z.infer<typeof datasetSchema>;

export const datasetListSchema = z.object({ items: z.array(datasetSummarySchema) }).meta({ id: 'DatasetList' });

export const datasetPreviewSchema = z
  .object({
    fileName: z.string(),
    columns: z.array(z.string()).describe('Header of the file'),
    delimiter: z.string(),
    rowCount: z.number().int().describe('Data rows in the file'),
    rows: z.array(z.record(z.string(), z.string())).describe('The first rows as text, by column'),
    points: z.array(benchPointSchema).describe('The first rows read with the mapping, when it is complete'),
    errors: z.array(z.object({ path: z.string(), message: z.string() })).describe('Row-level problems, the first 100'),
    errorCount: z.number().int(),
    complete: z.boolean().describe('True when the mapping is complete, so the rows were checked in full'),
  })
  .meta({ id: 'DatasetPreview' });
export type DatasetPreview = z.infer<typeof datasetPreviewSchema>;

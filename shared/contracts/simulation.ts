import { z } from 'zod';

/**
 * What a time-domain simulation run is asked to do (ENGINE.md section 5): the input profile in the
 * measurand's unit (Pa in pressure mode, m^3/s in flow mode), the sample rate as samples per carrier
 * period, the duration, the seed and which waveforms to keep. Shared by the CLI, the worker and the
 * engine; the result holds typed arrays and is described in shared/engine/simulation/result.ts.
 */

const measurand = (label: string) => z.number({ error: `${label} must be a number in Pa or m^3/s` }).describe(`${label} [Pa or m^3/s]`);
const seconds = (label: string) =>
  z.number({ error: `${label} must be a number in s` }).gte(0, `${label} must be at least 0 s`).describe(`${label} [s]`);

export const constantProfileSchema = z.object({ kind: z.literal('constant'), value: measurand('Value') }).strict();

export const sineProfileSchema = z
  .object({
    kind: z.literal('sine'),
    offset: measurand('Offset').default(0),
    amplitude: measurand('Amplitude'),
    frequency: z.number({ error: 'Frequency must be a number in Hz' }).gt(0, 'Frequency must be above 0 Hz').describe('Frequency [Hz]'),
    phase: z.number({ error: 'Phase must be a number in deg' }).default(0).describe('Phase at t = 0 [deg]'),
  })
  .strict();

export const stepProfileSchema = z
  .object({
    kind: z.literal('step'),
    time: seconds('Step time'),
    height: measurand('Step height'),
    base: measurand('Level before the step').default(0),
  })
  .strict();

export const rampProfileSchema = z
  .object({
    kind: z.literal('ramp'),
    start: seconds('Ramp start'),
    end: seconds('Ramp end'),
    from: measurand('Level before the ramp'),
    to: measurand('Level after the ramp'),
  })
  .strict()
  .refine((ramp) => ramp.end > ramp.start, { message: 'Ramp end must be after its start', path: ['end'] });

export const piecewiseLinearProfileSchema = z
  .object({
    kind: z.literal('piecewiseLinear'),
    points: z
      .array(z.tuple([seconds('Point time'), measurand('Point value')]), { error: 'Points must be a list of [time, value] pairs' })
      .min(1, 'A piecewise-linear profile needs at least one point')
      .max(100000, 'A piecewise-linear profile holds at most 100000 points')
      .refine((points) => points.every((p, i) => i === 0 || p[0] > points[i - 1][0]), { message: 'Point times must increase' })
      .describe('[time s, value] pairs; the first and last values hold outside them'),
  })
  .strict();

export const inputProfileSchema = z
  .discriminatedUnion('kind', [constantProfileSchema, sineProfileSchema, stepProfileSchema, rampProfileSchema, piecewiseLinearProfileSchema], {
    error: (issue) => (issue.code === 'invalid_union' ? 'Input kind must be constant, sine, step, ramp or piecewiseLinear' : undefined),
  })
  .describe('Measurand against time, in the mode unit');

export type InputProfile = z.infer<typeof inputProfileSchema>;
export type InputProfileInput = z.input<typeof inputProfileSchema>;

/** Default sample rate in samples per carrier period, and the least that resolves the square wave. */
export const DEFAULT_SAMPLES_PER_PERIOD = 64;
export const MIN_SAMPLES_PER_PERIOD = 16;

export const simulationOptionsSchema = z
  .object({
    duration: z.number({ error: 'Duration must be a number in s' }).gt(0, 'Duration must be above 0 s').lte(100, 'Duration must be at most 100 s').describe('Simulated time [s]'),
    samplesPerPeriod: z
      .number({ error: 'Samples per period must be a whole number' })
      .int('Samples per period must be a whole number')
      .gte(MIN_SAMPLES_PER_PERIOD, `Samples per period must be at least ${MIN_SAMPLES_PER_PERIOD}`)
      .lte(4096, 'Samples per period must be at most 4096')
      .default(DEFAULT_SAMPLES_PER_PERIOD)
      .describe('N of fs = N f0 [1]'),
    seed: z.number({ error: 'Seed must be a whole number' }).int('Seed must be a whole number').gte(0, 'Seed must be at least 0').lte(2 ** 32 - 1, 'Seed must be below 2^32').default(1).describe('Seed of every noise generator'),
    noise: z.boolean().default(true).describe('False runs the chain without its noise sources (the ADC still quantizes)'),
    input: inputProfileSchema.optional().describe('Measurand profile; constant at the design operating point when left out'),
    record: z.array(z.string()).default([]).describe('Node ids whose full waveform is returned besides the output node (e.g. "ca.A", "g1")'),
    envelopeColumns: z.number().int().gte(0).lte(20000).default(1000).describe('Columns of the min/max envelope kept for every node; 0 keeps none'),
    sensitivity: z.boolean().default(true).describe('Also measure the DC sensitivity from two constant input levels (two short noise-free runs)'),
    segmentLength: z
      .number()
      .int()
      .gte(16)
      .refine((n) => (n & (n - 1)) === 0, { message: 'Segment length must be a power of two' })
      .optional()
      .describe('Welch segment length of the output spectrum [samples]; chosen from the run length when left out'),
  })
  .describe('A time-domain simulation run');

export type SimulationOptions = z.infer<typeof simulationOptionsSchema>;
export type SimulationOptionsInput = z.input<typeof simulationOptionsSchema>;

export type ParsedInputSpec = { ok: true; profile: InputProfile } | { ok: false; message: string };

const SPEC_HELP =
  'expected constant:VALUE, sine:amplitude=A,frequency=F[,offset=O][,phase=DEG], step:time=T,height=H[,base=B], ' +
  'ramp:start=T0,end=T1,from=V0,to=V1 or pwl:T=V,T=V,...';

/**
 * Reads the CLI's --input SPEC into a profile. Numbers in SI units (s, Hz, Pa or m^3/s).
 * Examples: "constant:3e4", "sine:offset=3e4,amplitude=1e4,frequency=20", "step:time=0.05,height=6e4",
 * "ramp:start=0.1,end=0.3,from=0,to=6e4", "pwl:0=0,0.1=3e4,0.2=3e4,0.3=0".
 */
export function parseInputSpec(spec: string): ParsedInputSpec {
  const colon = spec.indexOf(':');
  if (colon < 0) return { ok: false, message: `Input "${spec}": ${SPEC_HELP}` };
  const kind = spec.slice(0, colon).trim();
  const body = spec.slice(colon + 1).trim();
  const number = (text: string): number => (text.trim() === '' ? Number.NaN : Number(text));
  let candidate: unknown;
  if (kind === 'constant') {
    candidate = { kind, value: number(body.replace(/^value=/, '')) };
  } else if (kind === 'pwl') {
    const points = body.split(',').map((pair) => pair.split('=').map(number));
    if (points.some((p) => p.length !== 2 || p.some((v) => !Number.isFinite(v)))) return { ok: false, message: `Input "${spec}": pwl points are TIME=VALUE pairs separated by commas` };
    candidate = { kind: 'piecewiseLinear', points };
  } else if (kind === 'sine' || kind === 'step' || kind === 'ramp') {
    const fields: Record<string, unknown> = { kind };
    for (const pair of body.split(',')) {
      const [key, value, extra] = pair.split('=');
      if (value === undefined || extra !== undefined || key.trim() === '') return { ok: false, message: `Input "${spec}": "${pair}" is not KEY=VALUE; ${SPEC_HELP}` };
      fields[key.trim()] = number(value);
    }
    candidate = fields;
  } else {
    return { ok: false, message: `Input kind "${kind}" is unknown: ${SPEC_HELP}` };
  }
  const parsed = inputProfileSchema.safeParse(candidate);
  if (parsed.success) return { ok: true, profile: parsed.data };
  const issue = parsed.error.issues[0];
  const where = issue.path.length > 0 ? `${issue.path.join('.')}: ` : '';
  return { ok: false, message: `Input "${spec}": ${where}${issue.message}` };
}

/**
 * Reads (time, value) rows of a CSV file (comma, semicolon or tab separated; a header row and
 * blank lines are skipped) into a piecewise-linear profile.
 */
export function parsePiecewiseLinearCsv(text: string): ParsedInputSpec {
  const points: [number, number][] = [];
  const lines = text.split(/\r?\n/);
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i].trim();
    if (line === '') continue;
    const cells = line.split(/[,;\t]/).map((c) => c.trim());
    const time = Number(cells[0]);
    const value = Number(cells[1]);
    if (cells.length < 2 || cells[0] === '' || cells[1] === '' || !Number.isFinite(time) || !Number.isFinite(value)) {
      if (points.length === 0 && i === lines.findIndex((l) => l.trim() !== '')) continue;
      return { ok: false, message: `Line ${i + 1} is not a (time, value) pair of numbers: "${line}"` };
    }
    points.push([time, value]);
  }
  const parsed = inputProfileSchema.safeParse({ kind: 'piecewiseLinear', points });
  if (parsed.success) return { ok: true, profile: parsed.data };
  return { ok: false, message: parsed.error.issues[0].message };
}

import { z } from 'zod';
import { findingSchema } from './findings';

/**
 * Every figure of the analytic budget (ENGINE.md section 4), SI units. A figure that does not apply
 * (flow figures in pressure mode) or is undefined (zero sensitivity) is null, never left out; an
 * undefined figure comes with a finding that names the parameter.
 */
const figure = (description: string) => z.number().describe(description);
const optionalFigure = (description: string) => z.number().nullable().describe(`${description}; null when it does not apply`);

const perUnitSchema = z.object({
  farad: optionalFigure('In differential capacitance [F]'),
  pascal: optionalFigure('In pressure on cell A [Pa]'),
  cubicMetrePerSecond: optionalFigure('In volume flow [m^3/s]; flow mode only'),
});

export const noiseContributionSchema = z.object({
  stage: z.string().describe('Stage id (or "excitation")'),
  source: z.string().describe('Name of the source, e.g. "voltage noise (noise gain, 1/f)"'),
  outputRms: figure('RMS at the chain output over the noise band [V]'),
  share: figure('Fraction of the total output noise power [1]; all shares sum to 1'),
  inputReferred: perUnitSchema.describe('The same noise referred to the input'),
});

export const nodeLevelSchema = z.object({
  node: z.string().describe('Stage id whose output this is'),
  kind: z.string().describe('Stage kind'),
  domain: z.enum(['carrier', 'baseband']),
  peak: figure('Peak deviation of the signal from the node centre over the full scale [V] (per side for the charge amplifier and differential stages)'),
  centre: figure('Voltage the signal is centred on [V]'),
  swingLow: optionalFigure('Lowest allowed voltage [V]; null for a passive node'),
  swingHigh: optionalFigure('Highest allowed voltage [V]; null for a passive node'),
  usedFraction: optionalFigure('Peak over the room to the nearer limit [1]; above 1 the node clips'),
});

export const budgetSchema = z
  .object({
    mode: z.enum(['pressure', 'flow']),
    sensitivity: z.object({
      voltsPerFarad: figure('Output per differential capacitance S_C = (Vm/Cf) G_pre D G_post [V/F]'),
      voltsPerPascal: figure('Output per pascal on cell A at the operating point [V/Pa]'),
      voltsPerCubicMetrePerSecond: optionalFigure('Output per volume flow at the operating point [V s/m^3]'),
    }),
    demodulatorGain: figure('D: DC gain of the switching demodulator for the square-wave carrier through the pre-demodulator chain [1]'),
    demodulatorHarmonics: z.number().int().describe('Odd carrier harmonics summed for D'),
    harmonicsSummed: z.number().int().describe('Odd carrier harmonics summed in the noise folding'),
    bestDemodulatorPhase: figure('Reference phase giving the largest D [deg]'),
    offset: z.object({
      untrimmedVolts: figure('Output offset at zero measurand with the trim at 1 (counter-pulses of equal amplitude) [V]'),
      settingVolts: figure('Output offset at zero measurand with the design\'s trim [V]'),
      trimmedVolts: optionalFigure('Output offset at zero measurand with the trim DAC at its best code [V]'),
      untrimmedFarad: figure('Offset capacitance with the trim at 1 [F]'),
      residualFarad: optionalFigure('Offset capacitance left at the best code [F]'),
      residualFullScale: optionalFigure('That residual as a fraction of the full-scale capacitance span [1]'),
      idealTrim: optionalFigure('Trim that nulls the offset, (Cr_A - (C0_A - C0_B)) / Cr_B [1]'),
      trimCode: z.number().int().nullable().describe('Trim DAC code nearest the ideal trim; null without Cr_B'),
      trimAtCode: optionalFigure('Trim the best code gives [1]'),
    }),
    noise: z.object({
      outputRms: figure('Total output noise over [bandLow, bandHigh] [V rms]'),
      bandLow: figure('Noise band low end [Hz]'),
      bandHigh: figure('Noise band high end [Hz]'),
      bandHighFromChain: z.boolean().describe('True when bandHigh was set where the baseband response falls by 60 dB'),
      basebandEnbw: figure('Equivalent noise bandwidth of the baseband path over the band [Hz]'),
      contributions: z.array(noiseContributionSchema),
    }),
    resolution: perUnitSchema.extend({
      bandLow: figure('Band of the resolution, low end [Hz]'),
      bandHigh: figure('Band of the resolution, high end [Hz]'),
      fullScaleFraction: optionalFigure('Resolution over the full-scale span [1]'),
    }),
    snr: optionalFigure('Full-scale output span over the output RMS noise [dB]'),
    dynamicRange: optionalFigure('Largest output span before the tightest node clips, over the output RMS noise [dB]'),
    enob: optionalFigure('Effective bits across the full-scale span: (SNR of a full-span sine - 1.76 dB) / 6.02 dB'),
    transfer: z.object({
      measurandUnit: z.enum(['Pa', 'm^3/s']),
      curve: z.array(z.object({ measurand: figure('Measurand [Pa or m^3/s]'), outputVolts: figure('Chain output [V]') })),
      voltsPerUnitAtZero: figure('Slope at zero measurand [V per Pa or V s/m^3]'),
      voltsPerUnitAtFullScale: figure('Slope at full scale [V per Pa or V s/m^3]'),
      outputSpanVolts: figure('Output change from zero to full scale [V]'),
    }),
    levels: z.array(nodeLevelSchema),
    closestToClipping: z.string().nullable().describe('Node with the largest used fraction; null when no node has a swing'),
    ripple: z.object({
      outputPeak: figure('Carrier ripple at the chain output at full scale [V peak]: the peak of the summed waveform of its components at 2 f0, 4 f0, ..., 16 f0'),
      frequency: figure('Lowest ripple frequency, 2 f0 [Hz]'),
    }),
    stepResponse: z.object({
      riseTime: optionalFigure('10-90 % rise time of the baseband path [s]'),
      overshoot: optionalFigure('Overshoot over the final value [1]'),
      settlingTime1Percent: optionalFigure('Time to stay within 1 % of the final value [s]'),
      settlingTime01Percent: optionalFigure('Time to stay within 0.1 % of the final value [s]'),
    }),
    fluidics: z.object({
      hydraulicResistance: optionalFigure('Capillary resistance [Pa s/m^3]; flow mode'),
      pressureDropAtFullScale: optionalFigure('Pressure across the capillary at full-scale flow [Pa]'),
      reynoldsAtFullScale: optionalFigure('Reynolds number at full-scale flow [1]; needs the capillary geometry'),
      commonModeRejection: optionalFigure('Differential slope over the slope mismatch, c1_A / |c1_A - c1_B| [dB]'),
      commonModeFlowPerPascal: optionalFigure('Apparent flow per pascal of line pressure [m^3/s per Pa]'),
    }),
    findings: z.array(findingSchema),
  })
  .meta({ id: 'Budget' });

export type Budget = z.infer<typeof budgetSchema>;
export type NoiseContribution = z.infer<typeof noiseContributionSchema>;
export type NodeLevel = z.infer<typeof nodeLevelSchema>;

import type { z } from 'zod';
import type { Complex } from '../filters/prototype';
import type { Finding } from '../../contracts/findings';

/** Where a stage may sit: before the demodulator (at the carrier), after it (at baseband), or either. */
export type StagePlacement = 'carrier' | 'baseband' | 'either';

/** The side of the demodulator a prepared stage ended up on. */
export type StageDomain = 'carrier' | 'baseband';

/** Common fields of every chain entry. */
export interface StageParameters {
  id: string;
  kind: string;
}

/** What a stage needs to know about the rest of the design when it is prepared. */
export interface StageContext {
  /** Position in the chain and its document path, e.g. "chain[2]". */
  index: number;
  path: string;
  domain: StageDomain;
  /** Carrier (excitation) frequency [Hz]. */
  carrierFrequency: number;
  /** Excitation amplitude Vm [V]. */
  excitationAmplitude: number;
  /** Supply voltage [V]; the output common mode sits at its middle. */
  supply: number;
  temperature: number;
  /** Capacitance to ground on each amplifier input at the operating point, sensing cell + counter-pulse + parasitic [F]. */
  inputCapacitanceA: number;
  inputCapacitanceB: number;
}

/** A noise source of a stage, referred to that stage's output. */
export interface NoiseSource {
  /** Short name in the trade's words, e.g. "voltage noise", "feedback resistor". */
  source: string;
  /** One-sided power spectral density at the stage output [V^2/Hz], for f > 0. */
  density?: (frequency: number) => number;
  /** Noise power in [low, high] [V^2], for sources not spread as a smooth density (quantization). */
  bandPower?: (low: number, high: number) => number;
}

/** Numbers of the finished budget a stage's checks read. */
export interface StageCheckView {
  /** Peak deviation of the signal at this stage's output from its centre [V], and the fraction of the swing used, or null without a swing. */
  levelPeak: number;
  usedFraction: number | null;
  /** Total output RMS noise in the analysis band [V]. */
  outputNoiseRms: number;
  /** Output sensitivity to differential capacitance [V/F]. */
  voltsPerFarad: number;
  /** Resolution relative to the full-scale span (resolution / span), or null when undefined. */
  relativeResolution: number | null;
  /** Carrier ripple left at the chain output [V peak]. */
  rippleOutputPeak: number;
  /** Demodulator gain D and the best D over the reference phase, with the phase [deg] giving it. */
  demodulatorGain: number;
  bestDemodulatorGain: number;
  bestPhase: number;
  /** Output noise power above and below half the ADC sample rate [V^2], when there is an ADC. */
  noiseAboveNyquist: number;
  noiseBelowNyquist: number;
}

/** A stage ready for evaluation: numbers precomputed, functions that only do arithmetic. */
export interface PreparedStage {
  readonly id: string;
  readonly kind: string;
  readonly path: string;
  readonly domain: StageDomain;
  /** Passband gain, kept out of the response so that D sees the shape only (charge amplifier: 1/Cf in V/C). */
  readonly flatGain: number;
  /** Multiplies `value` in place by the normalised response H(f) / flatGain. */
  multiplyResponse(frequency: number, value: Complex): void;
  /** |H(f) / flatGain|^2, the cheap form the noise integration uses. */
  responsePower(frequency: number): number;
  /** Poles of the normalised response [rad/s], for the step response; only baseband stages need them. */
  readonly poles: readonly Complex[];
  readonly noiseSources: readonly NoiseSource[];
  /**
   * How the node's level is judged: each input side on its own (charge amplifier: common-mode plus
   * differential charge), half the differential signal per side, or the converter's differential input.
   */
  readonly levelKind: 'perSide' | 'differential' | 'converter';
  /** Allowed output swing [V] and where the signal is centred in it, or null for a passive node. */
  readonly swing: { low: number; high: number; centre: number } | null;
  /** Reference phase of a demodulator [rad]; null for every other kind. */
  readonly demodulatorPhase: number | null;
  /** Output range, resolution and rate of a converter; null for every other kind. */
  readonly converter: { low: number; high: number; bits: number; sampleRate: number } | null;
  /** The stage's own checks on the finished budget. */
  findings(view: StageCheckView): Finding[];
}

/**
 * A block processor for the time-domain simulation, keeping its own state between blocks. Stage
 * modules may provide one; the analytic budget does not use it.
 */
export interface BlockProcessor {
  process(input: Float64Array, output: Float64Array): void;
  reset(): void;
}

/** One stage kind: its document schema, a default entry, and how it is evaluated. */
export interface StageModule<P extends StageParameters = StageParameters> {
  readonly kind: P['kind'];
  /** Name in a sentence: "charge amplifier". */
  readonly label: string;
  readonly placement: StagePlacement;
  /** True for a stage that must end the chain (the converter). */
  readonly mustBeLast: boolean;
  /** Schema of one chain entry of this kind, `kind` a literal. */
  readonly schema: z.ZodType<P>;
  defaults(id: string): P;
  prepare(parameters: P, context: StageContext): PreparedStage;
  createProcessor?(parameters: P, context: StageContext, sampleRate: number): BlockProcessor;
}

/**
 * What a simulation returns: every node's envelope (and the waveforms asked for) as typed arrays,
 * the output in volts and in the measurand's unit, the measured figures beside the analytic ones,
 * and the clipping findings. SI units throughout.
 */
import type { Finding } from '../../contracts/findings';
import type { InputProfile } from '../../contracts/simulation';
import type { Envelope } from './envelope';
import type { StepMetrics } from './measure';

export type { Envelope } from './envelope';
export type { StepMetrics } from './measure';

export interface SimulatedNode {
  /** "input" (the measurand), "<ca>.A" / "<ca>.B" (each charge amplifier output), or a stage id (differential for every stage after the charge amplifier's sides). */
  id: string;
  /** Stage kind, "input" or "chargeAmplifierSide". */
  kind: string;
  domain: 'input' | 'carrier' | 'baseband';
  /** Unit of the samples: V (per side absolute around mid-supply for the sides, differential V(out+) - V(out-) otherwise), Pa or m^3/s for the input. */
  unit: 'V' | 'Pa' | 'm^3/s';
  /** Rate of this node's samples [Hz]: the simulation's, or the converter's own. */
  sampleRate: number;
  samples: number;
  /** Min/max per display column; null when no columns were asked for. */
  envelope: Envelope | null;
  /** Every sample, when the node was asked for (always for the output node); else null. */
  waveform: Float64Array | null;
  /** Samples limited to the swing or the converter range (each side its own; both sides for the charge amplifier differential node). */
  clippedSamples: number;
}

export interface SimulationFigures {
  /** Output RMS noise over [bandLow, bandHigh] from the Welch PSD of the settled output [V]. */
  outputRms: number;
  /** The budget's noise band [Hz]; bandHigh capped at the output's Nyquist frequency. */
  bandLow: number;
  bandHigh: number;
  /** Welch segment used [samples]. */
  segmentLength: number;
  /** Output change over the change of differential capacitance between two constant input levels [V/F]; null without the sensitivity runs. */
  sensitivityVoltsPerFarad: number | null;
  /** Peak of the carrier-synchronous ripple on the last analog node after settling [V]. */
  ripplePeak: number;
  /** Node the ripple and step metrics were read on (the last one before the converter). */
  rippleNode: string;
  /** Step metrics on that node, for a step input; else null. */
  step: StepMetrics | null;
  /** Time skipped before the figures are measured [s]. */
  settlingTime: number;
}

export interface SimulationResult {
  /** fs = N f0 [Hz], N, samples and the simulated time [s]. */
  sampleRate: number;
  samplesPerPeriod: number;
  samples: number;
  duration: number;
  seed: number;
  noise: boolean;
  input: InputProfile;
  /** Trim the simulated DAC applied (the design's, at the nearest code) [1]. */
  trim: number;
  nodes: SimulatedNode[];
  output: {
    node: string;
    sampleRate: number;
    /** The chain output [V differential]. */
    volts: Float64Array;
    /** The same through the design's transfer curve, in the measurand's unit; null when the curve cannot be inverted. */
    measurand: Float64Array | null;
    unit: 'Pa' | 'm^3/s';
  };
  figures: SimulationFigures;
  /** The analytic budget's figures for the same design, for showing side by side. */
  analytic: {
    outputRms: number;
    sensitivityVoltsPerFarad: number | null;
    ripplePeak: number;
    step: { rise: number | null; overshoot: number | null; settle1: number | null; settle01: number | null };
  };
  findings: Finding[];
}

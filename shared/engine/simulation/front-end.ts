/**
 * Sensor, excitation and counter-pulses: the charge injected into each amplifier input per sample,
 * by charge conservation dq[n] = q[n] - q[n-1] with q = (C_cell - Cr) v on input A and
 * (C_cell - trim Cr) v on input B (the counter-pulse capacitor driven in antiphase), so that the
 * excitation edges and every change of the cell capacitance between them both count.
 *
 * Cell A sees the pressure p (pressure mode) or R_hyd Q (flow mode, the capillary's drop); cell B
 * stays at ambient, as in the analytic budget. The trim is the design's, quantized to the trim
 * DAC's nearest code. Excitation amplitude noise (white, on Vm) drives the cells and the
 * counter-pulses alike, so it multiplies the capacitance the counter-pulses leave uncancelled.
 */
import type { Design } from '../../contracts/design';
import { WhiteNoise } from '../noise/white-noise';
import type { Xoshiro128StarStar } from '../noise/xoshiro128';
import { prepareSensor } from '../stages/sensor';
import { referencePeriod } from './processors/demodulator';

/** The trim the simulated DAC applies: the design's trim at the nearest code of the DAC over [0, 2]. */
export function quantizedTrim(trim: number, trimBits: number): number {
  const codes = 2 ** trimBits;
  const step = 2 / codes;
  return Math.min(codes - 1, Math.max(0, Math.round(trim / step))) * step;
}

export class FrontEnd {
  /** Excitation drive of one carrier period, +1 then -1 (times Vm) [1]. */
  readonly drive: Float64Array;
  readonly trim: number;
  private readonly amplitude: number;
  private readonly pressurePerUnit: number;
  private readonly baseA: number;
  private readonly c1: number;
  private readonly c2: number;
  private readonly c3: number;
  /** C_B - trim Cr_B, constant: cell B stays at ambient [F]. */
  private readonly residualB: number;
  private readonly counterA: number;
  private readonly noise: WhiteNoise | null;
  private noiseBlock = new Float64Array(0);
  private position = 0;
  private chargeA = 0;
  private chargeB = 0;

  constructor(design: Design, samplesPerPeriod: number, sampleRate: number, random: Xoshiro128StarStar | null) {
    const { sensor, excitation } = design;
    const prepared = prepareSensor(sensor);
    this.drive = referencePeriod(samplesPerPeriod, 0);
    this.trim = quantizedTrim(excitation.trim, excitation.trimBits);
    this.amplitude = excitation.amplitude;
    this.pressurePerUnit = prepared.mode === 'flow' ? (prepared.hydraulicResistance ?? 1) : 1;
    const [c1, c2 = 0, c3 = 0] = sensor.cellA.coefficients;
    this.baseA = sensor.cellA.baseCapacitance;
    this.c1 = c1;
    this.c2 = c2;
    this.c3 = c3;
    this.counterA = excitation.referenceCapacitanceA;
    this.residualB = prepared.capacitanceB(0) - this.trim * excitation.referenceCapacitanceB;
    this.noise = random === null || excitation.amplitudeNoise === 0 ? null : new WhiteNoise({ density: excitation.amplitudeNoise, sampleRate }, random);
  }

  /** C_A - Cr_A at measurand x [F]. */
  residualA(x: number): number {
    const p = this.pressurePerUnit * x;
    return this.baseA + p * (this.c1 + p * (this.c2 + p * this.c3)) - this.counterA;
  }

  /** Differential capacitance the chain sees, C_A - C_B - (Cr_A - trim Cr_B), at measurand x [F]. */
  effectiveDifference(x: number): number {
    return this.residualA(x) - this.residualB;
  }

  /**
   * Sets the charges of the sample before the first: the excitation has been running, so it sat at
   * -Vm, with the cells at the first input value x0. Returns them [C] for the charge amplifier's start.
   */
  start(x0: number): { chargeA: number; chargeB: number } {
    const v = this.drive[this.drive.length - 1] * this.amplitude;
    this.chargeA = this.residualA(x0) * v;
    this.chargeB = this.residualB * v;
    this.position = 0;
    return { chargeA: this.chargeA, chargeB: this.chargeB };
  }

  /**
   * @param measurand input profile samples [Pa or m^3/s].
   * @param chargeA receives the charge injected into input A per sample [C]; chargeB likewise.
   */
  process(measurand: Float64Array, chargeA: Float64Array, chargeB: Float64Array): void {
    const length = measurand.length;
    const drive = this.drive;
    const period = drive.length;
    const { amplitude, pressurePerUnit: scale, baseA, c1, c2, c3, counterA, residualB } = this;
    let e: Float64Array | null = null;
    if (this.noise !== null) {
      if (this.noiseBlock.length < length) this.noiseBlock = new Float64Array(length);
      e = this.noiseBlock.subarray(0, length);
      this.noise.fill(e);
    }
    let k = this.position;
    let previousA = this.chargeA;
    let previousB = this.chargeB;
    for (let n = 0; n < length; n++) {
      const v = drive[k] * (e === null ? amplitude : amplitude + e[n]);
      if (++k === period) k = 0;
      const p = scale * measurand[n];
      const qA = (baseA + p * (c1 + p * (c2 + p * c3)) - counterA) * v;
      const qB = residualB * v;
      chargeA[n] = qA - previousA;
      chargeB[n] = qB - previousB;
      previousA = qA;
      previousB = qB;
    }
    this.position = k;
    this.chargeA = previousA;
    this.chargeB = previousB;
  }
}

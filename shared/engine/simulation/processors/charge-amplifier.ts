/**
 * The charge amplifier pair, one per input. Each side is the bilinear discretisation of its
 * charge-to-voltage transfer V = -Q (s Rf / (1 + s Rf Cf)) / (1 + s / w_cl), fed with the charge
 * injected per sample dq[n] (so the running sum Q never appears: the s of the transfer and the sum
 * cancel), then limited to the output swing. w_cl = 2 pi GBW / NG with that side's high-frequency
 * noise gain NG = 1 + C_tot / Cf.
 *
 * Noise per side, at the op-amp input as in the analytic budget: the voltage noise e (white and
 * 1/f) enters as the equivalent charge -C_tot e on the summing node plus e itself at the output, so
 * that the output sees e NG(f) with NG = 1 + Zf s C_tot; the current noise and the feedback
 * resistor's thermal noise are white currents into the summing node, drawn as one generator of
 * their summed power i_n^2 + 4 k T / Rf (they share the node and the transfer |Zf|).
 */
import { BOLTZMANN } from '../../constants';
import type { ChargeAmplifierStage } from '../../stages/charge-amplifier';
import type { StageContext } from '../../stages/stage';
import { WhiteNoise } from '../../noise/white-noise';
import { firstOrderLowPass, voltageNoise, type NodeProcessor, type NoiseBlock, type ProcessorNoise } from './processor';

interface Side {
  /** u[n] = chargeGain dq[n] + chargeFeedback u[n-1]: the Rf||Cf section [V]. */
  chargeGain: number;
  chargeFeedback: number;
  /** Closed-loop pole section. */
  poleGain: number;
  poleFeedback: number;
  /** Capacitance on the summing node, sensing cell + counter-pulse + parasitic + op-amp input [F]. */
  totalCapacitance: number;
  voltage: NoiseBlock | null;
  current: NoiseBlock | null;
  u: number;
  x: number;
  w: number;
  noisePrevious: number;
  clipped: number;
}

export class ChargeAmplifierProcessor implements NodeProcessor {
  readonly timeConstant: number;
  private readonly sides: [Side, Side];
  private readonly low: number;
  private readonly high: number;
  private readonly centre: number;
  private readonly feedbackCapacitance: number;
  private voltageBlock = new Float64Array(0);
  private currentBlock = new Float64Array(0);
  private scratch = new Float64Array(0);

  constructor(parameters: ChargeAmplifierStage, context: StageContext, sampleRate: number, noise: ProcessorNoise | null = null) {
    const cf = parameters.feedbackCapacitance;
    const rf = parameters.feedbackResistance;
    // s Rf / (1 + s Rf Cf) after the sum of dq: alpha / ((1 + alpha) + (1 - alpha) z^-1) / Cf, alpha = 2 Rf Cf fs.
    const alpha = 2 * rf * cf * sampleRate;
    const currentDensity = Math.sqrt(parameters.currentNoise ** 2 + (4 * BOLTZMANN * context.temperature) / rf);
    const side = (inputCapacitance: number, firstSource: number): Side => {
      const totalCapacitance = inputCapacitance + parameters.inputCapacitance;
      const pole = firstOrderLowPass(parameters.gainBandwidth / (1 + totalCapacitance / cf), sampleRate);
      return {
        chargeGain: -alpha / ((1 + alpha) * cf),
        chargeFeedback: (alpha - 1) / (alpha + 1),
        poleGain: pole.gain,
        poleFeedback: pole.feedback,
        totalCapacitance,
        voltage: noise === null ? null : voltageNoise(parameters.voltageNoise, parameters.flickerCorner, sampleRate, noise.lowestFrequency, noise.random(firstSource)),
        // A white current of density I gives a charge per sample of variance I^2 fs / 2 / fs^2: density I / fs.
        current: noise === null || currentDensity === 0 ? null : new WhiteNoise({ density: currentDensity / sampleRate, sampleRate }, noise.random(firstSource + 1)),
        u: 0,
        x: 0,
        w: 0,
        noisePrevious: 0,
        clipped: 0,
      };
    };
    this.sides = [side(context.inputCapacitanceA, 0), side(context.inputCapacitanceB, 2)];
    [this.low, this.high] = parameters.outputSwing;
    this.centre = context.supply / 2;
    this.feedbackCapacitance = cf;
    this.timeConstant = Math.max(...this.sides.map((s) => -1 / (Math.log(Math.abs(s.poleFeedback)) * sampleRate)));
  }

  get clippedSamples(): number {
    return this.sides[0].clipped + this.sides[1].clipped;
  }

  /** Samples clipped on input side 0 (A) or 1 (B). */
  clippedOnSide(side: 0 | 1): number {
    return this.sides[side].clipped;
  }

  /**
   * Starts each side on the plateau its input charge holds in the square wave's steady state (the
   * output at -q / Cf around the centre, the mean charge being zero), instead of from rest, so the
   * run does not open with a transient of the slow Rf Cf corner.
   * @param chargeA charge on input A before the first sample [C]; chargeB likewise.
   */
  startOnPlateau(chargeA: number, chargeB: number): void {
    const charges = [chargeA, chargeB];
    this.sides.forEach((s, i) => {
      s.u = -charges[i] / this.feedbackCapacitance;
      s.x = s.u;
      s.w = s.u;
    });
  }

  /**
   * One block of both sides.
   * @param chargeA charge injected into input A per sample [C]; chargeB likewise.
   * @param outputA side A output [V, absolute, around mid-supply]; outputB likewise.
   * @param differential V(out+) - V(out-) with out+ on input B and out- on input A, so that more
   *   charge on input A reads positive (the budget's sign) [V].
   */
  processSides(chargeA: Float64Array, chargeB: Float64Array, outputA: Float64Array, outputB: Float64Array, differential: Float64Array): void {
    const length = chargeA.length;
    this.processSide(this.sides[0], chargeA, outputA, length);
    this.processSide(this.sides[1], chargeB, outputB, length);
    for (let n = 0; n < length; n++) differential[n] = outputB[n] - outputA[n];
  }

  /** The BlockProcessor form: differential charge per sample [C] in (half on each input, opposite signs), differential voltage [V] out. */
  process(input: Float64Array, output: Float64Array): void {
    const length = input.length;
    if (this.scratch.length < 4 * length) this.scratch = new Float64Array(4 * length);
    const chargeA = this.scratch.subarray(0, length);
    const chargeB = this.scratch.subarray(length, 2 * length);
    for (let n = 0; n < length; n++) {
      chargeA[n] = input[n] / 2;
      chargeB[n] = -input[n] / 2;
    }
    this.processSides(chargeA, chargeB, this.scratch.subarray(2 * length, 3 * length), this.scratch.subarray(3 * length, 4 * length), output);
  }

  reset(): void {
    for (const s of this.sides) {
      s.u = 0;
      s.x = 0;
      s.w = 0;
      s.noisePrevious = 0;
      s.clipped = 0;
    }
  }

  private processSide(side: Side, charge: Float64Array, output: Float64Array, length: number): void {
    const { chargeGain, chargeFeedback, poleGain, poleFeedback, totalCapacitance } = side;
    const low = this.low;
    const high = this.high;
    const centre = this.centre;
    let { u, x, w, noisePrevious } = side;
    let clipped = 0;
    if (side.voltage === null && side.current === null) {
      for (let n = 0; n < length; n++) {
        u = chargeGain * charge[n] + chargeFeedback * u;
        w = poleGain * (u + x) + poleFeedback * w;
        x = u;
        let v = centre + w;
        if (v > high) {
          v = high;
          clipped++;
        } else if (v < low) {
          v = low;
          clipped++;
        }
        output[n] = v;
      }
    } else {
      if (this.voltageBlock.length < length) {
        this.voltageBlock = new Float64Array(length);
        this.currentBlock = new Float64Array(length);
      }
      const e = this.voltageBlock.subarray(0, length);
      const i = this.currentBlock.subarray(0, length);
      if (side.voltage === null) e.fill(0);
      else side.voltage.fill(e);
      if (side.current === null) i.fill(0);
      else side.current.fill(i);
      for (let n = 0; n < length; n++) {
        const en = e[n];
        u = chargeGain * (charge[n] + i[n] - totalCapacitance * (en - noisePrevious)) + chargeFeedback * u;
        noisePrevious = en;
        const xn = u + en;
        w = poleGain * (xn + x) + poleFeedback * w;
        x = xn;
        let v = centre + w;
        if (v > high) {
          v = high;
          clipped++;
        } else if (v < low) {
          v = low;
          clipped++;
        }
        output[n] = v;
      }
    }
    side.u = u;
    side.x = x;
    side.w = w;
    side.noisePrevious = noisePrevious;
    side.clipped += clipped;
  }
}

export function createChargeAmplifierProcessor(parameters: ChargeAmplifierStage, context: StageContext, sampleRate: number, noise: ProcessorNoise | null = null): ChargeAmplifierProcessor {
  return new ChargeAmplifierProcessor(parameters, context, sampleRate, noise);
}

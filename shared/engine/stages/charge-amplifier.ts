import { z } from 'zod';
import { quantity, stageIdSchema, voltageRange } from '../../contracts/fields';
import { BOLTZMANN, FREQUENCY_FLOOR, TWO_PI } from '../constants';
import { digits, finding, number } from '../findings';
import type { Finding } from '../../contracts/findings';
import { formatQuantity } from '../../units/format';
import type { NoiseSource, StageModule } from './stage';
import { createChargeAmplifierProcessor } from '../simulation/processors/charge-amplifier';

export const chargeAmplifierSchema = z
  .object({
    id: stageIdSchema,
    kind: z.literal('chargeAmplifier'),
    feedbackCapacitance: quantity('Feedback capacitance', 'F', { above: 0 }, 'Cf: sets the charge gain 1/Cf'),
    feedbackResistance: quantity('Feedback resistance', 'ohm', { above: 0 }, 'Rf: DC path across Cf; with Cf it sets the charge-domain high-pass corner 1/(2 pi Rf Cf)'),
    gainBandwidth: quantity('Gain-bandwidth product', 'Hz', { above: 0 }, 'Of the op-amp; the closed-loop bandwidth is GBW / noise gain'),
    voltageNoise: quantity('Voltage noise density', 'V/rtHz', { atLeast: 0 }, 'Op-amp input voltage noise, white part'),
    flickerCorner: quantity('Flicker corner', 'Hz', { atLeast: 0 }, 'Where the 1/f voltage noise equals the white part'),
    currentNoise: quantity('Current noise density', 'A/rtHz', { atLeast: 0 }, 'Op-amp input current noise'),
    inputCapacitance: quantity('Input capacitance', 'F', { atLeast: 0 }, 'Op-amp input capacitance, common mode plus differential'),
    outputSwing: voltageRange('Output swing', 'the range each output can reach'),
    slewRate: quantity('Slew rate', 'V/s', { above: 0 }),
  })
  .describe('Charge amplifier: one per input, converts the injected charge into a voltage -q/Cf');

export type ChargeAmplifierStage = z.infer<typeof chargeAmplifierSchema>;

/** Settling error of each half period must stay below the resolution; the carrier well above the Rf Cf corner. */
const CORNER_MARGIN = 10;

export const chargeAmplifierModule: StageModule<ChargeAmplifierStage> = {
  kind: 'chargeAmplifier',
  label: 'charge amplifier',
  placement: 'carrier',
  mustBeLast: false,
  schema: chargeAmplifierSchema,
  defaults: (id) => ({
    id,
    kind: 'chargeAmplifier',
    feedbackCapacitance: 1e-12,
    feedbackResistance: 1e9,
    gainBandwidth: 1e7,
    voltageNoise: 8e-9,
    flickerCorner: 2e3,
    currentNoise: 1e-15,
    inputCapacitance: 4e-12,
    outputSwing: [0.1, 4.9],
    slewRate: 5e6,
  }),
  createProcessor: createChargeAmplifierProcessor,
  prepare(p, context) {
    const cf = p.feedbackCapacitance;
    const rf = p.feedbackResistance;
    const tau = rf * cf;
    const corner = 1 / (TWO_PI * tau);
    const totalA = context.inputCapacitanceA + p.inputCapacitance;
    const totalB = context.inputCapacitanceB + p.inputCapacitance;
    // The slower side sets the closed-loop pole both sides see.
    const highFrequencyNoiseGain = 1 + Math.max(totalA, totalB) / cf;
    const closedLoop = p.gainBandwidth / highFrequencyNoiseGain;
    const carrier = context.carrierFrequency;
    const en2 = p.voltageNoise * p.voltageNoise;
    const in2 = p.currentNoise * p.currentNoise;
    const thermal2 = (4 * BOLTZMANN * context.temperature) / rf;
    const rfA = rf * (cf + totalA);
    const rfB = rf * (cf + totalB);
    const closedLoopPower = (f: number) => 1 / (1 + (f / closedLoop) ** 2);
    const feedbackPower = (f: number) => {
      const w = TWO_PI * f;
      return (rf * rf) / (1 + w * w * tau * tau);
    };
    const target = { stage: p.id, path: context.path };

    // |NG|^2 = (1 + w^2 Rf^2 (Cf + Ctot)^2) / (1 + w^2 Rf^2 Cf^2), summed over both inputs, within the closed loop.
    const voltageNoisePower = (f: number) => {
      const w = TWO_PI * f;
      return (en2 * (2 + w * w * (rfA * rfA + rfB * rfB))) / (1 + w * w * tau * tau) * closedLoopPower(f);
    };
    const noiseSources: NoiseSource[] = [
      { source: 'voltage noise (times noise gain)', density: voltageNoisePower },
      { source: 'voltage flicker noise (1/f)', density: (f) => voltageNoisePower(f) * (p.flickerCorner / Math.max(f, FREQUENCY_FLOOR)) },
      { source: 'current noise', density: (f) => 2 * in2 * feedbackPower(f) * closedLoopPower(f) },
      { source: 'feedback resistor thermal noise', density: (f) => 2 * thermal2 * feedbackPower(f) * closedLoopPower(f) },
    ];

    return {
      id: p.id,
      kind: p.kind,
      path: context.path,
      domain: context.domain,
      flatGain: 1 / cf,
      poles: [],
      noiseSources,
      swing: { low: p.outputSwing[0], high: p.outputSwing[1], centre: context.supply / 2 },
      levelKind: 'perSide',
      demodulatorPhase: null,
      converter: null,
      multiplyResponse(f, value) {
        const x = TWO_PI * f * tau;
        // jx / (1 + jx) times 1 / (1 + j f/fcl)
        const hRe = (x * x) / (1 + x * x);
        const hIm = x / (1 + x * x);
        const y = f / closedLoop;
        const s = 1 / (1 + y * y);
        const pRe = (hRe + hIm * y) * s;
        const pIm = (hIm - hRe * y) * s;
        const vRe = value.re * pRe - value.im * pIm;
        value.im = value.re * pIm + value.im * pRe;
        value.re = vRe;
      },
      responsePower(f) {
        const x = TWO_PI * f * tau;
        return ((x * x) / (1 + x * x)) * closedLoopPower(f);
      },
      findings(view) {
        const out: Finding[] = [];
        if (carrier < CORNER_MARGIN * corner) {
          out.push(
            finding('warning', 'charge-amplifier-corner', target, 'feedbackResistance', `The carrier sits within ${CORNER_MARGIN}x of the Rf Cf corner (${formatQuantity(corner, 'frequency')}): the plateau of each half period droops`, [number('Rf Cf corner', corner, 'Hz'), number('carrier frequency', carrier, 'Hz')], `raise the feedback resistance above ${formatQuantity((CORNER_MARGIN / (TWO_PI * cf * carrier)), 'resistance')}`),
          );
        }
        const settlingError = Math.exp((-Math.PI * closedLoop) / carrier);
        if (view.relativeResolution !== null && settlingError > view.relativeResolution) {
          const needed = (-Math.log(view.relativeResolution) * carrier * highFrequencyNoiseGain) / Math.PI;
          out.push(
            finding('warning', 'charge-amplifier-settling', target, 'gainBandwidth', `Each half period settles only to ${digits(settlingError * 100)} % (closed-loop bandwidth ${formatQuantity(closedLoop, 'frequency')}), more than the resolution of ${digits(view.relativeResolution * 100)} %FS`, [number('settling error', settlingError, ''), number('closed-loop bandwidth', closedLoop, 'Hz'), number('noise gain', highFrequencyNoiseGain, '')], `use an op-amp with a gain-bandwidth above ${formatQuantity(needed, 'frequency')} or lower the carrier frequency`),
          );
        }
        // A per-side output step of 2 * peak, settling with the closed-loop pole, starts at its steepest.
        const edgeRate = 2 * view.levelPeak * TWO_PI * closedLoop;
        if (edgeRate > p.slewRate) {
          out.push(
            finding('warning', 'charge-amplifier-slew', target, 'slewRate', `The output edges need ${formatQuantity(edgeRate, 'slewRate')}, more than the slew rate of ${formatQuantity(p.slewRate, 'slewRate')}: settling becomes slew-limited`, [number('edge rate', edgeRate, 'V/s'), number('slew rate', p.slewRate, 'V/s')], 'choose a faster op-amp, or reduce the residual charge per side with the counter-pulse capacitors'),
          );
        }
        if (p.flickerCorner > carrier / 3) {
          out.push(
            finding('note', 'charge-amplifier-flicker', target, 'flickerCorner', `The flicker corner (${formatQuantity(p.flickerCorner, 'frequency')}) is close to the carrier: chopping does not escape the 1/f noise fully`, [number('flicker corner', p.flickerCorner, 'Hz'), number('carrier frequency', carrier, 'Hz')], 'raise the carrier frequency well above the flicker corner'),
          );
        }
        return out;
      },
    };
  },
};

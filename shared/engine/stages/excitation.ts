import { z } from 'zod';
import { quantity, wholeNumber } from '../../contracts/fields';
import type { Finding } from '../../contracts/findings';
import { digits, finding, number } from '../findings';
import { formatQuantity } from '../../units/format';
import type { PreparedSensor } from './sensor';

export const excitationSchema = z
  .object({
    frequency: quantity('Excitation frequency', 'Hz', { above: 0 }, 'Carrier f0 of the square wave'),
    amplitude: quantity('Excitation amplitude', 'V', { above: 0 }, 'Vm: the square wave swings +/-Vm around mid-supply'),
    supply: quantity('Supply voltage', 'V', { above: 0 }),
    referenceCapacitanceA: quantity('Counter-pulse capacitance A', 'F', { atLeast: 0 }, 'Cr_A, driven in antiphase with amplitude Vm on input A'),
    referenceCapacitanceB: quantity('Counter-pulse capacitance B', 'F', { atLeast: 0 }, 'Cr_B, driven in antiphase with amplitude trim * Vm on input B'),
    trim: quantity('Trim', '', { atLeast: 0, atMost: 2 }, 'Counter-pulse amplitude ratio on side B [V/V]'),
    trimBits: wholeNumber('Trim DAC resolution', 1, 16, 'Bits of the trim DAC spanning [0, 2]'),
    amplitudeNoise: quantity('Excitation amplitude noise', 'V/rtHz', { atLeast: 0 }, 'White noise on Vm; it multiplies the capacitance the counter-pulses leave uncancelled').default(0),
  })
  .describe('Square-wave excitation of both cells and the counter-pulse trim');

export type Excitation = z.infer<typeof excitationSchema>;

/** The square wave needs this much room to each rail (a rail-to-rail driver's output stage). */
export const DRIVER_HEADROOM = 0.2;

export interface PreparedExcitation {
  /** Trim that nulls the offset at zero measurand, or null without a side-B counter-pulse. */
  idealTrim: number | null;
  /** DAC step [1] and the code nearest the ideal trim (clamped to the DAC range). */
  trimStep: number;
  trimCode: number | null;
  trimAtCode: number | null;
  /** Differential capacitance the chain sees, C_A - C_B - (Cr_A - trim Cr_B) [F]. */
  effectiveDifference(x: number, trim: number): number;
  /** Charge amplitude per side over Vm: |C_side - Cr_side| [F]. */
  residualA(x: number): number;
  residualB(x: number, trim: number): number;
  findings(): Finding[];
}

export function prepareExcitation(excitation: Excitation, sensor: PreparedSensor): PreparedExcitation {
  const { referenceCapacitanceA: crA, referenceCapacitanceB: crB } = excitation;
  const baseDifference = sensor.difference(0);
  const idealTrim = crB > 0 ? (crA - baseDifference) / crB : null;
  const codes = 2 ** excitation.trimBits;
  const trimStep = 2 / codes;
  const trimCode = idealTrim === null ? null : Math.min(codes - 1, Math.max(0, Math.round(idealTrim / trimStep)));
  const trimAtCode = trimCode === null ? null : trimCode * trimStep;
  const target = { stage: 'excitation', path: 'excitation' };
  return {
    idealTrim,
    trimStep,
    trimCode,
    trimAtCode,
    effectiveDifference: (x, trim) => sensor.difference(x) - (crA - trim * crB),
    residualA: (x) => Math.abs(sensor.capacitanceA(x) - crA),
    residualB: (x, trim) => Math.abs(sensor.capacitanceB(x) - trim * crB),
    findings() {
      const out: Finding[] = [];
      const headroom = excitation.supply / 2 - excitation.amplitude;
      const numbers = [number('amplitude', excitation.amplitude, 'V'), number('supply', excitation.supply, 'V'), number('headroom to each rail', headroom, 'V')];
      if (headroom < 0) {
        out.push(finding('error', 'excitation-exceeds-supply', target, 'amplitude', `A +/-${formatQuantity(excitation.amplitude, 'voltage')} square wave around mid-supply does not fit a ${formatQuantity(excitation.supply, 'voltage')} supply`, numbers, `lower the amplitude to ${digits(excitation.supply / 2 - DRIVER_HEADROOM)} V or less`));
      } else if (headroom < DRIVER_HEADROOM) {
        out.push(finding('warning', 'excitation-headroom', target, 'amplitude', `The excitation comes within ${formatQuantity(headroom, 'voltage')} of the rails; its driver needs about ${DRIVER_HEADROOM} V`, numbers, `lower the amplitude to ${digits(excitation.supply / 2 - DRIVER_HEADROOM)} V`));
      }
      if (idealTrim === null) {
        out.push(finding('warning', 'no-trim-capacitor', target, 'referenceCapacitanceB', 'Without a counter-pulse capacitor on side B the offset cannot be trimmed', [number('Cr_B', crB, 'F')], `add a counter-pulse capacitor near ${formatQuantity(Math.max(crA - baseDifference, 0), 'capacitance')}`));
      } else if (idealTrim < 0 || idealTrim > 2 - trimStep) {
        const suggested = crA - baseDifference;
        out.push(finding('error', 'trim-out-of-range', target, 'referenceCapacitanceB', `The offset needs a trim of ${digits(idealTrim)}, outside the DAC range 0 to ${digits(2 - trimStep)}`, [number('ideal trim', idealTrim, ''), number('Cr_B', crB, 'F')], suggested > 0 ? `set Cr_B near ${formatQuantity(suggested, 'capacitance')} so that the ideal trim is close to 1` : 'raise the counter-pulse capacitance on side A'));
      } else if (trimAtCode !== null && Math.abs(excitation.trim - trimAtCode) > trimStep / 2) {
        out.push(finding('note', 'trim-not-at-best-code', target, 'trim', `The trim is ${digits(excitation.trim)}; the DAC code nearest the ideal trim gives ${digits(trimAtCode)}`, [number('trim', excitation.trim, ''), number('best code', trimCode ?? 0, ''), number('trim at that code', trimAtCode, '')], `set the trim to ${trimAtCode} (code ${trimCode})`));
      }
      return out;
    },
  };
}

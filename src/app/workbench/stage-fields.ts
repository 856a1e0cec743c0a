import type { ChainStage } from '@shared/contracts/design';
import type { DimensionName } from '@shared/units';

export type StageKind = ChainStage['kind'];

/** How a field of a stage is edited. */
export type StageField =
  | { key: string; label: string; type: 'quantity'; dimension: DimensionName }
  | { key: string; label: string; type: 'number'; unit: string }
  | { key: string; label: string; type: 'integer'; min: number; max: number }
  | { key: string; label: string; type: 'response' }
  | { key: string; label: string; type: 'range'; dimension: DimensionName };

const swing = { key: 'outputSwing', label: 'Output swing', type: 'range', dimension: 'voltage' } as const;
const opAmpNoise = [
  { key: 'voltageNoise', label: 'Voltage noise density', type: 'quantity', dimension: 'voltageNoiseDensity' },
  { key: 'flickerCorner', label: 'Flicker corner', type: 'quantity', dimension: 'frequency' },
] as const;

/** The fields of each stage kind in the order the forms show them; the names are the document's. */
export const stageFields: Record<StageKind, readonly StageField[]> = {
  chargeAmplifier: [
    { key: 'feedbackCapacitance', label: 'Feedback capacitance', type: 'quantity', dimension: 'capacitance' },
    { key: 'feedbackResistance', label: 'Feedback resistance', type: 'quantity', dimension: 'resistance' },
    { key: 'gainBandwidth', label: 'Gain-bandwidth product', type: 'quantity', dimension: 'frequency' },
    ...opAmpNoise,
    { key: 'currentNoise', label: 'Current noise density', type: 'quantity', dimension: 'currentNoiseDensity' },
    { key: 'inputCapacitance', label: 'Input capacitance', type: 'quantity', dimension: 'capacitance' },
    swing,
    { key: 'slewRate', label: 'Slew rate', type: 'quantity', dimension: 'slewRate' },
  ],
  gain: [
    { key: 'gain', label: 'Gain', type: 'number', unit: 'V/V' },
    { key: 'gainBandwidth', label: 'Gain-bandwidth product', type: 'quantity', dimension: 'frequency' },
    ...opAmpNoise,
    swing,
  ],
  highPass: [
    { key: 'order', label: 'Order', type: 'integer', min: 1, max: 4 },
    { key: 'corner', label: 'Corner frequency', type: 'quantity', dimension: 'frequency' },
    { key: 'response', label: 'Response', type: 'response' },
  ],
  demodulator: [{ key: 'phase', label: 'Reference phase', type: 'number', unit: 'deg' }],
  lowPass: [
    { key: 'order', label: 'Order', type: 'integer', min: 1, max: 4 },
    { key: 'corner', label: 'Corner frequency', type: 'quantity', dimension: 'frequency' },
    { key: 'response', label: 'Response', type: 'response' },
    ...opAmpNoise,
    swing,
  ],
  adc: [
    { key: 'bits', label: 'Resolution', type: 'integer', min: 4, max: 32 },
    { key: 'inputRange', label: 'Input range', type: 'range', dimension: 'voltage' },
    { key: 'sampleRate', label: 'Sample rate', type: 'quantity', dimension: 'frequency' },
  ],
};

export const filterResponses = [
  { value: 'butterworth', label: 'Butterworth (flat)' },
  { value: 'bessel', label: 'Bessel (linear phase)' },
  { value: 'critical', label: 'Critically damped' },
] as const;

/** Short names for the chain picture and headings. */
export const stageTitles: Record<StageKind, string> = {
  chargeAmplifier: 'Charge amplifier',
  gain: 'Gain',
  highPass: 'High-pass',
  demodulator: 'Demodulator',
  lowPass: 'Low-pass',
  adc: 'ADC',
};

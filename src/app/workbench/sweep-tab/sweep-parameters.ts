import type { Design } from '@shared/contracts/design';
import { stageRegistry } from '@shared/engine/index';
import { formatQuantity, parseQuantity, type DimensionName } from '@shared/units';

/** A number of the design a sweep can vary, named as a designer would name it. */
export interface SweepParameter {
  /** Path as the engine reads it: `excitation.amplitude`, `chain[4].corner`. */
  readonly path: string;
  /** Where it sits: "Excitation", "Charge amplifier ca". */
  readonly group: string;
  readonly label: string;
  /** Quantity for parsing and display; null for a plain ratio or count. */
  readonly dimension: DimensionName | null;
  /** Unit written after a plain number ("V/V", "deg", "bits"); empty when it has a dimension. */
  readonly unit: string;
  readonly integer: boolean;
  /** Value in the design now. */
  readonly value: number;
}

interface FieldInfo {
  readonly label: string;
  readonly dimension?: DimensionName;
  readonly unit?: string;
  readonly integer?: boolean;
}

const FIELDS: Readonly<Record<string, FieldInfo>> = {
  temperature: { label: 'Temperature', dimension: 'temperature' },
  baseCapacitance: { label: 'base capacitance', dimension: 'capacitance' },
  parasiticCapacitance: { label: 'Parasitic capacitance', dimension: 'capacitance' },
  length: { label: 'Capillary length', dimension: 'length' },
  innerDiameter: { label: 'Capillary inner diameter', dimension: 'length' },
  viscosity: { label: 'Liquid viscosity', dimension: 'viscosity' },
  density: { label: 'Liquid density', dimension: 'massDensity' },
  resistance: { label: 'Hydraulic resistance', dimension: 'hydraulicResistance' },
  frequency: { label: 'Excitation frequency', dimension: 'frequency' },
  amplitude: { label: 'Excitation amplitude', dimension: 'voltage' },
  supply: { label: 'Supply voltage', dimension: 'voltage' },
  referenceCapacitanceA: { label: 'Counter-pulse capacitance A', dimension: 'capacitance' },
  referenceCapacitanceB: { label: 'Counter-pulse capacitance B', dimension: 'capacitance' },
  trim: { label: 'Trim', unit: 'V/V' },
  trimBits: { label: 'Trim DAC resolution', unit: 'bits', integer: true },
  amplitudeNoise: { label: 'Excitation amplitude noise', dimension: 'voltageNoiseDensity' },
  feedbackCapacitance: { label: 'Feedback capacitance', dimension: 'capacitance' },
  feedbackResistance: { label: 'Feedback resistance', dimension: 'resistance' },
  gainBandwidth: { label: 'Gain-bandwidth product', dimension: 'frequency' },
  voltageNoise: { label: 'Voltage noise density', dimension: 'voltageNoiseDensity' },
  flickerCorner: { label: 'Flicker corner', dimension: 'frequency' },
  currentNoise: { label: 'Current noise density', dimension: 'currentNoiseDensity' },
  inputCapacitance: { label: 'Input capacitance', dimension: 'capacitance' },
  slewRate: { label: 'Slew rate', dimension: 'slewRate' },
  gain: { label: 'Gain', unit: 'V/V' },
  order: { label: 'Filter order', integer: true },
  corner: { label: 'Corner frequency', dimension: 'frequency' },
  phase: { label: 'Reference phase', unit: 'deg' },
  bits: { label: 'Resolution', unit: 'bits', integer: true },
  sampleRate: { label: 'Sample rate', dimension: 'frequency' },
  bandLow: { label: 'Noise band low end', dimension: 'frequency' },
  bandHigh: { label: 'Noise band high end', dimension: 'frequency' },
};

const RANGE_ENDS: Readonly<Record<string, string>> = { outputSwing: 'Output swing', inputRange: 'Input range' };
const GROUPS: Readonly<Record<string, string>> = { environment: 'Environment', sensor: 'Sensor', excitation: 'Excitation', analysis: 'Analysis' };

/** Every number in the design, in document order, with the label and the quantity it is. */
export function sweepParameters(design: Design): SweepParameter[] {
  const found: SweepParameter[] = [];
  const measurand: DimensionName = design.sensor.mode === 'pressure' ? 'pressure' : 'volumeFlow';
  const add = (path: string, group: string, key: string, value: number, label?: string, dimension?: DimensionName) => {
    const info = FIELDS[key] ?? { label: spellOut(key) };
    found.push({
      path,
      group,
      label: label ?? info.label,
      dimension: dimension ?? info.dimension ?? null,
      unit: dimension === undefined && info.dimension === undefined ? (info.unit ?? '') : '',
      integer: info.integer ?? false,
      value,
    });
  };
  const visit = (node: unknown, path: string, group: string, prefix: string) => {
    if (typeof node !== 'object' || node === null) return;
    for (const [key, value] of Object.entries(node)) {
      const at = `${path}.${key}`;
      if (typeof value === 'number') {
        if (key === 'fullScale' || key === 'operatingPoint') add(at, group, key, value, key === 'fullScale' ? 'Full scale' : 'Operating point', measurand);
        else add(at, group, key, value, key === 'baseCapacitance' ? `${prefix}${FIELDS[key].label}` : undefined);
      } else if (Array.isArray(value) && key in RANGE_ENDS && value.length === 2) {
        value.forEach((end: unknown, index) => {
          if (typeof end === 'number') add(`${at}[${index}]`, group, key, end, `${RANGE_ENDS[key]} ${index === 0 ? 'low' : 'high'} end`, 'voltage');
        });
      } else if (Array.isArray(value) && key === 'coefficients') {
        value.forEach((coefficient: unknown, index) => {
          if (typeof coefficient !== 'number') return;
          const first = index === 0;
          found.push({
            path: `${at}[${index}]`,
            group,
            label: `${prefix}coefficient c${index + 1}`,
            dimension: first ? 'capacitancePerPressure' : null,
            unit: first ? '' : `F/Pa^${index + 1}`,
            integer: false,
            value: coefficient,
          });
        });
      } else if (typeof value === 'object' && value !== null && !Array.isArray(value)) {
        const cell = /^cell([AB])$/.exec(key);
        visit(value, at, group, cell ? `Cell ${cell[1]} ` : prefix);
      }
    }
  };
  for (const section of ['environment', 'sensor', 'excitation'] as const) visit(design[section], section, GROUPS[section], '');
  design.chain.forEach((stage, index) => {
    const label = stageRegistry.get(stage.kind)?.label ?? spellOut(stage.kind);
    visit(stage, `chain[${index}]`, `${capitalise(label)} ${stage.id}`, '');
  });
  visit(design.analysis, 'analysis', GROUPS['analysis'], '');
  return found;
}

/** A value of the parameter as text in its unit: "2.2 pF", "20 V/V". */
export function formatParameterValue(parameter: SweepParameter, value: number): string {
  if (parameter.dimension !== null) return formatQuantity(value, parameter.dimension, { significant: 4 });
  const text = String(Number(value.toPrecision(4)));
  return parameter.unit === '' ? text : `${text} ${parameter.unit}`;
}

/** Reads a value typed for the parameter: engineering units where it has a quantity, a number (SI prefix allowed) otherwise. */
export function parseParameterValue(parameter: SweepParameter, text: string): { ok: true; value: number } | { ok: false; message: string } {
  if (parameter.dimension !== null) return parseQuantity(text, parameter.dimension);
  const unit = parameter.unit.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
  const match = new RegExp(`^\\s*([+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?)\\s*([afpnumkMG]?)\\s*(?:${unit})?\\s*$`).exec(text);
  if (match === null) return { ok: false, message: `expected a number${parameter.unit === '' ? '' : ` in ${parameter.unit}`}` };
  const prefixes: Record<string, number> = { a: 1e-18, f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, m: 1e-3, '': 1, k: 1e3, M: 1e6, G: 1e9 };
  return { ok: true, value: Number(match[1]) * prefixes[match[2]] };
}

/** The label with its unit for an axis: "Excitation amplitude [V]". */
export function axisLabel(parameter: SweepParameter): string {
  const unit = parameter.dimension === null ? parameter.unit : SI_UNITS[parameter.dimension];
  return unit === '' ? parameter.label : `${parameter.label} [${unit}]`;
}

const SI_UNITS: Readonly<Record<DimensionName, string>> = {
  capacitance: 'F',
  frequency: 'Hz',
  voltage: 'V',
  current: 'A',
  resistance: 'Ω',
  time: 's',
  temperature: 'K',
  pressure: 'Pa',
  length: 'm',
  volumeFlow: 'm³/s',
  viscosity: 'Pa s',
  massDensity: 'kg/m³',
  hydraulicResistance: 'Pa s/m³',
  voltageNoiseDensity: 'V/√Hz',
  currentNoiseDensity: 'A/√Hz',
  slewRate: 'V/s',
  capacitancePerPressure: 'F/Pa',
  voltsPerFarad: 'V/F',
  voltsPerPascal: 'V/Pa',
  voltsPerVolumeFlow: 'V s/m³',
};

function spellOut(key: string): string {
  return capitalise(key.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase());
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

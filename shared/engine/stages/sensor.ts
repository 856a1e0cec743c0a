import { z } from 'zod';
import { quantity } from '../../contracts/fields';
import type { Finding } from '../../contracts/findings';
import { digits, finding, number } from '../findings';
import { formatQuantity } from '../../units/format';

const cellSchema = (name: string) =>
  z
    .object({
      baseCapacitance: quantity(`Cell ${name} base capacitance`, 'F', { above: 0 }, 'C0 at zero gauge pressure'),
      coefficients: z
        .array(z.number({ error: `Cell ${name} coefficients must be numbers` }), { error: `Cell ${name} coefficients must be a list of numbers` })
        .min(1, `Cell ${name} needs at least the linear coefficient c1`)
        .max(3, `Cell ${name} takes at most three coefficients c1, c2, c3`)
        .describe('c1, c2, c3 of dC = c1 p + c2 p^2 + c3 p^3 [F/Pa, F/Pa^2, F/Pa^3]'),
    })
    .describe(`Sensing cell ${name}`);

const capillaryGeometrySchema = z
  .object({
    length: quantity('Capillary length', 'm', { above: 0 }),
    innerDiameter: quantity('Capillary inner diameter', 'm', { above: 0 }),
    viscosity: quantity('Liquid viscosity', 'Pa s', { above: 0 }, 'Dynamic viscosity; water at 20 C is 1.0016e-3'),
    density: quantity('Liquid density', 'kg/m^3', { above: 0 }),
  })
  .strict();

const capillaryResistanceSchema = z.object({ resistance: quantity('Hydraulic resistance', 'Pa s/m^3', { above: 0 }) }).strict();

export const capillarySchema = z
  .union([capillaryGeometrySchema, capillaryResistanceSchema], {
    error: 'Capillary must give either length, innerDiameter, viscosity and density, or a resistance in Pa s/m^3',
  })
  .describe('Flow restrictor between the two cells (flow mode): its geometry (Hagen-Poiseuille) or its hydraulic resistance');

export const sensorSchema = z
  .object({
    mode: z.enum(['pressure', 'flow'], { error: 'Sensor mode must be pressure or flow' }).describe('pressure: cell A sees the pressure, cell B stays at ambient; flow: both cells on the line, a capillary between them'),
    cellA: cellSchema('A'),
    cellB: cellSchema('B'),
    parasiticCapacitance: quantity('Parasitic capacitance', 'F', { atLeast: 0 }, 'Per amplifier input, to ground'),
    fullScale: quantity('Full scale', 'Pa or m^3/s', { above: 0 }, 'Span of the measurand: Pa in pressure mode, m^3/s in flow mode'),
    capillary: capillarySchema.optional(),
  })
  .superRefine((sensor, context) => {
    if (sensor.mode === 'flow' && sensor.capillary === undefined) {
      context.addIssue({ code: 'custom', path: ['capillary'], message: 'Flow mode needs a capillary: its geometry or its hydraulic resistance' });
    }
  })
  .describe('The two-cell capacitive sensor and, in flow mode, its capillary');

export type Sensor = z.infer<typeof sensorSchema>;
export type Capillary = z.infer<typeof capillarySchema>;

/** Laminar flow holds below this Reynolds number. */
export const LAMINAR_LIMIT = 2000;

/** Hagen-Poiseuille: R = 128 mu L / (pi d^4) [Pa s/m^3]. */
export function hagenPoiseuilleResistance(viscosity: number, length: number, innerDiameter: number): number {
  return (128 * viscosity * length) / (Math.PI * innerDiameter ** 4);
}

/** Re = rho v d / mu with the mean velocity v = Q / (pi d^2 / 4). */
export function reynoldsNumber(flow: number, innerDiameter: number, viscosity: number, density: number): number {
  const velocity = flow / ((Math.PI * innerDiameter * innerDiameter) / 4);
  return (density * velocity * innerDiameter) / viscosity;
}

function cellCapacitance(baseCapacitance: number, coefficients: readonly number[], pressure: number): number {
  let power = pressure;
  let value = baseCapacitance;
  for (const c of coefficients) {
    value += c * power;
    power *= pressure;
  }
  return value;
}

function cellSlope(coefficients: readonly number[], pressure: number): number {
  let slope = 0;
  let power = 1;
  for (let k = 0; k < coefficients.length; k++) {
    slope += (k + 1) * coefficients[k] * power;
    power *= pressure;
  }
  return slope;
}

/** The sensor reduced to the functions the budget calls; x is the measurand in its mode's unit (Pa or m^3/s). */
export interface PreparedSensor {
  mode: 'pressure' | 'flow';
  fullScale: number;
  hydraulicResistance: number | null;
  reynoldsAtFullScale: number | null;
  /** Pressure on cell A above cell B for the measurand x [Pa]. */
  pressureFor(x: number): number;
  capacitanceA(x: number): number;
  capacitanceB(x: number): number;
  /** C_A - C_B [F]. */
  difference(x: number): number;
  /** d(C_A - C_B)/dx [F per unit]. */
  slope(x: number): number;
  /** dC_A/dp at the pressure the measurand x puts on cell A [F/Pa]. */
  pressureSlope(x: number): number;
  /** Change of C_A - C_B per pascal of pressure common to both cells [F/Pa] (flow mode). */
  commonModeSlope: number;
  findings(): Finding[];
}

export function prepareSensor(sensor: Sensor): PreparedSensor {
  const capillary = sensor.capillary;
  const flow = sensor.mode === 'flow';
  let resistance: number | null = null;
  let reynolds: number | null = null;
  if (flow && capillary !== undefined) {
    if ('resistance' in capillary) resistance = capillary.resistance;
    else {
      resistance = hagenPoiseuilleResistance(capillary.viscosity, capillary.length, capillary.innerDiameter);
      reynolds = reynoldsNumber(sensor.fullScale, capillary.innerDiameter, capillary.viscosity, capillary.density);
    }
  }
  const r = resistance ?? 1;
  const { cellA, cellB } = sensor;
  const pressureFor = (x: number) => (flow ? r * x : x);
  const target = { stage: 'sensor', path: 'sensor' };
  return {
    mode: sensor.mode,
    fullScale: sensor.fullScale,
    hydraulicResistance: resistance,
    reynoldsAtFullScale: reynolds,
    pressureFor,
    capacitanceA: (x) => cellCapacitance(cellA.baseCapacitance, cellA.coefficients, pressureFor(x)),
    capacitanceB: () => cellB.baseCapacitance,
    difference: (x) => cellCapacitance(cellA.baseCapacitance, cellA.coefficients, pressureFor(x)) - cellB.baseCapacitance,
    slope: (x) => cellSlope(cellA.coefficients, pressureFor(x)) * (flow ? r : 1),
    pressureSlope: (x) => cellSlope(cellA.coefficients, pressureFor(x)),
    commonModeSlope: cellA.coefficients[0] - cellB.coefficients[0],
    findings() {
      const out: Finding[] = [];
      if (reynolds !== null && reynolds > LAMINAR_LIMIT) {
        out.push(finding('warning', 'turbulent-flow', target, 'capillary', `Reynolds number ${digits(reynolds)} at full scale: above ${LAMINAR_LIMIT} the flow is no longer laminar and Hagen-Poiseuille does not hold`, [number('Reynolds number', reynolds, '')], 'widen the capillary or lower the full-scale flow'));
      }
      if (flow && cellA.coefficients[0] === cellB.coefficients[0]) {
        out.push(finding('note', 'common-mode-matched', target, 'cellB.coefficients', 'The cells have equal c1: line pressure cancels to first order and the common-mode rejection is set by effects outside this model', [number('c1', cellA.coefficients[0], 'F/Pa')]));
      }
      const fullScalePressure = pressureFor(sensor.fullScale);
      if (flow && fullScalePressure > 1e6) {
        out.push(finding('warning', 'capillary-pressure', target, 'capillary', `Full-scale flow needs ${formatQuantity(fullScalePressure, 'pressure')} across the capillary`, [number('pressure drop', fullScalePressure, 'Pa')], 'use a shorter or wider capillary'));
      }
      return out;
    },
  };
}

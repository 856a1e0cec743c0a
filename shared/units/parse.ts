import { create, createUnitDependencies, unitDependencies, type Unit } from 'mathjs';
import { dimensions, type Dimension, type DimensionName } from './dimensions';
import { siPrefixes } from './format';

// A private mathjs instance: adding rtHz must not change anyone else's mathjs.
const math = create({ unitDependencies, createUnitDependencies });
math.createUnit('rtHz', { definition: '1 Hz^0.5', aliases: ['sqrtHz'] });

const referenceUnits = new Map<DimensionName, Unit>(
  (Object.keys(dimensions) as DimensionName[]).map((name) => [name, math.unit(dimensions[name].siUnit)]),
);

const prefixScale = new Map<string, number>([...siPrefixes, ['µ', 1e-6], ['μ', 1e-6]]);

const bareNumber = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([afpnuµμmkMGT]?)$/;

export type ParsedQuantity = { ok: true; value: number } | { ok: false; message: string };

/**
 * Reads a value typed by a designer: "2.2 pF", "2.2p" (bare number with an SI prefix, in the
 * dimension's SI unit), "50 kHz", "8 nV/rtHz", "0.3 fF/kPa", "20 uL/s". Returns the SI value, or a
 * message such as "expected a capacitance, got a frequency".
 */
export function parseQuantity(text: string, dimensionName: DimensionName): ParsedQuantity {
  const dimension = dimensions[dimensionName];
  const trimmed = text.trim().replace(/√Hz/g, 'rtHz').replace(/Ω/g, 'ohm');
  if (trimmed === '') return { ok: false, message: `expected ${dimension.noun}, got nothing` };
  const bare = bareNumber.exec(trimmed);
  if (bare) return finite(Number(bare[1]) * (prefixScale.get(bare[2]) ?? 1), dimension);
  let unit: Unit;
  try {
    unit = math.unit(trimmed.replace(/µ|μ/g, 'u'));
  } catch {
    return { ok: false, message: `"${text.trim()}" is not a number with a unit, for example 2.2 pF` };
  }
  const reference = referenceUnits.get(dimensionName) as Unit;
  if (!unit.equalBase(reference)) return { ok: false, message: `expected ${dimension.noun}, got ${describeDimension(unit)}` };
  if (unit.value === null) return { ok: false, message: `expected ${dimension.noun} with a number, for example 1 ${dimension.displayUnit}` };
  return finite(unit.toNumber(dimension.siUnit), dimension);
}

function finite(value: number, dimension: Dimension): ParsedQuantity {
  return Number.isFinite(value) ? { ok: true, value } : { ok: false, message: `expected ${dimension.noun} as a finite number` };
}

function describeDimension(unit: Unit): string {
  for (const name of Object.keys(dimensions) as DimensionName[]) {
    if (unit.equalBase(referenceUnits.get(name) as Unit)) return dimensions[name].noun;
  }
  const siText = unit.toSI().formatUnits();
  return siText === '' ? 'a plain number' : `a quantity in ${siText}`;
}


import type { z } from 'zod';
import { analysisSchema, environmentSchema } from '../../contracts/design';
import { dimensions, type DimensionName } from '../../units/dimensions';
import { excitationSchema } from '../stages/excitation';
import { sensorSchema } from '../stages/sensor';
import type { StageRegistry } from '../stages/registry';

/** What a field of a design document is, as its schema describes it. */
export interface FieldUnit {
  /** Name in the designer's words, e.g. "Corner frequency". */
  label: string;
  /** SI unit of each value: one entry for a number, one per element for a list ([low, high], c1 c2 c3); empty for a dimensionless field. */
  units: string[];
}

const sections: Record<string, z.ZodType> = {
  environment: environmentSchema,
  sensor: sensorSchema,
  excitation: excitationSchema,
  analysis: analysisSchema,
};

interface ZodInternals {
  description?: string;
  shape?: Record<string, z.ZodType>;
  _zod: { def: { type: string; innerType?: z.ZodType; options?: z.ZodType[] } };
}

/** The schema one key further down, through optional, default, nullable and union wrappers; the first description met on the way. */
function child(schema: z.ZodType, key: string): { schema: z.ZodType; description: string | undefined } | null {
  let current = schema as unknown as ZodInternals;
  let description = current.description;
  while (current._zod.def.innerType !== undefined) {
    current = current._zod.def.innerType as unknown as ZodInternals;
    description ??= current.description;
  }
  if (current._zod.def.type === 'union') {
    for (const option of current._zod.def.options ?? []) {
      const found = child(option, key);
      if (found !== null) return found;
    }
    return null;
  }
  const next = current.shape?.[key];
  return next === undefined ? null : { schema: next, description };
}

function describedAt(schema: z.ZodType, keys: readonly string[]): string | undefined {
  let current: z.ZodType = schema;
  for (const key of keys) {
    const found = child(current, key);
    if (found === null) return undefined;
    current = found.schema;
  }
  let inner = current as unknown as ZodInternals;
  let description = inner.description;
  while (description === undefined && inner._zod.def.innerType !== undefined) {
    inner = inner._zod.def.innerType as unknown as ZodInternals;
    description = inner.description;
  }
  return description;
}

/**
 * Reads a field's label and unit from its schema description ("Corner frequency [Hz]. ...",
 * "Output swing [V, V]: ..."); a unit that depends on the mode ("Pa or m^3/s") takes the mode's.
 */
function fromDescription(description: string | undefined, key: string, mode: string | undefined): FieldUnit {
  if (description === undefined) return { label: key, units: [] };
  const head = description.split(/ \[|\. |: /)[0]!.trim();
  // A description that opens with a formula rather than a name ("c1, c2, c3 of dC = ...") is labelled by its key.
  const label = head.length > 0 && head.length <= 40 && !head.includes('=') ? head : key;
  const bracket = /\[([^\]]+)\]/.exec(description)?.[1];
  const units = (bracket ?? '').split(',').map((unit) => {
    const trimmed = unit.trim();
    return trimmed === 'Pa or m^3/s' ? (mode === 'flow' ? 'm^3/s' : 'Pa') : trimmed;
  });
  // A bracket of numbers is a range in the text ("spanning [0, 2]"), not a unit.
  return bracket === undefined || units.some((unit) => !/[A-Za-z]/.test(unit)) ? { label, units: [] } : { label, units };
}

/**
 * Label and units of a field of a section ("sensor", ["cellA", "baseCapacitance"]) or of a chain
 * stage of the given kind (["corner"]).
 */
export function fieldUnit(registry: StageRegistry, where: { section: string } | { stageKind: string }, keys: readonly string[], mode: string | undefined): FieldUnit {
  const schema = 'section' in where ? sections[where.section] : registry.get(where.stageKind)?.schema;
  const last = keys[keys.length - 1] ?? '';
  if (schema === undefined) return { label: last, units: [] };
  return fromDescription(describedAt(schema, keys), last, mode);
}

const dimensionBySiUnit = new Map<string, DimensionName>(
  (Object.entries(dimensions) as [DimensionName, (typeof dimensions)[DimensionName]][]).map(([name, dimension]) => [dimension.siUnit, name]),
);

/** The dimension whose SI unit this is ("F" -> capacitance), for display with engineering prefixes; null for units without one. */
export function dimensionOf(siUnit: string): DimensionName | null {
  return dimensionBySiUnit.get(siUnit) ?? null;
}

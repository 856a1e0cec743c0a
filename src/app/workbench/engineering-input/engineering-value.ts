import { dimensions, formatQuantity, parseQuantity, siPrefixes, type DimensionName, type ParsedQuantity } from '@shared/units';

const prefixScale = new Map<string, number>([...siPrefixes, ['µ', 1e-6], ['μ', 1e-6]]);
const plainNumber = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([afpnuµμmkMGT]?)$/;

/**
 * Reads a typed value: with a dimension, a number with a unit or a bare number with an SI prefix
 * ("2.2 pF", "2.2p"); without one, a plain number that may carry an SI prefix ("20", "1.5k").
 */
export function parseEngineeringValue(text: string, dimension: DimensionName | null): ParsedQuantity {
  if (dimension !== null) return parseQuantity(text, dimension);
  const trimmed = text.trim();
  if (trimmed === '') return { ok: false, message: 'expected a number, got nothing' };
  const match = plainNumber.exec(trimmed);
  if (!match) return { ok: false, message: `"${trimmed}" is not a number` };
  const value = Number(match[1]) * (prefixScale.get(match[2]) ?? 1);
  return Number.isFinite(value) ? { ok: true, value } : { ok: false, message: 'expected a finite number' };
}

/** Writes a value back into its field: engineering prefix and unit for a dimension, the plain number otherwise. */
export function formatEngineeringValue(value: number, dimension: DimensionName | null): string {
  return dimension === null ? String(value) : formatQuantity(value, dimension, { significant: 6 });
}

/** The unit a bare number in the field is read in: the SI unit of its dimension. */
export function unitOf(dimension: DimensionName | null, plainUnit: string): string {
  return dimension === null ? plainUnit : dimensions[dimension].siUnit;
}

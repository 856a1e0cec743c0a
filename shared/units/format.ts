import { dimensions, type DimensionName } from './dimensions';

/** Engineering prefixes used for display, and the SI prefixes a bare number may carry. */
export const siPrefixes: ReadonlyArray<readonly [string, number]> = [
  ['a', 1e-18],
  ['f', 1e-15],
  ['p', 1e-12],
  ['n', 1e-9],
  ['u', 1e-6],
  ['m', 1e-3],
  ['', 1],
  ['k', 1e3],
  ['M', 1e6],
  ['G', 1e9],
  ['T', 1e12],
];

export interface FormatOptions {
  /** Significant digits; 3 unless told. */
  significant?: number;
}

/**
 * Writes an SI value with an engineering prefix on the display unit's first symbol:
 * 2.2e-12 F -> "2.2 pF", 3e-19 F/Pa -> "300 aF/kPa", 2e-8 m^3/s -> "20 uL/s".
 */
export function formatQuantity(value: number, dimensionName: DimensionName, options: FormatOptions = {}): string {
  const dimension = dimensions[dimensionName];
  const significant = options.significant ?? 3;
  if (!Number.isFinite(value)) return `- ${dimension.displayUnit}`;
  const scaled = value / dimension.displayScale;
  if (!dimension.prefixed || scaled === 0) return `${trimDigits(scaled, significant)} ${dimension.displayUnit}`;
  const exponent = Math.floor(Math.log10(Math.abs(scaled)) / 3) * 3;
  const clamped = Math.min(12, Math.max(-18, exponent));
  let prefixValue = Math.pow(10, clamped);
  let mantissa = scaled / prefixValue;
  // Rounding can carry 999.7 up to 1000: move to the next prefix instead.
  if (Math.abs(Number(mantissa.toPrecision(significant))) >= 1000 && clamped < 12) {
    prefixValue *= 1000;
    mantissa = scaled / prefixValue;
  }
  const prefix = siPrefixes.find(([, scale]) => Math.abs(scale / prefixValue - 1) < 1e-9)?.[0] ?? '';
  return `${trimDigits(mantissa, significant)} ${prefix}${dimension.displayUnit}`;
}

function trimDigits(value: number, significant: number): string {
  return String(Number(value.toPrecision(significant)));
}

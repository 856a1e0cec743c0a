/**
 * The physical quantities a readout design uses, each with its SI unit (how the engine stores it)
 * and the unit a designer reads it in (where the SI prefix goes).
 */
export interface Dimension {
  /** Name in a sentence: "expected a capacitance". */
  readonly noun: string;
  /** SI unit the engine stores, in mathjs syntax. */
  readonly siUnit: string;
  /** Unit shown to the designer; the SI prefix is put on its first symbol. */
  readonly displayUnit: string;
  /** How the display unit relates to the SI unit: value_display = value_SI / displayScale (before the prefix). */
  readonly displayScale: number;
  /** False where a prefix reads wrong ("1 kkg/m^3", "0.3 kK"). */
  readonly prefixed: boolean;
}

function dimension(noun: string, siUnit: string, displayUnit = siUnit, displayScale = 1, prefixed = true): Dimension {
  return { noun, siUnit, displayUnit, displayScale, prefixed };
}

export const dimensions = {
  capacitance: dimension('a capacitance', 'F'),
  frequency: dimension('a frequency', 'Hz'),
  voltage: dimension('a voltage', 'V'),
  current: dimension('a current', 'A'),
  resistance: dimension('a resistance', 'ohm'),
  time: dimension('a time', 's'),
  temperature: dimension('a temperature', 'K', 'K', 1, false),
  pressure: dimension('a pressure', 'Pa'),
  length: dimension('a length', 'm'),
  volumeFlow: dimension('a volume flow', 'm^3/s', 'L/s', 1e-3),
  viscosity: dimension('a dynamic viscosity', 'Pa s'),
  massDensity: dimension('a mass density', 'kg/m^3', 'kg/m^3', 1, false),
  hydraulicResistance: dimension('a hydraulic resistance', 'Pa s/m^3'),
  voltageNoiseDensity: dimension('a voltage noise density', 'V/rtHz'),
  currentNoiseDensity: dimension('a current noise density', 'A/rtHz'),
  slewRate: dimension('a slew rate', 'V/s', 'V/us', 1e6),
  capacitancePerPressure: dimension('a capacitance per pressure', 'F/Pa', 'F/kPa', 1e-3),
  voltsPerFarad: dimension('a sensitivity per capacitance', 'V/F', 'V/fF', 1e15),
  voltsPerPascal: dimension('a sensitivity per pressure', 'V/Pa', 'V/kPa', 1e-3),
  voltsPerVolumeFlow: dimension('a sensitivity per volume flow', 'V s/m^3', 'V s/uL', 1e9),
} as const satisfies Record<string, Dimension>;

export type DimensionName = keyof typeof dimensions;

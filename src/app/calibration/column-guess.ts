
type ColumnField = 'referenceColumn' | 'readoutColumn' | 'cellColumn' | 'runColumn' | 'directionColumn' | 'timeColumn';

/** Words a bench file's header tends to use for each role, tried in order. */
const hints: Record<ColumnField, RegExp> = {
  referenceColumn: /^(reference|ref|pressure|flow|p|setpoint)/i,
  readoutColumn: /^(readout|output|out|reading|signal|value|v|adc|counts?)/i,
  cellColumn: /^(cell|device|dut|sensor|serial)/i,
  runColumn: /^(run|cycle|pass|repeat)/i,
  directionColumn: /^(direction|dir|traverse|sweep)/i,
  timeColumn: /^(time|t|timestamp|elapsed)/i,
};

/** A first guess of the column mapping from the header, so a conventional file needs no clicks. */
export function guessMapping(columns: readonly string[]): Partial<Record<ColumnField, string>> {
  const taken = new Set<string>();
  const guess: Partial<Record<ColumnField, string>> = {};
  for (const field of Object.keys(hints) as ColumnField[]) {
    const column = columns.find((name) => !taken.has(name) && hints[field].test(name.trim()));
    if (column !== undefined) {
      guess[field] = column;
      taken.add(column);
    }
  }
  return guess;
}

/** A unit written into the header, e.g. "pressure_kPa" or "output [mV]". */
export function unitInHeader<T extends string>(column: string | undefined, units: readonly T[]): T | undefined {
  if (column === undefined) return undefined;
  return units.find((unit) => new RegExp(`(^|[^A-Za-z])${unit.replace(/[\^$/]/g, '\\$&')}([^A-Za-z]|$)`).test(column));
}

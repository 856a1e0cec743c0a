import { format, type NumberValue, type ScaleContinuousNumeric } from 'd3';

/** Tick labels with SI prefixes ("2.5k", "300µ"), three significant digits at most. */
export const siTick = format('.3~s');

/** A value read off a cursor: four significant digits with an SI prefix and the unit, if any. */
export function cursorValue(value: number, unit: string): string {
  if (!Number.isFinite(value)) return '-';
  const text = format('.4~s')(value);
  return unit === '' ? text : `${text} ${unit}`;
}

/**
 * Tick labels for an axis: SI prefixes at the precision the tick step needs (d3's tickFormat), and
 * zero written as "0" rather than "0m".
 */
export function axisTickFormat(scale: ScaleContinuousNumeric<number, number>, count: number): (value: NumberValue) => string {
  const label = scale.tickFormat(count, '~s');
  return (value) => (+value === 0 ? '0' : label(value));
}

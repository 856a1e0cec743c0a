/**
 * Bench data for calibration (ENGINE.md section 6): points of (reference, readout), each with its
 * cell, run and traverse direction. Values are in SI units (the reference in Pa or m^3/s, the
 * readout in V, F or counts); the engine never needs to know which.
 */

export type TraverseDirection = 'up' | 'down';

export interface CalibrationPoint {
  /** Value of the reference instrument (the measurand), SI unit. */
  readonly reference: number;
  /** Value the device under test reports, SI unit. */
  readonly readout: number;
  readonly cell: string;
  readonly run: string;
  readonly direction: TraverseDirection;
}

/**
 * Which way a fit goes: the characteristic readout = f(reference) shows the sensor; the
 * calibration curve reference = g(readout) is what a device evaluates.
 */
export type FitDirection = 'characteristic' | 'calibration';

/** The fit's independent and dependent values of a point. */
export function fitAxes(point: CalibrationPoint, direction: FitDirection): { x: number; y: number } {
  return direction === 'characteristic' ? { x: point.reference, y: point.readout } : { x: point.readout, y: point.reference };
}

/** Default width of a set point: references within 1 % of the span of each other are one point. */
export const DEFAULT_SETPOINT_TOLERANCE = 0.01;

/**
 * Groups points by set point: a reference instrument never reads the same value twice, so the
 * "same reference point" of ISA-51.1 is a cluster of references closer than `tolerance` (a
 * fraction of the reference span) to their neighbour.
 * @returns for each point the index of its set point, numbered upwards from the lowest reference.
 */
export function setpointIndices(references: ArrayLike<number>, tolerance = DEFAULT_SETPOINT_TOLERANCE): number[] {
  const order = Array.from({ length: references.length }, (_, i) => i).sort((a, b) => references[a] - references[b]);
  const indices = new Array<number>(references.length);
  if (order.length === 0) return indices;
  const span = references[order[order.length - 1]] - references[order[0]];
  const gap = tolerance * span;
  let group = 0;
  for (let k = 0; k < order.length; k++) {
    if (k > 0 && references[order[k]] - references[order[k - 1]] > gap) group++;
    indices[order[k]] = group;
  }
  return indices;
}

/** The cells of a batch in natural order ("cell 2" before "cell 10"). */
export function cellIds(points: ReadonlyArray<CalibrationPoint>): string[] {
  return [...new Set(points.map((point) => point.cell))].sort((a, b) => a.localeCompare(b, 'en', { numeric: true }));
}

export function mean(values: ReadonlyArray<number>): number {
  let sum = 0;
  for (const value of values) sum += value;
  return sum / values.length;
}

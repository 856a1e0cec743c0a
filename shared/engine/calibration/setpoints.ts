/** Per-set-point summaries of one cell's points: the basis of every %FS figure. */
import { mean, setpointIndices, type CalibrationPoint, type TraverseDirection } from './points';

export interface SetpointReadings {
  /** Set point number, upwards from the lowest reference. */
  readonly index: number;
  /** Mean reference of the set point's points. */
  readonly reference: number;
  /** Mean readout over every point at the set point. */
  readonly readout: number;
  /** The points' positions in the cell's point array. */
  readonly members: number[];
  /** Mean readout of each run and direction at this set point, keyed `${direction}:${run}`. */
  readonly byRun: ReadonlyMap<string, { readonly run: string; readonly direction: TraverseDirection; readonly readouts: number[] }>;
}

/** Groups a cell's points into set points (see setpointIndices) in ascending reference order. */
export function summariseSetpoints(points: ReadonlyArray<CalibrationPoint>, tolerance?: number): SetpointReadings[] {
  const indices = setpointIndices(
    points.map((point) => point.reference),
    tolerance,
  );
  const groups: { members: number[] }[] = [];
  indices.forEach((group, position) => (groups[group] ??= { members: [] }).members.push(position));
  return groups.map(({ members }, index) => {
    const byRun = new Map<string, { run: string; direction: TraverseDirection; readouts: number[] }>();
    for (const position of members) {
      const { run, direction, readout } = points[position];
      const key = `${direction}:${run}`;
      const entry = byRun.get(key) ?? { run, direction, readouts: [] };
      entry.readouts.push(readout);
      byRun.set(key, entry);
    }
    return {
      index,
      reference: mean(members.map((position) => points[position].reference)),
      readout: mean(members.map((position) => points[position].readout)),
      members,
      byRun,
    };
  });
}

/** Span of the readout between the lowest and the highest set point (the output span of ISA-51.1). */
export function readoutSpan(setpoints: ReadonlyArray<SetpointReadings>): number {
  return Math.abs(setpoints[setpoints.length - 1].readout - setpoints[0].readout);
}

/** Span of the reference between the lowest and the highest set point (the input span). */
export function referenceSpan(setpoints: ReadonlyArray<SetpointReadings>): number {
  return setpoints[setpoints.length - 1].reference - setpoints[0].reference;
}

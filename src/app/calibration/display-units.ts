import { readoutUnits, referenceUnits, type Dataset, type ReadoutUnit, type ReferenceUnit } from '@shared/contracts/calibration';
import type { CalibrationPoint } from '@shared/engine/calibration/points';

/** The units a dataset was written in: values are stored in SI and shown in these. */
export interface DisplayUnits {
  readonly reference: string;
  readonly readout: string;
  /** SI value / scale = display value. */
  readonly referenceScale: number;
  readonly readoutScale: number;
}

export function displayUnits(dataset: Dataset): DisplayUnits {
  const reference = dataset.units.referenceDisplay as ReferenceUnit;
  const readout = dataset.units.readoutDisplay as ReadoutUnit;
  return { reference, readout, referenceScale: referenceUnits[reference]?.scale ?? 1, readoutScale: readoutUnits[readout]?.scale ?? 1 };
}

/** The dataset's points as the engine takes them (SI units). */
export function enginePoints(dataset: Dataset, cells?: ReadonlySet<string>): CalibrationPoint[] {
  return dataset.points
    .filter((point) => cells === undefined || cells.has(point.cell))
    .map(({ reference, readout, cell, run, direction }) => ({ reference, readout, cell, run, direction }));
}

/** A number to four significant figures for tables. */
export function figure(value: number | null | undefined, digits = 4): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '–' : value.toPrecision(digits);
}

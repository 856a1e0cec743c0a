/** Degrees 1 to 5 side by side for one cell, so the user sees where a higher degree stops paying. */
import { FitInputError } from '../fit/polynomial-fit';
import { analyseCell, type CellAnalysisOptions } from './cell-analysis';
import type { CalibrationPoint } from './points';

export interface DegreeComparisonRow {
  readonly degree: number;
  /** Null when the data cannot carry this degree; `problem` then says why. */
  readonly residualSd: number | null;
  readonly r2: number | null;
  /** Nonlinearity against the least-squares curve of this degree [%FS]. */
  readonly nonlinearityPercentFullScale: number | null;
  /** Largest |residual| of any single point [%FS]. */
  readonly worstResidualPercentFullScale: number | null;
  readonly coefficients: number[] | null;
  readonly problem: string | null;
}

export const COMPARED_DEGREES = [1, 2, 3, 4, 5] as const;

export function compareDegrees(points: ReadonlyArray<CalibrationPoint>, options: Omit<CellAnalysisOptions, 'degree'>): DegreeComparisonRow[] {
  return COMPARED_DEGREES.map((degree) => {
    try {
      const analysis = analyseCell(points, { ...options, degree });
      const worstResidual = Math.max(...analysis.fit.residuals.map(Math.abs));
      return {
        degree,
        residualSd: analysis.fit.residualSd,
        r2: analysis.fit.r2,
        nonlinearityPercentFullScale: analysis.nonlinearity[0].percentFullScale,
        worstResidualPercentFullScale: (100 * worstResidual) / analysis.fullScale,
        coefficients: analysis.fit.coefficients,
        problem: null,
      };
    } catch (error) {
      if (!(error instanceof FitInputError)) throw error;
      return { degree, residualSd: null, r2: null, nonlinearityPercentFullScale: null, worstResidualPercentFullScale: null, coefficients: null, problem: error.message };
    }
  });
}

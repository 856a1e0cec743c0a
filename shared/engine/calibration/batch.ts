/**
 * Batch calibration (ENGINE.md section 6): can a production batch share one calibration curve?
 * One curve reference = g(readout) is fitted on the pooled points of k reference cells and applied
 * to every other cell, raw or after a per-cell trim; each cell's worst error is compared with a
 * target in % of the reference full scale.
 */
import { evaluateFit, fitPolynomial, type PolynomialFit } from '../fit/polynomial-fit';
import { cellIds, mean, type CalibrationPoint } from './points';
import { referenceSpan, summariseSetpoints } from './setpoints';

/**
 * Per-cell correction after the shared curve: none; a one-point offset trim at the lowest set
 * point; a two-point gain and offset trim at the lowest and highest set points.
 */
export type TrimMode = 'none' | 'offset' | 'gain-offset';

export interface BatchOptions {
  readonly degree: number;
  readonly throughOrigin?: boolean;
  readonly trim: TrimMode;
  /** A cell passes when its worst error is at most this [% of full scale]. */
  readonly targetPercentFullScale: number;
  /** Full scale in the reference unit; default: the batch's reference span between its lowest and highest set point. */
  readonly fullScale?: number;
  readonly setpointTolerance?: number;
}

export interface CellVerdict {
  readonly cell: string;
  /** Largest |calibrated - reference| over the cell's points [% of full scale]. */
  readonly worstErrorPercentFullScale: number;
  /** Reference value of the point with the worst error. */
  readonly atReference: number;
  readonly passed: boolean;
}

export interface BatchEvaluation {
  readonly referenceCells: string[];
  /** The shared calibration curve reference = g(readout). */
  readonly fit: PolynomialFit;
  readonly fullScale: number;
  /** Every cell not in the reference set, in natural order. */
  readonly cells: CellVerdict[];
  /** Passing cells over evaluated cells, 0..1; null when every cell is a reference cell. */
  readonly passShare: number | null;
}

/** Input a batch evaluation cannot use. */
export class BatchInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'BatchInputError';
  }
}

export function evaluateBatch(points: ReadonlyArray<CalibrationPoint>, referenceCells: ReadonlyArray<string>, options: BatchOptions): BatchEvaluation {
  const cells = cellIds(points);
  const chosen = new Set(referenceCells);
  for (const cell of chosen) if (!cells.includes(cell)) throw new BatchInputError(`Cell "${cell}" is not in the dataset`);
  if (chosen.size === 0) throw new BatchInputError('Choose at least one reference cell');
  const fullScale = options.fullScale ?? referenceSpan(summariseSetpoints(points, options.setpointTolerance));
  if (!(fullScale > 0)) throw new BatchInputError('Full scale must be above 0: the references do not span a range');
  const pooled = points.filter((point) => chosen.has(point.cell));
  const fit = fitPolynomial(
    pooled.map((point) => point.readout),
    pooled.map((point) => point.reference),
    { degree: options.degree, throughOrigin: options.throughOrigin },
  );
  const verdicts = cells
    .filter((cell) => !chosen.has(cell))
    .map((cell) => judgeCell(cell, points.filter((point) => point.cell === cell), fit, fullScale, options));
  return {
    referenceCells: cells.filter((cell) => chosen.has(cell)),
    fit,
    fullScale,
    cells: verdicts,
    passShare: verdicts.length === 0 ? null : verdicts.filter((verdict) => verdict.passed).length / verdicts.length,
  };
}

function judgeCell(cell: string, points: ReadonlyArray<CalibrationPoint>, fit: PolynomialFit, fullScale: number, options: BatchOptions): CellVerdict {
  const calibrated = points.map((point) => evaluateFit(fit, point.readout));
  const trimmed = trim(points, calibrated, options);
  let worst = 0;
  for (let i = 1; i < points.length; i++) {
    if (Math.abs(trimmed[i] - points[i].reference) > Math.abs(trimmed[worst] - points[worst].reference)) worst = i;
  }
  const worstErrorPercentFullScale = (100 * Math.abs(trimmed[worst] - points[worst].reference)) / fullScale;
  return { cell, worstErrorPercentFullScale, atReference: points[worst].reference, passed: worstErrorPercentFullScale <= options.targetPercentFullScale };
}

/** The trim a production line would apply from the cell's own readings at its end set points. */
function trim(points: ReadonlyArray<CalibrationPoint>, calibrated: number[], options: BatchOptions): number[] {
  if (options.trim === 'none') return calibrated;
  const setpoints = summariseSetpoints(points, options.setpointTolerance);
  const at = (index: number) => ({
    reference: mean(setpoints[index].members.map((position) => points[position].reference)),
    calibrated: mean(setpoints[index].members.map((position) => calibrated[position])),
  });
  const low = at(0);
  if (options.trim === 'offset') return calibrated.map((value) => value - (low.calibrated - low.reference));
  const high = at(setpoints.length - 1);
  if (setpoints.length < 2 || high.calibrated === low.calibrated) throw new BatchInputError('A two-point trim needs two set points with different readouts in every cell');
  const gain = (high.reference - low.reference) / (high.calibrated - low.calibrated);
  return calibrated.map((value) => low.reference + gain * (value - low.calibrated));
}

export interface BatchSizeRow {
  /** Number of reference cells. */
  readonly k: number;
  /** How many reference sets were tried. */
  readonly sets: number;
  /** Mean, lowest and highest share of passing cells over the sets, 0..1. */
  readonly meanPassShare: number;
  readonly worstPassShare: number;
  readonly bestPassShare: number;
}

/**
 * Tries every k from 1 to N - 1. With at most `maxSets` subsets of size k all are tried; beyond
 * that the N windows of k consecutive cells (in natural order, wrapping round), so the result
 * stays deterministic.
 */
export function sweepBatchSize(points: ReadonlyArray<CalibrationPoint>, options: BatchOptions, maxSets = 200): BatchSizeRow[] {
  const cells = cellIds(points);
  const rows: BatchSizeRow[] = [];
  for (let k = 1; k < cells.length; k++) {
    const subsets = binomialCount(cells.length, k) <= maxSets ? combinations(cells, k) : windows(cells, k);
    const shares = subsets.map((subset) => evaluateBatch(points, subset, options).passShare ?? 0);
    rows.push({ k, sets: subsets.length, meanPassShare: mean(shares), worstPassShare: Math.min(...shares), bestPassShare: Math.max(...shares) });
  }
  return rows;
}

function binomialCount(n: number, k: number): number {
  let value = 1;
  for (let i = 1; i <= k; i++) value = (value * (n - k + i)) / i;
  return Math.round(value);
}

function combinations<T>(items: ReadonlyArray<T>, k: number): T[][] {
  const out: T[][] = [];
  const pick = (start: number, chosen: T[]) => {
    if (chosen.length === k) {
      out.push([...chosen]);
      return;
    }
    for (let i = start; i <= items.length - (k - chosen.length); i++) pick(i + 1, [...chosen, items[i]]);
  };
  pick(0, []);
  return out;
}

function windows<T>(items: ReadonlyArray<T>, k: number): T[][] {
  return items.map((_, start) => Array.from({ length: k }, (_, offset) => items[(start + offset) % items.length]));
}

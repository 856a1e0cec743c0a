/**
 * The %FS figures of one cell (ENGINE.md section 6; ANSI/ISA-51.1 terms): its fit in the chosen
 * direction, nonlinearity against the fitted curve (and, for a straight line, against the
 * terminal-based and minimax lines), hysteresis, repeatability and resolution.
 */
import { fitPolynomial, fitSlope, type PolynomialFit } from '../fit/polynomial-fit';
import { minimaxLine, terminalLine } from '../fit/straight-lines';
import { leastSquaresCurveName, type PercentFigure } from './figure';
import { hysteresis, repeatability } from './hysteresis';
import { fitAxes, mean, type CalibrationPoint, type FitDirection } from './points';
import { readoutSpan, referenceSpan, summariseSetpoints, type SetpointReadings } from './setpoints';

export interface CellAnalysisOptions {
  readonly direction: FitDirection;
  readonly degree: number;
  readonly throughOrigin?: boolean;
  /** Full scale in the unit of the fit's dependent value; default: its span between the lowest and highest set point. */
  readonly fullScale?: number;
  /** Readout noise in rms readout units (from the design's budget, say); default: the measured spread. */
  readonly noiseRms?: number;
  /** Set point width as a fraction of the reference span (points.ts). */
  readonly setpointTolerance?: number;
}

export interface ResolutionFigure {
  /** Where the noise came from. */
  readonly source: 'measured spread' | 'noise figure';
  /** The readout noise used [rms, readout unit]. */
  readonly noiseRms: number;
  /** Largest noise divided by the local slope over the set points [reference unit]. */
  readonly value: number;
  /** The same in % of the reference span. */
  readonly percentFullScale: number;
  readonly atReference: number;
}

export interface CellAnalysis {
  readonly direction: FitDirection;
  readonly fit: PolynomialFit;
  /** Full scale the nonlinearity is a percentage of, in the fit's dependent unit. */
  readonly fullScale: number;
  readonly readoutSpan: number;
  readonly referenceSpan: number;
  /** The fitted curve first, then for a straight line the terminal-based and minimax lines. */
  readonly nonlinearity: PercentFigure[];
  /** In % of the readout span; null without both directions at one set point. */
  readonly hysteresis: PercentFigure | null;
  /** In % of the readout span; null without two runs at one set point and direction. */
  readonly repeatability: PercentFigure | null;
  /** Null when no noise is given and no set point has repeated readings, or the slope vanishes. */
  readonly resolution: ResolutionFigure | null;
  readonly setpoints: SetpointReadings[];
}

/** A full scale that is not positive leaves every %FS figure undefined. */
export class FullScaleError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FullScaleError';
  }
}

export function analyseCell(points: ReadonlyArray<CalibrationPoint>, options: CellAnalysisOptions): CellAnalysis {
  const { direction, degree } = options;
  const throughOrigin = options.throughOrigin ?? false;
  const axes = points.map((point) => fitAxes(point, direction));
  const fit = fitPolynomial(
    axes.map((axis) => axis.x),
    axes.map((axis) => axis.y),
    { degree, throughOrigin },
  );
  const setpoints = summariseSetpoints(points, options.setpointTolerance);
  if (setpoints.length < 2) throw new FullScaleError('The points lie at a single set point; full scale needs at least two');
  const spans = { readout: readoutSpan(setpoints), reference: referenceSpan(setpoints) };
  const fullScale = options.fullScale ?? (direction === 'characteristic' ? spans.readout : spans.reference);
  if (!(fullScale > 0) || !(spans.readout > 0)) throw new FullScaleError('Full scale must be above 0: the readout does not change over the set points');

  // Each set point's mean (x, y) and mean residual: nonlinearity leaves hysteresis and noise to their own figures.
  const means = setpoints.map((setpoint) => ({
    reference: setpoint.reference,
    x: mean(setpoint.members.map((position) => axes[position].x)),
    y: mean(setpoint.members.map((position) => axes[position].y)),
    residual: mean(setpoint.members.map((position) => fit.residuals[position])),
  }));
  const worstOf = (against: string, deviation: (entry: (typeof means)[number]) => number): PercentFigure => {
    let worst = means[0];
    for (const entry of means) if (Math.abs(deviation(entry)) > Math.abs(deviation(worst))) worst = entry;
    const value = Math.abs(deviation(worst));
    return { against, value, percentFullScale: (100 * value) / fullScale, atReference: worst.reference };
  };
  const nonlinearity = [worstOf(leastSquaresCurveName(degree, throughOrigin), (entry) => entry.residual)];
  if (degree === 1) {
    const bottom = means[0];
    const top = means[means.length - 1];
    const terminal = terminalLine(bottom.x, bottom.y, top.x, top.y);
    nonlinearity.push(worstOf('terminal-based line', (entry) => entry.y - terminal.intercept - terminal.slope * entry.x));
    const minimax = minimaxLine(
      means.map((entry) => entry.x),
      means.map((entry) => entry.y),
    );
    nonlinearity.push(worstOf('minimax line', (entry) => entry.y - minimax.intercept - minimax.slope * entry.x));
  }

  return {
    direction,
    fit,
    fullScale,
    readoutSpan: spans.readout,
    referenceSpan: spans.reference,
    nonlinearity,
    hysteresis: hysteresis(setpoints, spans.readout),
    repeatability: repeatability(setpoints, spans.readout),
    resolution: resolution(setpoints, fit, direction, spans.reference, options.noiseRms),
    setpoints,
  };
}

/** Readout noise through the local slope d readout / d reference at each set point; the worst one. */
function resolution(
  setpoints: ReadonlyArray<SetpointReadings>,
  fit: PolynomialFit,
  direction: FitDirection,
  span: number,
  noiseRms: number | undefined,
): ResolutionFigure | null {
  const noise = noiseRms !== undefined ? { source: 'noise figure' as const, value: noiseRms } : measuredSpread(setpoints);
  if (noise === null || !(noise.value >= 0)) return null;
  let worst: ResolutionFigure | null = null;
  for (const setpoint of setpoints) {
    const slope = direction === 'characteristic' ? fitSlope(fit, setpoint.reference) : 1 / fitSlope(fit, setpoint.readout);
    if (!Number.isFinite(slope) || slope === 0) continue;
    const value = noise.value / Math.abs(slope);
    if (worst === null || value > worst.value) {
      worst = { source: noise.source, noiseRms: noise.value, value, percentFullScale: (100 * value) / span, atReference: setpoint.reference };
    }
  }
  return worst;
}

/** Pooled standard deviation of the readouts at each set point and direction (across runs and repeats). */
function measuredSpread(setpoints: ReadonlyArray<SetpointReadings>): { source: 'measured spread'; value: number } | null {
  let sumSquares = 0;
  let freedom = 0;
  for (const setpoint of setpoints) {
    for (const direction of ['up', 'down'] as const) {
      const readouts = [...setpoint.byRun.values()].filter((entry) => entry.direction === direction).flatMap((entry) => entry.readouts);
      if (readouts.length < 2) continue;
      const centre = mean(readouts);
      for (const readout of readouts) sumSquares += (readout - centre) ** 2;
      freedom += readouts.length - 1;
    }
  }
  return freedom > 0 ? { source: 'measured spread', value: Math.sqrt(sumSquares / freedom) } : null;
}

import type { SweepPoint } from '@shared/engine/index';

/** What the sweep tab plots of one point: few numbers, so a worker can send a thousand cheaply. */
export interface SweepRow {
  readonly value: number;
  /** Resolution in differential capacitance [F]; null where the point has no budget. */
  readonly resolutionFarad: number | null;
  /** In the mode's measurand: Pa (pressure) or m^3/s (flow). */
  readonly resolutionMeasurand: number | null;
  /** Largest fraction of its swing any node uses [1]; above 1 something clips. */
  readonly worstUsedFraction: number | null;
  /** Node with that largest fraction. */
  readonly worstNode: string | null;
  /** Carrier ripple at the output at full scale [V peak]. */
  readonly ripple: number | null;
  /** What makes the value invalid for the design, when it is. */
  readonly error: string | null;
}

export function sweepRow(point: SweepPoint): SweepRow {
  if (point.budget === null) {
    const first = point.errors[0];
    return {
      value: point.value,
      resolutionFarad: null,
      resolutionMeasurand: null,
      worstUsedFraction: null,
      worstNode: null,
      ripple: null,
      error: first === undefined ? 'The design cannot take this value' : `${first.path}: ${first.message}`,
    };
  }
  const budget = point.budget;
  let worst: number | null = null;
  let worstNode: string | null = null;
  for (const level of budget.levels) {
    if (level.usedFraction !== null && (worst === null || level.usedFraction > worst)) {
      worst = level.usedFraction;
      worstNode = level.node;
    }
  }
  const measurand = budget.mode === 'pressure' ? budget.resolution.pascal : budget.resolution.cubicMetrePerSecond;
  return {
    value: point.value,
    resolutionFarad: budget.resolution.farad,
    resolutionMeasurand: measurand,
    worstUsedFraction: worst,
    worstNode,
    ripple: budget.ripple.outputPeak,
    error: null,
  };
}

/**
 * The row with the finest resolution (in the measurand where there is one, else in capacitance)
 * among those where no node uses more than its swing; null when every row clips or fails.
 */
export function bestWithinHeadroom(rows: readonly SweepRow[]): SweepRow | null {
  let best: SweepRow | null = null;
  for (const row of rows) {
    if (row.error !== null || (row.worstUsedFraction !== null && row.worstUsedFraction > 1)) continue;
    const resolution = row.resolutionMeasurand ?? row.resolutionFarad;
    if (resolution === null || !Number.isFinite(resolution) || resolution <= 0) continue;
    const bestResolution = best === null ? Infinity : (best.resolutionMeasurand ?? best.resolutionFarad ?? Infinity);
    if (resolution < bestResolution) best = row;
  }
  return best;
}

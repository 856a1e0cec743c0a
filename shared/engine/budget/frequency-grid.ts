/** Grid points per decade of each segment. */
export const POINTS_PER_DECADE = 24;

/** A stretch of the grid evenly spaced in ln f: points start..start + count, spacing `step`. */
export interface GridSegment {
  start: number;
  count: number;
  step: number;
}

/**
 * A log-spaced grid over [low, high], in two segments split exactly at `split` (half the ADC
 * sample rate) when it lies inside, so that the noise above and below it can be told apart.
 */
export interface FrequencyGrid {
  frequency: Float64Array;
  segments: GridSegment[];
  /** Segments from this index on lie above the split. */
  firstAboveSplit: number;
}

export function logFrequencyGrid(low: number, high: number, split: number | null): FrequencyGrid {
  const inside = split !== null && split > low && split < high;
  const edges = inside ? [low, split as number, high] : [low, high];
  const segments: GridSegment[] = [];
  let start = 0;
  for (let s = 0; s + 1 < edges.length; s++) {
    const count = Math.max(8, Math.ceil(Math.log10(edges[s + 1] / edges[s]) * POINTS_PER_DECADE));
    segments.push({ start, count, step: Math.log(edges[s + 1] / edges[s]) / count });
    start += count;
  }
  const frequency = new Float64Array(start + 1);
  for (let s = 0; s < segments.length; s++) {
    const { start: first, count, step } = segments[s];
    for (let i = 0; i < count; i++) frequency[first + i] = edges[s] * Math.exp(step * i);
  }
  frequency[start] = high;
  const firstAboveSplit = inside ? 1 : split !== null && split <= low ? 0 : segments.length;
  return { frequency, segments, firstAboveSplit };
}

/**
 * integral of S(f) df over one segment, as the integral of g(u) = S(e^u) e^u du by the trapezoid
 * rule with the Euler-Maclaurin end correction -(h^2 / 12)(g'(b) - g'(a)) (one-sided second-order
 * differences): fourth order for flat spectra, and still exponentially accurate for spectra that
 * die away at both ends, like a white source through a low-pass.
 * `g` holds S times f at the segment's points, read with the given stride and offset.
 */
export function integrateSegment(segment: GridSegment, g: Float64Array, stride: number, offset: number): number {
  const { start, count, step } = segment;
  const at = (i: number) => g[(start + i) * stride + offset];
  let sum = 0.5 * (at(0) + at(count));
  for (let i = 1; i < count; i++) sum += at(i);
  const slopeStart = (-3 * at(0) + 4 * at(1) - at(2)) / (2 * step);
  const slopeEnd = (3 * at(count) - 4 * at(count - 1) + at(count - 2)) / (2 * step);
  return step * sum - ((step * step) / 12) * (slopeEnd - slopeStart);
}

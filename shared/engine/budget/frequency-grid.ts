/** Grid points per decade: the trapezoid rule in log f is exponentially accurate for smooth spectra, so few suffice. */
export const POINTS_PER_DECADE = 24;

/**
 * A log-spaced grid with trapezoid weights for integral S(f) df = integral S(f) f d(ln f), the
 * weights split into the parts below and above a split frequency (half the ADC sample rate).
 */
export interface FrequencyGrid {
  frequency: Float64Array;
  /** Weights (already times f) of the integral below and above the split. */
  weightBelow: Float64Array;
  weightAbove: Float64Array;
}

export function logFrequencyGrid(low: number, high: number, split: number | null): FrequencyGrid {
  const inside = split !== null && split > low && split < high;
  const edges = inside ? [low, split as number, high] : [low, high];
  const counts: number[] = [];
  for (let s = 0; s + 1 < edges.length; s++) counts.push(Math.max(8, Math.ceil(Math.log10(edges[s + 1] / edges[s]) * POINTS_PER_DECADE)));
  const total = counts.reduce((sum, c) => sum + c, 0) + 1;
  const frequency = new Float64Array(total);
  const weightBelow = new Float64Array(total);
  const weightAbove = new Float64Array(total);
  let offset = 0;
  for (let s = 0; s < counts.length; s++) {
    const n = counts[s];
    const step = Math.log(edges[s + 1] / edges[s]) / n;
    // Everything below the split when there is none, or when the split lies above the band.
    const weight = s === 0 && (inside || split === null || split >= high) ? weightBelow : weightAbove;
    for (let i = 0; i <= n; i++) {
      const f = i === n ? edges[s + 1] : edges[s] * Math.exp(step * i);
      frequency[offset + i] = f;
      weight[offset + i] += (i === 0 || i === n ? 0.5 : 1) * step * f;
    }
    offset += n;
  }
  return { frequency, weightBelow, weightAbove };
}

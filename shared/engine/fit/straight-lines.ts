/**
 * The straight lines a linearity figure can be measured against (ANSI/ISA-51.1, Process
 * Instrumentation Terminology): terminal-based (through the end points) and minimax (the line
 * whose largest deviation is smallest: independent linearity in ISA-51.1, the Chebyshev line).
 */

export interface StraightLine {
  readonly intercept: number;
  readonly slope: number;
}

/**
 * Terminal-based line through (x0, y0) and (x1, y1), the lower and upper range points.
 * @throws RangeError when x0 = x1.
 */
export function terminalLine(x0: number, y0: number, x1: number, y1: number): StraightLine {
  if (x1 === x0) throw new RangeError('The terminal points must have different x values');
  const slope = (y1 - y0) / (x1 - x0);
  return { slope, intercept: y0 - slope * x0 };
}

/**
 * Minimax (Chebyshev) straight line of a point set, with its largest deviation.
 *
 * The largest deviation of y - (a + m x) is minimised over a by centring, which leaves half the
 * vertical width w(m) = max(y - m x) - min(y - m x); w is convex and piecewise linear in m with
 * its corners at the slopes of the convex hull's edges, so the best slope is one of those.
 */
export function minimaxLine(x: ArrayLike<number>, y: ArrayLike<number>): StraightLine & { readonly maxDeviation: number } {
  const order = Array.from({ length: x.length }, (_, i) => i).sort((a, b) => x[a] - x[b] || y[a] - y[b]);
  if (order.length < 2 || x[order[0]] === x[order[order.length - 1]]) {
    throw new RangeError('A straight line needs at least two different x values');
  }
  const cross = (o: number, a: number, b: number) => (x[a] - x[o]) * (y[b] - y[o]) - (y[a] - y[o]) * (x[b] - x[o]);
  const lower: number[] = [];
  const upper: number[] = [];
  for (const i of order) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], i) <= 0) lower.pop();
    lower.push(i);
  }
  for (let k = order.length - 1; k >= 0; k--) {
    const i = order[k];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], i) <= 0) upper.pop();
    upper.push(i);
  }
  const slopes = new Set<number>();
  for (const chain of [lower, upper]) {
    for (let k = 1; k < chain.length; k++) {
      const dx = x[chain[k]] - x[chain[k - 1]];
      if (dx !== 0) slopes.add((y[chain[k]] - y[chain[k - 1]]) / dx);
    }
  }
  let best = { slope: 0, intercept: 0, maxDeviation: Infinity };
  for (const slope of slopes) {
    let high = -Infinity;
    let low = Infinity;
    for (let i = 0; i < x.length; i++) {
      const offset = y[i] - slope * x[i];
      high = Math.max(high, offset);
      low = Math.min(low, offset);
    }
    const maxDeviation = (high - low) / 2;
    if (maxDeviation < best.maxDeviation) best = { slope, intercept: (high + low) / 2, maxDeviation };
  }
  return best;
}

import type { Complex } from '../filters/prototype';

export interface StepMetrics {
  /** 10-90 % rise time [s]. */
  riseTime: number;
  /** Peak above the final value, as a fraction of it [1]. */
  overshoot: number;
  /** Time after which the response stays within 1 % and 0.1 % of its final value [s]. */
  settlingTime1Percent: number;
  settlingTime01Percent: number;
}

/** Poles faster than this multiple of the slowest one only delay the step by a negligible 1/|p|. */
const FAST_POLE_RATIO = 100;
/** Time steps per 1/|p| of the fastest pole kept: bilinear warping error ~ (1/STEPS)^2 / 12. */
const STEPS_PER_TIME_CONSTANT = 50;
/** Simulated duration in units of the slowest decay time 1/|Re p|, enough for four equal poles to settle to 1e-4. */
const DURATION_TIME_CONSTANTS = 25;

/**
 * Step response metrics of an all-pole path H(s) = prod(-p) / prod(s - p), unit DC gain: each
 * complex pair or real pole as a bilinear-transform section, stepped finely enough to read the
 * crossings. Null when the path has no poles.
 */
export function stepResponseMetrics(poles: readonly Complex[]): StepMetrics | null {
  if (poles.length === 0) return null;
  const slowest = Math.min(...poles.map((p) => Math.hypot(p.re, p.im)));
  const kept = poles.filter((p) => Math.hypot(p.re, p.im) <= FAST_POLE_RATIO * slowest && p.im >= 0);
  const fastest = Math.max(...kept.map((p) => Math.hypot(p.re, p.im)));
  const slowestDecay = Math.min(...kept.map((p) => Math.abs(p.re)));
  const dt = 1 / (STEPS_PER_TIME_CONSTANT * fastest);
  const steps = Math.ceil(DURATION_TIME_CONSTANTS / (slowestDecay * dt));
  const k = 2 / dt;
  // Section coefficients y[n] = b0 x[n] + b1 x[n-1] + b2 x[n-2] - a1 y[n-1] - a2 y[n-2].
  const sections = kept.map((p) => {
    if (p.im > 0) {
      const w2 = p.re * p.re + p.im * p.im;
      const damping = -2 * p.re;
      const a0 = k * k + damping * k + w2;
      return { b0: w2 / a0, b1: (2 * w2) / a0, b2: w2 / a0, a1: (2 * w2 - 2 * k * k) / a0, a2: (k * k - damping * k + w2) / a0 };
    }
    const a = -p.re;
    return { b0: a / (k + a), b1: a / (k + a), b2: 0, a1: (a - k) / (k + a), a2: 0 };
  });
  const state = sections.map(() => ({ x1: 0, x2: 0, y1: 0, y2: 0 }));
  let t10 = -1;
  let t90 = -1;
  let peak = 0;
  let lastOutside1 = 0;
  let lastOutside01 = 0;
  let previous = 0;
  for (let n = 1; n <= steps; n++) {
    let x = 1;
    for (let s = 0; s < sections.length; s++) {
      const c = sections[s];
      const z = state[s];
      const y = c.b0 * x + c.b1 * z.x1 + c.b2 * z.x2 - c.a1 * z.y1 - c.a2 * z.y2;
      z.x2 = z.x1;
      z.x1 = x;
      z.y2 = z.y1;
      z.y1 = y;
      x = y;
    }
    const t = n * dt;
    if (t10 < 0 && x >= 0.1) t10 = crossing(t, dt, previous, x, 0.1);
    if (t90 < 0 && x >= 0.9) t90 = crossing(t, dt, previous, x, 0.9);
    peak = Math.max(peak, x);
    const error = Math.abs(x - 1);
    if (error > 0.01) lastOutside1 = t;
    if (error > 0.001) lastOutside01 = t;
    previous = x;
  }
  return {
    riseTime: t90 > 0 && t10 >= 0 ? t90 - t10 : 0,
    overshoot: Math.max(0, peak - 1),
    settlingTime1Percent: lastOutside1 + dt,
    settlingTime01Percent: lastOutside01 + dt,
  };
}

/** Time where the response crosses `level` between the previous sample and this one (linear). */
function crossing(t: number, dt: number, before: number, after: number, level: number): number {
  return after === before ? t : t - dt + (dt * (level - before)) / (after - before);
}

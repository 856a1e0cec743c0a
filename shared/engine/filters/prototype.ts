/**
 * Analog low-pass prototypes: the normalised poles every filter of the chain is built from, both in
 * the analytic budget (H(f) from the poles) and in the time-domain simulation (bilinear transform).
 */

export type FilterResponse = 'butterworth' | 'bessel' | 'critical';

export interface Complex {
  re: number;
  im: number;
}

const MIN_ORDER = 1;
const MAX_ORDER = 4;

/**
 * Poles (rad/s) of the analog low-pass prototype with DC gain 1 and -3 dB at 1 rad/s (bessel
 * normalised by magnitude, like scipy norm='mag'; critical = n equal real poles). Conjugate pairs
 * adjacent with the positive-imaginary one first; for odd orders the real pole last. order 1..4
 *
 * Pairs are listed from the highest pole Q to the lowest. The DC gain of the prototype is
 * prod(-p), so no separate gain is returned.
 */
export function lowPassPrototypePoles(response: FilterResponse, order: number): Complex[] {
  if (!Number.isInteger(order) || order < MIN_ORDER || order > MAX_ORDER) {
    throw new RangeError(`Filter order must be an integer from ${MIN_ORDER} to ${MAX_ORDER}, got ${order}`);
  }
  switch (response) {
    case 'butterworth':
      return butterworthPoles(order);
    case 'bessel':
      return besselPoles(order);
    case 'critical':
      return criticalPoles(order);
    default:
      throw new RangeError(`Unknown filter response '${String(response)}'`);
  }
}

/** p_k = exp(j pi (2k + n - 1) / (2n)), k = 1..n: evenly spaced on the left half of the unit circle. */
function butterworthPoles(order: number): Complex[] {
  const poles: Complex[] = [];
  for (let k = 1; k <= Math.floor(order / 2); k++) {
    const angle = (Math.PI * (2 * k + order - 1)) / (2 * order);
    const re = Math.cos(angle);
    const im = Math.abs(Math.sin(angle));
    poles.push({ re, im }, { re, im: -im });
  }
  if (order % 2 === 1) poles.push({ re: -1, im: 0 });
  return poles;
}

/**
 * n equal real poles at -a with (1 + 1/a^2)^(n/2) = sqrt(2), so that |H(j1)| = 1/sqrt(2):
 * a = 1 / sqrt(2^(1/n) - 1).
 */
function criticalPoles(order: number): Complex[] {
  const a = 1 / Math.sqrt(Math.pow(2, 1 / order) - 1);
  return Array.from({ length: order }, () => ({ re: -a, im: 0 }));
}

/**
 * Roots of the reverse Bessel polynomial theta_n(s) = sum_k (2n-k)! / (2^(n-k) k! (n-k)!) s^k
 * (Durand-Kerner iteration), then scaled in frequency so that |H(j1)| = 1/sqrt(2).
 */
function besselPoles(order: number): Complex[] {
  const coefficients = reverseBesselCoefficients(order);
  const roots = polynomialRoots(coefficients);
  const corner = magnitudeCorner(roots);
  return orderPoles(roots.map((p) => ({ re: p.re / corner, im: p.im / corner })));
}

/** Coefficients of theta_n, index k holding the coefficient of s^k. */
function reverseBesselCoefficients(order: number): number[] {
  const factorial = (m: number): number => (m <= 1 ? 1 : m * factorial(m - 1));
  const coefficients: number[] = [];
  for (let k = 0; k <= order; k++) {
    coefficients.push(factorial(2 * order - k) / (Math.pow(2, order - k) * factorial(k) * factorial(order - k)));
  }
  return coefficients;
}

/** Durand-Kerner (Weierstrass) iteration on the monic polynomial; coefficients low order first. */
function polynomialRoots(coefficients: number[]): Complex[] {
  const degree = coefficients.length - 1;
  const lead = coefficients[degree];
  const monic = coefficients.map((c) => c / lead);
  const radius = 1 + Math.max(...monic.slice(0, degree).map(Math.abs));
  // Starting points off the real axis and not on a symmetric ring, as the method requires.
  const seed: Complex = { re: 0.4, im: 0.9 };
  let roots: Complex[] = [];
  let power: Complex = { re: 1, im: 0 };
  for (let i = 0; i < degree; i++) {
    roots.push({ re: power.re * radius, im: power.im * radius });
    power = multiply(power, seed);
  }
  for (let iteration = 0; iteration < 500; iteration++) {
    let largestStep = 0;
    const next = roots.map((root, i) => {
      let denominator: Complex = { re: 1, im: 0 };
      roots.forEach((other, j) => {
        if (j !== i) denominator = multiply(denominator, { re: root.re - other.re, im: root.im - other.im });
      });
      const step = divide(evaluate(monic, root), denominator);
      largestStep = Math.max(largestStep, Math.hypot(step.re, step.im));
      return { re: root.re - step.re, im: root.im - step.im };
    });
    roots = next;
    if (largestStep < 1e-16) break;
  }
  return roots;
}

/** Frequency w (rad/s) where |H(jw)| = 1/sqrt(2) for H(s) = prod(-p) / prod(s - p); bisection, H monotonic. */
function magnitudeCorner(poles: Complex[]): number {
  const squaredMagnitude = (w: number): number =>
    poles.reduce((product, p) => {
      const dcFactor = p.re * p.re + p.im * p.im;
      const atW = p.re * p.re + (w - p.im) * (w - p.im);
      return (product * dcFactor) / atW;
    }, 1);
  let low = 0;
  let high = 1;
  while (squaredMagnitude(high) > 0.5) high *= 2;
  for (let i = 0; i < 200 && high - low > 1e-16 * high; i++) {
    const middle = 0.5 * (low + high);
    if (squaredMagnitude(middle) > 0.5) low = middle;
    else high = middle;
  }
  return 0.5 * (low + high);
}

/** Pairs (positive imaginary first) from the highest Q to the lowest, then the real pole. */
function orderPoles(poles: Complex[]): Complex[] {
  const imaginaryTolerance = 1e-12;
  const upper = poles
    .filter((p) => p.im > imaginaryTolerance)
    .sort((a, b) => Math.abs(a.re) / Math.hypot(a.re, a.im) - Math.abs(b.re) / Math.hypot(b.re, b.im));
  const real = poles.filter((p) => Math.abs(p.im) <= imaginaryTolerance).map((p) => ({ re: p.re, im: 0 }));
  const ordered: Complex[] = [];
  for (const p of upper) ordered.push({ re: p.re, im: p.im }, { re: p.re, im: -p.im });
  return ordered.concat(real);
}

function multiply(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

function divide(a: Complex, b: Complex): Complex {
  const scale = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / scale, im: (a.im * b.re - a.re * b.im) / scale };
}

function evaluate(coefficients: number[], s: Complex): Complex {
  let value: Complex = { re: 0, im: 0 };
  for (let k = coefficients.length - 1; k >= 0; k--) {
    value = multiply(value, s);
    value.re += coefficients[k];
  }
  return value;
}

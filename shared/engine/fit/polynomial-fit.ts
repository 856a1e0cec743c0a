/**
 * Least-squares polynomial fit y = b0 + b1 x + ... + bd x^d (or without b0: through the origin).
 *
 * The fit is solved on the scaled variable t = (x - centre) / halfRange, which lies in [-1, 1], by
 * Householder QR with refinement (householder-qr.ts). The half range is rounded up to a power of
 * two so that the scaling itself rounds nothing: integer data such as Wampler's give an exact
 * matrix, and the solution is then as good as the data allow; the monomial matrix in raw x (Pontius: x up to 3e6, x^2 up to 1e13) would lose
 * most digits before any solver sees it. The coefficients are then expanded back into ascending
 * powers of the unscaled x, and their covariance carried through the same linear map. Through the
 * origin the centre is 0, so the map is a diagonal scaling and the model keeps y(0) = 0.
 */
import { RankDeficientError, solveLeastSquares } from './householder-qr';
import { evaluatePolynomial } from './polynomial';

export interface PolynomialFitOptions {
  /** Polynomial degree, a positive integer. */
  readonly degree: number;
  /** Leave out the constant term, so that the curve passes through (0, 0). */
  readonly throughOrigin?: boolean;
}

export interface PolynomialFit {
  readonly degree: number;
  readonly throughOrigin: boolean;
  /** Coefficients in ascending powers of the unscaled x, from x^0 (0 when through the origin) to x^degree. */
  readonly coefficients: number[];
  /** Standard error of each coefficient, same order; 0 for the constant left out through the origin. */
  readonly standardErrors: number[];
  /** sqrt(SSres / (n - p)), p the number of fitted coefficients, in the unit of y. */
  readonly residualSd: number;
  /**
   * Coefficient of determination: 1 - SSres / sum (y - mean y)^2 with a constant term,
   * 1 - SSres / sum y^2 (uncentred) through the origin; null when the denominator is 0.
   */
  readonly r2: number | null;
  /** Number of points. */
  readonly count: number;
  /** Residual degrees of freedom n - p. */
  readonly degreesOfFreedom: number;
  /** y - fit at each point, in input order. */
  readonly residuals: number[];
  /** Range of x the fit was made on (its validity range). */
  readonly xMin: number;
  readonly xMax: number;
  /** The scaled form the fit was solved in: y = sum a_k ((x - centre) / halfRange)^k; evaluate with it. */
  readonly scaled: { readonly centre: number; readonly halfRange: number; readonly coefficients: number[] };
}

/** Input the fit cannot use, with a message a user can act on. */
export class FitInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FitInputError';
  }
}

/**
 * Fits a polynomial by least squares.
 * @param x independent values (any unit).
 * @param y dependent values (any unit), same length.
 */
export function fitPolynomial(x: ArrayLike<number>, y: ArrayLike<number>, options: PolynomialFitOptions): PolynomialFit {
  const { degree } = options;
  const throughOrigin = options.throughOrigin ?? false;
  const n = x.length;
  if (!Number.isInteger(degree) || degree < 1) throw new FitInputError(`Degree must be a whole number of at least 1, got ${degree}`);
  if (y.length !== n) throw new FitInputError(`x and y must have the same length, got ${n} and ${y.length}`);
  const parameters = throughOrigin ? degree : degree + 1;
  if (n <= parameters) {
    throw new FitInputError(`A degree-${degree} fit${throughOrigin ? ' through the origin' : ''} needs at least ${parameters + 1} points, got ${n}`);
  }
  let xMin = Infinity;
  let xMax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) throw new FitInputError(`Point ${i + 1} is not a finite number`);
    xMin = Math.min(xMin, x[i]);
    xMax = Math.max(xMax, x[i]);
  }
  const centre = throughOrigin ? 0 : (xMin + xMax) / 2;
  const spread = throughOrigin ? Math.max(Math.abs(xMin), Math.abs(xMax)) : (xMax - xMin) / 2;
  if (!(spread > 0)) throw new FitInputError('All x values are equal; a curve needs at least two different x values');
  const halfRange = 2 ** Math.ceil(Math.log2(spread));

  const firstPower = throughOrigin ? 1 : 0;
  const matrix = new Float64Array(n * parameters);
  const scaledX = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = (x[i] - centre) / halfRange;
    scaledX[i] = t;
    let power = firstPower === 0 ? 1 : t;
    for (let j = 0; j < parameters; j++) {
      matrix[j * n + i] = power;
      power *= t;
    }
  }
  const rhs = Float64Array.from(y as ArrayLike<number>);
  let qr;
  try {
    qr = solveLeastSquares(matrix, n, parameters, rhs);
  } catch (error) {
    if (error instanceof RankDeficientError) {
      throw new FitInputError(`The points do not determine a degree-${degree} curve: use more distinct x values or a lower degree`);
    }
    throw error;
  }

  // Scaled coefficients a_k for powers 0..degree (a_0 = 0 through the origin).
  const scaledCoefficients = new Array<number>(degree + 1).fill(0);
  for (let j = 0; j < parameters; j++) scaledCoefficients[j + firstPower] = qr.solution[j];

  const residuals = new Array<number>(n);
  let ssRes = 0;
  let sumY = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i] - evaluatePolynomial(scaledCoefficients, scaledX[i]);
    residuals[i] = r;
    ssRes += r * r;
    sumY += y[i];
  }
  const meanY = throughOrigin ? 0 : sumY / n;
  let ssTotal = 0;
  for (let i = 0; i < n; i++) ssTotal += (y[i] - meanY) ** 2;
  const degreesOfFreedom = n - parameters;
  const residualSd = Math.sqrt(ssRes / degreesOfFreedom);

  // b = T a with T[j][k] = C(k, j) (-centre)^(k-j) / halfRange^k for k >= j (binomial expansion).
  const transform: number[][] = [];
  for (let j = 0; j <= degree; j++) {
    const row = new Array<number>(degree + 1).fill(0);
    for (let k = j; k <= degree; k++) row[k] = binomial(k, j) * (-centre) ** (k - j) / halfRange ** k;
    transform.push(row);
  }
  const coefficients = transform.map((row) => row.reduce((sum, value, k) => sum + value * scaledCoefficients[k], 0));
  // Covariance of a is s^2 R^-1 R^-T (rows of R^-1 belong to the fitted powers), so se(b_j) = s ||(T R^-1)_j||.
  const standardErrors = transform.map((row) => {
    let sumSquares = 0;
    for (let l = 0; l < parameters; l++) {
      let value = 0;
      for (let j = 0; j <= l; j++) value += row[j + firstPower] * qr.rInverse[j * parameters + l];
      sumSquares += value * value;
    }
    return residualSd * Math.sqrt(sumSquares);
  });

  return {
    degree,
    throughOrigin,
    coefficients,
    standardErrors,
    residualSd,
    r2: ssTotal > 0 ? 1 - ssRes / ssTotal : null,
    count: n,
    degreesOfFreedom,
    residuals,
    xMin,
    xMax,
    scaled: { centre, halfRange, coefficients: scaledCoefficients },
  };
}

/** The fitted curve at x, evaluated in the scaled form the fit was solved in. */
export function evaluateFit(fit: PolynomialFit, x: number): number {
  return evaluatePolynomial(fit.scaled.coefficients, (x - fit.scaled.centre) / fit.scaled.halfRange);
}

/** Slope dy/dx of the fitted curve at x. */
export function fitSlope(fit: PolynomialFit, x: number): number {
  const { centre, halfRange, coefficients } = fit.scaled;
  const t = (x - centre) / halfRange;
  let value = 0;
  for (let k = coefficients.length - 1; k >= 1; k--) value = value * t + k * coefficients[k];
  return value / halfRange;
}

function binomial(n: number, k: number): number {
  let value = 1;
  for (let i = 1; i <= k; i++) value = (value * (n - k + i)) / i;
  return value;
}

/** Polynomials as coefficient arrays in ascending powers: c[0] + c[1] x + c[2] x^2 + ... */

/** Value at x by Horner's rule. */
export function evaluatePolynomial(coefficients: ArrayLike<number>, x: number): number {
  let value = 0;
  for (let k = coefficients.length - 1; k >= 0; k--) value = value * x + coefficients[k];
  return value;
}

/** Coefficients of the derivative, ascending; a constant gives [0]. */
export function derivativeCoefficients(coefficients: ArrayLike<number>): number[] {
  if (coefficients.length <= 1) return [0];
  const out: number[] = [];
  for (let k = 1; k < coefficients.length; k++) out.push(k * coefficients[k]);
  return out;
}

/**
 * Error-free transformations for sums and products in double precision (T. J. Dekker, "A
 * floating-point technique for extending the available precision", Numer. Math. 18, 1971; T. Ogita,
 * S. M. Rump and S. Oishi, "Accurate sum and dot product", SIAM J. Sci. Comput. 26(6), 2005).
 * They give residuals as if computed in twice the working precision, which is what iterative
 * refinement of a least-squares solution needs.
 */

const SPLITTER = 134217729; // 2^27 + 1

/** Accumulates a sum of terms and products with a running error term (Dot2 of Ogita, Rump and Oishi). */
export class CompensatedSum {
  private sum = 0;
  private error = 0;

  add(value: number): this {
    const total = this.sum + value;
    const virtual = total - this.sum;
    this.error += this.sum - (total - virtual) + (value - virtual);
    this.sum = total;
    return this;
  }

  addProduct(a: number, b: number): this {
    const product = a * b;
    let t = SPLITTER * a;
    const aHigh = t - (t - a);
    const aLow = a - aHigh;
    t = SPLITTER * b;
    const bHigh = t - (t - b);
    const bLow = b - bHigh;
    this.error += aHigh * bHigh - product + aHigh * bLow + aLow * bHigh + aLow * bLow;
    return this.add(product);
  }

  /** The sum rounded once to double precision. */
  value(): number {
    return this.sum + this.error;
  }
}

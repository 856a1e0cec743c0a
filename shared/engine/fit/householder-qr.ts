/**
 * Least squares by Householder QR (G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed.,
 * 2013, sections 5.1 and 5.3): A = QR with orthogonal Q built from reflections, so the solution
 * never forms the normal equations A^T A, whose condition number is the square of A's.
 *
 * When the residual is large (NIST's Wampler4 and Wampler5), the error of a QR solution grows with
 * the square of the condition number times the residual; two steps of refinement on the augmented
 * system [I A; A^T 0][r; x] = [b; 0] with compensated residuals (A. Bjorck, "Iterative refinement
 * of linear least squares solutions I", BIT 7, 1967) bring it back to the size of the data's own
 * rounding.
 */
import { CompensatedSum } from './compensated';

/** The triangular factor and the solution of min ||A x - b||. */
export interface QrSolution {
  /** Least-squares solution, one entry per column of A. */
  readonly solution: Float64Array;
  /** R^-1 (upper triangular, row-major n x n): the covariance of the solution is s^2 R^-1 R^-T. */
  readonly rInverse: Float64Array;
}

/** Raised when the columns of A are linearly dependent to working precision. */
export class RankDeficientError extends Error {
  constructor(readonly column: number) {
    super(`Column ${column} of the design matrix depends on the others`);
    this.name = 'RankDeficientError';
  }
}

/**
 * Solves min ||A x - b|| for a full-column-rank A.
 * @param matrix A, column-major (entry (i, j) at j * rows + i); overwritten.
 * @param rows m, at least `columns`.
 * @param columns n.
 * @param rhs b, length m; overwritten.
 */
export function solveLeastSquares(matrix: Float64Array, rows: number, columns: number, rhs: Float64Array): QrSolution {
  const original = Float64Array.from(matrix);
  const observations = Float64Array.from(rhs);
  const reflectorNorms = new Float64Array(columns);
  const diagonal = new Float64Array(columns);
  let largest = 0;
  for (let k = 0; k < columns; k++) {
    const offset = k * rows;
    let norm = 0;
    for (let i = k; i < rows; i++) norm = Math.hypot(norm, matrix[offset + i]);
    const alpha = matrix[offset + k] > 0 ? -norm : norm;
    diagonal[k] = alpha;
    largest = Math.max(largest, norm);
    if (norm === 0) continue;
    // v = x - alpha e1 replaces the column from the diagonal down; v^T v = 2 norm |v0|.
    matrix[offset + k] -= alpha;
    const vNormSquared = 2 * norm * Math.abs(matrix[offset + k]);
    reflectorNorms[k] = vNormSquared;
    for (let j = k + 1; j < columns; j++) {
      const target = j * rows;
      let dot = 0;
      for (let i = k; i < rows; i++) dot += matrix[offset + i] * matrix[target + i];
      const factor = (2 * dot) / vNormSquared;
      for (let i = k; i < rows; i++) matrix[target + i] -= factor * matrix[offset + i];
    }
    reflect(k, rhs);
  }
  const tolerance = largest * rows * Number.EPSILON;
  for (let k = 0; k < columns; k++) if (!(Math.abs(diagonal[k]) > tolerance)) throw new RankDeficientError(k);

  /** Applies the k-th reflection H_k = I - 2 v v^T / v^T v to a vector in place. */
  function reflect(k: number, vector: Float64Array): void {
    if (reflectorNorms[k] === 0) return;
    const offset = k * rows;
    let dot = 0;
    for (let i = k; i < rows; i++) dot += matrix[offset + i] * vector[i];
    const factor = (2 * dot) / reflectorNorms[k];
    for (let i = k; i < rows; i++) vector[i] -= factor * matrix[offset + i];
  }

  // R: diagonal from the reflections, strictly upper part left in the matrix above the diagonal.
  const r = (i: number, j: number) => (i === j ? diagonal[i] : matrix[j * rows + i]);
  const solution = new Float64Array(columns);
  for (let i = columns - 1; i >= 0; i--) {
    let sum = rhs[i];
    for (let j = i + 1; j < columns; j++) sum -= r(i, j) * solution[j];
    solution[i] = sum / diagonal[i];
  }

  const residual = new Float64Array(rows);
  for (let i = 0; i < rows; i++) {
    const sum = new CompensatedSum().add(observations[i]);
    for (let j = 0; j < columns; j++) sum.addProduct(-original[j * rows + i], solution[j]);
    residual[i] = sum.value();
  }
  for (let step = 0; step < 2; step++) {
    // f = b - r - A x and g = -A^T r, the defects of both block equations.
    const f = new Float64Array(rows);
    for (let i = 0; i < rows; i++) {
      const sum = new CompensatedSum().add(observations[i]).add(-residual[i]);
      for (let j = 0; j < columns; j++) sum.addProduct(-original[j * rows + i], solution[j]);
      f[i] = sum.value();
    }
    const h = new Float64Array(columns);
    for (let j = 0; j < columns; j++) {
      const sum = new CompensatedSum();
      for (let i = 0; i < rows; i++) sum.addProduct(-original[j * rows + i], residual[i]);
      // R^T h = g, forward substitution.
      let value = sum.value();
      for (let l = 0; l < j; l++) value -= r(l, j) * h[l];
      h[j] = value / diagonal[j];
    }
    for (let k = 0; k < columns; k++) reflect(k, f);
    // dx = R^-1 (d1 - h); dr = Q [h; d2].
    for (let i = columns - 1; i >= 0; i--) {
      let sum = f[i] - h[i];
      for (let j = i + 1; j < columns; j++) sum -= r(i, j) * f[j];
      f[i] = sum / diagonal[i];
    }
    const correction = new Float64Array(rows);
    for (let j = 0; j < columns; j++) {
      solution[j] += f[j];
      correction[j] = h[j];
    }
    for (let i = columns; i < rows; i++) correction[i] = f[i];
    for (let k = columns - 1; k >= 0; k--) reflect(k, correction);
    for (let i = 0; i < rows; i++) residual[i] += correction[i];
  }

  const rInverse = new Float64Array(columns * columns);
  for (let j = 0; j < columns; j++) {
    rInverse[j * columns + j] = 1 / diagonal[j];
    for (let i = j - 1; i >= 0; i--) {
      let sum = 0;
      for (let l = i + 1; l <= j; l++) sum += r(i, l) * rInverse[l * columns + j];
      rInverse[i * columns + j] = -sum / diagonal[i];
    }
  }
  return { solution, rInverse };
}

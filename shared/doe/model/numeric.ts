// Small numerical helpers for the model code: the compensated sums of shared/stats, the
// QR least-squares solve with rank detection, and triangular inverses.
import { Matrix, QrDecomposition } from 'ml-matrix';

/** Inverse of an upper-triangular matrix by back substitution. Cost: O(p³/3). */
export function upperTriangularInverse(r: number[][]): number[][] {
  const p = r.length;
  const inverse: number[][] = [];
  for (let i = 0; i < p; i++) inverse.push(new Array<number>(p).fill(0));
  for (let j = 0; j < p; j++) {
    inverse[j][j] = 1 / r[j][j];
    for (let i = j - 1; i >= 0; i--) {
      let sum = 0;
      for (let k = i + 1; k <= j; k++) sum += r[i][k] * inverse[k][j];
      inverse[i][j] = -sum / r[i][i];
    }
  }
  return inverse;
}

export interface QrLeastSquares {
  /** indices of the columns that were estimated */
  estimated: number[];
  /** indices of the columns found to be linear combinations of earlier ones */
  aliased: number[];
  /** coefficients of the estimated columns */
  beta: number[];
  /** R⁻¹ of the thin QR of the estimated columns */
  rInverse: number[][];
}

/**
 * Least squares by Householder QR, dropping columns that are (numerically) linear
 * combinations of earlier ones. A column is aliased when |R_jj| ≤ tolerance·‖x_j‖, i.e. the
 * part of it orthogonal to the earlier columns is negligible (default 1e-7, the usual
 * choice of statistical packages; such a column would have a VIF above 1e14); earlier
 * columns win, so the lower-order terms of a hierarchical model are kept.
 * Reference: Golub & Van Loan, Matrix Computations, §5.3 (QR least squares) and §5.4.
 * Cost: O(n·p²) per pass, at most a few passes.
 * @example qrLeastSquares([[1, 0], [1, 1], [1, 2]], [1, 2, 3]).beta // [1, 1]
 */
export function qrLeastSquares(x: number[][], y: number[], tolerance = 1e-7): QrLeastSquares {
  const n = x.length;
  const p = n > 0 ? x[0].length : 0;
  const norms = new Array<number>(p).fill(0);
  for (let j = 0; j < p; j++) {
    let sumSquares = 0;
    for (let i = 0; i < n; i++) sumSquares += x[i][j] * x[i][j];
    norms[j] = Math.sqrt(sumSquares);
  }
  let estimated: number[] = [];
  const aliased: number[] = [];
  for (let j = 0; j < p; j++) {
    if (norms[j] === 0) aliased.push(j);
    else estimated.push(j);
  }
  for (let pass = 0; pass < p + 1; pass++) {
    const sub = x.map((row) => estimated.map((j) => row[j]));
    const qr = new QrDecomposition(new Matrix(sub));
    const r = qr.upperTriangularMatrix.to2DArray();
    const dropped: number[] = [];
    for (let k = 0; k < estimated.length; k++) {
      if (!(Math.abs(r[k][k]) > tolerance * norms[estimated[k]])) dropped.push(estimated[k]);
    }
    if (dropped.length > 0) {
      // drop only the first offender: once it is gone, later columns may be fine
      aliased.push(dropped[0]);
      estimated = estimated.filter((j) => j !== dropped[0]);
      continue;
    }
    const beta = qr.solve(Matrix.columnVector(y)).getColumn(0);
    aliased.sort((a, b) => a - b);
    return { estimated, aliased, beta, rInverse: upperTriangularInverse(r) };
  }
  throw new Error('qrLeastSquares: rank detection did not settle (internal)');
}

// A short Levenberg–Marquardt least-squares solver over ml-matrix, for residual vectors with an
// analytic Jacobian (complex impedance residuals are stacked as real and imaginary parts).
import { Matrix, QrDecomposition, inverse } from 'ml-matrix';
import { compensatedSumOfSquares } from '../stats/compensated-sum';

export interface LeastSquaresProblem {
  /** starting parameter vector */
  initial: readonly number[];
  /** residual vector r(p) (already weighted), length m ≥ number of parameters */
  residuals: (parameters: readonly number[]) => Float64Array;
  /** Jacobian ∂rᵢ/∂pⱼ as m rows of p numbers */
  jacobian: (parameters: readonly number[]) => number[][];
  /** bounds, one per parameter; a step is projected onto them */
  lower?: readonly number[];
  upper?: readonly number[];
}

export interface LeastSquaresOptions {
  /** default 500 */
  maxIterations?: number;
  /** stop when every relative parameter step is below this; default 1e-13 */
  stepTolerance?: number;
  /** stop when the relative fall of the sum of squares is below this twice running; default 1e-15 */
  costTolerance?: number;
}

export interface LeastSquaresResult {
  parameters: number[];
  /** Σ rᵢ² at the solution */
  sumOfSquares: number;
  iterations: number;
  converged: boolean;
  /** why the iteration stopped */
  stopReason: string;
  /** (JᵀJ)⁻¹ at the solution (multiply by the residual variance for the covariance); null when singular */
  inverseNormal: number[][] | null;
  /** parameters that ended on a bound */
  atBound: number[];
}

const sumSquares = compensatedSumOfSquares;

function finite(values: Float64Array): boolean {
  for (let i = 0; i < values.length; i++) if (!Number.isFinite(values[i])) return false;
  return true;
}

/**
 * Bounded Levenberg–Marquardt with Marquardt's scaling.
 * Method: each iteration scales the Jacobian's columns to unit norm (Dⱼ = ‖Jⱼ‖), solves the damped
 * problem min ‖J̃·δ̃ + r‖² + λ‖δ̃‖² by QR of the stacked matrix [J̃; √λ·I] (no normal equations),
 * steps p + D⁻¹δ̃ projected onto the bounds, and accepts it when the sum of squares falls (λ ÷ 3)
 * or rejects it (λ × 4). It stops when the relative step is below stepTolerance, the relative fall
 * of the sum of squares is below costTolerance twice running, the sum of squares is 0, or λ
 * exceeds 1e16 (no descent left). (JᵀJ)⁻¹ at the solution is returned for standard errors.
 * Reference: Marquardt (1963), J. SIAM 11, 431–441; Moré (1978), "The Levenberg–Marquardt
 * algorithm: implementation and theory", Lecture Notes in Mathematics 630, 105–116 (scaling, QR).
 * Cost: O(iterations · m · p²) for m residuals and p parameters.
 * @throws RangeError when the problem is malformed (no parameters, bounds of the wrong length,
 *   fewer residuals than parameters, non-finite residuals at the start).
 * @example leastSquares({ initial: [1], residuals: (p) => Float64Array.of(p[0] - 2, p[0] - 4), jacobian: () => [[1], [1]] }).parameters // [3]
 */
export function leastSquares(problem: LeastSquaresProblem, options: LeastSquaresOptions = {}): LeastSquaresResult {
  const count = problem.initial.length;
  if (count === 0) throw new RangeError('leastSquares: at least one parameter is needed');
  const lower = problem.lower ?? new Array<number>(count).fill(-Infinity);
  const upper = problem.upper ?? new Array<number>(count).fill(Infinity);
  if (lower.length !== count || upper.length !== count) throw new RangeError(`leastSquares: bounds must have ${count} entries`);
  const maxIterations = options.maxIterations ?? 500;
  const stepTolerance = options.stepTolerance ?? 1e-13;
  const costTolerance = options.costTolerance ?? 1e-15;
  const project = (values: number[]): number[] => values.map((value, j) => Math.min(upper[j], Math.max(lower[j], value)));

  let parameters = project([...problem.initial]);
  let residuals = problem.residuals(parameters);
  if (residuals.length < count) throw new RangeError(`leastSquares: ${residuals.length} residuals cannot determine ${count} parameters`);
  if (!finite(residuals)) throw new RangeError('leastSquares: the residuals are not finite at the starting parameters');
  let cost = sumSquares(residuals);
  let lambda = 1e-3;
  let iterations = 0;
  let smallFalls = 0;
  let converged = false;
  let stopReason = 'iteration limit reached';
  let jacobian = problem.jacobian(parameters);

  while (iterations < maxIterations) {
    iterations++;
    if (cost === 0) {
      converged = true;
      stopReason = 'exact fit';
      break;
    }
    const m = residuals.length;
    const scale = new Array<number>(count).fill(0);
    for (let i = 0; i < m; i++) for (let j = 0; j < count; j++) scale[j] += jacobian[i][j] * jacobian[i][j];
    for (let j = 0; j < count; j++) scale[j] = Math.sqrt(scale[j]) || 1;
    let accepted = false;
    while (!accepted) {
      const stacked = new Matrix(m + count, count);
      const rhs = new Matrix(m + count, 1);
      for (let i = 0; i < m; i++) {
        for (let j = 0; j < count; j++) stacked.set(i, j, jacobian[i][j] / scale[j]);
        rhs.set(i, 0, -residuals[i]);
      }
      const root = Math.sqrt(lambda);
      for (let j = 0; j < count; j++) stacked.set(m + j, j, root);
      const scaledStep = new QrDecomposition(stacked).solve(rhs);
      const trial = project(parameters.map((value, j) => value + scaledStep.get(j, 0) / scale[j]));
      const trialResiduals = problem.residuals(trial);
      const trialCost = finite(trialResiduals) ? sumSquares(trialResiduals) : Infinity;
      if (trialCost < cost) {
        let relativeStep = 0;
        for (let j = 0; j < count; j++) relativeStep = Math.max(relativeStep, Math.abs(trial[j] - parameters[j]) / (Math.abs(parameters[j]) + 1e-300));
        const fall = (cost - trialCost) / cost;
        parameters = trial;
        residuals = trialResiduals;
        cost = trialCost;
        jacobian = problem.jacobian(parameters);
        lambda = Math.max(lambda / 3, 1e-12);
        accepted = true;
        smallFalls = fall < costTolerance ? smallFalls + 1 : 0;
        if (relativeStep < stepTolerance) {
          converged = true;
          stopReason = 'parameter steps below tolerance';
        } else if (smallFalls >= 2) {
          converged = true;
          stopReason = 'sum of squares no longer falling';
        }
      } else {
        lambda *= 4;
        if (lambda > 1e16) {
          converged = true;
          stopReason = 'no further descent (at the minimum to machine precision)';
          break;
        }
      }
    }
    if (converged) break;
  }

  // (JᵀJ)⁻¹ through the column-scaled Jacobian, which keeps the inverse well conditioned.
  const m = residuals.length;
  const scale = new Array<number>(count).fill(0);
  for (let i = 0; i < m; i++) for (let j = 0; j < count; j++) scale[j] += jacobian[i][j] * jacobian[i][j];
  for (let j = 0; j < count; j++) scale[j] = Math.sqrt(scale[j]) || 1;
  const normal = new Matrix(count, count);
  for (let a = 0; a < count; a++) {
    for (let b = 0; b < count; b++) {
      let sum = 0;
      for (let i = 0; i < m; i++) sum += (jacobian[i][a] / scale[a]) * (jacobian[i][b] / scale[b]);
      normal.set(a, b, sum);
    }
  }
  let inverseNormal: number[][] | null = null;
  try {
    const inverted = inverse(normal);
    inverseNormal = [];
    let ok = true;
    for (let a = 0; a < count; a++) {
      const row: number[] = [];
      for (let b = 0; b < count; b++) {
        const value = inverted.get(a, b) / (scale[a] * scale[b]);
        if (!Number.isFinite(value)) ok = false;
        row.push(value);
      }
      inverseNormal.push(row);
    }
    for (let a = 0; a < count; a++) if (!(inverseNormal[a][a] >= 0)) ok = false;
    if (!ok) inverseNormal = null;
  } catch {
    inverseNormal = null;
  }
  const atBound: number[] = [];
  parameters.forEach((value, j) => {
    if (value === lower[j] || value === upper[j]) atBound.push(j);
  });
  return { parameters, sumOfSquares: cost, iterations, converged, stopReason, inverseNormal, atBound };
}

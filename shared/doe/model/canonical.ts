// Canonical analysis of a fitted second-order surface: where its stationary point is, what
// kind of point it is (maximum, minimum, saddle, ridge) and along which directions it bends.
import { EigenvalueDecomposition, Matrix, solve } from 'ml-matrix';
import { DoeInputError } from './errors';
import { decodeValue } from './encode';
import { checkExtrapolation, predict, type Prediction } from './predict';
import type { SurfaceFit } from './types';

export type StationaryNature = 'maximum' | 'minimum' | 'saddle' | 'ridge';

export interface CanonicalAnalysis {
  /** continuous factor keys, the order of b, B, the eigenvectors and the stationary point */
  factors: string[];
  /** level used for each categorical factor (the surface is analysed at these levels) */
  levels: Record<string, string>;
  /** first-order coefficients b (coded units) */
  b: number[];
  /** symmetric second-order matrix B: b_ii on the diagonal, b_ij/2 off it (coded units) */
  B: number[][];
  /** eigenvalues of B, largest first */
  eigenvalues: number[];
  /** unit eigenvectors, eigenvectors[i] belongs to eigenvalues[i] (coded units) */
  eigenvectors: number[][];
  nature: StationaryNature;
  /** stationary point x_s = −½B⁻¹b; null on a ridge (B singular) */
  stationaryCoded: Record<string, number> | null;
  stationaryActual: Record<string, number> | null;
  /** fitted response at x_s with 95 % intervals; null on a ridge */
  prediction: Prediction | null;
  /** whether x_s lies outside the region the runs support; null on a ridge */
  extrapolation: boolean | null;
}

/**
 * Canonical analysis of a quadratic response surface, in coded units.
 * Definition: writing the fit as ŷ = b₀ + xᵀb + xᵀBx, the stationary point is x_s = −½B⁻¹b
 * with ŷ_s = b₀ + ½x_sᵀb; the eigenvalues λᵢ of B give ŷ = ŷ_s + Σλᵢwᵢ²: all negative → maximum,
 * all positive → minimum, mixed signs → saddle; an eigenvalue ≈ 0 (|λ| ≤ 1e-6·max|λ|) → ridge,
 * where no single stationary point exists.
 * Reference: Montgomery, Design and Analysis of Experiments, §11.3 (location of the stationary
 * point, canonical analysis); Box & Draper, Response Surfaces, Mixtures and Ridge Analyses, ch. 10.
 * Cost: O(k³) for k continuous factors, plus one prediction.
 * @throws DoeInputError ('not-quadratic') when the model has no second-order terms, has terms
 *   above second order, or has no continuous factors; ('invalid-point') for an unknown level.
 * @example canonicalAnalysis(fit).stationaryActual // { time: 86.9, temp: 176.5 }
 */
export function canonicalAnalysis(fit: SurfaceFit, options: { levels?: Record<string, string> } = {}): CanonicalAnalysis {
  const basis = fit.basis;
  const continuous: number[] = [];
  const levels: Record<string, string> = {};
  basis.factors.forEach((factor, index) => {
    if (factor.kind === 'continuous') continuous.push(index);
    else {
      const chosen = options.levels?.[factor.key] ?? (factor.levels as string[])[0];
      if (!(factor.levels as string[]).includes(chosen)) {
        throw new DoeInputError('invalid-point', `canonicalAnalysis: "${chosen}" is not a level of factor "${factor.key}" (options.levels)`);
      }
      levels[factor.key] = chosen;
    }
  });
  const k = continuous.length;
  if (k === 0) throw new DoeInputError('not-quadratic', 'canonicalAnalysis: the model has no continuous factors (fit)');
  const slot = new Map<number, number>();
  continuous.forEach((factorIndex, position) => slot.set(factorIndex, position));

  const b = new Array<number>(k).fill(0);
  const bMatrix: number[][] = [];
  for (let i = 0; i < k; i++) bMatrix.push(new Array<number>(k).fill(0));
  let secondOrder = 0;
  fit.coefficients.forEach((coefficient, columnIndex) => {
    const column = basis.columns[columnIndex];
    let degree = 0;
    for (const power of column.powers) degree += power;
    if (degree > 2) {
      throw new DoeInputError('not-quadratic', `canonicalAnalysis: term ${column.name} is above second order (fit)`);
    }
    if (coefficient.aliased || degree === 0) return;
    for (const indicator of column.indicators) {
      if (levels[basis.factors[indicator.factor].key] !== indicator.level) return;
    }
    const present: number[] = [];
    column.powers.forEach((power, factorIndex) => {
      for (let r = 0; r < power; r++) present.push(slot.get(factorIndex) as number);
    });
    if (degree === 1) b[present[0]] += coefficient.coded;
    else {
      secondOrder++;
      const [i, j] = present;
      if (i === j) bMatrix[i][i] += coefficient.coded;
      else {
        bMatrix[i][j] += coefficient.coded / 2;
        bMatrix[j][i] += coefficient.coded / 2;
      }
    }
  });
  if (secondOrder === 0) {
    throw new DoeInputError('not-quadratic', 'canonicalAnalysis: the model has no second-order terms, so there is no stationary point (fit)');
  }

  const decomposition = new EigenvalueDecomposition(new Matrix(bMatrix), { assumeSymmetric: true });
  const values = decomposition.realEigenvalues;
  const vectors = decomposition.eigenvectorMatrix.to2DArray();
  const order = values.map((_, i) => i).sort((a, c) => values[c] - values[a]);
  const eigenvalues = order.map((i) => values[i]);
  const eigenvectors = order.map((i) => {
    const vector = vectors.map((row) => row[i]);
    // fix the sign so results are reproducible: largest component positive
    let largest = 0;
    for (let r = 1; r < k; r++) if (Math.abs(vector[r]) > Math.abs(vector[largest])) largest = r;
    return vector[largest] < 0 ? vector.map((value) => -value) : vector;
  });
  let maxAbs = 0;
  for (const value of eigenvalues) maxAbs = Math.max(maxAbs, Math.abs(value));
  const keys = continuous.map((index) => basis.factors[index].key);
  const isRidge = maxAbs === 0 || eigenvalues.some((value) => Math.abs(value) <= 1e-6 * maxAbs);
  const base = { factors: keys, levels, b, B: bMatrix, eigenvalues, eigenvectors };
  if (isRidge) {
    return { ...base, nature: 'ridge', stationaryCoded: null, stationaryActual: null, prediction: null, extrapolation: null };
  }
  const nature: StationaryNature = eigenvalues.every((value) => value < 0)
    ? 'maximum'
    : eigenvalues.every((value) => value > 0)
      ? 'minimum'
      : 'saddle';
  const half = solve(new Matrix(bMatrix), Matrix.columnVector(b)).getColumn(0);
  const stationaryCoded: Record<string, number> = {};
  const stationaryActual: Record<string, number> = {};
  const point: Record<string, number | string> = { ...levels };
  continuous.forEach((factorIndex, position) => {
    const coded = -0.5 * half[position];
    const factor = basis.factors[factorIndex];
    stationaryCoded[factor.key] = coded;
    stationaryActual[factor.key] = decodeValue(factor, coded);
    point[factor.key] = stationaryActual[factor.key];
  });
  return {
    ...base,
    nature,
    stationaryCoded,
    stationaryActual,
    prediction: predict(fit, point),
    extrapolation: checkExtrapolation(fit, point).extrapolation,
  };
}

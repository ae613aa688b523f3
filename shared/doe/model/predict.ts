// Prediction from a fitted surface at a point given in actual units, with 95 % confidence and
// prediction intervals, and the extrapolation check used by plots and proposals.
import { tQuantile } from '../../stats/distributions';
import { CompensatedSum } from '../../stats/compensated-sum';
import { encodePoint } from './encode';
import { modelRow } from './terms';
import { factorName, roundForText } from './labels';
import type { FitBasis, SurfaceFit } from './types';

export interface Prediction {
  value: number;
  /** standard error of the fitted mean at the point */
  se: number;
  ciLow: number;
  ciHigh: number;
  piLow: number;
  piHigh: number;
  /** x₀ᵀ(XᵀX)⁻¹x₀, the point's leverage against the data */
  leverage: number;
}

/** Leverage x₀ᵀ(XᵀX)⁻¹x₀ = ‖R⁻ᵀx₀‖² of a model row (all columns; aliased ones are skipped). */
export function rowLeverage(basis: FitBasis, row: number[]): number {
  const { estimated, rInverse } = basis;
  let sumSquares = 0;
  for (let m = 0; m < estimated.length; m++) {
    let z = 0;
    for (let a = 0; a <= m; a++) z += row[estimated[a]] * rInverse[a][m];
    sumSquares += z * z;
  }
  return sumSquares;
}

/** Fitted value of a model row: estimated columns times their coded coefficients. */
export function rowValue(basis: FitBasis, row: number[]): number {
  const sum = new CompensatedSum();
  for (let a = 0; a < basis.estimated.length; a++) sum.add(row[basis.estimated[a]] * basis.beta[a]);
  return sum.value();
}

/**
 * Predicted response at a point with 95 % intervals.
 * Definition: ŷ₀ = x₀ᵀb; se = √(MSE·h₀) with h₀ = x₀ᵀ(XᵀX)⁻¹x₀; confidence interval
 * ŷ₀ ± t(0.975, df)·se (where the mean lies); prediction interval ŷ₀ ± t(0.975, df)·√(MSE(1 + h₀))
 * (where one new build would land).
 * Reference: Montgomery, Design and Analysis of Experiments, §10.6 (confidence and prediction
 * intervals on the response); NIST/SEMATECH e-Handbook §4.5.2.
 * Cost: O(p²).
 * @throws DoeInputError ('invalid-point') for a missing factor value or an unknown level.
 * @example predict(fit, { temp: 175, binder: 20 }) // { value, se, ciLow, ciHigh, piLow, piHigh, leverage }
 */
export function predict(fit: SurfaceFit, point: Record<string, number | string>): Prediction {
  const basis = fit.basis;
  const encoded = encodePoint('predict', basis.factors, point);
  const row = modelRow(basis.columns, encoded);
  const value = rowValue(basis, row);
  const leverage = rowLeverage(basis, row);
  const t = tQuantile(0.975, basis.dfResidual);
  const se = Math.sqrt(basis.mse * leverage);
  const sePrediction = Math.sqrt(basis.mse * (1 + leverage));
  return {
    value,
    se,
    ciLow: value - t * se,
    ciHigh: value + t * se,
    piLow: value - t * sePrediction,
    piHigh: value + t * sePrediction,
    leverage,
  };
}

export interface ExtrapolationCheck {
  extrapolation: boolean;
  /** one sentence per reason, empty when the point is inside the data region */
  reasons: string[];
}

/**
 * Whether a point lies outside the region the data support.
 * Definition: outside when a continuous value is beyond the factor's range (the declared
 * low/high widened to any runs outside it, e.g. the axial points of a central composite), or
 * when its leverage x₀ᵀ(XᵀX)⁻¹x₀ exceeds the largest leverage of the observed runs — the
 * "regressor variable hull" test.
 * Reference: Montgomery, Peck & Vining, Introduction to Linear Regression Analysis, §3.8
 * (hidden extrapolation).
 * Cost: O(p²).
 * @throws DoeInputError ('invalid-point') for a missing factor value or an unknown level.
 * @example checkExtrapolation(fit, { temp: 240, binder: 20 }).reasons
 */
export function checkExtrapolation(fit: SurfaceFit, point: Record<string, number | string>): ExtrapolationCheck {
  const basis = fit.basis;
  const encoded = encodePoint('isExtrapolation', basis.factors, point);
  const reasons: string[] = [];
  for (const factor of basis.factors) {
    if (factor.kind !== 'continuous') continue;
    const value = point[factor.key] as number;
    const low = Math.min(factor.low as number, factor.dataMin ?? Infinity);
    const high = Math.max(factor.high as number, factor.dataMax ?? -Infinity);
    // a relative slack keeps points placed exactly on a bound (or rounded to it) inside
    const slack = 1e-9 * (high - low);
    if (value < low - slack || value > high + slack) {
      reasons.push(`${factorName(factor)} ${roundForText(value)} is outside ${roundForText(low)}–${roundForText(high)}${factor.unit ? ` ${factor.unit}` : ''}.`);
    }
  }
  const leverage = rowLeverage(basis, modelRow(basis.columns, encoded));
  if (leverage > basis.maxLeverage * (1 + 1e-9)) {
    reasons.push(`Leverage ${leverage.toPrecision(3)} exceeds the largest leverage of the runs (${basis.maxLeverage.toPrecision(3)}): the point is away from the data.`);
  }
  return { extrapolation: reasons.length > 0, reasons };
}

/**
 * True when a point is outside the data region (see checkExtrapolation for the definition).
 * Cost: O(p²).
 * @throws DoeInputError ('invalid-point') for a missing factor value or an unknown level.
 * @example isExtrapolation(fit, { temp: 240, binder: 20 }) // true
 */
export function isExtrapolation(fit: SurfaceFit, point: Record<string, number | string>): boolean {
  return checkExtrapolation(fit, point).extrapolation;
}

// The trust region of a fitted surface: where the builds already made give the model support.
// Proposals inside it are ones the data vouch for; outside it a prediction is an extrapolation.
import { encodePoint } from './encode';
import { factorName, roundForText } from './labels';
import { rowLeverage } from './predict';
import { modelRow } from './terms';
import type { SurfaceFit } from './types';

export interface SupportCheck {
  /** inside the trust region */
  inside: boolean;
  /** x₀ᵀ(XᵀX)⁻¹x₀ of the point */
  leverage: number;
  /** the largest leverage of the builds in the fit: the stated limit */
  leverageLimit: number;
  /** leverage / leverageLimit (≤ 1 inside) */
  leverageRatio: number;
  /** one sentence per reason the point is outside, in words; empty inside */
  reasons: string[];
}

/**
 * Whether a recipe lies inside the trust region of a fit.
 * Definition: inside when (1) every continuous factor lies within the smallest and largest
 * value actually run, (2) every categorical factor is at a level actually run, and (3) the
 * point's leverage h₀ = x₀ᵀ(XᵀX)⁻¹x₀ is no larger than the largest leverage among the builds
 * in the fit — the point is no more remote, for this model, than the most remote build
 * already made (the regressor-variable-hull test). h₀ = Var(ŷ₀)/σ², so the limit also caps the
 * prediction's own uncertainty at what was seen at the builds.
 * Reference: Montgomery, Peck & Vining, Introduction to Linear Regression Analysis, §3.8
 * (hidden extrapolation); Cook & Weisberg, Residuals and Influence in Regression, §2.2 (leverage).
 * Cost: O(p²).
 * @throws DoeInputError ('invalid-point') for a missing factor value or an unknown level.
 * @example checkSupport(fit, { binder: 25, cellTemp: 180, gdl: 'woven carbon' }).inside // true
 */
export function checkSupport(fit: SurfaceFit, point: Record<string, number | string>): SupportCheck {
  const basis = fit.basis;
  const reasons: string[] = [];
  for (const factor of basis.factors) {
    const value = point[factor.key];
    if (factor.kind === 'continuous') {
      const low = factor.dataMin ?? (factor.low as number);
      const high = factor.dataMax ?? (factor.high as number);
      const slack = 1e-9 * Math.max(1e-12, high - low);
      if (typeof value === 'number' && (value < low - slack || value > high + slack)) {
        reasons.push(`${factorName(factor)} ${roundForText(value)}${factor.unit ? ` ${factor.unit}` : ''} is outside the range built so far (${roundForText(low)}–${roundForText(high)}${factor.unit ? ` ${factor.unit}` : ''}).`);
      }
    } else if (factor.levelsRun && !factor.levelsRun.includes(String(value))) {
      reasons.push(`${factorName(factor)} "${String(value)}" has not been built yet.`);
    }
  }
  const encoded = encodePoint('checkSupport', basis.factors, point);
  const leverage = rowLeverage(basis, modelRow(basis.columns, encoded));
  const leverageLimit = basis.maxLeverage;
  const leverageRatio = leverageLimit > 0 ? leverage / leverageLimit : Infinity;
  if (leverage > leverageLimit * (1 + 1e-9)) {
    reasons.push(`The recipe is further from the builds than any build made so far (leverage ${roundForText(leverage, 3)}, limit ${roundForText(leverageLimit, 3)}).`);
  }
  return { inside: reasons.length === 0, leverage, leverageLimit, leverageRatio, reasons };
}

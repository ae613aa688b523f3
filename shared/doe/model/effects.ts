// What each term of a fitted surface does, in the response's own unit over the factor's range:
// "PTFE binder 10→40 wt %: +59 mV ± 20". The researcher's first question on the surface page.
import { tQuantile } from '../../stats/distributions';
import { factorName, roundForText } from './labels';
import type { ResolvedFactor, SurfaceFit } from './types';

export type EffectKind = 'main' | 'level' | 'interaction' | 'level-interaction' | 'curvature' | 'other';

export interface Effect {
  /** model column name (for CSV and matching with the coefficient table) */
  term: string;
  kind: EffectKind;
  /** what moves, in words and units, e.g. "PTFE binder 10→40 wt %" */
  label: string;
  /** what the number means, in one clause */
  meaning: string;
  /** the effect in the response's internal unit */
  effect: number;
  se: number;
  /** 95 % confidence interval of the effect */
  low: number;
  high: number;
  p: number | null;
  /** the 95 % interval excludes zero */
  clear: boolean;
}

function withUnit(value: number, factor: ResolvedFactor): string {
  return `${roundForText(value)}${factor.unit ? ` ${factor.unit}` : ''}`;
}

function span(factor: ResolvedFactor): string {
  return `${roundForText(factor.low as number)}→${roundForText(factor.high as number)}${factor.unit ? ` ${factor.unit}` : ''}`;
}

/**
 * The effect of every estimated term over its factor's coding range, sorted by size.
 * Definition (coded coefficients b, factors coded −1…+1 over low/high, others at the middle
 * of their ranges and categorical factors at their first level):
 *   main effect of A: ŷ(A high) − ŷ(A low) = 2·b_A;
 *   A × B: how much larger the A effect is at B high than at B low = 4·b_AB;
 *   A²: how far the middle of A's range sits above the straight line between its ends = −b_AA;
 *   level L of a categorical factor: ŷ(L) − ŷ(first level) = b_L;
 *   A × level L: how much larger the A effect is at L than at the first level = 2·b_AL.
 * Each effect is a fixed multiple m of one coefficient, so its standard error is |m|·SE(b) and
 * its 95 % interval effect ± t(0.975, df_residual)·|m|·SE(b).
 * Reference: effects of two-level factorials, Montgomery, Design and Analysis of Experiments,
 * §6.2–6.3 (effect = 2 × coded coefficient); interval on a coefficient, ibid. §10.5.
 * Cost: O(p·k).
 * @throws never.
 * @example surfaceEffects(fit)[0] // { label: 'PTFE binder 10→40 wt %', effect: 0.059, low: 0.039, high: 0.079, … }
 */
export function surfaceEffects(fit: SurfaceFit): Effect[] {
  const { factors, columns } = fit.basis;
  const t = fit.basis.dfResidual > 0 ? tQuantile(0.975, fit.basis.dfResidual) : NaN;
  const out: Effect[] = [];
  fit.coefficients.forEach((coefficient, j) => {
    if (j === 0 || coefficient.aliased || coefficient.codedSE === null) return;
    const column = columns[j];
    const continuous: { index: number; power: number }[] = [];
    column.powers.forEach((power, index) => {
      if (power > 0) continuous.push({ index, power });
    });
    const indicators = column.indicators;
    let multiplier = 1;
    let kind: EffectKind = 'other';
    let label = coefficient.label;
    let meaning = 'coefficient per half-range of each factor in the term';
    if (indicators.length === 0 && continuous.length === 1 && continuous[0].power === 1) {
      const f = factors[continuous[0].index];
      multiplier = 2;
      kind = 'main';
      label = `${factorName(f)} ${span(f)}`;
      meaning = `change from the low to the high end of the range, other factors at mid-range`;
    } else if (indicators.length === 0 && continuous.length === 1 && continuous[0].power === 2) {
      const f = factors[continuous[0].index];
      const middle = ((f.low as number) + (f.high as number)) / 2;
      multiplier = -1;
      kind = 'curvature';
      label = `${factorName(f)}: middle vs ends`;
      meaning = `how far ${withUnit(middle, f)} sits above the straight line between ${withUnit(f.low as number, f)} and ${withUnit(f.high as number, f)}`;
    } else if (indicators.length === 0 && continuous.length === 2 && continuous.every((c) => c.power === 1)) {
      const a = factors[continuous[0].index];
      const b = factors[continuous[1].index];
      multiplier = 4;
      kind = 'interaction';
      label = `${factorName(a)} × ${factorName(b)}`;
      meaning = `how much larger the ${factorName(a)} effect (${span(a)}) is at ${withUnit(b.high as number, b)} than at ${withUnit(b.low as number, b)}`;
    } else if (indicators.length === 1 && continuous.length === 0) {
      const f = factors[indicators[0].factor];
      const baseline = (f.levels as string[])[0];
      multiplier = 1;
      kind = 'level';
      label = `${factorName(f)}: ${baseline} → ${indicators[0].level}`;
      meaning = `change from ${baseline} to ${indicators[0].level}, other factors at mid-range`;
    } else if (indicators.length === 1 && continuous.length === 1 && continuous[0].power === 1) {
      const a = factors[continuous[0].index];
      const f = factors[indicators[0].factor];
      const baseline = (f.levels as string[])[0];
      multiplier = 2;
      kind = 'level-interaction';
      label = `${factorName(a)} × ${factorName(f)}: ${indicators[0].level}`;
      meaning = `how much larger the ${factorName(a)} effect (${span(a)}) is with ${indicators[0].level} than with ${baseline}`;
    }
    const effect = multiplier * coefficient.coded;
    const se = Math.abs(multiplier) * coefficient.codedSE;
    const half = Number.isFinite(t) ? t * se : NaN;
    out.push({
      term: coefficient.term,
      kind,
      label,
      meaning,
      effect,
      se,
      low: effect - half,
      high: effect + half,
      p: coefficient.p,
      clear: Number.isFinite(half) && (effect - half > 0 || effect + half < 0),
    });
  });
  out.sort((a, b) => Math.abs(b.effect) - Math.abs(a.effect));
  return out;
}

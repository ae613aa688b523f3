// Apparent reaction order from a pressure or concentration series: the slope of ln j against ln p.
import { slopeWithInterval } from './slope-interval';
import type { SeriesResult } from './types';

/** One member of a pressure (or concentration) series. */
export interface PressurePoint {
  buildId: number;
  /** absolute or partial pressure of the reactant, or its concentration; one unit for all points (> 0) */
  value: number;
  /** current density at the series potential, A/cm² (> 0) */
  currentDensity: number;
}

export interface ReactionOrderOptions {
  /** what was varied; default 'pressure' */
  variable?: 'pressure' | 'concentration';
  /** unit of `value`, for the axis title (e.g. 'kPa'); default 'kPa' for pressure, 'mol/L' for concentration */
  unit?: string;
  /** confidence level of the interval; default 0.95 */
  confidence?: number;
  /** what j is, for the method sentence; default "j at a fixed potential" */
  currentLabel?: string;
}

/** Below this ratio of the largest to the smallest pressure the estimate is flagged as resting on a narrow range. */
const NARROW_RATIO = 1.5;

/**
 * Apparent reaction order m = ∂ln j / ∂ln p at a fixed potential.
 * Definition: with j ∝ pᵐ, ln j is a straight line in ln p of slope m. Fit ln(j / 1 A·cm⁻²) against
 * ln(p / 1 unit) by least squares; the interval is the slope's Student-t interval with n − 2 degrees
 * of freedom. When the interval holds 0 the series shows no dependence within noise (a step that
 * does not involve the varied reactant may limit the rate). Pressures must be absolute or partial
 * pressures (a gauge reading gives a wrong ratio); the unit cancels in the slope.
 * Reference: Bard & Faulkner, "Electrochemical Methods", 2nd ed., ch. 3 (reaction orders from
 * current–concentration dependence); slope interval: Draper & Smith, "Applied Regression
 * Analysis", 3rd ed., ch. 1. Points are plotted as x = ln p, y = ln j.
 * Cost: O(n).
 * @throws RangeError when fewer than two points or fewer than two distinct values are given, a value
 *   or current density is not a positive finite number, or an option is malformed.
 * @example reactionOrder([{ buildId: 1, value: 100, currentDensity: 0.01 }, { buildId: 2, value: 200, currentDensity: 0.0141 }, { buildId: 3, value: 300, currentDensity: 0.0173 }]).estimate // ≈ 0.5
 */
export function reactionOrder(points: readonly PressurePoint[], options: ReactionOrderOptions = {}): SeriesResult {
  if (!Array.isArray(points)) throw new RangeError('reactionOrder: points must be an array');
  if (points.length < 2) throw new RangeError(`reactionOrder: at least 2 points are needed, got ${points.length}`);
  const variable = options.variable ?? 'pressure';
  if (variable !== 'pressure' && variable !== 'concentration') throw new RangeError(`reactionOrder: variable must be 'pressure' or 'concentration', got ${String(variable)}`);
  const unit = options.unit ?? (variable === 'pressure' ? 'kPa' : 'mol/L');
  if (typeof unit !== 'string' || unit.trim() === '') throw new RangeError('reactionOrder: unit must be a non-empty string');
  const confidence = options.confidence ?? 0.95;
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`reactionOrder: confidence must be in (0, 1), got ${confidence}`);
  points.forEach((point, index) => {
    if (point === null || typeof point !== 'object') throw new RangeError(`reactionOrder: point ${index} must be an object`);
    if (!(Number.isFinite(point.value) && point.value > 0)) {
      throw new RangeError(`reactionOrder: point ${index} (build ${point.buildId}): the ${variable} must be a positive number of ${unit}, got ${point.value}`);
    }
    if (!(Number.isFinite(point.currentDensity) && point.currentDensity > 0)) {
      throw new RangeError(`reactionOrder: point ${index} (build ${point.buildId}): currentDensity must be a positive number of A/cm², got ${point.currentDensity}`);
    }
  });
  if (new Set(points.map((point) => point.value)).size < 2) {
    throw new RangeError(`reactionOrder: the points must span at least 2 different values of the ${variable}, got all at ${points[0].value} ${unit}`);
  }
  const x = points.map((point) => Math.log(point.value));
  const y = points.map((point) => Math.log(point.currentDensity));
  const fit = slopeWithInterval(x, y, confidence);
  const notes: string[] = [];
  let noDependence: boolean | null = null;
  if (fit.n === 2) {
    notes.push('two points only: the line passes through both and no interval can be given');
  } else {
    noDependence = (fit.low as number) <= 0 && (fit.high as number) >= 0;
    if (noDependence) notes.push(`no dependence within noise: the ${Number((confidence * 100).toPrecision(4))} % interval of the order holds 0`);
  }
  const values = points.map((point) => point.value);
  const ratio = Math.max(...values) / Math.min(...values);
  if (ratio < NARROW_RATIO) notes.push(`the ${variable} varies only by a factor ${ratio.toFixed(2)}: the slope rests on a narrow range`);
  const currentLabel = options.currentLabel ?? 'j at a fixed potential';
  const percent = `${Number((confidence * 100).toPrecision(4))} %`;
  return {
    kind: 'order',
    points: points.map((point, index) => ({ buildId: point.buildId, x: x[index], y: y[index] })),
    estimate: fit.slope,
    low: fit.low,
    high: fit.high,
    unit: 'dimensionless',
    confidence,
    xLabel: `ln(${variable} / ${unit})`,
    yLabel: `ln(${currentLabel} / A·cm⁻²)`,
    fit,
    method:
      `least-squares slope of ln(${currentLabel}) against ln(${variable}) over ${fit.n} points at ${new Set(values).size} values; ` +
      (fit.n > 2 ? `${percent} interval from Student's t with ${fit.df} degrees of freedom; an interval holding 0 reads as no dependence within noise` : 'no interval (two points)'),
    notes,
    noDependenceWithinNoise: noDependence,
  };
}

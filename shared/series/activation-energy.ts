// Apparent activation energy from a temperature series: the Arrhenius line of ln j against 1/T.
import { GAS_CONSTANT } from '../curves/semi-empirical';
import { ZERO_CELSIUS_K } from '../units/temperature';
import { slopeWithInterval } from './slope-interval';
import type { SeriesResult } from './types';

/** One member of a temperature series: the current density read at a fixed potential. */
export interface TemperaturePoint {
  buildId: number;
  /** cell temperature, °C */
  temperatureC: number;
  /** current density at the series potential, A/cm² (> 0) */
  currentDensity: number;
}

export interface ActivationEnergyOptions {
  /** confidence level of the interval; default 0.95 */
  confidence?: number;
  /** what j is, for the method sentence, e.g. "j at 0.85 V iR-free"; default "j at a fixed potential" */
  currentLabel?: string;
}

/** Below this temperature span the estimate is flagged as resting on a narrow range, K. */
const NARROW_SPAN_K = 20;

/**
 * Apparent activation energy Eₐ of a temperature series.
 * Definition: Arrhenius, j = A·exp(−Eₐ/(R·T)), so ln j is a straight line in 1/T with slope −Eₐ/R.
 * Fit ln(j / 1 A·cm⁻²) against 1/T (T = t/°C + 273.15 K) by least squares; Eₐ = −slope·R/1000 in
 * kJ/mol with R = 8.314462618 J/(mol·K) (CODATA 2018); the interval is the slope's Student-t
 * interval with n − 2 degrees of freedom, mapped through the same factor. Read at a fixed
 * (iR-free) potential the result is "apparent": it includes how the overpotential at that potential
 * changes with temperature.
 * Reference: Bard & Faulkner, "Electrochemical Methods", 2nd ed., ch. 3 (Arrhenius form of the rate
 * constant); slope interval: Draper & Smith, "Applied Regression Analysis", 3rd ed., ch. 1.
 * Points are plotted as x = 1/T (K⁻¹), y = ln j.
 * Cost: O(n).
 * @throws RangeError when fewer than two points or fewer than two distinct temperatures are given,
 *   a temperature is not finite or not above absolute zero, a current density is not a positive
 *   finite number, or confidence is not in (0, 1).
 * @example activationEnergy([{ buildId: 1, temperatureC: 160, currentDensity: 0.005 }, { buildId: 2, temperatureC: 180, currentDensity: 0.01 }, { buildId: 3, temperatureC: 200, currentDensity: 0.019 }]).estimate // ≈ 58 kJ/mol
 */
export function activationEnergy(points: readonly TemperaturePoint[], options: ActivationEnergyOptions = {}): SeriesResult {
  if (!Array.isArray(points)) throw new RangeError('activationEnergy: points must be an array');
  if (points.length < 2) throw new RangeError(`activationEnergy: at least 2 points are needed, got ${points.length}`);
  const confidence = options.confidence ?? 0.95;
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`activationEnergy: confidence must be in (0, 1), got ${confidence}`);
  points.forEach((point, index) => {
    if (point === null || typeof point !== 'object') throw new RangeError(`activationEnergy: point ${index} must be an object`);
    if (!Number.isFinite(point.temperatureC) || point.temperatureC <= -ZERO_CELSIUS_K) {
      throw new RangeError(`activationEnergy: point ${index} (build ${point.buildId}): temperatureC must be a finite number above −273.15 °C, got ${point.temperatureC}`);
    }
    if (!(Number.isFinite(point.currentDensity) && point.currentDensity > 0)) {
      throw new RangeError(`activationEnergy: point ${index} (build ${point.buildId}): currentDensity must be a positive number of A/cm², got ${point.currentDensity}`);
    }
  });
  const kelvin = points.map((point) => point.temperatureC + ZERO_CELSIUS_K);
  const x = kelvin.map((value) => 1 / value);
  const y = points.map((point) => Math.log(point.currentDensity));
  if (new Set(points.map((point) => point.temperatureC)).size < 2) {
    throw new RangeError(`activationEnergy: the points must span at least 2 different temperatures, got all at ${points[0].temperatureC} °C`);
  }
  const fit = slopeWithInterval(x, y, confidence);
  const factor = -GAS_CONSTANT / 1000; // kJ/mol per unit of slope (slope in K)
  const estimate = fit.slope * factor;
  // the factor is negative: the slope's upper end gives Eₐ's lower end
  const low = fit.high === null ? null : fit.high * factor;
  const high = fit.low === null ? null : fit.low * factor;

  const notes: string[] = [];
  const spanK = Math.max(...kelvin) - Math.min(...kelvin);
  if (fit.n === 2) notes.push('two points only: the line passes through both and no interval can be given');
  if (spanK < NARROW_SPAN_K) notes.push(`the temperatures span only ${spanK.toFixed(1)} K: the slope rests on a narrow range`);
  if (estimate < 0) notes.push('the current falls as the temperature rises: not an activated process at this potential (check the series members)');
  const currentLabel = options.currentLabel ?? 'j at a fixed potential';
  const percent = `${Number((confidence * 100).toPrecision(4))} %`;
  return {
    kind: 'arrhenius',
    points: points.map((point, index) => ({ buildId: point.buildId, x: x[index], y: y[index] })),
    estimate,
    low,
    high,
    unit: 'kJ/mol',
    confidence,
    xLabel: '1/T (1/K)',
    yLabel: `ln(${currentLabel} / A·cm⁻²)`,
    fit,
    method:
      `least-squares line of ln(${currentLabel}) against 1/T over ${fit.n} points at ${new Set(points.map((point) => point.temperatureC)).size} temperatures; ` +
      `Eₐ = −slope·R with R = 8.314462618 J/(mol·K); ` +
      (fit.n > 2 ? `${percent} interval from Student's t with ${fit.df} degrees of freedom` : 'no interval (two points)'),
    notes,
  };
}

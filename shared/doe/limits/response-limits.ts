// Physical limits on a predicted response: a cell voltage cannot exceed the reversible voltage
// at the cell temperature nor the highest open-circuit voltage measured; current densities,
// activities, power and resistances cannot go below zero. A prediction past a limit is held at
// the limit and flagged, never shown as a number to trust.
import { reversibleCellVoltage } from './reversible-voltage';
import { metricLimit } from '../../curves/metric-catalogue';

export interface LimitContext {
  /** response key (curve metric keys have known physics; others have no limits) */
  response: string;
  /** factor key holding the cell temperature in °C, when cell temperature is a factor */
  cellTemperatureFactor?: string | null;
  /** cell temperature of the tests, °C, used when it is not a factor (the lowest tested gives the loosest limit) */
  testTemperatureC?: number | null;
  /** highest open-circuit voltage measured on the project's builds, V */
  highestOcvV?: number | null;
}

export interface LimitAtPoint {
  /** the largest physically possible value here (internal unit), or null */
  upper: number | null;
  /** the smallest physically possible value (internal unit), or null */
  lower: number | null;
  /** what sets the upper limit, in words, e.g. "reversible voltage at 180 °C" */
  upperWhy: string | null;
  lowerWhy: string | null;
}

export interface BoundedValue {
  /** the value held inside the limits */
  value: number;
  /** the model's own number before the limits */
  modelValue: number;
  low: number;
  high: number;
  /** true when the model's value is at or past a limit: not a number to trust */
  hitsLimit: boolean;
  /** true when only the interval reaches past a limit (the interval was cut there) */
  intervalCut: boolean;
  /** one sentence when hitsLimit or intervalCut, else null */
  note: string | null;
}

/**
 * The physical limits on a response at one recipe.
 * Definition: for cell voltages (V at j_ref, iR-free V at j_ref, OCV) upper = E_rev(T) with T
 * the recipe's cell temperature (the factor) or the test temperature, and for V at j_ref and its
 * iR-free form also ≤ the highest measured OCV; for current densities, mass activity, peak
 * power, HFR, Tafel slope and break-in, lower = 0. Other responses: no limits.
 * Reference: reversible voltage, Larminie & Dicks, Fuel Cell Systems Explained, Table 2.2; the
 * OCV ceiling and non-negative currents are common practice in the trade.
 * Cost: O(1).
 * @throws never (an out-of-table temperature gives no voltage limit from it).
 * @example limitsAt({ response: 'vAtRef', cellTemperatureFactor: 'cellTemp' }, { cellTemp: 180 }).upper // 1.1471…
 */
export function limitsAt(context: LimitContext, point: Record<string, number | string>): LimitAtPoint {
  const out: LimitAtPoint = { upper: null, lower: null, upperWhy: null, lowerWhy: null };
  if (metricLimit(context.response) === 'cell-voltage') {
    let temperature: number | null = null;
    if (context.cellTemperatureFactor && typeof point[context.cellTemperatureFactor] === 'number') temperature = point[context.cellTemperatureFactor] as number;
    else if (context.testTemperatureC != null && Number.isFinite(context.testTemperatureC)) temperature = context.testTemperatureC;
    let reversible: number | null = null;
    try {
      reversible = reversibleCellVoltage(temperature ?? 25);
    } catch {
      reversible = null;
    }
    if (reversible !== null) {
      out.upper = reversible;
      out.upperWhy = temperature === null ? 'the reversible voltage at 25 °C' : `the reversible voltage at ${Number(temperature.toPrecision(4))} °C`;
    }
    const ocv = context.highestOcvV;
    if (context.response !== 'ocv' && ocv != null && Number.isFinite(ocv) && (out.upper === null || ocv < out.upper)) {
      out.upper = ocv;
      out.upperWhy = 'the highest open-circuit voltage measured';
    }
  }
  if (metricLimit(context.response) === 'non-negative') {
    out.lower = 0;
    out.lowerWhy = 'zero';
  }
  return out;
}

/**
 * A prediction and its interval held inside the physical limits.
 * Definition: value = clamp(modelValue, lower, upper); hitsLimit when modelValue ≥ upper or
 * ≤ lower; the interval ends are clamped too, and intervalCut says when only they moved.
 * Cost: O(1).
 * @throws never.
 * @example boundPrediction({ upper: 1.15, lower: null, upperWhy: '…', lowerWhy: null }, 1.2, 1.1, 1.3).hitsLimit // true
 */
export function boundPrediction(limits: LimitAtPoint, modelValue: number, low: number, high: number, format: (v: number) => string = (v) => String(Number(v.toPrecision(4)))): BoundedValue {
  const { upper, lower } = limits;
  let value = modelValue;
  let hitsLimit = false;
  if (upper !== null && modelValue >= upper) {
    value = upper;
    hitsLimit = true;
  }
  if (lower !== null && modelValue <= lower) {
    value = lower;
    hitsLimit = true;
  }
  const cutLow = lower !== null && low < lower ? lower : upper !== null && low > upper ? upper : low;
  const cutHigh = upper !== null && high > upper ? upper : lower !== null && high < lower ? lower : high;
  const intervalCut = !hitsLimit && (cutLow !== low || cutHigh !== high);
  let note: string | null = null;
  if (hitsLimit) {
    const which = upper !== null && modelValue >= upper ? `above ${limits.upperWhy} (${format(upper)})` : `below ${limits.lowerWhy} (${format(lower as number)})`;
    note = `The model gives ${format(modelValue)}, ${which}: physically impossible, so this is not a prediction to trust.`;
  } else if (intervalCut) {
    note = `The interval was cut at ${cutHigh !== high ? `${limits.upperWhy} (${format(upper as number)})` : `${limits.lowerWhy} (${format(lower as number)})`}.`;
  }
  return { value, modelValue, low: cutLow, high: cutHigh, hitsLimit, intervalCut, note };
}

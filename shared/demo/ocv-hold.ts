// An invented open-circuit hold for the demo and the tests.
import { generateSyntheticLog } from '../durability/synthetic-log';
import type { CurveData } from '../curves/types';

export interface DemoOcvHoldOptions {
  /** length of the hold, h; default 100 */
  hours?: number;
  /** logging interval, min; default 1 */
  stepMinutes?: number;
  /** open-circuit voltage once settled, at the start, V; default 0.96 */
  ocv?: number;
  /** steady decay, mV/h; default 0.8 */
  decayMvPerH?: number;
  /** rise while the voltage settles after the load is removed, mV; default 25 */
  settlingRiseMv?: number;
  /** time by which settling is 99 % complete, h; default 0.2 (12 min) */
  settlingHours?: number;
  /** voltage noise, mV; default 0.5 */
  noiseMv?: number;
  /** cell temperature, °C; default 180 */
  temperatureC?: number;
  seed?: number;
}

/**
 * An invented open-circuit hold: V(t) = ocv − decay·t − rise·exp(−t/τ) + noise at j ≈ 0,
 * drawn by the durability log generator (generateSyntheticLog with kind 'hold').
 * Reference: none — demo data; the shape (a quick settling rise, then a slow linear decay, e.g.
 * from support corrosion at high temperature) is common practice in the trade.
 * Cost: O(hours / step).
 * @throws RangeError for options the generator refuses (non-positive length or step, negative noise).
 * @example demoOcvHold({ decayMvPerH: 1.2 }).kind // 'hold'
 */
export function demoOcvHold(options: DemoOcvHoldOptions = {}): CurveData {
  return generateSyntheticLog({
    hours: options.hours ?? 100,
    stepMinutes: options.stepMinutes ?? 1,
    v0: options.ocv ?? 0.96,
    breakInHours: options.settlingHours ?? 0.2,
    breakInDropMv: -(options.settlingRiseMv ?? 25),
    rateUvPerH: (options.decayMvPerH ?? 0.8) * 1000,
    noiseMv: options.noiseMv ?? 0.5,
    currentDensity: 0,
    kind: 'hold',
    temperatureC: options.temperatureC ?? 180,
    seed: options.seed ?? 1,
  });
}

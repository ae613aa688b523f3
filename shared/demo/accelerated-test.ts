// An invented accelerated test at high current density with a known onset of rapid failure, for
// the demo and the tests.
import { generateSyntheticLog } from '../durability/synthetic-log';
import type { CurveData } from '../curves/types';

export interface DemoAcceleratedTestOptions {
  /** length of the log, h; default 1500 */
  hours?: number;
  /** logging interval, min; default 10 */
  stepMinutes?: number;
  /** held current density, A/cm²; default 0.6 (common practice for accelerated HT-PEM tests) */
  currentDensity?: number;
  /** voltage of the stable line at t = 0, V; default 0.52 */
  v0?: number;
  /** break-in: time to 99 % settled, h, and the voltage lost above the line at t = 0, mV; default 24 h, 15 mV */
  breakInHours?: number;
  breakInDropMv?: number;
  /** stable loss rate, µV/h; default 15 */
  stableRateUvPerH?: number;
  /** onset of rapid failure, h, or null for a log without one; default 1100 */
  onsetHours?: number | null;
  /** loss rate after the onset, µV/h; default 250 */
  failureRateUvPerH?: number;
  /** noise SD, mV, and its lag-1 correlation between logged points; default 1 mV, 0.6 */
  noiseMv?: number;
  noiseCorrelation?: number;
  /** default 180 °C */
  temperatureC?: number;
  seed?: number;
}

/**
 * An invented accelerated-test log: the durability log generator's V(t) (stable line, exponential
 * break-in, AR(1) noise, generateSyntheticLog) minus (failure − stable rate)·max(0, t − onset), so the
 * loss rate steps from the stable to the failure rate at the onset.
 * Reference: none — demo and test data; a steady loss followed by an accelerating one is common
 * practice in the trade for accelerated tests (~0.6 A/cm² at ~180 °C for HT-PEM).
 * Cost: O(hours / step).
 * @throws RangeError for options the generator refuses, or an onset outside (0, hours).
 * @example demoAcceleratedTest({ onsetHours: 900 }).tHours!.length // 9001 (1500 h every 10 min)
 */
export function demoAcceleratedTest(options: DemoAcceleratedTestOptions = {}): CurveData {
  const hours = options.hours ?? 1500;
  const onset = options.onsetHours === undefined ? 1100 : options.onsetHours;
  if (onset !== null && !(Number.isFinite(onset) && onset > 0 && onset < hours)) throw new RangeError(`demoAcceleratedTest: onsetHours must lie in (0, ${hours}) h or be null, got ${onset}`);
  const stable = options.stableRateUvPerH ?? 15;
  const failure = options.failureRateUvPerH ?? 250;
  if (!Number.isFinite(failure)) throw new RangeError(`demoAcceleratedTest: failureRateUvPerH must be a finite number, got ${failure}`);
  const log = generateSyntheticLog({
    hours,
    stepMinutes: options.stepMinutes ?? 10,
    v0: options.v0 ?? 0.52,
    breakInHours: options.breakInHours ?? 24,
    breakInDropMv: options.breakInDropMv ?? 15,
    rateUvPerH: stable,
    noiseMv: options.noiseMv ?? 1,
    noiseCorrelation: options.noiseCorrelation ?? 0.6,
    currentDensity: options.currentDensity ?? 0.6,
    temperatureC: options.temperatureC ?? 180,
    seed: options.seed ?? 1,
  });
  if (onset !== null) {
    const extra = (failure - stable) * 1e-6;
    const t = log.tHours as Float64Array;
    for (let i = 0; i < t.length; i++) if (t[i] > onset) log.v[i] -= extra * (t[i] - onset);
  }
  return log;
}

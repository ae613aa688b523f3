// Invented durability logs (voltage vs time at constant current) with a known degradation rate,
// break-in, noise and optional restart / gap / current change — for tests and the demo seed.
import type { CurveData } from '../curves/types';
import { mulberry32, normalGenerator } from '../stats/random';

export interface SyntheticLogOptions {
  /** length of the run, h */
  hours: number;
  /** logging interval, minutes */
  stepMinutes: number;
  /** voltage of the long-run line at t = 0, V */
  v0: number;
  /** time by which the break-in transient has decayed to 1 % of its size, h (0 = no break-in) */
  breakInHours: number;
  /** voltage lost during break-in above the long-run line, mV; negative = voltage rises while the cell conditions */
  breakInDropMv: number;
  /** long-run degradation rate, µV/h, positive = losing voltage */
  rateUvPerH: number;
  /** standard deviation of the voltage noise, mV */
  noiseMv: number;
  /** lag-1 correlation of the noise from one logged point to the next, 0 ≤ φ < 1 (0 = white noise) */
  noiseCorrelation?: number;
  /** time of a stop and restart, h */
  restartAtHours?: number;
  /** voltage step at the restart, mV (positive = voltage higher afterwards, as when reversible losses recover) */
  restartShiftMv?: number;
  /** rows missing around the restart (the stop), h; default 1 */
  restartPauseHours?: number;
  /** start of a logging gap (no step in voltage), h */
  gapAtHours?: number;
  /** length of the logging gap, h */
  gapHours?: number;
  /** a sustained excursion of the current set-point */
  currentChange?: { atHours: number; hours: number; currentDensity: number };
  /** held current density, A/cm² (0 for an open-circuit hold) */
  currentDensity: number;
  /** 'hold' for an open-circuit hold; default 'durability' */
  kind?: 'durability' | 'hold';
  /** cell temperature, °C; default 160 */
  temperatureC?: number;
  /** PRNG seed; default 1 */
  seed?: number;
}

/**
 * Local slope of the polarization curve used to move V when the current set-point changes, V per A/cm².
 * Invented round number of the right size for an HT-PEM cell near 0.2–0.6 A/cm².
 */
const VOLTAGE_PER_CURRENT = 0.25;

/**
 * Generates an invented durability log:
 * V(t) = v0 − rate·t + drop·exp(−t/τ) + noise, τ = breakInHours / ln 100, sampled every stepMinutes,
 * with AR(1) noise e_k = φ·e_(k−1) + sqrt(1 − φ²)·σ·z_k, rows removed in gaps and the restart pause,
 * and the voltage stepped by restartShiftMv from the restart on.
 * Reference: none — a test fixture; the shape (exponential break-in, then linear loss) is common practice.
 * Cost: O(hours / step) time and memory.
 * @throws RangeError when an option is missing, not finite or out of range.
 * @example generateSyntheticLog({ hours: 500, stepMinutes: 10, v0: 0.65, breakInHours: 50, breakInDropMv: 20, rateUvPerH: 8, noiseMv: 1, currentDensity: 0.2 })
 */
export function generateSyntheticLog(options: SyntheticLogOptions): CurveData {
  const { hours, stepMinutes, v0, breakInHours, breakInDropMv, rateUvPerH, noiseMv, currentDensity } = options;
  const required: [string, number][] = [
    ['hours', hours],
    ['stepMinutes', stepMinutes],
    ['v0', v0],
    ['breakInHours', breakInHours],
    ['breakInDropMv', breakInDropMv],
    ['rateUvPerH', rateUvPerH],
    ['noiseMv', noiseMv],
    ['currentDensity', currentDensity],
  ];
  for (const [name, value] of required) {
    if (!Number.isFinite(value)) throw new RangeError(`generateSyntheticLog: ${name} must be a finite number, got ${value}`);
  }
  if (!(hours > 0)) throw new RangeError(`generateSyntheticLog: hours must be positive, got ${hours}`);
  if (!(stepMinutes > 0)) throw new RangeError(`generateSyntheticLog: stepMinutes must be positive, got ${stepMinutes}`);
  if (breakInHours < 0) throw new RangeError(`generateSyntheticLog: breakInHours must be ≥ 0, got ${breakInHours}`);
  if (noiseMv < 0) throw new RangeError(`generateSyntheticLog: noiseMv must be ≥ 0, got ${noiseMv}`);
  const phi = options.noiseCorrelation ?? 0;
  if (!(phi >= 0 && phi < 1)) throw new RangeError(`generateSyntheticLog: noiseCorrelation must be in [0, 1), got ${phi}`);
  const stepHours = stepMinutes / 60;
  const steps = Math.floor(hours / stepHours + 1e-9) + 1;
  if (steps > 20_000_000) throw new RangeError(`generateSyntheticLog: at most 20,000,000 rows, got ${steps}`);

  const restartAt = options.restartAtHours;
  const restartPause = options.restartPauseHours ?? 1;
  const restartShift = (options.restartShiftMv ?? 0) / 1000;
  const gapAt = options.gapAtHours;
  const gapHours = options.gapHours ?? 0;
  const change = options.currentChange;
  const baseTemperature = options.temperatureC ?? 160;
  const tau = breakInHours > 0 ? breakInHours / Math.log(100) : 0;
  const drop = breakInDropMv / 1000;
  const rate = rateUvPerH * 1e-6;
  const sigma = noiseMv / 1000;
  const innovation = Math.sqrt(1 - phi * phi) * sigma;

  const gauss = normalGenerator(mulberry32(options.seed ?? 1));
  const t = new Float64Array(steps);
  const v = new Float64Array(steps);
  const j = new Float64Array(steps);
  const temperature = new Float64Array(steps);
  let kept = 0;
  let noise = sigma * gauss(); // start the AR(1) process in its stationary state
  for (let k = 0; k < steps; k++) {
    const time = k * stepHours;
    if (k > 0) noise = phi * noise + innovation * gauss();
    const currentNoise = 2e-4 * gauss(); // station current control, A/cm²
    const temperatureNoise = 0.2 * gauss();
    // Draw the random numbers before deciding to drop the row, so a gap does not change the rest of the log.
    if (gapAt !== undefined && time >= gapAt && time < gapAt + gapHours) continue;
    if (restartAt !== undefined && time >= restartAt && time < restartAt + restartPause) continue;
    let current = currentDensity;
    if (change && time >= change.atHours && time < change.atHours + change.hours) current = change.currentDensity;
    let voltage = v0 - rate * time + noise;
    if (tau > 0) voltage += drop * Math.exp(-time / tau);
    if (restartAt !== undefined && time >= restartAt) voltage += restartShift;
    voltage -= VOLTAGE_PER_CURRENT * (current - currentDensity);
    t[kept] = time;
    v[kept] = voltage;
    j[kept] = current === 0 ? Math.abs(currentNoise) * 0.01 : current + currentNoise;
    temperature[kept] = baseTemperature + temperatureNoise;
    kept++;
  }
  return {
    kind: options.kind ?? (currentDensity === 0 ? 'hold' : 'durability'),
    tHours: t.slice(0, kept),
    v: v.slice(0, kept),
    j: j.slice(0, kept),
    temperatureC: temperature.slice(0, kept),
  };
}

// Too little data to be a curve of its kind: a polarization curve needs at least three current
// steps under load; a durability log needs enough readings and hours after break-in for a rate.
import { CurveFileError } from './types';
import type { CurveData } from './types';
import { countCurrentLevels } from './current-levels';

/** Least a polarization curve needs: three distinct current steps under load. */
export const MIN_POLARIZATION_STEPS = 3;
/** Least a durability log needs: readings in all, and hours logged after break-in. */
export const MIN_DURABILITY_POINTS = 20;
export const MIN_HOURS_AFTER_BREAK_IN = 3;
/** A log at least this long is kept whatever its break-in (the rate then says why it is missing). */
export const LONG_LOG_HOURS = 24;

// Below this |j| a reading is open circuit, not a current step (A/cm²).
const LOADED_J = 1e-4;

function formatJ(value: number): string {
  return value >= 0.1 ? value.toFixed(2) : value >= 0.01 ? value.toFixed(3) : value.toFixed(4);
}

/**
 * Refuses a polarization curve with fewer than three distinct current steps under load
 * (|j| > 0.1 mA/cm²; readings within 3 % or 0.1 mA/cm² of each other are one step), and a
 * durability log with fewer than 20 finite (time, voltage) readings.
 * Reference: three points are the fewest through which a curve (rather than a line) can be
 * read and interpolated (common practice in the trade).
 * Cost: O(n log n) on a sample of at most 20,000 readings.
 * @throws CurveFileError `too-few-steps` or `too-few-points`.
 * @example checkEnoughData({ kind: 'polarization', j: Float64Array.of(0, 0.1, 0.2), v: Float64Array.of(0.95, 0.7, 0.65) }) // throws: 2 steps
 */
export function checkEnoughData(curve: CurveData): void {
  if (curve.kind === 'polarization') {
    const loaded: number[] = [];
    const irFree = curve.vIrFree;
    for (let row = 0; row < curve.j.length; row++) {
      const hasVoltage = Number.isFinite(curve.v[row]) || (irFree !== undefined && Number.isFinite(irFree[row]));
      if (Math.abs(curve.j[row]) > LOADED_J && hasVoltage) loaded.push(curve.j[row]);
    }
    const { levels } = countCurrentLevels(loaded, { relativeTolerance: 0.03, absoluteTolerance: LOADED_J });
    if (levels.length < MIN_POLARIZATION_STEPS) {
      const found = levels.length === 0 ? 'no current step under load' : `${levels.length} (${levels.map((level) => `${formatJ(level.center)} A/cm²`).join(' and ')})`;
      const openCircuit = loaded.length < curve.j.length ? ' besides open circuit' : '';
      throw new CurveFileError(
        'too-few-steps',
        `a polarization curve needs at least ${MIN_POLARIZATION_STEPS} distinct current steps under load; this file has ${found}${openCircuit}. Upload the whole curve, or choose another kind.`,
      );
    }
    return;
  }
  if (curve.kind === 'durability') {
    const t = curve.tHours;
    let finite = 0;
    // enough is enough: the count stops once it reaches the least a log needs
    for (let row = 0; row < curve.v.length && finite < MIN_DURABILITY_POINTS; row++) if (curve.v[row] === curve.v[row] && (t === undefined || t[row] === t[row])) finite++;
    if (finite < MIN_DURABILITY_POINTS) {
      throw new CurveFileError(
        'too-few-points',
        `a durability log needs at least ${MIN_DURABILITY_POINTS} readings of voltage against time for a degradation rate; this file has ${finite}. Upload the whole log.`,
      );
    }
  }
}

/**
 * After break-in is known: refuses a durability log shorter than a day that has fewer than
 * 3 hours (or fewer than 20 readings) after break-in — no rate can be read from it. Longer
 * logs are kept (their rate, when missing, says why).
 * Cost: O(n).
 * @throws CurveFileError `too-short`.
 * @example checkHoursAfterBreakIn(curve, 1.5) // throws when the log ends at 3 h
 */
export function checkHoursAfterBreakIn(curve: CurveData, breakInHours: number | null): void {
  const t = curve.tHours;
  if (curve.kind !== 'durability' || t === undefined || t.length === 0) return;
  let first = Infinity;
  let last = -Infinity;
  for (let row = 0; row < t.length; row++) {
    if (t[row] < first) first = t[row];
    if (t[row] > last) last = t[row];
  }
  const hoursRun = last - first;
  if (hoursRun >= LONG_LOG_HOURS) return;
  const start = first + Math.max(0, breakInHours ?? 0);
  let after = 0;
  for (let row = 0; row < t.length; row++) if (t[row] >= start && curve.v[row] === curve.v[row]) after++;
  const hoursAfter = Math.max(0, last - start);
  if (hoursAfter < MIN_HOURS_AFTER_BREAK_IN || after < MIN_DURABILITY_POINTS) {
    const breakIn = breakInHours != null && breakInHours > 0 ? ` after a break-in of ${breakInHours.toFixed(1)} h` : '';
    throw new CurveFileError(
      'too-short',
      `a durability log needs at least ${MIN_HOURS_AFTER_BREAK_IN} h and ${MIN_DURABILITY_POINTS} readings after break-in for a degradation rate; this one runs ${hoursRun.toFixed(1)} h, leaving ${hoursAfter.toFixed(1)} h and ${after} readings${breakIn}. Upload the whole log.`,
    );
  }
}

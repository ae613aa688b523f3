// Time columns at the file's edge → hours, the unit used inside Cellwright.
import type { TimeUnit } from '../curves/types';

/**
 * Multiplier that turns a time reading in `unit` into hours. A `timestamp` column holds
 * epoch seconds (see parseTimestamp), so its factor is that of seconds.
 * Reference: 1 h = 60 min = 3600 s (BIPM SI Brochure, 9th ed., table 8). Cost: O(1).
 * @throws RangeError when the unit is unknown.
 * @example hoursFactor('min') // 1/60
 */
export function hoursFactor(unit: TimeUnit): number {
  switch (unit) {
    case 's':
    case 'timestamp':
      return 1 / 3600;
    case 'min':
      return 1 / 60;
    case 'h':
      return 1;
    default:
      throw new RangeError(`hoursFactor: unknown time unit ${String(unit)}`);
  }
}

/**
 * One time reading → hours. Cost: O(1).
 * @throws RangeError when the unit is unknown or the value is not finite.
 * @example toHours(90, 'min') // 1.5
 */
export function toHours(value: number, unit: TimeUnit): number {
  if (!Number.isFinite(value)) throw new RangeError(`toHours: value must be a finite number, got ${value}`);
  return value * hoursFactor(unit);
}

/**
 * Time readings → hours elapsed since the first reading: (t − t₀) × factor.
 * Subtracting before scaling keeps full precision for epoch timestamps (~1.7e9 s), where
 * scaling first would leave only ~1e-7 h of resolution. No check of order here: the caller
 * (applyMapping) decides what a backwards step means.
 * Cost: O(n) time, one Float64Array of n.
 * @throws RangeError when the unit is unknown or a value is not finite.
 * @example elapsedHours(Float64Array.of(1714557600, 1714561200), 'timestamp') // [0, 1]
 */
export function elapsedHours(values: ArrayLike<number>, unit: TimeUnit): Float64Array {
  const factor = hoursFactor(unit);
  const out = new Float64Array(values.length);
  if (values.length === 0) return out;
  const start = values[0];
  for (let index = 0; index < values.length; index++) {
    const value = values[index];
    if (!Number.isFinite(value)) throw new RangeError(`elapsedHours: value ${index} must be a finite number, got ${value}`);
    out[index] = (value - start) * factor;
  }
  return out;
}

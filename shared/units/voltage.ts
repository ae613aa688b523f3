// Cell voltage at the file's edge → volts.
import type { VoltageUnit } from '../curves/types';

/**
 * Multiplier that turns a voltage in `unit` into volts.
 * Reference: SI prefixes (BIPM SI Brochure, 9th ed.): 1 mV = 1e-3 V. Cost: O(1).
 * @throws RangeError when the unit is unknown.
 * @example voltageFactor('mV') // 0.001
 */
export function voltageFactor(unit: VoltageUnit): number {
  if (unit === 'V') return 1;
  if (unit === 'mV') return 1e-3;
  throw new RangeError(`voltageFactor: unknown voltage unit ${String(unit)}`);
}

/**
 * One voltage reading → volts. Cost: O(1).
 * @throws RangeError when the unit is unknown or the value is not finite.
 * @example toVolts(652, 'mV') // 0.652
 */
export function toVolts(value: number, unit: VoltageUnit): number {
  if (!Number.isFinite(value)) throw new RangeError(`toVolts: value must be a finite number, got ${value}`);
  return value * voltageFactor(unit);
}

/**
 * Volts → the reading a file in `unit` would hold. Cost: O(1).
 * @throws RangeError when the unit is unknown or the value is not finite.
 * @example fromVolts(0.652, 'mV') // 652
 */
export function fromVolts(valueV: number, unit: VoltageUnit): number {
  if (!Number.isFinite(valueV)) throw new RangeError(`fromVolts: value must be a finite number, got ${valueV}`);
  return valueV / voltageFactor(unit);
}

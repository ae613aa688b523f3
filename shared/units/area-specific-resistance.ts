// High-frequency resistance at the file's edge → area-specific resistance in Ω·cm².
import type { HfrUnit } from '../curves/types';

/**
 * Multiplier that turns an HFR reading in `unit` into area-specific resistance, Ω·cm².
 * Definition: ASR = R · A for a cell resistance R (Ω) over active area A (cm²); a resistance
 * is multiplied (not divided) by the area because a larger cell of the same material has a
 * proportionally smaller resistance.
 * Reference: Ohm's law for a slab, R = ρ·L/A, so R·A = ρ·L depends only on the material.
 * Cost: O(1).
 * @throws RangeError when the unit is a cell resistance and the area is missing or ≤ 0,
 *   or when the unit is unknown.
 * @example hfrFactor('mohm', 25) // 0.025  (1 mΩ on 25 cm² = 0.025 Ω·cm²)
 */
export function hfrFactor(unit: HfrUnit, areaCm2?: number | null): number {
  switch (unit) {
    case 'ohm*cm2':
      return 1;
    case 'mohm*cm2':
      return 1e-3;
    case 'ohm':
    case 'mohm': {
      if (areaCm2 === undefined || areaCm2 === null || !Number.isFinite(areaCm2) || areaCm2 <= 0) {
        throw new RangeError(`hfrFactor: a cell resistance in ${unit === 'ohm' ? 'Ω' : 'mΩ'} needs a positive active area in cm², got ${String(areaCm2)}`);
      }
      return (unit === 'ohm' ? 1 : 1e-3) * areaCm2;
    }
    default:
      throw new RangeError(`hfrFactor: unknown HFR unit ${String(unit)}`);
  }
}

/**
 * One HFR reading → Ω·cm². Cost: O(1).
 * @throws RangeError as `hfrFactor`, or when the value is not finite.
 * @example toOhmCm2(180, 'mohm*cm2') // 0.18
 */
export function toOhmCm2(value: number, unit: HfrUnit, areaCm2?: number | null): number {
  if (!Number.isFinite(value)) throw new RangeError(`toOhmCm2: value must be a finite number, got ${value}`);
  return value * hfrFactor(unit, areaCm2);
}

/**
 * Ω·cm² → the reading a file in `unit` would hold. Cost: O(1).
 * @throws RangeError as `hfrFactor`, or when the value is not finite.
 * @example fromOhmCm2(0.2, 'mohm', 25) // 8 (mΩ)
 */
export function fromOhmCm2(valueOhmCm2: number, unit: HfrUnit, areaCm2?: number | null): number {
  if (!Number.isFinite(valueOhmCm2)) throw new RangeError(`fromOhmCm2: value must be a finite number, got ${valueOhmCm2}`);
  return valueOhmCm2 / hfrFactor(unit, areaCm2);
}

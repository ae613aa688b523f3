// Current at the file's edge → current density in A/cm², the unit used inside Cellwright.
import type { CurrentUnit } from '../curves/types';

/**
 * Multiplier that turns a current reading in `unit` into current density in A/cm².
 * Definition: j = I / A for total currents (A, mA), a plain scale for densities.
 * Reference: SI prefixes (BIPM SI Brochure, 9th ed., table 7): 1 mA = 1e-3 A.
 * Cost: O(1).
 * @throws RangeError when the unit is total current and the area is missing, not finite or ≤ 0,
 *   or when the unit is unknown.
 * @example currentDensityFactor('mA', 25) // 4e-5  (1 mA on 25 cm² = 4e-5 A/cm²)
 */
export function currentDensityFactor(unit: CurrentUnit, areaCm2?: number | null): number {
  switch (unit) {
    case 'A/cm2':
      return 1;
    case 'mA/cm2':
      return 1e-3;
    case 'A':
    case 'mA': {
      if (areaCm2 === undefined || areaCm2 === null || !Number.isFinite(areaCm2) || areaCm2 <= 0) {
        throw new RangeError(`currentDensityFactor: a total current in ${unit} needs a positive active area in cm², got ${String(areaCm2)}`);
      }
      return (unit === 'A' ? 1 : 1e-3) / areaCm2;
    }
    default:
      throw new RangeError(`currentDensityFactor: unknown current unit ${String(unit)}`);
  }
}

/**
 * One current reading → current density in A/cm².
 * Reference: as `currentDensityFactor`. Cost: O(1).
 * @throws RangeError as `currentDensityFactor`, or when value is not finite.
 * @example toCurrentDensity(200, 'mA/cm2') // 0.2
 */
export function toCurrentDensity(value: number, unit: CurrentUnit, areaCm2?: number | null): number {
  if (!Number.isFinite(value)) throw new RangeError(`toCurrentDensity: value must be a finite number, got ${value}`);
  return value * currentDensityFactor(unit, areaCm2);
}

/**
 * Current density in A/cm² → the reading a file in `unit` would hold (the inverse, for writers).
 * Cost: O(1).
 * @throws RangeError as `currentDensityFactor`, or when value is not finite.
 * @example fromCurrentDensity(0.2, 'A', 25) // 5 (A total)
 */
export function fromCurrentDensity(valueAcm2: number, unit: CurrentUnit, areaCm2?: number | null): number {
  if (!Number.isFinite(valueAcm2)) throw new RangeError(`fromCurrentDensity: value must be a finite number, got ${valueAcm2}`);
  return valueAcm2 / currentDensityFactor(unit, areaCm2);
}

// Coded ↔ actual units for one continuous factor inside the design tables: coded −1 is the
// low setting, +1 the high one, 0 the centre. Kept local so this folder does not depend on
// the fitting code's coding module.

/**
 * Actual setting of a coded value: actual = centre + coded · halfRange,
 * centre = (low + high)/2, halfRange = (high − low)/2. Axial points beyond ±1 map outside
 * [low, high]. Rounded to 12 significant digits so 0.1-type settings print cleanly.
 * Reference: coded variables, e.g. NIST/SEMATECH e-Handbook of Statistical Methods §5.3.3.6 (from memory).
 * Cost: O(1).
 * @throws RangeError when a value is not finite or high ≤ low.
 * @example codedToActual(-1, 150, 190) // 150 (°C)
 */
export function codedToActual(coded: number, low: number, high: number): number {
  if (!Number.isFinite(coded) || !Number.isFinite(low) || !Number.isFinite(high)) {
    throw new RangeError(`codedToActual: coded, low, high: must be finite numbers, got ${coded}, ${low}, ${high}`);
  }
  if (!(high > low)) throw new RangeError(`codedToActual: high: must be greater than low, got low ${low}, high ${high}`);
  const centre = low / 2 + high / 2;
  const halfRange = high / 2 - low / 2;
  const actual = centre + coded * halfRange;
  // toPrecision trims binary noise (0.30000000000000004); "+ 0" turns −0 into 0.
  return Number(actual.toPrecision(12)) + 0;
}

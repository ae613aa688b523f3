// Specific precious-metal use: grams of precious metal per kilowatt of cell power.

/**
 * Grams of precious metal per kW at a power density.
 * Definition: g/kW = metal loading / power density. Units: (mg/cm²) / (W/cm²) = mg/W, and
 * 1 mg/W = 10⁻³ g / 10⁻³ kW = 1 g/kW, so the number is the loading in mg/cm² divided by the power
 * density in W/cm², with no conversion factor.
 * Reference: unit algebra (hand-worked: 0.4 mg Pt/cm² at 0.5 W/cm² = 0.8 mg/W = 0.8 g/kW).
 * Cost: O(1).
 * @throws RangeError when the loading is negative or not finite, or the power density is not a
 *   positive finite number.
 * @example specificMetalUse(0.4, 0.5) // 0.8 g/kW
 */
export function specificMetalUse(metalLoadingMgCm2: number, powerDensityWcm2: number): number {
  if (!(Number.isFinite(metalLoadingMgCm2) && metalLoadingMgCm2 >= 0)) {
    throw new RangeError(`specificMetalUse: metalLoadingMgCm2 must be a number ≥ 0 mg/cm², got ${metalLoadingMgCm2}`);
  }
  if (!(Number.isFinite(powerDensityWcm2) && powerDensityWcm2 > 0)) {
    throw new RangeError(`specificMetalUse: powerDensityWcm2 must be a positive number of W/cm², got ${powerDensityWcm2}`);
  }
  return metalLoadingMgCm2 / powerDensityWcm2;
}

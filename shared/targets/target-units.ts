// Conversion between the units a target may be stated in and the fixed internal units of the
// curve metrics (V, A/cm², A/g, W/cm², Ω·cm², mV/dec, µV/h, h, mg/cm²). Pure.

/** unit → [dimension, factor to the dimension's base unit] */
const UNITS: Readonly<Record<string, readonly [string, number]>> = {
  V: ['voltage', 1], mV: ['voltage', 1e-3], 'µV': ['voltage', 1e-6],
  'A/cm²': ['current density', 1], 'mA/cm²': ['current density', 1e-3], 'A/cm2': ['current density', 1], 'mA/cm2': ['current density', 1e-3],
  'A/g': ['mass activity', 1], 'mA/mg': ['mass activity', 1], 'A/mg': ['mass activity', 1e3],
  'W/cm²': ['power density', 1], 'mW/cm²': ['power density', 1e-3], 'W/cm2': ['power density', 1], 'mW/cm2': ['power density', 1e-3],
  'Ω·cm²': ['area resistance', 1], 'mΩ·cm²': ['area resistance', 1e-3], 'Ohm cm2': ['area resistance', 1], 'mOhm cm2': ['area resistance', 1e-3],
  'mV/dec': ['tafel slope', 1], 'V/dec': ['tafel slope', 1e3],
  'µV/h': ['voltage rate', 1], 'mV/h': ['voltage rate', 1e3], 'mV/kh': ['voltage rate', 1], 'uV/h': ['voltage rate', 1],
  h: ['time', 1], min: ['time', 1 / 60],
  'mg/cm²': ['areal loading', 1], 'µg/cm²': ['areal loading', 1e-3], 'mg/cm2': ['areal loading', 1], 'ug/cm2': ['areal loading', 1e-3],
};

/** The units a target may be written in: the internal unit's family (for the form's choice). */
export function unitsLike(unit: string): string[] {
  const dim = UNITS[unit]?.[0];
  if (!dim) return [unit];
  return Object.keys(UNITS).filter((u) => UNITS[u][0] === dim && !/[0-9]$|Ohm|^u/.test(u));
}

/**
 * Factor f with value_in_`to` = f · value_in_`from`, or null when the two units are not of one
 * dimension. Identical strings always convert with factor 1 (hand-entered responses keep their
 * own unit, e.g. "€/kW").
 * Cost: O(1).
 * @example conversionFactor('V', 'mV') // 1000
 */
export function conversionFactor(from: string, to: string): number | null {
  if (from.trim() === to.trim()) return 1;
  const a = UNITS[from.trim()];
  const b = UNITS[to.trim()];
  if (!a || !b || a[0] !== b[0]) return null;
  // the factors are powers of ten (and 1/60): 12 significant digits drop the binary rounding
  return Number((a[1] / b[1]).toPrecision(12));
}

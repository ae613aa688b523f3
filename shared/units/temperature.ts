// Temperature at the file's edge → °C.
import type { TemperatureUnit } from '../curves/types';

/** 0 °C in kelvin, exact by definition of the Celsius scale (BIPM SI Brochure, 9th ed., 2.3.1). */
export const ZERO_CELSIUS_K = 273.15;

/**
 * One temperature reading → °C.
 * Definition: t/°C = T/K − 273.15. Reference: BIPM SI Brochure, 9th ed. Cost: O(1).
 * @throws RangeError when the unit is unknown, the value is not finite, or it is below absolute zero.
 * @example toCelsius(433.15, 'K') // 160
 */
export function toCelsius(value: number, unit: TemperatureUnit): number {
  if (!Number.isFinite(value)) throw new RangeError(`toCelsius: value must be a finite number, got ${value}`);
  let celsius: number;
  if (unit === 'C') celsius = value;
  else if (unit === 'K') celsius = value - ZERO_CELSIUS_K;
  else throw new RangeError(`toCelsius: unknown temperature unit ${String(unit)}`);
  if (celsius < -ZERO_CELSIUS_K) throw new RangeError(`toCelsius: ${value} ${unit} is below absolute zero`);
  return celsius;
}

/**
 * °C → kelvin. Cost: O(1).
 * @throws RangeError when the value is not finite or below absolute zero.
 * @example toKelvin(160) // 433.15
 */
export function toKelvin(valueC: number): number {
  if (!Number.isFinite(valueC)) throw new RangeError(`toKelvin: value must be a finite number, got ${valueC}`);
  if (valueC < -ZERO_CELSIUS_K) throw new RangeError(`toKelvin: ${valueC} °C is below absolute zero`);
  return valueC + ZERO_CELSIUS_K;
}

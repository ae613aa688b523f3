// Unit conversions at the edges of Cellwright and the header-unit recogniser.
export { currentDensityFactor, toCurrentDensity, fromCurrentDensity } from './current-density';
export { voltageFactor, toVolts, fromVolts } from './voltage';
export { hfrFactor, toOhmCm2, fromOhmCm2 } from './area-specific-resistance';
export { hoursFactor, toHours, elapsedHours } from './elapsed-time';
export { ZERO_CELSIUS_K, toCelsius, toKelvin } from './temperature';
export { parseTimestamp, parseDuration } from './parse-timestamp';
export { recogniseHeaderUnit, lookUpUnit, normaliseUnitKey } from './recognise-header-unit';
export type { HeaderUnitMatch, HeaderQuantity, PowerUnit, PressureUnit } from './recognise-header-unit';

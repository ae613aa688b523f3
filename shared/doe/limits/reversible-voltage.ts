// The reversible (open-circuit, no-loss) voltage of a hydrogen/oxygen cell at its temperature:
// the ceiling no measured or predicted cell voltage can pass.

// Gibbs energy of formation of the product water, kJ/mol, at °C: Larminie & Dicks, Fuel Cell
// Systems Explained, 2nd ed., Table 2.2 (liquid water at 25 and 80 °C, water vapour from 80 °C).
const LIQUID: readonly [number, number][] = [
  [25, -237.2],
  [80, -228.2],
];
const VAPOUR: readonly [number, number][] = [
  [80, -226.1],
  [100, -225.2],
  [200, -220.4],
  [400, -210.3],
  [600, -199.6],
  [800, -188.6],
  [1000, -177.4],
];
// CODATA 2018
const FARADAY = 96485.33212;

function interpolate(table: readonly [number, number][], t: number): number {
  for (let i = 1; i < table.length; i++) {
    const [t0, g0] = table[i - 1];
    const [t1, g1] = table[i];
    if (t <= t1) return g0 + ((g1 - g0) * (t - t0)) / (t1 - t0);
  }
  return table[table.length - 1][1];
}

/**
 * Reversible H2/O2 cell voltage at a cell temperature.
 * Definition: E = −Δg_f/(2F) with Δg_f the molar Gibbs energy of formation of the product
 * water, interpolated linearly in temperature in the handbook table: liquid water from 25 to
 * 80 °C, water vapour from 100 °C up, and a straight line between 80 °C (liquid) and 100 °C
 * (vapour). Values: 1.2292 V at 25 °C, 1.1670 V at 100 °C, 1.1421 V at 200 °C.
 * Reference: Larminie & Dicks, Fuel Cell Systems Explained, 2nd ed. (2003), §2.2, Table 2.2;
 * Faraday constant CODATA 2018.
 * Cost: O(1).
 * @throws RangeError when the temperature is not a number from 25 to 1000 °C.
 * @example reversibleCellVoltage(180) // 1.1471…
 */
export function reversibleCellVoltage(temperatureC: number): number {
  if (typeof temperatureC !== 'number' || !Number.isFinite(temperatureC) || temperatureC < 25 || temperatureC > 1000) {
    throw new RangeError(`reversibleCellVoltage: temperature must be 25–1000 °C (temperatureC = ${String(temperatureC)})`);
  }
  let g: number;
  if (temperatureC <= 80) g = interpolate(LIQUID, temperatureC);
  else if (temperatureC < 100) g = LIQUID[1][1] + ((VAPOUR[1][1] - LIQUID[1][1]) * (temperatureC - 80)) / 20;
  else g = interpolate(VAPOUR, temperatureC);
  return (-g * 1000) / (2 * FARADAY);
}

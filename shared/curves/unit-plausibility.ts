// Unit slips: a column whose values cannot be what its unit says — volts under a mV header,
// mV under a V header, a total current that gives more current density than any cell carries,
// an HFR no cell shows — and the unit that would make them plausible.
import type { ColumnSummary, CurrentUnit, CurveKind, HfrUnit, VoltageUnit } from './types';

/**
 * Magnitudes of single PEM cells (common practice in the trade): cell voltage up to ~1.3 V
 * (reversible H₂/O₂ ≈ 1.23 V at 25 °C); current density up to ~5 A/cm² (limiting currents of
 * the best cells are 2–4 A/cm²); a polarization curve reaches well above 5 mA/cm²; HFR
 * (area-specific) 0.02–3 Ω·cm² (thin membranes ≈ 0.03, PBI/phosphoric acid 0.1–0.4,
 * badly hydrated or poorly contacted cells ~1).
 */
export const PLAUSIBLE = {
  maxCellVoltageV: 2,
  maxCurrentDensity: 5,
  minPolarizationPeak: 0.005,
  hfrOhmCm2: [0.02, 3] as const,
};

export interface UnitSlip {
  quantity: 'voltage' | 'current' | 'hfr';
  /** 0-based row that shows the slip best (its file line is named in messages) */
  row: number;
  stated: string;
  /** the unit that makes the column plausible, or null when none does */
  proposed: string | null;
  /** what is wrong and the likely fix, without the line/column prefix */
  message: string;
}

const LABEL: Readonly<Record<string, string>> = {
  'A/cm2': 'A/cm²',
  'mA/cm2': 'mA/cm²',
  A: 'A',
  mA: 'mA',
  V: 'V',
  mV: 'mV',
  'ohm*cm2': 'Ω·cm²',
  'mohm*cm2': 'mΩ·cm²',
  ohm: 'Ω',
  mohm: 'mΩ',
};

export function unitLabel(unit: string): string {
  return LABEL[unit] ?? unit;
}

function shown(value: number): string {
  const magnitude = Math.abs(value);
  if (magnitude === 0) return '0';
  if (magnitude >= 1e5 || magnitude < 1e-4) return value.toExponential(2);
  return String(Number(value.toPrecision(4)));
}

interface Extremes {
  maxAbs: number;
  /** the first row with the largest |value| (looked for only when a slip is told) */
  maxRow: () => number;
  finite: number;
}

/** The first row whose |value| is `magnitude` (−1 when none is). */
function firstRowOf(values: ArrayLike<number>, magnitude: number): number {
  for (let row = 0; row < values.length; row++) if (Math.abs(values[row]) === magnitude) return row;
  return -1;
}

/** The largest |value| (and its first row) and the count of values that are not blank; from the parser's summary when given. */
function extremes(values: ArrayLike<number>, summary?: ColumnSummary | null): Extremes {
  if (summary) return { maxAbs: summary.maxAbs, maxRow: () => firstRowOf(values, summary.maxAbs), finite: summary.finite };
  let maxAbs = 0;
  let maxRow = -1;
  let finite = 0;
  for (let row = 0; row < values.length; row++) {
    const value = values[row];
    if (value !== value) continue;
    finite++;
    const magnitude = Math.abs(value);
    if (magnitude > maxAbs || maxRow < 0) {
      maxAbs = magnitude;
      maxRow = row;
    }
  }
  return { maxAbs, maxRow: () => maxRow, finite };
}

// Median of |values| over finite, non-zero readings, from an evenly strided sample (long logs).
// The row named is the one a stable sort of the sample puts in the middle: among equal values, in row order.
function medianMagnitude(values: ArrayLike<number>): { median: number; row: number } | null {
  const stride = Math.max(1, Math.floor(values.length / 10_001));
  const magnitudes = new Float64Array(Math.ceil(values.length / stride));
  const rows = new Int32Array(magnitudes.length);
  let count = 0;
  for (let row = 0; row < values.length; row += stride) {
    const value = Math.abs(values[row]);
    if (value === value && value > 0) {
      magnitudes[count] = value;
      rows[count++] = row;
    }
  }
  if (count === 0) return null;
  const sorted = magnitudes.slice(0, count).sort();
  const middle = count >> 1;
  const median = sorted[middle];
  // the middle is the k-th sampled value equal to the median, k = its place among them
  let equalBefore = middle;
  while (equalBefore > 0 && sorted[equalBefore - 1] === median) equalBefore--;
  let k = middle - equalBefore;
  for (let s = 0; s < count; s++) {
    if (magnitudes[s] === median && k-- === 0) return { median, row: rows[s] };
  }
  return { median, row: rows[0] };
}

/**
 * Volts under a mV header (largest |value| ≤ 2, i.e. ≤ 2 mV — no cell curve stays that low)
 * or mV under a V header (median |value| above 2 V and the largest ≤ 2000). Cost: O(n).
 * @example voltageSlip(Float64Array.of(0.98, 0.7), 'mV')?.proposed // 'V'
 */
export function voltageSlip(values: ArrayLike<number>, unit: VoltageUnit, summary?: ColumnSummary | null): UnitSlip | null {
  const { maxAbs, maxRow, finite } = extremes(values, summary);
  if (finite === 0 || maxAbs === 0) return null;
  if (unit === 'mV' && maxAbs <= PLAUSIBLE.maxCellVoltageV) {
    return {
      quantity: 'voltage',
      row: maxRow(),
      stated: 'mV',
      proposed: 'V',
      message: `the highest value is ${shown(maxAbs)} mV; a cell voltage in mV runs to hundreds (an open circuit is ~950 mV), so these are volts: choose V as the unit`,
    };
  }
  // the median cannot be above 2 V when no value is
  const middle = unit === 'V' && maxAbs > PLAUSIBLE.maxCellVoltageV ? medianMagnitude(values) : null;
  if (unit === 'V' && middle !== null && middle.median > PLAUSIBLE.maxCellVoltageV && maxAbs <= 1000 * PLAUSIBLE.maxCellVoltageV) {
    return {
      quantity: 'voltage',
      row: maxRow(),
      stated: 'V',
      proposed: 'mV',
      message: `values up to ${shown(maxAbs)} V are not cell voltages (no cell holds more than ~1.3 V); they read as millivolts: choose mV as the unit`,
    };
  }
  return null;
}

function densityFactor(unit: CurrentUnit, areaCm2: number | null): number | null {
  if (unit === 'A/cm2') return 1;
  if (unit === 'mA/cm2') return 1e-3;
  if (areaCm2 === null || !(areaCm2 > 0)) return null;
  return (unit === 'A' ? 1 : 1e-3) / areaCm2;
}

const BIGGER_CURRENT: Readonly<Partial<Record<CurrentUnit, CurrentUnit>>> = { mA: 'A', 'mA/cm2': 'A/cm2' };
const SMALLER_CURRENT: Readonly<Partial<Record<CurrentUnit, CurrentUnit>>> = { A: 'mA', 'A/cm2': 'mA/cm2' };

/**
 * A current column whose density cannot be a cell's: above 5 A/cm² anywhere (then the unit one
 * step smaller is proposed when it fits, e.g. A → mA), or, for a polarization curve, never
 * above 5 mA/cm² (the unit one step larger, mA → A). Durability logs are judged on their
 * median current. Totals need the area; without it nothing is judged. Cost: O(n).
 * @example currentSlip(Float64Array.of(0, 500, 1000), 'A', 25, 'polarization')?.proposed // 'mA'
 */
export function currentSlip(values: ArrayLike<number>, unit: CurrentUnit, areaCm2: number | null, kind: CurveKind, summary?: ColumnSummary | null): UnitSlip | null {
  const factor = densityFactor(unit, areaCm2);
  if (factor === null || kind === 'hold') return null;
  const { maxAbs, maxRow, finite } = extremes(values, summary);
  if (finite === 0) return null;
  const total = unit === 'A' || unit === 'mA';
  const onArea = total ? ` on ${shown(areaCm2 as number)} cm²` : '';
  const peak = maxAbs * factor;
  if (peak > PLAUSIBLE.maxCurrentDensity) {
    const smaller = SMALLER_CURRENT[unit] ?? null;
    const fits = smaller !== null && peak / 1000 <= PLAUSIBLE.maxCurrentDensity;
    const what = `${shown(maxAbs)} ${unitLabel(unit)}${onArea} is ${shown(peak)} A/cm², more than any cell carries (≤ ~${PLAUSIBLE.maxCurrentDensity} A/cm²)`;
    const fix = fits ? `; is the unit ${unitLabel(smaller)}? (→ ${shown(peak / 1000)} A/cm²)` : total ? '; is the active area right?' : '; is this the current column?';
    return { quantity: 'current', row: maxRow(), stated: unit, proposed: fits ? smaller : null, message: what + fix };
  }
  const level = kind === 'durability' ? medianMagnitude(values) : { median: maxAbs, get row() { return maxRow(); } };
  if (level === null || level.median === 0) return null;
  const typical = level.median * factor;
  if (typical < PLAUSIBLE.minPolarizationPeak) {
    const bigger = BIGGER_CURRENT[unit] ?? null;
    const fits = bigger !== null && typical * 1000 <= PLAUSIBLE.maxCurrentDensity && typical * 1000 >= PLAUSIBLE.minPolarizationPeak;
    const what =
      kind === 'durability'
        ? `the held current ${shown(level.median)} ${unitLabel(unit)}${onArea} is only ${shown(typical)} A/cm²`
        : `the highest current ${shown(level.median)} ${unitLabel(unit)}${onArea} is only ${shown(typical)} A/cm²; a polarization curve runs well past ${PLAUSIBLE.minPolarizationPeak * 1000} mA/cm²`;
    const fix = fits ? `; is the unit ${unitLabel(bigger)}? (→ ${shown(typical * 1000)} A/cm²)` : total ? '; is the active area right?' : '; is this the current column?';
    return { quantity: 'current', row: level.row, stated: unit, proposed: fits ? bigger : null, message: what + fix };
  }
  return null;
}

const HFR_UNITS: readonly HfrUnit[] = ['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm'];

function hfrFactorOrNull(unit: HfrUnit, areaCm2: number | null): number | null {
  if (unit === 'ohm*cm2') return 1;
  if (unit === 'mohm*cm2') return 1e-3;
  if (areaCm2 === null || !(areaCm2 > 0)) return null;
  return (unit === 'ohm' ? 1 : 1e-3) * areaCm2;
}

/**
 * HFR readings whose median (non-zero readings) is outside 0.02–3 Ω·cm² in the stated unit;
 * the one unit among Ω·cm², mΩ·cm², Ω and mΩ (totals × area) that brings it inside is proposed.
 * Cost: O(n).
 * @example hfrSlip(Float64Array.of(8, 8.2), 'mohm*cm2', 25)?.proposed // 'mohm' (8 mΩ on 25 cm² = 0.2 Ω·cm²)
 */
export function hfrSlip(values: ArrayLike<number>, unit: HfrUnit, areaCm2: number | null): UnitSlip | null {
  const factor = hfrFactorOrNull(unit, areaCm2);
  if (factor === null) return null;
  const middle = medianMagnitude(values);
  if (middle === null) return null;
  const asr = middle.median * factor;
  const [low, high] = PLAUSIBLE.hfrOhmCm2;
  if (asr >= low && asr <= high) return null;
  const fitting: { unit: HfrUnit; asr: number }[] = [];
  for (const other of HFR_UNITS) {
    if (other === unit) continue;
    const otherFactor = hfrFactorOrNull(other, areaCm2);
    if (otherFactor === null) continue;
    const value = middle.median * otherFactor;
    if (value >= low && value <= high) fitting.push({ unit: other, asr: value });
  }
  const onArea = unit === 'ohm' || unit === 'mohm' ? ` on ${shown(areaCm2 as number)} cm²` : '';
  const what = `the typical HFR ${shown(middle.median)} ${unitLabel(unit)}${onArea} is ${shown(asr)} Ω·cm², outside what any cell shows (${low}–${high} Ω·cm²)`;
  if (fitting.length === 1) {
    const only = fitting[0];
    const total = only.unit === 'ohm' || only.unit === 'mohm' ? ` (a total resistance, × ${shown(areaCm2 as number)} cm²)` : '';
    return { quantity: 'hfr', row: middle.row, stated: unit, proposed: only.unit, message: `${what}; is the unit ${unitLabel(only.unit)}${total}? (→ ${shown(only.asr)} Ω·cm²)` };
  }
  const options = fitting.map((entry) => unitLabel(entry.unit)).join(' or ');
  return { quantity: 'hfr', row: middle.row, stated: unit, proposed: null, message: `${what}; ${fitting.length > 1 ? `is the unit ${options}?` : 'is this the HFR column?'}` };
}

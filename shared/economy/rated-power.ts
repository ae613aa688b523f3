// The power density a specific-metal figure is quoted at: at a stated cell voltage, or the
// highest measured power of the curve.
import { polarizationMetrics } from '../curves/polarization-metrics';
import type { CurveData } from '../curves/types';

export type PowerBasis = { kind: 'voltage'; voltage: number } | { kind: 'peak' };

export interface RatedPower {
  /** W/cm², or null when the curve does not give it (see note) */
  powerDensityWcm2: number | null;
  /** the current density at that point, A/cm² */
  currentDensity: number | null;
  /** cell voltage at that point, V */
  voltage: number | null;
  basis: PowerBasis;
  /** "at 0.6 V" or "at peak power (highest measured)" — the condition to print beside the figure */
  label: string;
  /** why the value is null, or a caveat (peak still rising at the last step) */
  note: string | null;
  method: string;
}

/**
 * Power density of a polarization curve at a stated cell voltage, or at peak power.
 * Definition: at a voltage V, P = V·j(V) with j where the measured (not iR-free) cell voltage first
 * falls through V (the `jAtRef` metric of polarizationMetrics, log-j interpolation in the kinetic
 * region, never extrapolated); at peak, the highest measured j·V (the `peakPower` metric, never
 * fitted; flagged when it is the last step, i.e. the true peak lies beyond the data).
 * Reference: P = V·j (W/cm² = V × A/cm²); metrics as polarizationMetrics (shared/curves).
 * Cost: O(n log n) for n readings.
 * @throws RangeError when the curve is malformed (as polarizationMetrics) or the basis is not
 *   { kind: 'peak' } or { kind: 'voltage', voltage in (0, 2) V }.
 * @example ratedPower(curve, { kind: 'voltage', voltage: 0.6 }).powerDensityWcm2 // W/cm²
 */
export function ratedPower(curve: CurveData, basis: PowerBasis): RatedPower {
  if (basis === null || typeof basis !== 'object' || (basis.kind !== 'peak' && basis.kind !== 'voltage')) {
    throw new RangeError("ratedPower: basis must be { kind: 'peak' } or { kind: 'voltage', voltage }");
  }
  if (basis.kind === 'voltage' && !(Number.isFinite(basis.voltage) && basis.voltage > 0 && basis.voltage < 2)) {
    throw new RangeError(`ratedPower: the voltage must be between 0 and 2 V, got ${basis.voltage}`);
  }
  const refVoltage = basis.kind === 'voltage' ? basis.voltage : 0.6;
  const result = polarizationMetrics(curve, { refCurrentDensity: 0.2, refVoltage, irFree: false, loadingBasis: 'catalyst' }, { loadingMgCm2: null });
  if (basis.kind === 'voltage') {
    const j = result.metrics.jAtRef;
    const label = `at ${basis.voltage} V`;
    const method = `P = V·j at V = ${basis.voltage} V; j by ${result.method.jAtRef?.method ?? 'first fall of V through the voltage'}`;
    if (j === null) return { powerDensityWcm2: null, currentDensity: null, voltage: basis.voltage, basis, label, note: result.metricNotes.jAtRef ?? 'not reached', method };
    return { powerDensityWcm2: basis.voltage * j, currentDensity: j, voltage: basis.voltage, basis, label, note: null, method };
  }
  const peak = result.metrics.peakPower;
  const inputs = result.method.peakPower?.inputs ?? {};
  const jPeak = typeof inputs.jAtPeak === 'number' ? inputs.jAtPeak : null;
  const vPeak = typeof inputs.vAtPeak === 'number' ? inputs.vAtPeak : null;
  return {
    powerDensityWcm2: peak,
    currentDensity: jPeak,
    voltage: vPeak,
    basis,
    label: 'at peak power (highest measured)',
    note: result.metricNotes.peakPower ?? null,
    method: result.method.peakPower?.method ?? 'highest measured j·V',
  };
}

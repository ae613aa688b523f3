// The current density a polarization curve gives at a fixed iR-free voltage — the quantity a
// temperature or pressure series compares — read by the project's own polarization metrics.
import { polarizationMetrics } from '../curves/polarization-metrics';
import type { CurveData } from '../curves/types';

/** Readings of one polarization curve, in internal units (A/cm², V, Ω·cm²). */
export interface CurvePoints {
  j: ArrayLike<number>;
  v: ArrayLike<number>;
  /** HFR per reading, Ω·cm²; needed unless `vIrFree` is given */
  hfr?: ArrayLike<number>;
  /** the file's own iR-free voltage, V */
  vIrFree?: ArrayLike<number>;
}

export interface CurrentAtVoltageOptions {
  /** H₂ crossover current density added to j, A/cm²; default 0 */
  h2CrossoverAcm2?: number;
  /**
   * limiting current density of the electrode, A/cm² (measured or stated): when given, the kinetic
   * current j_k = j·j_lim/(j_lim − j) is returned where the curve allows (see maxLimitingFraction)
   */
  limitingCurrentDensity?: number;
  /** largest j/j_lim at which the mass-transport correction is applied; default 0.5 (correction ≤ 2×) */
  maxLimitingFraction?: number;
}

export interface CurrentAtVoltage {
  /** the value to use, A/cm², or null when the curve does not reach the voltage */
  currentDensity: number | null;
  /** which current `currentDensity` is: the iR-free current, or the mass-transport-corrected kinetic current */
  basis: 'iR-free' | 'kinetic' | null;
  /** the iR-free current density at the voltage, A/cm² (always given when reached) */
  irFreeCurrentDensity: number | null;
  /** j_k / j when the kinetic current is given, else null */
  correctionFactor: number | null;
  /** the voltage asked for, V (iR-free) */
  voltage: number;
  /** why the value is null, or what was done */
  note: string | null;
  /** how the value was read */
  method: string;
}

function toFloat(values: ArrayLike<number>): Float64Array {
  return values instanceof Float64Array ? values : Float64Array.from(values);
}

/**
 * Current density at a fixed iR-free voltage, and the kinetic current where the curve allows.
 * Definition: iR-free V = V + j·HFR (or the file's iR-free column); j is where the step-averaged
 * iR-free curve first falls through the voltage, interpolated in log j in the kinetic region and
 * never extrapolated — exactly the `jAtRefIrFree` metric (polarizationMetrics) with V_ref set to the
 * series voltage. With a limiting current density j_lim stated and j ≤ maxLimitingFraction·j_lim,
 * the kinetic current j_k = j·j_lim/(j_lim − j) (1/j = 1/j_k + 1/j_lim) is returned instead, and
 * `basis` says so; otherwise the iR-free current is returned with the reason in `note`.
 * Reference: polarizationMetrics (shared/curves); the mass-transport correction is the
 * Koutecký–Levich form, Bard & Faulkner, "Electrochemical Methods", 2nd ed., ch. 9 (Koutecký–Levich treatment).
 * Cost: O(n log n) for n readings.
 * @throws RangeError when the arrays differ in length or are empty, the voltage is not in (0, 2) V,
 *   the curve has neither HFR nor an iR-free column, or an option is malformed.
 * @example currentAtIrFreeVoltage({ j, v, hfr }, 0.85).currentDensity // A/cm² at 0.85 V iR-free
 */
export function currentAtIrFreeVoltage(points: CurvePoints, voltage: number, options: CurrentAtVoltageOptions = {}): CurrentAtVoltage {
  if (points === null || typeof points !== 'object' || points.j === undefined || points.v === undefined) {
    throw new RangeError('currentAtIrFreeVoltage: points must hold j and v');
  }
  const n = points.j.length;
  if (n === 0) throw new RangeError('currentAtIrFreeVoltage: the curve has no readings');
  if (points.v.length !== n) throw new RangeError(`currentAtIrFreeVoltage: j has ${n} readings but v has ${points.v.length}`);
  if (points.hfr !== undefined && points.hfr.length !== n) throw new RangeError(`currentAtIrFreeVoltage: j has ${n} readings but hfr has ${points.hfr.length}`);
  if (points.vIrFree !== undefined && points.vIrFree.length !== n) throw new RangeError(`currentAtIrFreeVoltage: j has ${n} readings but vIrFree has ${points.vIrFree.length}`);
  if (points.hfr === undefined && points.vIrFree === undefined) {
    throw new RangeError('currentAtIrFreeVoltage: the curve needs an HFR or an iR-free voltage column to give an iR-free current');
  }
  if (!(Number.isFinite(voltage) && voltage > 0 && voltage < 2)) throw new RangeError(`currentAtIrFreeVoltage: voltage must be between 0 and 2 V, got ${voltage}`);
  const limiting = options.limitingCurrentDensity;
  if (limiting !== undefined && !(Number.isFinite(limiting) && limiting > 0)) {
    throw new RangeError(`currentAtIrFreeVoltage: limitingCurrentDensity must be a positive number of A/cm², got ${limiting}`);
  }
  const maxFraction = options.maxLimitingFraction ?? 0.5;
  if (!(maxFraction > 0 && maxFraction < 1)) throw new RangeError(`currentAtIrFreeVoltage: maxLimitingFraction must be in (0, 1), got ${maxFraction}`);

  const curve: CurveData = { kind: 'polarization', j: toFloat(points.j), v: toFloat(points.v) };
  if (points.hfr !== undefined) curve.hfr = toFloat(points.hfr);
  if (points.vIrFree !== undefined) curve.vIrFree = toFloat(points.vIrFree);
  const result = polarizationMetrics(
    curve,
    // only V_ref matters here; j_ref and the loading basis feed metrics this function does not read
    { refCurrentDensity: 0.2, refVoltage: voltage, irFree: true, loadingBasis: 'catalyst' },
    { loadingMgCm2: null },
    { h2CrossoverAcm2: options.h2CrossoverAcm2 ?? 0 },
  );
  const irFreeJ = result.metrics.jAtRefIrFree;
  const baseMethod = result.method.jAtRefIrFree?.method ?? 'first fall of the iR-free voltage through the voltage';
  if (irFreeJ === null) {
    return {
      currentDensity: null,
      basis: null,
      irFreeCurrentDensity: null,
      correctionFactor: null,
      voltage,
      note: result.metricNotes.jAtRefIrFree ?? 'not reached',
      method: baseMethod,
    };
  }
  const crossoverNote = result.metricNotes.jAtRefIrFree ?? null;
  if (limiting === undefined) {
    return { currentDensity: irFreeJ, basis: 'iR-free', irFreeCurrentDensity: irFreeJ, correctionFactor: null, voltage, note: crossoverNote ?? 'iR-free current (no limiting current stated, so no kinetic current)', method: baseMethod };
  }
  const fraction = irFreeJ / limiting;
  if (fraction > maxFraction) {
    return {
      currentDensity: irFreeJ,
      basis: 'iR-free',
      irFreeCurrentDensity: irFreeJ,
      correctionFactor: null,
      voltage,
      note: `iR-free current: j is ${(fraction * 100).toFixed(0)} % of the limiting current (above ${(maxFraction * 100).toFixed(0)} %), too close for a mass-transport correction`,
      method: baseMethod,
    };
  }
  const kinetic = (irFreeJ * limiting) / (limiting - irFreeJ);
  return {
    currentDensity: kinetic,
    basis: 'kinetic',
    irFreeCurrentDensity: irFreeJ,
    correctionFactor: kinetic / irFreeJ,
    voltage,
    note: `kinetic current: j·j_lim/(j_lim − j) with j_lim = ${limiting} A/cm² (correction ×${(kinetic / irFreeJ).toFixed(3)})${crossoverNote ? `; ${crossoverNote}` : ''}`,
    method: `${baseMethod}; then corrected for mass transport, j_k = j·j_lim/(j_lim − j)`,
  };
}

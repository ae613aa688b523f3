// The metrics object of a polarization curve (V at j_ref, j at V_ref, iR-free values, mass
// activity, peak power, OCV, Tafel slope, HFR), each with how it was obtained, read from the
// step-averaged curve (stepAverage) without extrapolating and without interpolating from the
// open-circuit reading.
import type { BuildLoading, CurveData, MetricMethod, MetricsResult, ReferencePoint } from './types';
import type { CurveMetrics, MetricKey } from './types';
import { stepAverage } from './step-average';
import type { CurveStep, CurveSweep, StepAverageOptions } from './step-average';
import { CompensatedSum } from '../stats/compensated-sum';
import { lineSlope } from '../stats/linear-fit';
import { metricsOfKind, nullMetrics } from './metric-catalogue';
import { median } from '../stats/median';

export interface PolarizationMetricsOptions {
  step?: StepAverageOptions;
  /** kinetic window for the Tafel slope, A/cm²; default [0.005, 0.05] */
  tafelWindow?: readonly [number, number];
  /** below this lower-step current, interpolate in log j (kinetic region), A/cm²; default 0.1 */
  kineticLimitAcm2?: number;
  /** H₂ crossover current density added to j for the kinetic metrics, A/cm²; default 0 (none) */
  h2CrossoverAcm2?: number | null;
}

const DEFAULT_TAFEL_WINDOW: readonly [number, number] = [0.005, 0.05];
const DEFAULT_KINETIC_LIMIT = 0.1;
/** Largest crossover current density accepted, A/cm² (100 mA/cm² would be a leaking membrane). */
const MAX_CROSSOVER = 0.1;
// relative slack when comparing a reference value with the ends of the measured range (round-off)
const RANGE_SLACK = 1e-9;
const ONLY_IR_FREE = 'the file gives only an iR-free voltage';

interface Curve {
  /** current density (with the crossover added where stated), ascending */
  j: number[];
  y: number[];
}

interface SweepCurves {
  direction: CurveSweep['direction'];
  measured: Curve;
  irFree: Curve;
}

/** A range of j in one unit: mA/cm² when both ends are below 0.1 A/cm², else A/cm². */
function rangeText(low: number, high: number): string {
  if (high < 0.1) return `${Number((low * 1000).toPrecision(3))}–${Number((high * 1000).toPrecision(3))} mA/cm²`;
  return `${low.toFixed(3)}–${high.toFixed(3)} A/cm²`;
}

/** j, mA/cm² below 0.1 A/cm², else A/cm², with sensible digits. */
function jText(value: number): string {
  if (Math.abs(value) < 0.1) return `${Number((value * 1000).toPrecision(3))} mA/cm²`;
  return `${value.toFixed(3)} A/cm²`;
}

// Steps in ascending j with a value, equal j (within round-off) merged by averaging.
function curveOf(steps: readonly CurveStep[], indices: readonly number[], pick: (step: CurveStep) => number | null, shift: number): Curve {
  const members = indices.map((index) => steps[index]).filter((step) => pick(step) !== null).sort((a, b) => a.j - b.j);
  const j: number[] = [];
  const y: number[] = [];
  const weight: number[] = [];
  for (const step of members) {
    const value = pick(step) as number;
    const x = step.j + shift;
    const last = j.length - 1;
    if (last >= 0 && Math.abs(x - j[last]) <= RANGE_SLACK * Math.max(1, Math.abs(x))) {
      y[last] = (y[last] * weight[last] + value) / (weight[last] + 1);
      weight[last]++;
    } else {
      j.push(x);
      y.push(value);
      weight.push(1);
    }
  }
  return { j, y };
}

// Interpolation on ascending x; NaN outside [x₀, xₙ₋₁] — never extrapolates. Between two points
// whose lower one lies in the kinetic region (0 < x < kineticLimit) the value is linear in log x
// (a Tafel line); elsewhere linear in x.
function interpolate(x: readonly number[], y: readonly number[], at: number, kineticLimit: number): number {
  const n = x.length;
  if (n === 0) return Number.NaN;
  const slack = RANGE_SLACK * Math.max(1, Math.abs(at));
  if (at < x[0] - slack || at > x[n - 1] + slack) return Number.NaN;
  if (at <= x[0]) return y[0];
  if (at >= x[n - 1]) return y[n - 1];
  let low = 0;
  let high = n - 1;
  while (high - low > 1) {
    const middle = (low + high) >> 1;
    if (x[middle] <= at) low = middle;
    else high = middle;
  }
  if (x[high] === x[low]) return y[low];
  const fraction = x[low] > 0 && x[low] < kineticLimit ? Math.log(at / x[low]) / Math.log(x[high] / x[low]) : (at - x[low]) / (x[high] - x[low]);
  return y[low] + fraction * (y[high] - y[low]);
}

// Sweeps averaged at common j: on the union of all sweeps' j, the mean of every sweep that covers it.
function combine(curves: readonly Curve[], kineticLimit: number): Curve {
  const grid: number[] = [];
  for (const curve of curves) for (const value of curve.j) grid.push(value);
  grid.sort((a, b) => a - b);
  const j: number[] = [];
  const y: number[] = [];
  for (const at of grid) {
    if (j.length > 0 && Math.abs(at - j[j.length - 1]) <= RANGE_SLACK * Math.max(1, Math.abs(at))) continue;
    const sum = new CompensatedSum();
    let covering = 0;
    for (const curve of curves) {
      const value = interpolate(curve.j, curve.y, at, kineticLimit);
      if (value === value) {
        sum.add(value);
        covering++;
      }
    }
    if (covering > 0) {
      j.push(at);
      y.push(sum.value() / covering);
    }
  }
  return { j, y };
}

function spanText(curve: Curve): string {
  return `${curve.j[0].toFixed(2)}–${curve.j[curve.j.length - 1].toFixed(2)} A/cm²`;
}

interface CrossingResult {
  j: number | null;
  note: string | null;
}

// First crossing of V_ref coming from the low-current side, on loaded steps only; in log j where
// the lower step lies in the kinetic region. Not bracketed → "not reached" with the nearest point.
function crossing(curve: Curve, voltage: number, kineticLimit: number): CrossingResult {
  const n = curve.j.length;
  if (n === 0) return { j: null, note: 'not reached: no loaded steps' };
  if (curve.y[0] < voltage) {
    return {
      j: null,
      note:
        `not reached: V_ref ${voltage.toFixed(3)} V lies above the lowest-current loaded step ` +
        `(nearest measured: ${curve.y[0].toFixed(3)} V at ${jText(curve.j[0])}); the open-circuit reading is never interpolated from`,
    };
  }
  for (let index = 0; index < n; index++) {
    if (curve.y[index] === voltage) return { j: curve.j[index], note: null };
    if (index + 1 < n && curve.y[index] > voltage && curve.y[index + 1] < voltage) {
      const fraction = (voltage - curve.y[index]) / (curve.y[index + 1] - curve.y[index]);
      const [low, high] = [curve.j[index], curve.j[index + 1]];
      const value = low > 0 && low < kineticLimit ? low * Math.pow(high / low, fraction) : low + fraction * (high - low);
      return { j: value, note: null };
    }
  }
  let lowest = 0;
  for (let index = 1; index < n; index++) if (curve.y[index] < curve.y[lowest]) lowest = index;
  return {
    j: null,
    note: `not reached: lowest voltage ${curve.y[lowest].toFixed(3)} V at ${curve.j[lowest].toFixed(3)} A/cm² (nearest measured; curve spans ${spanText(curve)})`,
  };
}


function checkInputs(curve: CurveData, ref: ReferencePoint, loading: BuildLoading): void {
  if (curve === null || typeof curve !== 'object' || !(curve.j instanceof Float64Array) || !(curve.v instanceof Float64Array)) {
    throw new RangeError('polarizationMetrics: curve must have Float64Array j and v');
  }
  if (curve.j.length === 0) throw new RangeError('polarizationMetrics: the curve has no readings');
  if (curve.v.length !== curve.j.length) throw new RangeError(`polarizationMetrics: j has ${curve.j.length} readings but v has ${curve.v.length}`);
  let voltages = 0;
  for (let index = 0; index < curve.j.length; index++) {
    if (!Number.isFinite(curve.j[index])) throw new RangeError(`polarizationMetrics: reading ${index} has a non-finite j`);
    if (Number.isFinite(curve.v[index]) || (curve.vIrFree !== undefined && Number.isFinite(curve.vIrFree[index]))) voltages++;
  }
  if (voltages === 0) throw new RangeError('polarizationMetrics: the curve has no voltage readings (measured or iR-free)');
  if (ref === null || typeof ref !== 'object') throw new RangeError('polarizationMetrics: ref must be a ReferencePoint');
  if (!(Number.isFinite(ref.refCurrentDensity) && ref.refCurrentDensity > 0)) {
    throw new RangeError(`polarizationMetrics: refCurrentDensity must be a positive number of A/cm², got ${String(ref.refCurrentDensity)}`);
  }
  if (!(Number.isFinite(ref.refVoltage) && ref.refVoltage > 0 && ref.refVoltage < 2)) {
    throw new RangeError(`polarizationMetrics: refVoltage must be between 0 and 2 V, got ${String(ref.refVoltage)}`);
  }
  if (ref.loadingBasis !== 'catalyst' && ref.loadingBasis !== 'metal') {
    throw new RangeError(`polarizationMetrics: loadingBasis must be 'catalyst' or 'metal', got ${String(ref.loadingBasis)}`);
  }
  if (loading === null || typeof loading !== 'object') throw new RangeError('polarizationMetrics: loading must be a BuildLoading');
}

/**
 * Metrics of a polarization curve, read on the step-averaged curve (stepAverage: steps by set
 * point, settled part of each dwell, sweeps of ≥ 3 steps, order-free when the order does not read
 * as sweeps). Only loaded steps are interpolated (never the open-circuit reading), nothing is
 * extrapolated; with up and down sweeps both measured they are averaged at common j (each sweep's
 * V at j_ref and the hysteresis are in `summary`).
 * - vAtRef, vAtRefIrFree: V (iR-free V) at j_ref; "not reached" outside the loaded steps.
 * - jAtRef, jAtRefIrFree: j where V (iR-free V) first falls through V_ref; between steps whose lower
 *   one is below 0.1 A/cm² the interpolation is linear in log j (Tafel region), else linear in j;
 *   "not reached" with the nearest measured point when V_ref is not bracketed. jAtRefIrFree
 *   includes the H₂ crossover current when one is given (j + j_x).
 * - massActivity, A/g: (j at V_ref, iR-free when ref.irFree, + j_x) ÷ (loading mg/cm² × 1e-3 g/mg)
 *   on ref.loadingBasis (whole catalyst, or metal only).
 * - peakPower, W/cm²: the highest j·V among the measured steps (never fitted or extrapolated).
 * - ocv, V: mean V at the zero-current set point; null when the curve has no such reading.
 * - tafelSlope, mV/dec: −least-squares slope of iR-free V against log10(j + j_x) over the steps in
 *   the kinetic window (default 5–50 mA/cm²), at least 3 steps; otherwise null (no other window).
 * - hfr, Ω·cm²: median of the HFR readings present and > 0.
 * iR-free V is the file's own iR-free column when it has one, else V + j·HFR per reading.
 * Reference: the metric definitions of the README (Metric definitions); Tafel analysis as in Bard & Faulkner,
 * Electrochemical Methods, 2nd ed., §3.4; adding the H₂ crossover current to the measured current
 * for kinetic analysis is common practice in the trade.
 * Cost: O(n log n) for n readings.
 * @throws RangeError when the curve is empty, j is not finite, there is no voltage at all, or ref,
 *   loading or options are malformed.
 * @example polarizationMetrics(curve, { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' }, { loadingMgCm2: 1 }).metrics.vAtRef
 */
/** What every metric is read from: the checked options, the step-averaged curves and the words of the method. */
interface Reading {
  curve: CurveData;
  ref: ReferencePoint;
  loading: BuildLoading;
  averaged: ReturnType<typeof stepAverage>;
  steps: readonly CurveStep[];
  /** whether the file gives a measured cell voltage at all */
  anyV: boolean;
  fileIrFree: boolean;
  irFreeAvailable: boolean;
  irFreeSource: string;
  sweepCurves: SweepCurves[];
  measured: Curve;
  irFree: Curve;
  /** the iR-free curve with the crossover current added to j */
  kinetic: Curve;
  /** the measured curve with the crossover current added to j */
  kineticMeasured: Curve;
  stepsWithoutIrFree: number;
  kineticLimit: number;
  crossover: number;
  crossoverText: string;
  readText: string;
  stepText: string;
  window: readonly [number, number];
  jRef: number;
  vRef: number;
}

/** The metrics object being filled, with the note and method of each metric. */
interface MetricsDraft {
  metrics: CurveMetrics;
  metricNotes: Partial<Record<MetricKey, string>>;
  method: Partial<Record<MetricKey, MetricMethod>>;
}

const NO_IR_FREE = 'no HFR or iR-free voltage column: iR-free voltage cannot be computed';

/** Step 1: check the options, step-average the curve and build the loaded curve(s) the metrics read. */
function readCurve(curve: CurveData, ref: ReferencePoint, loading: BuildLoading, options: PolarizationMetricsOptions): Reading {
  const window = options.tafelWindow ?? DEFAULT_TAFEL_WINDOW;
  if (!(window[0] > 0 && window[1] > window[0])) throw new RangeError(`polarizationMetrics: tafelWindow must be 0 < low < high, got ${window[0]}–${window[1]}`);
  const kineticLimit = options.kineticLimitAcm2 ?? DEFAULT_KINETIC_LIMIT;
  if (!(kineticLimit > 0)) throw new RangeError(`polarizationMetrics: kineticLimitAcm2 must be > 0, got ${kineticLimit}`);
  const crossover = options.h2CrossoverAcm2 ?? 0;
  if (!(Number.isFinite(crossover) && crossover >= 0 && crossover < MAX_CROSSOVER)) {
    throw new RangeError(`polarizationMetrics: h2CrossoverAcm2 must be a number in [0, ${MAX_CROSSOVER}) A/cm², got ${String(crossover)}`);
  }
  const crossoverText = crossover > 0 ? `, + H₂ crossover ${Number((crossover * 1000).toPrecision(3))} mA/cm²` : '';

  const averaged = stepAverage(curve, options.step);
  const { steps } = averaged;
  let anyV = false;
  for (let index = 0; index < curve.v.length && !anyV; index++) if (Number.isFinite(curve.v[index])) anyV = true;
  const fileIrFree = curve.vIrFree !== undefined;
  const irFreeAvailable = fileIrFree || curve.hfr !== undefined;
  const irFreeSource = fileIrFree ? "the file's iR-free voltage column" : 'V + j·HFR per reading';

  // the loaded curve(s): sweeps kept apart and averaged at common j, or one curve of all loaded steps
  const sweepCurves: SweepCurves[] = averaged.sweeps.map((sweep) => ({
    direction: sweep.direction,
    measured: curveOf(steps, sweep.steps, (step) => step.v, 0),
    irFree: curveOf(steps, sweep.steps, (step) => step.vIrFree, 0),
  }));
  let measured: Curve;
  let irFree: Curve;
  if (averaged.sweepsKeptApart) {
    measured = combine(sweepCurves.map((sweep) => sweep.measured), kineticLimit);
    irFree = combine(sweepCurves.map((sweep) => sweep.irFree), kineticLimit);
  } else {
    measured = curveOf(steps, averaged.loadedSteps, (step) => step.v, 0);
    irFree = curveOf(steps, averaged.loadedSteps, (step) => step.vIrFree, 0);
  }
  // the same iR-free curve with the crossover added to j, for the kinetic metrics
  const kinetic: Curve = { j: irFree.j.map((value) => value + crossover), y: irFree.y };
  const kineticMeasured: Curve = { j: measured.j.map((value) => value + crossover), y: measured.y };
  const stepsWithoutIrFree = irFreeAvailable ? averaged.loadedSteps.filter((index) => steps[index].vIrFree === null).length : 0;

  const orderText =
    averaged.order === 'sorted'
      ? 'steps sorted by current (the row order does not read as sweeps)'
      : averaged.sweepsKeptApart
        ? averaged.sweeps.length === 2
          ? 'both sweeps (up and down) averaged at common j'
          : `${averaged.sweeps.length} sweeps (up and down) averaged at common j`
        : averaged.sweeps.length === 1
          ? `single ${averaged.sweeps[0].direction} sweep`
          : `${averaged.sweeps.length} ${averaged.sweeps[0].direction} sweeps, dwells at one set point averaged`;
  const readText = `loaded steps only (the open-circuit reading is never interpolated from), no extrapolation; linear in j, or in log j where the lower step is below ${kineticLimit} A/cm²; ${orderText}`;
  const stepText = averaged.method;
  return {
    curve, ref, loading, averaged, steps, anyV, fileIrFree, irFreeAvailable, irFreeSource, sweepCurves, measured, irFree, kinetic, kineticMeasured,
    stepsWithoutIrFree, kineticLimit, crossover, crossoverText, readText, stepText, window, jRef: ref.refCurrentDensity, vRef: ref.refVoltage,
  };
}

/** V and iR-free V at j_ref. */
function readVoltageAtRef(r: Reading, { metrics, metricNotes, method }: MetricsDraft): void {
  const { curve, anyV, fileIrFree, irFreeAvailable, irFreeSource, measured, irFree, kineticLimit, readText, jRef, stepText } = r;
  const vAt = (target: Curve): { value: number | null; note: string | null } => {
    if (target.j.length === 0) return { value: null, note: 'not reached: no loaded steps' };
    const value = interpolate(target.j, target.y, jRef, kineticLimit);
    if (value !== value) return { value: null, note: `not reached: curve spans ${spanText(target)}` };
    return { value, note: null };
  };
  method.vAtRef = { method: `V at j_ref on the step-averaged curve: ${readText}. Steps: ${stepText}`, inputs: { jRef } };
  if (anyV) {
    const vAtRef = vAt(measured);
    metrics.vAtRef = vAtRef.value;
    if (vAtRef.note !== null) metricNotes.vAtRef = vAtRef.note;
  } else {
    metricNotes.vAtRef = ONLY_IR_FREE;
  }
  method.vAtRefIrFree = { method: `iR-free V (${irFreeSource}, averaged per step) at j_ref: ${readText}`, inputs: { jRef, hfrAvailable: curve.hfr !== undefined, fileIrFree } };
  if (irFreeAvailable) {
    const vAtRefIrFree = vAt(irFree);
    metrics.vAtRefIrFree = vAtRefIrFree.value;
    if (vAtRefIrFree.note !== null) metricNotes.vAtRefIrFree = vAtRefIrFree.note;
  } else {
    metricNotes.vAtRefIrFree = NO_IR_FREE;
  }
}

/** j and iR-free j where the voltage first falls through V_ref. */
function readCurrentAtRef(r: Reading, { metrics, metricNotes, method }: MetricsDraft): void {
  const { curve, anyV, fileIrFree, irFreeAvailable, irFreeSource, measured, kinetic, kineticLimit, crossover, crossoverText, readText, vRef } = r;
  method.jAtRef = { method: `first fall of V through V_ref: ${readText}`, inputs: { vRef } };
  if (anyV) {
    const jAtRef = crossing(measured, vRef, kineticLimit);
    metrics.jAtRef = jAtRef.j;
    if (jAtRef.note !== null) metricNotes.jAtRef = jAtRef.note;
  } else {
    metricNotes.jAtRef = ONLY_IR_FREE;
  }
  method.jAtRefIrFree = {
    method: `first fall of iR-free V (${irFreeSource}) through V_ref${crossoverText}: ${readText}`,
    inputs: { vRef, hfrAvailable: curve.hfr !== undefined, fileIrFree, h2CrossoverAcm2: crossover },
  };
  if (irFreeAvailable) {
    const jAtRefIrFree = crossing(kinetic, vRef, kineticLimit);
    metrics.jAtRefIrFree = jAtRefIrFree.j;
    if (jAtRefIrFree.note !== null) metricNotes.jAtRefIrFree = jAtRefIrFree.note;
    else if (crossover > 0) metricNotes.jAtRefIrFree = `includes the H₂ crossover current (${Number((crossover * 1000).toPrecision(3))} mA/cm²)`;
  } else {
    metricNotes.jAtRefIrFree = NO_IR_FREE;
  }
}

/** Mass activity from j at V_ref and the loading on the chosen basis (after readCurrentAtRef). */
function readMassActivity(r: Reading, { metrics, metricNotes, method }: MetricsDraft): void {
  const { ref, loading, anyV, irFreeAvailable, kineticMeasured, kineticLimit, crossover, crossoverText, vRef } = r;
  const loadingValue = ref.loadingBasis === 'metal' ? (loading.metalLoadingMgCm2 ?? null) : loading.loadingMgCm2;
  let activityJ: number | null = null;
  let activityNote: string | undefined;
  if (ref.irFree) {
    activityJ = metrics.jAtRefIrFree;
    activityNote = irFreeAvailable ? metricNotes.jAtRefIrFree : NO_IR_FREE;
  } else if (anyV) {
    const measuredCrossing = crossing(kineticMeasured, vRef, kineticLimit);
    activityJ = measuredCrossing.j;
    activityNote = measuredCrossing.note ?? undefined;
  } else {
    activityNote = ONLY_IR_FREE;
  }
  const basisText = ref.loadingBasis === 'metal' ? 'per g of metal' : 'per g of catalyst';
  method.massActivity = {
    method: `j at V_ref (${ref.irFree ? 'iR-free' : 'measured'} voltage${crossoverText}) ÷ (${ref.loadingBasis} loading × 1e-3 g/mg): A/g ${basisText} at ${vRef} V${ref.irFree ? ' iR-free' : ''}`,
    inputs: { vRef, irFree: ref.irFree, basis: ref.loadingBasis, loadingMgCm2: loadingValue, jAtVRef: activityJ, h2CrossoverAcm2: crossover },
  };
  if (loadingValue === null || loadingValue === undefined || !Number.isFinite(loadingValue) || loadingValue <= 0) {
    metricNotes.massActivity = `no ${ref.loadingBasis === 'metal' ? 'metal' : 'catalyst'} loading on the build (mg/cm²)`;
  } else if (activityJ === null) {
    metricNotes.massActivity = `j at V_ref ${ref.irFree ? '(iR-free) ' : ''}not available: ${activityNote ?? 'not reached'}`;
  } else {
    metrics.massActivity = activityJ / (loadingValue * 1e-3);
    metricNotes.massActivity = `A/g ${basisText} at ${vRef} V${ref.irFree ? ' iR-free' : ''}${crossoverText}`;
  }
}

/** Peak power: the highest measured j·V. */
function readPeakPower(r: Reading, { metrics, metricNotes, method }: MetricsDraft): void {
  const { anyV, measured } = r;
  method.peakPower = { method: 'highest measured j·V among the loaded step-averaged points (no fit, no extrapolation)', inputs: {} };
  if (!anyV) {
    metricNotes.peakPower = ONLY_IR_FREE;
  } else {
    let peak = -1;
    for (let index = 0; index < measured.j.length; index++) if (peak < 0 || measured.j[index] * measured.y[index] > measured.j[peak] * measured.y[peak]) peak = index;
    if (peak >= 0 && measured.j[peak] * measured.y[peak] > 0) {
      metrics.peakPower = measured.j[peak] * measured.y[peak];
      method.peakPower.inputs = { jAtPeak: measured.j[peak], vAtPeak: measured.y[peak] };
      metricNotes.peakPower =
        peak === measured.j.length - 1
          ? 'highest measured, at the highest current: the power was still rising, the true peak lies beyond the data'
          : `highest measured (at ${jText(measured.j[peak])})`;
    } else {
      metricNotes.peakPower = 'no loaded point with positive power';
    }
  }
}

/** OCV: the zero-current set point only. */
function readOcv(r: Reading, { metrics, metricNotes, method }: MetricsDraft): void {
  const { averaged, steps, measured } = r;
  const open = averaged.openCircuitStep === null ? null : steps[averaged.openCircuitStep];
  method.ocv = { method: 'mean voltage of the readings at the zero-current set point (the open-circuit step, averaged as a dwell)', inputs: { readings: open?.readings ?? 0 } };
  if (open !== null && open.v !== null) {
    metrics.ocv = open.v;
  } else if (open !== null && open.vIrFree !== null) {
    metrics.ocv = open.vIrFree;
    metricNotes.ocv = "from the file's iR-free voltage column (equal to the cell voltage at zero current)";
  } else if (open !== null) {
    metricNotes.ocv = 'the open-circuit readings have no voltage';
  } else {
    const lowest = measured.j.length > 0 ? `; the lowest current measured is ${jText(measured.j[0])} at ${measured.y[0].toFixed(3)} V` : '';
    metricNotes.ocv =
      averaged.control === 'voltage'
        ? `no reading at zero current: potentiostatic steps without an open-circuit reading${lowest}`
        : `no reading at zero current (no open-circuit step)${lowest}`;
  }
}

/** Tafel slope over the kinetic window, on iR-free voltage. */
function readTafelSlope(r: Reading, { metrics, metricNotes, method }: MetricsDraft): void {
  const { irFreeAvailable, irFreeSource, kinetic, crossover, crossoverText, window } = r;
  const windowText = rangeText(window[0], window[1]);
  const inWindow: number[] = [];
  for (let index = 0; index < kinetic.j.length; index++) {
    if (kinetic.j[index] >= window[0] * (1 - RANGE_SLACK) && kinetic.j[index] <= window[1] * (1 + RANGE_SLACK)) inWindow.push(index);
  }
  method.tafelSlope = {
    method: `−least-squares slope of iR-free V (${irFreeSource}) against log10(j${crossover > 0 ? ' + j_x' : ''}) over the loaded steps in the kinetic window ${windowText}${crossoverText}; at least 3 steps; no other window is tried`,
    inputs: { window: `${formatJ(window[0])}–${formatJ(window[1])} A/cm²`, points: irFreeAvailable ? inWindow.length : 0, irFree: irFreeAvailable, h2CrossoverAcm2: crossover },
  };
  if (!irFreeAvailable) {
    metricNotes.tafelSlope = `${NO_IR_FREE} (kinetic window ${windowText})`;
  } else if (inWindow.length < 3) {
    metricNotes.tafelSlope = `only ${inWindow.length} loaded step${inWindow.length === 1 ? '' : 's'} with an iR-free voltage in the kinetic window ${windowText}; at least 3 needed`;
  } else {
    const slope = lineSlope(
      inWindow.map((index) => Math.log10(kinetic.j[index])),
      inWindow.map((index) => kinetic.y[index]),
    );
    if (slope === null) {
      metricNotes.tafelSlope = `the loaded steps in the kinetic window ${windowText} share one current density: no Tafel line`;
    } else if (slope >= 0) {
      metricNotes.tafelSlope = `iR-free voltage does not fall with current in the kinetic window ${windowText}: no Tafel line`;
    } else {
      metrics.tafelSlope = -slope * 1000;
      metricNotes.tafelSlope = `fitted on iR-free V over ${windowText} (${inWindow.length} steps${crossoverText})`;
    }
  }
}

/** HFR: median of the readings present and > 0. */
function readHfr(r: Reading, { metrics, metricNotes, method }: MetricsDraft): void {
  const { curve, averaged, steps } = r;
  if (curve.hfr !== undefined) {
    const values: number[] = [];
    for (const step of steps) {
      if (step.pastLimit) continue;
      for (const index of step.members) if (Number.isFinite(curve.hfr[index]) && curve.hfr[index] > 0) values.push(curve.hfr[index]);
    }
    method.hfr = { method: 'median of the HFR readings (missing and zero readings left out)', inputs: { readings: values.length } };
    if (values.length > 0) {
      metrics.hfr = median(values);
      if (averaged.hfrMissing > 0) metricNotes.hfr = `${averaged.hfrMissing} HFR reading${averaged.hfrMissing === 1 ? '' : 's'} missing or 0, left out`;
    } else {
      metricNotes.hfr = 'no HFR readings (every HFR cell is missing or 0)';
    }
  } else {
    method.hfr = { method: 'median of the HFR readings', inputs: { readings: 0 } };
    metricNotes.hfr = 'no HFR column';
  }
}

/** Adds to the iR-free metrics a note on loaded steps that had no iR-free reading. */
function noteStepsWithoutIrFree(r: Reading, { metricNotes }: MetricsDraft): void {
  const { stepsWithoutIrFree } = r;
  if (stepsWithoutIrFree > 0) {
    const text = `${stepsWithoutIrFree} loaded step${stepsWithoutIrFree === 1 ? '' : 's'} without an HFR or iR-free reading left out of the iR-free curve`;
    for (const key of ['vAtRefIrFree', 'jAtRefIrFree', 'tafelSlope'] as const) metricNotes[key] = metricNotes[key] ? `${metricNotes[key]}; ${text}` : text;
  }
}

/** The facts about the curve beside the metrics: steps, sweeps, hysteresis, what was left out. */
function summarize(r: Reading, metrics: CurveMetrics): MetricsResult['summary'] {
  const { curve, averaged, steps, anyV, fileIrFree, irFreeAvailable, sweepCurves, measured, irFree, kineticLimit, crossover, jRef } = r;
  const open = averaged.openCircuitStep === null ? null : steps[averaged.openCircuitStep];
  const upSweeps = sweepCurves.filter((sweep) => sweep.direction === 'up');
  const downSweeps = sweepCurves.filter((sweep) => sweep.direction === 'down');
  const summary: MetricsResult['summary'] = {
    steps: steps.length,
    readings: curve.j.length,
    readingsPerStepMin: averaged.readingsPerStep.min,
    readingsPerStepMedian: averaged.readingsPerStep.median,
    readingsPerStepMax: averaged.readingsPerStep.max,
    sweeps: averaged.sweeps.length,
    sweepDirections: averaged.sweeps.map((sweep) => sweep.direction).join(','),
    sweepsAveraged: averaged.sweepsKeptApart,
    stepOrder: averaged.order,
    control: averaged.control,
    stepMethod: averaged.method,
    openCircuitReadings: open?.readings ?? 0,
    leftOutDwells: averaged.leftOutDwells,
    pastLimitSteps: averaged.pastLimitSteps.length,
    pastLimitReadings: averaged.pastLimitReadings,
    jMin: measured.j.length > 0 ? measured.j[0] : irFree.j.length > 0 ? irFree.j[0] : null,
    jMax: measured.j.length > 0 ? measured.j[measured.j.length - 1] : irFree.j.length > 0 ? irFree.j[irFree.j.length - 1] : null,
    hfrAvailable: curve.hfr !== undefined,
    hfrMissingReadings: averaged.hfrMissing,
    irFreeSource: irFreeAvailable ? (fileIrFree ? 'file column' : 'V + j·HFR') : null,
    h2CrossoverMAcm2: crossover > 0 ? crossover * 1000 : null,
    vAtRefUp: null,
    vAtRefDown: null,
    hysteresisMv: null,
    hysteresisHigherSweep: null,
  };
  const at = (target: Curve): number | null => {
    const value = interpolate(target.j, target.y, jRef, kineticLimit);
    return value === value ? value : null;
  };
  if (averaged.sweepsKeptApart && anyV) {
    const up = at(upSweeps[0].measured);
    const down = at(downSweeps[0].measured);
    summary.vAtRefUp = up;
    summary.vAtRefDown = down;
    if (up !== null && down !== null) {
      summary.hysteresisMv = Math.abs(up - down) * 1000;
      summary.hysteresisHigherSweep = up > down ? 'up' : down > up ? 'down' : 'equal';
    }
  } else if (averaged.sweeps.length > 0 && anyV) {
    if (averaged.sweeps[0].direction === 'up') summary.vAtRefUp = metrics.vAtRef;
    else summary.vAtRefDown = metrics.vAtRef;
  }
  if (averaged.notes.length > 0) summary.stepNotes = averaged.notes.join('; ');
  return summary;
}

export function polarizationMetrics(curve: CurveData, ref: ReferencePoint, loading: BuildLoading, options: PolarizationMetricsOptions = {}): MetricsResult {
  checkInputs(curve, ref, loading);
  const r = readCurve(curve, ref, loading, options);
  const draft: MetricsDraft = { metrics: nullMetrics(metricsOfKind('polarization')), metricNotes: {}, method: {} };
  readVoltageAtRef(r, draft);
  readCurrentAtRef(r, draft);
  readMassActivity(r, draft);
  readPeakPower(r, draft);
  readOcv(r, draft);
  readTafelSlope(r, draft);
  readHfr(r, draft);
  noteStepsWithoutIrFree(r, draft);
  return { ...draft, summary: summarize(r, draft.metrics) };
}

function formatJ(value: number): string {
  return value >= 0.01 ? value.toFixed(3) : String(Number(value.toPrecision(3)));
}

// The metrics object of a polarization curve (V at j_ref, j at V_ref, iR-free values, mass
// activity, peak power, OCV, Tafel slope, HFR), each with how it was obtained.
import type { BuildLoading, CurveData, MetricMethod, MetricsResult, ReferencePoint } from './types';
import type { CurveMetrics, MetricKey } from './types';
import { stepAverage } from './step-average';
import type { CurveStep, CurveSweep, StepAverageOptions } from './step-average';
import { CompensatedSum } from '../stats/compensated-sum';

export interface PolarizationMetricsOptions {
  step?: StepAverageOptions;
  /** kinetic window for the Tafel slope, A/cm²; default [0.005, 0.05] */
  tafelWindow?: readonly [number, number];
}

/** |j| below this is open circuit, A/cm² (1 mA/cm²). */
const OPEN_CIRCUIT_J = 0.001;
const DEFAULT_TAFEL_WINDOW: readonly [number, number] = [0.005, 0.05];
// relative slack when comparing j_ref with the ends of the measured range (float round-off)
const RANGE_SLACK = 1e-9;

interface SweepCurve {
  direction: CurveSweep['direction'];
  j: number[];
  v: number[];
  vIrFree: number[] | null;
}

interface Curve {
  j: number[];
  y: number[];
}

// A sweep's steps in ascending j; equal j (within round-off) merged by averaging.
function toSweepCurve(steps: readonly CurveStep[], sweep: CurveSweep, withIrFree: boolean): SweepCurve {
  const members = sweep.steps.map((index) => steps[index]).sort((a, b) => a.j - b.j);
  const j: number[] = [];
  const v: number[] = [];
  const vIrFree: number[] = [];
  const weight: number[] = [];
  for (const step of members) {
    const last = j.length - 1;
    if (last >= 0 && Math.abs(step.j - j[last]) <= RANGE_SLACK * Math.max(1, Math.abs(step.j))) {
      const n = weight[last];
      v[last] = (v[last] * n + step.v) / (n + 1);
      if (withIrFree) vIrFree[last] = (vIrFree[last] * n + (step.vIrFree as number)) / (n + 1);
      weight[last] = n + 1;
    } else {
      j.push(step.j);
      v.push(step.v);
      if (withIrFree) vIrFree.push(step.vIrFree as number);
      weight.push(1);
    }
  }
  return { direction: sweep.direction, j, v, vIrFree: withIrFree ? vIrFree : null };
}

// Linear interpolation on ascending x; NaN outside [x₀, xₙ₋₁] — never extrapolates.
function interpolate(x: readonly number[], y: readonly number[], at: number): number {
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
  return y[low] + ((at - x[low]) * (y[high] - y[low])) / (x[high] - x[low]);
}

// Sweeps averaged at common j: on the union of all sweeps' j, the mean of every sweep that covers it.
function combineSweeps(sweeps: readonly SweepCurve[], pick: (sweep: SweepCurve) => number[] | null): Curve {
  const grid: number[] = [];
  for (const sweep of sweeps) for (const value of sweep.j) grid.push(value);
  grid.sort((a, b) => a - b);
  const j: number[] = [];
  const y: number[] = [];
  for (const at of grid) {
    if (j.length > 0 && Math.abs(at - j[j.length - 1]) <= RANGE_SLACK * Math.max(1, Math.abs(at))) continue;
    const sum = new CompensatedSum();
    let covering = 0;
    for (const sweep of sweeps) {
      const values = pick(sweep);
      if (values === null) continue;
      const value = interpolate(sweep.j, values, at);
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

// First crossing of V_ref coming from the open-circuit side (lowest j upwards).
function crossing(curve: Curve, voltage: number): CrossingResult {
  const n = curve.j.length;
  if (n === 0) return { j: null, note: 'not reached: no usable steps' };
  if (curve.y[0] < voltage) {
    return { j: null, note: `not reached: the curve is below ${voltage.toFixed(3)} V already at its lowest current (${curve.y[0].toFixed(3)} V at ${curve.j[0].toFixed(3)} A/cm²)` };
  }
  for (let index = 0; index < n; index++) {
    if (curve.y[index] === voltage) return { j: curve.j[index], note: null };
    if (index + 1 < n && curve.y[index] > voltage && curve.y[index + 1] < voltage) {
      const fraction = (voltage - curve.y[index]) / (curve.y[index + 1] - curve.y[index]);
      return { j: curve.j[index] + fraction * (curve.j[index + 1] - curve.j[index]), note: null };
    }
  }
  let lowest = 0;
  for (let index = 1; index < n; index++) if (curve.y[index] < curve.y[lowest]) lowest = index;
  return { j: null, note: `not reached: lowest voltage ${curve.y[lowest].toFixed(3)} V at ${curve.j[lowest].toFixed(3)} A/cm² (curve spans ${spanText(curve)})` };
}

// Least-squares slope, centred two-pass with compensated sums (numerically careful for
// log10 j values bunched in one decade).
function leastSquaresSlope(x: readonly number[], y: readonly number[]): number {
  const n = x.length;
  const sumX = new CompensatedSum();
  const sumY = new CompensatedSum();
  for (let index = 0; index < n; index++) {
    sumX.add(x[index]);
    sumY.add(y[index]);
  }
  const meanX = sumX.value() / n;
  const meanY = sumY.value() / n;
  const sxy = new CompensatedSum();
  const sxx = new CompensatedSum();
  for (let index = 0; index < n; index++) {
    const dx = x[index] - meanX;
    sxy.add(dx * (y[index] - meanY));
    sxx.add(dx * dx);
  }
  return sxy.value() / sxx.value();
}

function checkInputs(curve: CurveData, ref: ReferencePoint, loading: BuildLoading): void {
  if (curve === null || typeof curve !== 'object' || !(curve.j instanceof Float64Array) || !(curve.v instanceof Float64Array)) {
    throw new RangeError('polarizationMetrics: curve must have Float64Array j and v');
  }
  if (curve.j.length === 0) throw new RangeError('polarizationMetrics: the curve has no readings');
  if (curve.v.length !== curve.j.length) throw new RangeError(`polarizationMetrics: j has ${curve.j.length} readings but v has ${curve.v.length}`);
  for (let index = 0; index < curve.j.length; index++) {
    if (!Number.isFinite(curve.j[index]) || !Number.isFinite(curve.v[index])) {
      throw new RangeError(`polarizationMetrics: reading ${index} has a non-finite j or V`);
    }
  }
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
 * Metrics of a polarization curve, read on the step-averaged curve (stepAverage), with the
 * up and down sweeps averaged at common j when both exist (each sweep's V at j_ref and the
 * hysteresis are in `summary`).
 * - vAtRef, vAtRefIrFree: V (and V + j·HFR) linearly interpolated at j_ref; never
 *   extrapolated: null "not reached: curve spans a–b A/cm²" outside the measured range.
 * - jAtRef, jAtRefIrFree: j where V (iR-free V) first crosses V_ref from the open-circuit side.
 * - massActivity, A/g: j at V_ref (iR-free when ref.irFree) ÷ (loading mg/cm² × 1e-3 g/mg),
 *   loading on ref.loadingBasis (catalyst or metal).
 * - peakPower, W/cm²: max j·V over the measured (step-averaged) points.
 * - ocv, V: mean V of the readings with |j| < 1 mA/cm².
 * - tafelSlope, mV/dec: |least-squares slope| of iR-free V vs log10 j in 0.005–0.05 A/cm²
 *   (or the lowest decade with ≥ 3 points); measured V when there is no HFR (said in notes).
 * - hfr, Ω·cm²: median of the HFR readings.
 * Steps past the limiting current are excluded throughout.
 * Reference: definitions of domain.md (Cellwright); Tafel analysis as in Bard & Faulkner,
 * Electrochemical Methods, 2nd ed., §3.4.
 * Cost: O(n log n) for n readings.
 * @throws RangeError when the curve is empty or non-finite, or ref/loading are malformed.
 * @example polarizationMetrics(curve, { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' }, { loadingMgCm2: 1 }).metrics.vAtRef
 */
export function polarizationMetrics(curve: CurveData, ref: ReferencePoint, loading: BuildLoading, options: PolarizationMetricsOptions = {}): MetricsResult {
  checkInputs(curve, ref, loading);
  const window = options.tafelWindow ?? DEFAULT_TAFEL_WINDOW;
  if (!(window[0] > 0 && window[1] > window[0])) throw new RangeError(`polarizationMetrics: tafelWindow must be 0 < low < high, got ${window[0]}–${window[1]}`);

  const averaged = stepAverage(curve, options.step);
  const { steps, sweeps } = averaged;
  const hasHfr = curve.hfr !== undefined;
  const sweepCurves = sweeps.map((sweep) => toSweepCurve(steps, sweep, hasHfr));
  const measured = combineSweeps(sweepCurves, (sweep) => sweep.v);
  const irFree = hasHfr ? combineSweeps(sweepCurves, (sweep) => sweep.vIrFree) : { j: [], y: [] };
  const upSweeps = sweepCurves.filter((sweep) => sweep.direction === 'up');
  const downSweeps = sweepCurves.filter((sweep) => sweep.direction === 'down');
  const bothSweeps = upSweeps.length > 0 && downSweeps.length > 0;
  const averagingText =
    sweepCurves.length <= 1 ? 'single sweep' : bothSweeps && sweepCurves.length === 2 ? 'both sweeps averaged' : `${sweepCurves.length} sweeps averaged at common j`;

  const metrics: CurveMetrics = {
    vAtRef: null,
    vAtRefIrFree: null,
    jAtRef: null,
    jAtRefIrFree: null,
    massActivity: null,
    peakPower: null,
    ocv: null,
    tafelSlope: null,
    hfr: null,
  };
  const metricNotes: Partial<Record<MetricKey, string>> = {};
  const method: Partial<Record<MetricKey, MetricMethod>> = {};
  const jRef = ref.refCurrentDensity;
  const vRef = ref.refVoltage;
  const interpolationMethod = `linear interpolation on step-averaged curve, ${averagingText}`;

  // ---- V at j_ref
  const vAt = (target: Curve): { value: number | null; note: string | null } => {
    if (target.j.length === 0) return { value: null, note: 'not reached: no usable steps' };
    const value = interpolate(target.j, target.y, jRef);
    if (value !== value) return { value: null, note: `not reached: curve spans ${spanText(target)}` };
    return { value, note: null };
  };
  const vAtRef = vAt(measured);
  metrics.vAtRef = vAtRef.value;
  if (vAtRef.note !== null) metricNotes.vAtRef = vAtRef.note;
  method.vAtRef = { method: interpolationMethod, inputs: { jRef } };
  if (hasHfr) {
    const vAtRefIrFree = vAt(irFree);
    metrics.vAtRefIrFree = vAtRefIrFree.value;
    if (vAtRefIrFree.note !== null) metricNotes.vAtRefIrFree = vAtRefIrFree.note;
  } else {
    metricNotes.vAtRefIrFree = 'no HFR column: iR-free voltage cannot be computed';
  }
  method.vAtRefIrFree = { method: `V + j·HFR averaged per step, then ${interpolationMethod}`, inputs: { jRef, hfrAvailable: hasHfr } };

  // ---- j at V_ref
  const jAtRef = crossing(measured, vRef);
  metrics.jAtRef = jAtRef.j;
  if (jAtRef.note !== null) metricNotes.jAtRef = jAtRef.note;
  method.jAtRef = { method: `first crossing of V_ref from the open-circuit side, ${interpolationMethod}`, inputs: { vRef } };
  if (hasHfr) {
    const jAtRefIrFree = crossing(irFree, vRef);
    metrics.jAtRefIrFree = jAtRefIrFree.j;
    if (jAtRefIrFree.note !== null) metricNotes.jAtRefIrFree = jAtRefIrFree.note;
  } else {
    metricNotes.jAtRefIrFree = 'no HFR column: iR-free voltage cannot be computed';
  }
  method.jAtRefIrFree = { method: `first crossing of V_ref by V + j·HFR from the open-circuit side, ${interpolationMethod}`, inputs: { vRef, hfrAvailable: hasHfr } };

  // ---- mass activity
  const loadingValue = ref.loadingBasis === 'metal' ? (loading.metalLoadingMgCm2 ?? null) : loading.loadingMgCm2;
  const activityJ = ref.irFree ? metrics.jAtRefIrFree : metrics.jAtRef;
  method.massActivity = {
    method: `j at V_ref (${ref.irFree ? 'iR-free' : 'measured'} voltage) ÷ (${ref.loadingBasis} loading × 1e-3 g/mg)`,
    inputs: { vRef, irFree: ref.irFree, basis: ref.loadingBasis, loadingMgCm2: loadingValue, jAtVRef: activityJ },
  };
  if (loadingValue === null || loadingValue === undefined || !Number.isFinite(loadingValue) || loadingValue <= 0) {
    metricNotes.massActivity = `no ${ref.loadingBasis === 'metal' ? 'metal' : 'catalyst'} loading on the build (mg/cm²)`;
  } else if (activityJ === null) {
    metricNotes.massActivity = `j at V_ref ${ref.irFree ? '(iR-free) ' : ''}not available: ${(ref.irFree ? metricNotes.jAtRefIrFree : metricNotes.jAtRef) ?? 'not reached'}`;
  } else {
    metrics.massActivity = activityJ / (loadingValue * 1e-3);
  }

  // ---- peak power over measured (step-averaged, not past-limit) points
  let peakIndex = -1;
  let highestJIndex = -1;
  for (let index = 0; index < steps.length; index++) {
    const step = steps[index];
    if (step.pastLimit) continue;
    if (peakIndex < 0 || step.j * step.v > steps[peakIndex].j * steps[peakIndex].v) peakIndex = index;
    if (highestJIndex < 0 || step.j > steps[highestJIndex].j) highestJIndex = index;
  }
  if (peakIndex >= 0 && steps[peakIndex].j * steps[peakIndex].v > 0) {
    const peak = steps[peakIndex];
    metrics.peakPower = peak.j * peak.v;
    method.peakPower = { method: 'maximum of j·V over the step-averaged measured points', inputs: { jAtPeak: peak.j, vAtPeak: peak.v } };
    if (peakIndex === highestJIndex) metricNotes.peakPower = 'peak not reached, highest measured';
  } else {
    method.peakPower = { method: 'maximum of j·V over the step-averaged measured points', inputs: {} };
    metricNotes.peakPower = 'no point with positive power';
  }

  // ---- OCV from the raw readings at open circuit
  const ocvSum = new CompensatedSum();
  let ocvCount = 0;
  for (const step of steps) {
    if (step.pastLimit) continue;
    for (let index = step.firstReading; index <= step.lastReading; index++) {
      if (Math.abs(curve.j[index]) < OPEN_CIRCUIT_J) {
        ocvSum.add(curve.v[index]);
        ocvCount++;
      }
    }
  }
  method.ocv = { method: 'mean voltage of the readings with |j| < 1 mA/cm²', inputs: { readings: ocvCount } };
  if (ocvCount > 0) metrics.ocv = ocvSum.value() / ocvCount;
  else metricNotes.ocv = 'no reading at open circuit (|j| < 1 mA/cm²)';

  // ---- Tafel slope
  const tafelSource = hasHfr ? irFree : measured;
  const positive: number[] = [];
  for (let index = 0; index < tafelSource.j.length; index++) if (tafelSource.j[index] > 0) positive.push(index);
  const inWindow = (low: number, high: number): number[] =>
    positive.filter((index) => tafelSource.j[index] >= low * (1 - RANGE_SLACK) && tafelSource.j[index] <= high * (1 + RANGE_SLACK));
  let tafelLow = window[0];
  let tafelHigh = window[1];
  let chosen = inWindow(tafelLow, tafelHigh);
  let windowText = 'default kinetic window';
  if (chosen.length < 3) {
    chosen = [];
    for (const start of positive) {
      const candidate = inWindow(tafelSource.j[start], 10 * tafelSource.j[start]);
      if (candidate.length >= 3) {
        chosen = candidate;
        tafelLow = tafelSource.j[start];
        tafelHigh = 10 * tafelSource.j[start];
        windowText = 'lowest decade with at least 3 points';
        break;
      }
    }
  }
  method.tafelSlope = {
    method: `least-squares slope of ${hasHfr ? 'iR-free' : 'measured'} V vs log10(j), ${windowText}, on the step-averaged curve (${averagingText})`,
    inputs: { window: `${formatJ(tafelLow)}–${formatJ(tafelHigh)} A/cm²`, points: chosen.length, irFree: hasHfr },
  };
  if (chosen.length >= 3) {
    const x = chosen.map((index) => Math.log10(tafelSource.j[index]));
    const y = chosen.map((index) => tafelSource.y[index]);
    const slope = leastSquaresSlope(x, y);
    metrics.tafelSlope = Math.abs(slope) * 1000;
    if (!hasHfr) metricNotes.tafelSlope = 'no HFR column: slope of the measured voltage (includes ohmic loss)';
    else if (slope > 0) metricNotes.tafelSlope = 'voltage rises with current in the window: not a kinetic region';
  } else {
    metricNotes.tafelSlope = `fewer than 3 step-averaged points in ${formatJ(window[0])}–${formatJ(window[1])} A/cm² or in any decade of j`;
  }

  // ---- HFR: median of the readings
  if (hasHfr && curve.hfr !== undefined) {
    const values: number[] = [];
    for (const step of steps) {
      if (step.pastLimit) continue;
      for (let index = step.firstReading; index <= step.lastReading; index++) if (Number.isFinite(curve.hfr[index])) values.push(curve.hfr[index]);
    }
    method.hfr = { method: 'median of the HFR readings', inputs: { readings: values.length } };
    if (values.length > 0) {
      values.sort((a, b) => a - b);
      const middle = values.length >> 1;
      metrics.hfr = values.length % 2 === 1 ? values[middle] : (values[middle - 1] + values[middle]) / 2;
    } else {
      metricNotes.hfr = 'no HFR readings';
    }
  } else {
    method.hfr = { method: 'median of the HFR readings', inputs: { readings: 0 } };
    metricNotes.hfr = 'no HFR column';
  }

  // ---- summary
  const summary: MetricsResult['summary'] = {
    steps: steps.length,
    readings: curve.j.length,
    readingsPerStepMin: averaged.readingsPerStep.min,
    readingsPerStepMedian: averaged.readingsPerStep.median,
    readingsPerStepMax: averaged.readingsPerStep.max,
    sweeps: sweeps.length,
    sweepDirections: sweeps.map((sweep) => sweep.direction).join(','),
    sweepsAveraged: sweepCurves.length > 1,
    pastLimitSteps: averaged.pastLimitSteps.length,
    pastLimitReadings: averaged.pastLimitReadings,
    jMin: measured.j.length > 0 ? measured.j[0] : null,
    jMax: measured.j.length > 0 ? measured.j[measured.j.length - 1] : null,
    hfrAvailable: hasHfr,
    vAtRefUp: null,
    vAtRefDown: null,
    hysteresisMv: null,
    hysteresisHigherSweep: null,
  };
  if (bothSweeps) {
    const up = interpolate(upSweeps[0].j, upSweeps[0].v, jRef);
    const down = interpolate(downSweeps[0].j, downSweeps[0].v, jRef);
    summary.vAtRefUp = up === up ? up : null;
    summary.vAtRefDown = down === down ? down : null;
    if (up === up && down === down) {
      summary.hysteresisMv = Math.abs(up - down) * 1000;
      summary.hysteresisHigherSweep = up > down ? 'up' : down > up ? 'down' : 'equal';
    }
  } else if (upSweeps.length > 0 || downSweeps.length > 0) {
    const only = upSweeps[0] ?? downSweeps[0];
    const value = interpolate(only.j, only.v, jRef);
    if (only.direction === 'up') summary.vAtRefUp = value === value ? value : null;
    else summary.vAtRefDown = value === value ? value : null;
  }
  if (averaged.notes.length > 0) summary.stepNotes = averaged.notes.join('; ');
  return { metrics, metricNotes, method, summary };
}

function formatJ(value: number): string {
  return value >= 0.01 ? value.toFixed(3) : String(Number(value.toPrecision(3)));
}

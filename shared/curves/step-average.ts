// Groups the readings of a polarization curve into current steps, averages each step, splits
// the steps into up and down sweeps, and flags points past the limiting current.
import type { CurveData } from './types';
import { CompensatedSum } from '../stats/compensated-sum';

export interface StepAverageOptions {
  /** readings within this fraction of the step's mean j belong to it; default 0.02 (2 %) */
  relativeTolerance?: number;
  /** …or within this many A/cm², whichever is larger; default 0.001 (1 mA/cm²) */
  absoluteToleranceAcm2?: number;
  /** a step whose mean voltage is below this is past the limiting current; default 0.05 V */
  collapseVoltage?: number;
}

/** One current step: consecutive readings at the same current density, averaged. */
export interface CurveStep {
  /** mean current density, A/cm² */
  j: number;
  /** mean cell voltage, V */
  v: number;
  /** sample standard deviation of the step's voltages, V (0 for a single reading) */
  vSd: number;
  /** mean HFR, Ω·cm², or null without an HFR column */
  hfr: number | null;
  /** mean of V + j·HFR over the step's readings, V, or null without an HFR column */
  vIrFree: number | null;
  readings: number;
  /** index of the step's first and last reading in the curve's arrays */
  firstReading: number;
  lastReading: number;
  /** past the limiting current: excluded from sweeps and metrics */
  pastLimit: boolean;
  pastLimitReason: string | null;
}

/** A run of steps in one direction of current. The turning step belongs to both sweeps it joins. */
export interface CurveSweep {
  direction: 'up' | 'down' | 'flat';
  /** indices into `steps`, in measurement order */
  steps: number[];
}

export interface StepAverageResult {
  steps: CurveStep[];
  sweeps: CurveSweep[];
  readingsPerStep: { min: number; median: number; max: number };
  /** indices into `steps` of the steps flagged past the limiting current */
  pastLimitSteps: number[];
  /** number of readings in those steps */
  pastLimitReadings: number;
  notes: string[];
}

function finishStep(curve: CurveData, first: number, last: number): CurveStep {
  const count = last - first + 1;
  const jSum = new CompensatedSum();
  const vSum = new CompensatedSum();
  const hfrSum = new CompensatedSum();
  const irFreeSum = new CompensatedSum();
  const hfr = curve.hfr;
  for (let index = first; index <= last; index++) {
    jSum.add(curve.j[index]);
    vSum.add(curve.v[index]);
    if (hfr !== undefined) {
      hfrSum.add(hfr[index]);
      irFreeSum.add(curve.v[index] + curve.j[index] * hfr[index]);
    }
  }
  const vMean = vSum.value() / count;
  // second pass about the mean (centred) for the SD
  const squares = new CompensatedSum();
  for (let index = first; index <= last; index++) squares.add((curve.v[index] - vMean) ** 2);
  return {
    j: jSum.value() / count,
    v: vMean,
    vSd: count > 1 ? Math.sqrt(squares.value() / (count - 1)) : 0,
    hfr: hfr === undefined ? null : hfrSum.value() / count,
    vIrFree: hfr === undefined ? null : irFreeSum.value() / count,
    readings: count,
    firstReading: first,
    lastReading: last,
    pastLimit: false,
    pastLimitReason: null,
  };
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

/**
 * Step averaging and sweep splitting of a polarization curve.
 * Steps: consecutive readings whose j lies within max(2 % of the running step mean, 1 mA/cm²)
 * of it; each step's j, V, HFR and V + j·HFR are averaged (compensated sums).
 * Past the limiting current (flagged, excluded from sweeps): a step whose mean V < 0.05 V
 * (voltage collapse), or, while the sweep is going up, a step whose j falls back below the
 * last good step's j while V is also lower (the cell cannot hold the current).
 * Sweeps: maximal runs of steps whose j keeps moving the same way (up or down); a single
 * step is `flat`.
 * Reference: step-wise galvanostatic polarization practice (common practice in the trade);
 * compensated summation after Neumaier (1974), ZAMM 54, 39–51.
 * Cost: O(n) for n readings.
 * @throws RangeError when j and v differ in length or are empty.
 * @example stepAverage({ kind: 'polarization', j: Float64Array.of(0.1, 0.1, 0.2), v: Float64Array.of(0.8, 0.8, 0.7) }).steps.length // 2
 */
export function stepAverage(curve: CurveData, options: StepAverageOptions = {}): StepAverageResult {
  const relativeTolerance = options.relativeTolerance ?? 0.02;
  const absoluteTolerance = options.absoluteToleranceAcm2 ?? 0.001;
  const collapseVoltage = options.collapseVoltage ?? 0.05;
  if (curve === null || typeof curve !== 'object' || !(curve.j instanceof Float64Array) || !(curve.v instanceof Float64Array)) {
    throw new RangeError('stepAverage: curve must have Float64Array j and v');
  }
  const count = curve.j.length;
  if (count === 0) throw new RangeError('stepAverage: the curve has no readings');
  if (curve.v.length !== count) throw new RangeError(`stepAverage: j has ${count} readings but v has ${curve.v.length}`);
  if (curve.hfr !== undefined && curve.hfr.length !== count) throw new RangeError(`stepAverage: j has ${count} readings but hfr has ${curve.hfr.length}`);
  if (!(relativeTolerance >= 0) || !(absoluteTolerance >= 0)) throw new RangeError('stepAverage: tolerances must be ≥ 0');

  const steps: CurveStep[] = [];
  let first = 0;
  let stepMean = curve.j[0];
  let stepSum = curve.j[0];
  for (let index = 1; index < count; index++) {
    const value = curve.j[index];
    const tolerance = Math.max(relativeTolerance * Math.abs(stepMean), absoluteTolerance);
    if (Math.abs(value - stepMean) <= tolerance) {
      stepSum += value;
      stepMean = stepSum / (index - first + 1);
    } else {
      steps.push(finishStep(curve, first, index - 1));
      first = index;
      stepMean = value;
      stepSum = value;
    }
  }
  steps.push(finishStep(curve, first, count - 1));

  // flag past-limit steps and split sweeps on the remaining ones
  const sweeps: CurveSweep[] = [];
  const pastLimitSteps: number[] = [];
  let lastGood = -1;
  let direction: CurveSweep['direction'] = 'flat';
  let current: CurveSweep | null = null;
  for (let index = 0; index < steps.length; index++) {
    const step = steps[index];
    if (step.v < collapseVoltage) {
      step.pastLimit = true;
      step.pastLimitReason = `voltage collapsed below ${collapseVoltage} V`;
    } else if (lastGood >= 0 && direction === 'up') {
      const good = steps[lastGood];
      const tolerance = Math.max(relativeTolerance * Math.abs(good.j), absoluteTolerance);
      if (step.j < good.j - tolerance && step.v < good.v) {
        step.pastLimit = true;
        step.pastLimitReason = 'current turned back while the voltage kept falling';
      }
    }
    if (step.pastLimit) {
      pastLimitSteps.push(index);
      continue;
    }
    if (current === null) {
      current = { direction: 'flat', steps: [index] };
      sweeps.push(current);
    } else {
      const good = steps[lastGood];
      const stepDirection: CurveSweep['direction'] = step.j > good.j ? 'up' : step.j < good.j ? 'down' : 'flat';
      if (current.direction === 'flat' || current.direction === stepDirection || stepDirection === 'flat') {
        if (current.direction === 'flat') current.direction = stepDirection;
        current.steps.push(index);
      } else {
        current = { direction: stepDirection, steps: [lastGood, index] };
        sweeps.push(current);
      }
      direction = current.direction;
    }
    lastGood = index;
  }

  const counts = steps.map((step) => step.readings);
  let fewest = counts[0];
  let most = counts[0];
  for (const readings of counts) {
    if (readings < fewest) fewest = readings;
    if (readings > most) most = readings;
  }
  let pastLimitReadings = 0;
  for (const index of pastLimitSteps) pastLimitReadings += steps[index].readings;
  const notes: string[] = [];
  if (pastLimitSteps.length > 0) {
    notes.push(`${pastLimitSteps.length} step${pastLimitSteps.length === 1 ? '' : 's'} (${pastLimitReadings} readings) past the limiting current, excluded`);
  }
  if (sweeps.length === 0) notes.push('every step is past the limiting current');
  return {
    steps,
    sweeps,
    readingsPerStep: { min: fewest, median: median(counts), max: most },
    pastLimitSteps,
    pastLimitReadings,
    notes,
  };
}

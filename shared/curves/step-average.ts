// Groups the readings of a polarization curve into steps by their set point (current, or voltage
// for potentiostatic steps), averages the settled part of each dwell, finds the sweeps, and flags
// points past the limiting current. The result does not depend on the order of the rows except
// where the order carries meaning (a forward and a backward sweep kept apart, dwell transients).
import type { CurveData } from './types';
import { CompensatedSum } from '../stats/compensated-sum';
import { median } from '../stats/median';

export interface StepAverageOptions {
  /** sorted neighbouring currents belong to one set point when within this fraction of the current…; default 0.01 */
  relativeTolerance?: number;
  /** …plus this many A/cm²; default 1e-5 (10 µA/cm²) */
  absoluteToleranceAcm2?: number;
  /** sorted neighbouring voltages belong to one voltage set point when within this many V; default 0.0005 */
  voltageToleranceV?: number;
  /** a step whose mean voltage is below this is past the limiting current; default 0.05 V */
  collapseVoltage?: number;
  /** share of a dwell kept at its end when the dwell shows a transient; default 0.5 (the last half) */
  settledFraction?: number;
  /** which quantity the station held: 'auto' decides from the data; default 'auto' */
  control?: 'auto' | 'current' | 'voltage';
}

/** One step: the readings at one set point (one dwell, or several dwells merged), averaged. */
export interface CurveStep {
  /** mean current density of the averaged readings, A/cm² */
  j: number;
  /** mean cell voltage of the averaged readings with a voltage, V; null when none has one */
  v: number | null;
  /** sample standard deviation of those voltages, V (0 for a single reading) */
  vSd: number;
  /** mean of the HFR readings that are present and > 0, Ω·cm²; null without any */
  hfr: number | null;
  /** mean iR-free voltage, V: the file's own iR-free column when given, else V + j·HFR; null without any */
  vIrFree: number | null;
  /** readings averaged (the settled part of each dwell) */
  readings: number;
  /** all readings at this set point in the step, averaged or not */
  totalReadings: number;
  /** dwells (uninterrupted runs of readings) merged into the step */
  dwells: number;
  /** dwells in which a transient was seen, so that only their last part was averaged */
  transientDwells: number;
  /** the set point: current density (A/cm²) or voltage (V), the centre of its readings */
  setPoint: number;
  /** readings at zero current (the open-circuit step); it belongs to no sweep */
  openCircuit: boolean;
  /** smallest and largest index of the step's readings in the curve's arrays */
  firstReading: number;
  lastReading: number;
  /** the averaged readings (indices into the curve's arrays) */
  members: number[];
  /** past the limiting current: excluded from sweeps and metrics */
  pastLimit: boolean;
  pastLimitReason: string | null;
}

/** Three or more steps in one direction of current. The turning step belongs to both sweeps it joins. */
export interface CurveSweep {
  direction: 'up' | 'down' | 'flat';
  /** indices into `steps`, in measurement order */
  steps: number[];
}

export interface StepAverageResult {
  /** the quantity the station held at each step */
  control: 'current' | 'voltage';
  /**
   * how the loaded steps were read: 'sweeps' = in measurement order, split into sweeps; 'sorted' =
   * as a set of steps sorted by current, because the order does not read as sweeps
   */
  order: 'sweeps' | 'sorted';
  /** the up and down sweeps are kept apart (both directions were measured) */
  sweepsKeptApart: boolean;
  steps: CurveStep[];
  sweeps: CurveSweep[];
  /** index into `steps` of the open-circuit step, or null when no reading is at zero current */
  openCircuitStep: number | null;
  /** steps (not open circuit, not past the limit) the metrics are read from, in ascending current */
  loadedSteps: number[];
  readingsPerStep: { min: number; median: number; max: number };
  /** indices into `steps` of the steps flagged past the limiting current */
  pastLimitSteps: number[];
  /** number of readings in those steps */
  pastLimitReadings: number;
  /** dwells that belonged to no sweep and were left out (only when sweeps are kept apart) */
  leftOutDwells: number;
  /** HFR readings that were missing or ≤ 0 (not used) */
  hfrMissing: number;
  /** the grouping and averaging rules in one sentence, for the method text */
  method: string;
  notes: string[];
}

/** Open circuit: a current set point whose centre is below this, A/cm² (0.1 mA/cm²). */
const OPEN_CIRCUIT_LEVEL_J = 1e-4;
/** Open circuit under voltage control: readings whose |j| is at most this, A/cm² (1 µA/cm²). */
const OPEN_CIRCUIT_READING_J = 1e-6;
/** A dwell needs this many readings before a transient is looked for. */
const MIN_DWELL_FOR_TRANSIENT = 6;
/** A transient must move the measured quantity by more than this between the first and last third. */
const TRANSIENT_MIN_V = 0.002;
const TRANSIENT_MIN_RELATIVE_J = 0.02;
/** …and by more than this many standard errors (noise from successive differences). */
const TRANSIENT_STANDARD_ERRORS = 4;
/** A sweep moves to the next measured set point, or skips one (a dwell left out on the way); a longer jump ends it. */
const MAX_SWEEP_MOVE = 2;

/** A set point whose readings spread wider than this is not one set point (a continuous sweep). */
const MAX_LEVEL_RELATIVE_WIDTH = 0.1;
const MAX_LEVEL_WIDTH_J = 1e-3;
const MAX_LEVEL_WIDTH_V = 0.005;
/** Under voltage control the current within a set point varies by more than this fraction (median). */
const HELD_CURRENT_MAX_SPREAD = 0.05;

function smallest(values: readonly number[]): number {
  let low = Infinity;
  for (const value of values) if (value < low) low = value;
  return low;
}
function largest(values: readonly number[]): number {
  let high = -Infinity;
  for (const value of values) if (value > high) high = value;
  return high;
}

interface Levels {
  /** level of each reading, −1 for a reading without a value */
  levelOf: Int32Array;
  centres: number[];
  counts: number[];
  /** readings in groups too wide for one set point, which had to be re-cut */
  recutReadings: number;
}

// One-dimensional grouping of readings into set points, independent of row order: sort the values,
// cut where sorted neighbours differ by more than the tolerance, re-cut any group too wide to be a
// single set point (a continuous sweep) into pieces no wider than the tolerance. Equal values never
// fall on both sides of a cut, so each reading finds its level by a binary search on the cut values
// (a native numeric sort instead of sorting indices with a comparator: ~10× faster on 10⁵ rows).
function groupLevels(values: ArrayLike<number>, relative: number, absolute: number, maxWidthAbsolute: number): Levels {
  const count = values.length;
  let finite = 0;
  for (let index = 0; index < count; index++) if (Number.isFinite(values[index])) finite++;
  const sorted = new Float64Array(finite);
  let position = 0;
  for (let index = 0; index < count; index++) if (Number.isFinite(values[index])) sorted[position++] = values[index];
  sorted.sort();
  // group starts (positions into `sorted`)
  const groupStarts: number[] = [];
  for (let k = 0; k < finite; k++) {
    if (k === 0 || sorted[k] - sorted[k - 1] > relative * Math.max(Math.abs(sorted[k]), Math.abs(sorted[k - 1])) + absolute) groupStarts.push(k);
  }
  const starts: number[] = [];
  let recutReadings = 0;
  for (let g = 0; g < groupStarts.length; g++) {
    const from = groupStarts[g];
    const to = g + 1 < groupStarts.length ? groupStarts[g + 1] : finite;
    const low = sorted[from];
    const high = sorted[to - 1];
    if (high - low <= MAX_LEVEL_RELATIVE_WIDTH * Math.abs((low + high) / 2) + maxWidthAbsolute) {
      starts.push(low);
      continue;
    }
    recutReadings += to - from;
    let start = low;
    starts.push(low);
    for (let k = from + 1; k < to; k++) {
      if (sorted[k] - start > relative * Math.abs(sorted[k]) + absolute) {
        start = sorted[k];
        starts.push(start);
      }
    }
  }
  const levelOf = new Int32Array(count).fill(-1);
  const sums = starts.map(() => new CompensatedSum());
  const counts = new Array<number>(starts.length).fill(0);
  for (let index = 0; index < count; index++) {
    const value = values[index];
    if (!Number.isFinite(value)) continue;
    let low = 0;
    let high = starts.length - 1;
    while (low < high) {
      const middle = (low + high + 1) >> 1;
      if (starts[middle] <= value) low = middle;
      else high = middle - 1;
    }
    levelOf[index] = low;
    sums[low].add(value);
    counts[low]++;
  }
  const centres = sums.map((sum, level) => sum.value() / counts[level]);
  return { levelOf, centres, counts, recutReadings };
}


// Voltage control when the voltage sits at a few exact set points (sorted voltages fall into
// narrow groups with clear gaps, no continuum) while the current within each varies far more than
// a held current would (a decaying current at a fixed potential). Open-circuit readings are left out.
function heldVoltage(curve: CurveData, voltageTolerance: number): boolean {
  const loaded = new Float64Array(curve.v.length);
  for (let index = 0; index < loaded.length; index++) loaded[index] = Math.abs(curve.j[index]) <= OPEN_CIRCUIT_READING_J ? Number.NaN : curve.v[index];
  const byVoltage = groupLevels(loaded, 0, voltageTolerance, MAX_LEVEL_WIDTH_V);
  const finite = byVoltage.counts.reduce((sum, value) => sum + value, 0);
  if (byVoltage.recutReadings > 0.1 * finite) return false;
  let repeated = 0;
  let repeatedLevels = 0;
  for (const size of byVoltage.counts) {
    if (size >= 2) {
      repeated += size;
      repeatedLevels++;
    }
  }
  if (repeatedLevels < 3 || repeated < 0.6 * finite) return false;
  const low = new Array<number>(byVoltage.centres.length).fill(Infinity);
  const high = new Array<number>(byVoltage.centres.length).fill(-Infinity);
  const sums = byVoltage.centres.map(() => new CompensatedSum());
  for (let index = 0; index < curve.j.length; index++) {
    const level = byVoltage.levelOf[index];
    if (level < 0) continue;
    low[level] = Math.min(low[level], curve.j[index]);
    high[level] = Math.max(high[level], curve.j[index]);
    sums[level].add(curve.j[index]);
  }
  const spreads: number[] = [];
  for (let level = 0; level < byVoltage.centres.length; level++) {
    if (byVoltage.counts[level] < 2) continue;
    const mean = Math.abs(sums[level].value() / byVoltage.counts[level]);
    if (mean < OPEN_CIRCUIT_LEVEL_J) continue;
    spreads.push((high[level] - low[level]) / mean);
  }
  // a held current stays within a few tolerances of its set point
  return spreads.length >= 3 && median(spreads) > HELD_CURRENT_MAX_SPREAD;
}

// The settled part of one dwell: all of it, unless the measured quantity moved between the first
// and the last third by more than the floor and more than 4 standard errors (noise estimated from
// successive differences, which a smooth transient hardly inflates) — then only its last part.
function settledPart(dwell: number[], measured: ArrayLike<number>, byCurrent: boolean, settledFraction: number): { kept: number[]; transient: boolean } {
  const finite = dwell.filter((index) => Number.isFinite(measured[index]));
  if (finite.length < MIN_DWELL_FOR_TRANSIENT) return { kept: dwell, transient: false };
  const third = Math.floor(finite.length / 3);
  let first = 0;
  let last = 0;
  for (let k = 0; k < third; k++) {
    first += measured[finite[k]];
    last += measured[finite[finite.length - 1 - k]];
  }
  first /= third;
  last /= third;
  const differences: number[] = [];
  for (let k = 1; k < finite.length; k++) differences.push(Math.abs(measured[finite[k]] - measured[finite[k - 1]]));
  // median |Δ| of a Gaussian series is 0.6745·√2·σ
  const sigma = median(differences) / (0.6744897501960817 * Math.SQRT2);
  const standardError = sigma * Math.sqrt(2 / third);
  const floor = byCurrent ? TRANSIENT_MIN_V : TRANSIENT_MIN_RELATIVE_J * Math.abs(last);
  const transient = Math.abs(last - first) > Math.max(floor, TRANSIENT_STANDARD_ERRORS * standardError);
  if (!transient) return { kept: dwell, transient: false };
  const keep = Math.max(1, Math.ceil(dwell.length * settledFraction));
  return { kept: dwell.slice(dwell.length - keep), transient: true };
}

interface Dwell {
  level: number;
  readings: number[];
}

interface Entry {
  level: number;
  dwells: number[];
  /** stats of the entry's settled readings */
  j: number;
  v: number | null;
  pastLimit: boolean;
  pastLimitReason: string | null;
}

function buildStep(curve: CurveData, dwells: readonly Dwell[], settled: readonly { kept: number[]; transient: boolean }[], which: readonly number[], setPoint: number, openCircuit: boolean): CurveStep {
  const members: number[] = [];
  let total = 0;
  let transientDwells = 0;
  let first = Infinity;
  let last = -Infinity;
  for (const dwell of which) {
    for (const index of settled[dwell].kept) members.push(index);
    for (const index of dwells[dwell].readings) {
      first = Math.min(first, index);
      last = Math.max(last, index);
    }
    total += dwells[dwell].readings.length;
    if (settled[dwell].transient) transientDwells++;
  }
  const jSum = new CompensatedSum();
  const vSum = new CompensatedSum();
  const hfrSum = new CompensatedSum();
  const irFreeSum = new CompensatedSum();
  let vCount = 0;
  let hfrCount = 0;
  let irFreeCount = 0;
  const { hfr, vIrFree } = curve;
  for (const index of members) {
    const j = curve.j[index];
    const v = curve.v[index];
    jSum.add(j);
    if (Number.isFinite(v)) {
      vSum.add(v);
      vCount++;
    }
    const resistance = hfr !== undefined && Number.isFinite(hfr[index]) && hfr[index] > 0 ? hfr[index] : Number.NaN;
    if (resistance === resistance) {
      hfrSum.add(resistance);
      hfrCount++;
    }
    if (vIrFree !== undefined) {
      if (Number.isFinite(vIrFree[index])) {
        irFreeSum.add(vIrFree[index]);
        irFreeCount++;
      }
    } else if (resistance === resistance && Number.isFinite(v)) {
      irFreeSum.add(v + j * resistance);
      irFreeCount++;
    }
  }
  const vMean = vCount > 0 ? vSum.value() / vCount : null;
  let vSd = 0;
  if (vMean !== null && vCount > 1) {
    const squares = new CompensatedSum();
    for (const index of members) if (Number.isFinite(curve.v[index])) squares.add((curve.v[index] - vMean) ** 2);
    vSd = Math.sqrt(squares.value() / (vCount - 1));
  }
  return {
    j: jSum.value() / members.length,
    v: vMean,
    vSd,
    hfr: hfrCount > 0 ? hfrSum.value() / hfrCount : null,
    vIrFree: irFreeCount > 0 ? irFreeSum.value() / irFreeCount : null,
    readings: members.length,
    totalReadings: total,
    dwells: which.length,
    transientDwells,
    setPoint,
    openCircuit,
    firstReading: first,
    lastReading: last,
    members,
    pastLimit: false,
    pastLimitReason: null,
  };
}

function plural(count: number, word: string): string {
  return `${count} ${word}${count === 1 ? '' : 's'}`;
}

/**
 * Steps, dwells and sweeps of a polarization curve.
 * - Set point: the current, or the voltage when the station held the voltage (auto: the voltage
 *   sits at ≥ 3 repeated exact values while the current within each varies by more than 5 %).
 * - Steps by set point, whatever the row order: sorted neighbouring values within 1 % of the value
 *   + 10 µA/cm² (voltage: 0.5 mV) share a set point; a group wider than 10 % + 1 mA/cm² (5 mV) is a
 *   continuous sweep and is cut into pieces of that tolerance.
 * - Open circuit: the current set point at 0 (centre below 0.1 mA/cm²; under voltage control,
 *   readings with |j| ≤ 1 µA/cm²). It belongs to no sweep.
 * - Dwells: uninterrupted runs of readings at one set point, in time order (the time column when
 *   there is one, else the row order). A dwell of ≥ 6 readings whose measured quantity (V, or j
 *   under voltage control) differs between its first and last third by more than 2 mV (2 % of j)
 *   and 4 standard errors shows a transient: only its last half is averaged.
 * - Past the limiting current (current control): a dwell whose mean V < 0.05 V, or whose current is
 *   lower than the previous good dwell's while its voltage is lower too.
 * - Sweeps: runs of ≥ 3 dwells at set points moving one way, each move to the next measured set
 *   point or over one (a longer jump is not a sweep). The order
 *   reads as sweeps when the longest sweep spans ≥ half the loaded set points and at most
 *   max(2, 10 %) dwells are in none; otherwise the steps are taken as a set sorted by current.
 *   With up and down sweeps both present — the sweeps of each direction together spanning ≥ half
 *   the loaded set points — each dwell is a step of its own (hysteresis kept); otherwise all dwells
 *   at one set point are averaged together (so a shuffled step order gives the sorted curve).
 * Reference: step-wise galvanostatic and potentiostatic polarization practice (common practice
 * in the trade); compensated sums after Neumaier (1974), ZAMM 54, 39–51; noise from successive
 * differences after von Neumann (1941), Ann. Math. Stat. 12, 367.
 * Cost: O(n log n) for n readings.
 * @throws RangeError when j and v differ in length, are empty, j is not finite, or options are out of range.
 * @example stepAverage({ kind: 'polarization', j: Float64Array.of(0.1, 0.1, 0.2), v: Float64Array.of(0.8, 0.8, 0.7) }).steps.length // 2
 */
export function stepAverage(curve: CurveData, options: StepAverageOptions = {}): StepAverageResult {
  const relative = options.relativeTolerance ?? 0.01;
  const absolute = options.absoluteToleranceAcm2 ?? 1e-5;
  const voltageTolerance = options.voltageToleranceV ?? 0.0005;
  const collapseVoltage = options.collapseVoltage ?? 0.05;
  const settledFraction = options.settledFraction ?? 0.5;
  const controlOption = options.control ?? 'auto';
  if (curve === null || typeof curve !== 'object' || !(curve.j instanceof Float64Array) || !(curve.v instanceof Float64Array)) {
    throw new RangeError('stepAverage: curve must have Float64Array j and v');
  }
  const count = curve.j.length;
  if (count === 0) throw new RangeError('stepAverage: the curve has no readings');
  if (curve.v.length !== count) throw new RangeError(`stepAverage: j has ${count} readings but v has ${curve.v.length}`);
  if (curve.hfr !== undefined && curve.hfr.length !== count) throw new RangeError(`stepAverage: j has ${count} readings but hfr has ${curve.hfr.length}`);
  if (curve.vIrFree !== undefined && curve.vIrFree.length !== count) throw new RangeError(`stepAverage: j has ${count} readings but vIrFree has ${curve.vIrFree.length}`);
  for (let index = 0; index < count; index++) if (!Number.isFinite(curve.j[index])) throw new RangeError(`stepAverage: reading ${index} has a non-finite j`);
  if (!(relative >= 0) || !(absolute >= 0) || !(voltageTolerance >= 0)) throw new RangeError('stepAverage: tolerances must be ≥ 0');
  if (!(settledFraction > 0 && settledFraction <= 1)) throw new RangeError(`stepAverage: settledFraction must be in (0, 1], got ${settledFraction}`);
  if (controlOption !== 'auto' && controlOption !== 'current' && controlOption !== 'voltage') throw new RangeError(`stepAverage: control must be 'auto', 'current' or 'voltage', got ${String(controlOption)}`);

  const notes: string[] = [];
  // time order: the time column when it is complete, else the row order
  const time = new Array<number>(count);
  for (let index = 0; index < count; index++) time[index] = index;
  const tHours = curve.tHours;
  let timeOrdered = false;
  if (tHours !== undefined && tHours.length === count && tHours.every((value) => Number.isFinite(value))) {
    time.sort((a, b) => tHours[a] - tHours[b] || a - b);
    timeOrdered = true;
  }

  let hasVoltage = false;
  for (let index = 0; index < count && !hasVoltage; index++) if (Number.isFinite(curve.v[index])) hasVoltage = true;
  const control: StepAverageResult['control'] =
    controlOption === 'auto' ? (hasVoltage && heldVoltage(curve, voltageTolerance) ? 'voltage' : 'current') : controlOption;
  if (control === 'voltage' && !hasVoltage) throw new RangeError('stepAverage: voltage control needs voltage readings');
  const byCurrent = control === 'current';
  const levels = byCurrent ? groupLevels(curve.j, relative, absolute, MAX_LEVEL_WIDTH_J) : groupLevels(curve.v, 0, voltageTolerance, MAX_LEVEL_WIDTH_V);
  const levelCount = levels.centres.length;
  // rank: ascending current (under voltage control, descending voltage)
  const rank = (level: number): number => (byCurrent ? level : levelCount - 1 - level);

  // the open-circuit level
  let openLevel = -1;
  if (byCurrent) {
    for (let level = 0; level < levelCount; level++) {
      if (Math.abs(levels.centres[level]) <= OPEN_CIRCUIT_LEVEL_J && (openLevel < 0 || Math.abs(levels.centres[level]) < Math.abs(levels.centres[openLevel]))) openLevel = level;
    }
  } else {
    const open: number[] = [];
    for (let index = 0; index < count; index++) if (Math.abs(curve.j[index]) <= OPEN_CIRCUIT_READING_J) open.push(index);
    if (open.length > 0) {
      // readings at zero current form a level of their own, whatever their voltage
      openLevel = levelCount;
      for (const index of open) levels.levelOf[index] = openLevel;
    }
  }

  // dwells in time order; readings without a set-point value do not break a dwell
  const dwells: Dwell[] = [];
  for (const index of time) {
    const level = levels.levelOf[index];
    if (level < 0) continue;
    const previous = dwells[dwells.length - 1];
    if (previous !== undefined && previous.level === level) previous.readings.push(index);
    else dwells.push({ level, readings: [index] });
  }
  const measured = byCurrent ? curve.v : curve.j;
  const settled = dwells.map((dwell) => settledPart(dwell.readings, measured, byCurrent, settledFraction));
  const unplaced = count - dwells.reduce((sum, dwell) => sum + dwell.readings.length, 0);
  if (unplaced > 0) notes.push(`${plural(unplaced, 'reading')} without a voltage could not be placed at a voltage set point and were left out`);

  // loaded dwells, consecutive ones at one set point joined (an open-circuit pause between them)
  const entryStats = (which: number[]): { j: number; v: number | null } => {
    const jSum = new CompensatedSum();
    const vSum = new CompensatedSum();
    let n = 0;
    let nv = 0;
    for (const dwell of which) {
      for (const index of settled[dwell].kept) {
        jSum.add(curve.j[index]);
        n++;
        if (Number.isFinite(curve.v[index])) {
          vSum.add(curve.v[index]);
          nv++;
        }
      }
    }
    return { j: jSum.value() / n, v: nv > 0 ? vSum.value() / nv : null };
  };
  const raw: Entry[] = [];
  for (let dwell = 0; dwell < dwells.length; dwell++) {
    if (dwells[dwell].level === openLevel) continue;
    const previous = raw[raw.length - 1];
    if (previous !== undefined && previous.level === dwells[dwell].level) previous.dwells.push(dwell);
    else raw.push({ level: dwells[dwell].level, dwells: [dwell], j: 0, v: null, pastLimit: false, pastLimitReason: null });
  }
  for (const entry of raw) Object.assign(entry, entryStats(entry.dwells));

  // past the limiting current (current control only: under voltage control a plateau is the limit itself)
  let lastGood: Entry | null = null;
  for (const entry of raw) {
    if (entry.v !== null && entry.v < collapseVoltage) {
      entry.pastLimit = true;
      entry.pastLimitReason = `voltage collapsed below ${collapseVoltage} V`;
    } else if (byCurrent && lastGood !== null && lastGood.v !== null && entry.v !== null && rank(entry.level) < rank(lastGood.level) && entry.v < lastGood.v) {
      entry.pastLimit = true;
      entry.pastLimitReason = 'current turned back while the voltage kept falling';
    }
    if (!entry.pastLimit) lastGood = entry;
  }
  const good: Entry[] = [];
  for (const entry of raw) {
    if (entry.pastLimit) continue;
    const previous = good[good.length - 1];
    if (previous !== undefined && previous.level === entry.level) {
      previous.dwells.push(...entry.dwells);
      Object.assign(previous, entryStats(previous.dwells));
    } else {
      good.push({ ...entry, dwells: [...entry.dwells] });
    }
  }

  // sweeps: maximal runs of moves one way; a run of ≥ 3 entries is a sweep
  const runs: { direction: 'up' | 'down'; from: number; to: number }[] = [];
  for (let position = 1; position < good.length; position++) {
    const move = rank(good[position].level) - rank(good[position - 1].level);
    // a jump over more than one measured set point is no step of a sweep (a shuffled step order)
    if (Math.abs(move) > MAX_SWEEP_MOVE) continue;
    const direction = move > 0 ? 'up' : 'down';
    const current = runs[runs.length - 1];
    if (current !== undefined && current.direction === direction && current.to === position - 1) current.to = position;
    else runs.push({ direction, from: position - 1, to: position });
  }
  const sweepRuns = runs.filter((run) => run.to - run.from + 1 >= 3);
  const inSweep = new Uint8Array(good.length);
  for (const run of sweepRuns) for (let position = run.from; position <= run.to; position++) inSweep[position] = 1;
  let strays = 0;
  for (let position = 0; position < good.length; position++) if (!inSweep[position]) strays++;
  const goodLevels = new Set(good.map((entry) => entry.level)).size;
  const longest = sweepRuns.reduce((best, run) => Math.max(best, run.to - run.from + 1), 0);
  const readsAsSweeps = sweepRuns.length > 0 && longest >= 0.5 * goodLevels && strays <= Math.max(2, Math.ceil(0.1 * good.length));
  // a direction was measured when its sweeps together span at least half the loaded set points: a
  // short run one way inside a shuffled step order (a lab randomising its current steps) is no sweep
  const spanned = (direction: 'up' | 'down') => {
    const levels = new Set<number>();
    for (const run of sweepRuns) if (run.direction === direction) for (let position = run.from; position <= run.to; position++) levels.add(good[position].level);
    return levels.size;
  };
  const hasUp = spanned('up') >= 0.5 * goodLevels;
  const hasDown = spanned('down') >= 0.5 * goodLevels;
  const keptApart = readsAsSweeps && hasUp && hasDown;

  // steps
  const steps: CurveStep[] = [];
  const sweeps: CurveSweep[] = [];
  let leftOutDwells = 0;
  const setPointOf = (level: number): number => (level < levelCount ? levels.centres[level] : 0);
  if (keptApart) {
    const stepOfEntry = new Map<number, number>();
    for (let position = 0; position < good.length; position++) {
      if (!inSweep[position]) {
        leftOutDwells += good[position].dwells.length;
        continue;
      }
      stepOfEntry.set(position, steps.length);
      steps.push(buildStep(curve, dwells, settled, good[position].dwells, setPointOf(good[position].level), false));
    }
    for (const run of sweepRuns) {
      const members: number[] = [];
      for (let position = run.from; position <= run.to; position++) members.push(stepOfEntry.get(position) as number);
      sweeps.push({ direction: run.direction, steps: members });
    }
  } else {
    const byLevel = new Map<number, number[]>();
    for (const entry of good) {
      const list = byLevel.get(entry.level) ?? [];
      list.push(...entry.dwells);
      byLevel.set(entry.level, list);
    }
    const stepOfLevel = new Map<number, number>();
    const orderedLevels = [...byLevel.keys()];
    if (readsAsSweeps) orderedLevels.sort((a, b) => smallest(byLevel.get(a) as number[]) - smallest(byLevel.get(b) as number[]));
    else orderedLevels.sort((a, b) => rank(a) - rank(b));
    for (const level of orderedLevels) {
      stepOfLevel.set(level, steps.length);
      steps.push(buildStep(curve, dwells, settled, byLevel.get(level) as number[], setPointOf(level), false));
    }
    if (readsAsSweeps) {
      for (const run of sweepRuns) {
        const members: number[] = [];
        for (let position = run.from; position <= run.to; position++) members.push(stepOfLevel.get(good[position].level) as number);
        sweeps.push({ direction: run.direction, steps: members });
      }
    }
  }
  const loadedSteps = steps.map((_, index) => index).sort((a, b) => steps[a].j - steps[b].j);

  // the open-circuit step and the past-limit steps
  let openCircuitStep: number | null = null;
  if (openLevel >= 0) {
    const which: number[] = [];
    for (let dwell = 0; dwell < dwells.length; dwell++) if (dwells[dwell].level === openLevel) which.push(dwell);
    if (which.length > 0) {
      openCircuitStep = steps.length;
      steps.push(buildStep(curve, dwells, settled, which, 0, true));
    }
  }
  const pastLimitSteps: number[] = [];
  let pastLimitReadings = 0;
  for (const entry of raw) {
    if (!entry.pastLimit) continue;
    const step = buildStep(curve, dwells, settled, entry.dwells, setPointOf(entry.level), false);
    step.pastLimit = true;
    step.pastLimitReason = entry.pastLimitReason;
    pastLimitSteps.push(steps.length);
    pastLimitReadings += step.totalReadings;
    steps.push(step);
  }

  let hfrMissing = 0;
  if (curve.hfr !== undefined) for (let index = 0; index < count; index++) if (!(Number.isFinite(curve.hfr[index]) && curve.hfr[index] > 0)) hfrMissing++;

  // notes and method
  const counts = steps.map((step) => step.readings);
  const transientDwells = steps.reduce((sum, step) => sum + step.transientDwells, 0);
  const settledRule = `a dwell of ≥ ${MIN_DWELL_FOR_TRANSIENT} readings whose ${byCurrent ? 'voltage' : 'current'} moves between its first and last third by more than ${byCurrent ? '2 mV' : '2 %'} and 4 standard errors is averaged over its last ${Math.round(settledFraction * 100)} % only, other dwells over all their readings`;
  const grouping = byCurrent
    ? 'readings grouped by current set point (sorted neighbours within 1 % + 10 µA/cm²)'
    : 'potentiostatic steps: readings grouped by voltage set point (within 0.5 mV)';
  const orderText = readsAsSweeps
    ? keptApart
      ? 'up and down sweeps kept apart'
      : `${plural(sweepRuns.length, sweepRuns[0].direction + ' sweep')}; dwells at one set point averaged together`
    : 'the row order does not read as sweeps of ≥ 3 steps, so the steps are taken as a set sorted by current';
  const method = `${grouping}${timeOrdered ? ', in time order' : ''}; ${settledRule}; ${orderText}`;
  if (!byCurrent) notes.push('potentiostatic steps: grouped by the voltage set point');
  if (transientDwells > 0) notes.push(`${plural(transientDwells, 'dwell')} with a transient: only the last ${Math.round(settledFraction * 100)} % of each averaged`);
  if (!readsAsSweeps && good.length > 0) notes.push(good.length < 3 ? 'fewer than 3 loaded steps: no sweep; steps sorted by current' : 'the row order does not read as sweeps: steps sorted by current');
  if (leftOutDwells > 0) notes.push(`${plural(leftOutDwells, 'dwell')} outside any sweep left out`);
  if (pastLimitSteps.length > 0) notes.push(`${plural(pastLimitSteps.length, 'step')} (${plural(pastLimitReadings, 'reading')}) past the limiting current, excluded`);
  if (loadedSteps.length === 0) notes.push(pastLimitSteps.length > 0 ? 'every loaded step is past the limiting current' : 'no loaded step: only open-circuit readings');
  if (hfrMissing > 0) notes.push(`${plural(hfrMissing, 'HFR reading')} missing or ≤ 0, not used`);
  return {
    control,
    order: readsAsSweeps ? 'sweeps' : 'sorted',
    sweepsKeptApart: keptApart,
    steps,
    sweeps,
    openCircuitStep,
    loadedSteps,
    readingsPerStep: { min: smallest(counts), median: median(counts), max: largest(counts) },
    pastLimitSteps,
    pastLimitReadings,
    leftOutDwells,
    hfrMissing,
    method,
    notes,
  };
}

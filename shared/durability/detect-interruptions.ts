// Finds where a durability log was interrupted — logging gaps, current set-point changes and
// restarts — so the degradation fit can split the run instead of drawing a line through a step.
import { median, medianForwardStep } from '../stats/median';
import { robustSd } from '../stats/robust-sd';

export type InterruptionKind = 'gap' | 'current-change' | 'restart';

export interface Interruption {
  kind: InterruptionKind;
  /** last logged time before the interruption (gap, restart) or first time at the other current, h */
  startHours: number;
  /** first logged time after the interruption (gap, restart) or last time at the other current, h */
  endHours: number;
  /** first row after the gap / restart, or first row at the other current */
  index: number;
  /** one past the last affected row (current changes); equals index + 1 for gaps and restarts */
  endIndex: number;
  /** human sentence with the numbers */
  detail: string;
  /** voltage step across a gap or restart, V (after − before); null for a time reset or a current change */
  voltageStep: number | null;
}

export interface InterruptionOptions {
  /** a gap is a step longer than max(gapFactor × median step, minGapHours); default 10 */
  gapFactor?: number;
  /** default 0.5 h */
  minGapHours?: number;
  /** a pause is a restart when the voltage steps by more than restartNoiseFactor × local noise; default 5 */
  restartNoiseFactor?: number;
  /** a pause that can hide a restart: a time step longer than this × the median step (rows missing); default 2 */
  restartPauseFactor?: number;
  /** time either side of a gap used for the voltage step and local noise, h; default 1 */
  localHours?: number;
  /** a current change departs from the median current density by more than this fraction of it; default 0.05 */
  currentFraction?: number;
  /** ...or by more than this, A/cm², whichever is larger (so an open-circuit hold near 0 A/cm² works); default 0.002 */
  minCurrentStep?: number;
  /** a current change must last at least this long, h; default 0.25 */
  minCurrentHours?: number;
  /** floor of the local voltage noise, V (station resolution); default 1e-5 */
  minNoiseV?: number;
  /** the caller has already checked that every value is finite (durabilityMetrics drops the rows that are not); default false */
  valuesChecked?: boolean;
}

const fmt = (value: number, digits: number): string => value.toFixed(digits);

/**
 * Robust SD of the differences between neighbouring block means of v (blocks of blockHours on the time
 * axis, begun afresh at a time reset). A voltage step is itself a difference of two levels, so it is
 * compared with this spread as it is. 0 when there are fewer than 5 differences.
 */
function hourToHourNoise(t: ArrayLike<number>, v: ArrayLike<number>, blockHours: number): number {
  const differences: number[] = [];
  let blockStart = t[0];
  let sum = 0;
  let count = 0;
  let previousMean = NaN;
  let previousBlockEnd = -Infinity;
  for (let i = 0; i <= t.length; i++) {
    const closes = i === t.length || t[i] >= blockStart + blockHours || t[i] < t[i - 1];
    if (closes && count > 0) {
      const mean = sum / count;
      // Only neighbouring blocks: across a gap or a reset the difference is not hour-to-hour wander.
      if (Number.isFinite(previousMean) && Math.abs(blockStart - previousBlockEnd) < blockHours * 1e-6) differences.push(mean - previousMean);
      previousMean = mean;
      previousBlockEnd = blockStart + blockHours;
      sum = 0;
      count = 0;
    }
    if (i === t.length) break;
    if (closes) {
      if (t[i] < t[i - 1]) {
        previousMean = NaN;
        blockStart = t[i];
      } else {
        blockStart += Math.floor((t[i] - blockStart) / blockHours) * blockHours;
      }
    }
    sum += v[i];
    count++;
  }
  return differences.length >= 5 ? robustSd(differences) : 0;
}

/**
 * Interruptions of a constant-current (or open-circuit) log, in row order.
 * Rules: gap = time step > max(10 × median step, 0.5 h); restart = time going backwards (a new run
 * appended) or a pause (time step > 2 × median step, i.e. rows missing — a stop and restart often
 * takes less than a gap's length) across which the median voltage of the hour before and the hour
 * after differ by more than 5 × the local noise; a gap without such a step stays a gap. Local noise =
 * the larger of the spread of the rows about each side's median (robust SD) and the robust SD of the
 * differences between consecutive 1 h block means over the whole log — the second one is how far the
 * level wanders from one hour to the next when the noise is autocorrelated, which the spread within
 * an hour understates; floored at 10 µV (station resolution);
 * current change = a run of rows lasting ≥ 0.25 h whose current density departs from the log's median
 * by more than max(5 % of the median, 2 mA/cm²).
 * Reference: none single — common practice in reading test-station logs; robust SD per Rousseeuw & Croux (1993).
 * Cost: O(n) expected time; scratch memory of an eighth of n at most for the medians (more only when
 * a sample misses the middle).
 * @throws RangeError when the arrays differ in length or hold non-finite values, or an option is out of range.
 * @example detectInterruptions(curve.tHours, curve.v, curve.j) // [{ kind: 'gap', startHours: 300, endHours: 306, ... }]
 */
export function detectInterruptions(
  tHours: ArrayLike<number>,
  v: ArrayLike<number>,
  j: ArrayLike<number>,
  options: InterruptionOptions = {},
): Interruption[] {
  const n = tHours.length;
  if (v.length !== n || j.length !== n) {
    throw new RangeError(`detectInterruptions: time, voltage and current must have the same length, got ${n}, ${v.length} and ${j.length}`);
  }
  const gapFactor = options.gapFactor ?? 10;
  const minGapHours = options.minGapHours ?? 0.5;
  const restartNoiseFactor = options.restartNoiseFactor ?? 5;
  const restartPauseFactor = options.restartPauseFactor ?? 2;
  const localHours = options.localHours ?? 1;
  const currentFraction = options.currentFraction ?? 0.05;
  const minCurrentStep = options.minCurrentStep ?? 0.002;
  const minCurrentHours = options.minCurrentHours ?? 0.25;
  const minNoiseV = options.minNoiseV ?? 1e-5;
  const positive: [string, number][] = [
    ['gapFactor', gapFactor],
    ['localHours', localHours],
    ['restartNoiseFactor', restartNoiseFactor],
    ['restartPauseFactor', restartPauseFactor],
  ];
  for (const [name, value] of positive) {
    if (!(Number.isFinite(value) && value > 0)) throw new RangeError(`detectInterruptions: ${name} must be a positive number, got ${value}`);
  }
  const nonNegative: [string, number][] = [
    ['minGapHours', minGapHours],
    ['currentFraction', currentFraction],
    ['minCurrentStep', minCurrentStep],
    ['minCurrentHours', minCurrentHours],
    ['minNoiseV', minNoiseV],
  ];
  for (const [name, value] of nonNegative) {
    if (!(Number.isFinite(value) && value >= 0)) throw new RangeError(`detectInterruptions: ${name} must be a number ≥ 0, got ${value}`);
  }
  for (let i = 0; i < (options.valuesChecked ? 0 : n); i++) {
    if (!Number.isFinite(tHours[i]) || !Number.isFinite(v[i]) || !Number.isFinite(j[i])) {
      throw new RangeError(`detectInterruptions: values must be finite numbers, got row ${i}: t = ${tHours[i]}, V = ${v[i]}, j = ${j[i]}`);
    }
  }
  if (n < 3) return [];

  const found: Interruption[] = [];

  // Typical logging interval, from the forward steps only (a time reset is not a step).
  const forwardMedian = medianForwardStep(tHours);
  const medianStep = Number.isNaN(forwardMedian) ? 0 : forwardMedian;
  const gapThreshold = Math.max(gapFactor * medianStep, minGapHours);
  const localRows = Math.max(5, medianStep > 0 ? Math.round(localHours / medianStep) : 5);
  let levelNoise: number | null = null;

  for (let i = 1; i < n; i++) {
    const dt = tHours[i] - tHours[i - 1];
    if (dt < 0) {
      found.push({
        kind: 'restart',
        startHours: tHours[i - 1],
        endHours: tHours[i],
        index: i,
        endIndex: i + 1,
        detail: `time went back from ${fmt(tHours[i - 1], 2)} h to ${fmt(tHours[i], 2)} h at row ${i + 1}: a new run appended to the log`,
        voltageStep: null,
      });
      continue;
    }
    const isGap = dt > gapThreshold;
    if (!isGap && !(medianStep > 0 && dt > restartPauseFactor * medianStep)) continue;
    const beforeFrom = Math.max(0, i - localRows);
    const afterTo = Math.min(n, i + localRows);
    const before = median(v, beforeFrom, i);
    const after = median(v, i, afterTo);
    const step = after - before;
    // Local noise: the larger of the rows' spread about each side's median and the log's hour-to-hour
    // wander, so neither white noise nor an autocorrelated drift is taken for a restart.
    const noiseBefore = i - beforeFrom >= 3 ? robustSd(v, beforeFrom, i) : 0;
    const noiseAfter = afterTo - i >= 3 ? robustSd(v, i, afterTo) : 0;
    if (levelNoise === null) levelNoise = hourToHourNoise(tHours, v, localHours);
    const noise = Math.max(minNoiseV, levelNoise, Math.sqrt((noiseBefore * noiseBefore + noiseAfter * noiseAfter) / 2));
    const stepText = `${step >= 0 ? '+' : '−'}${fmt(Math.abs(step) * 1000, 1)} mV`;
    if (Math.abs(step) > restartNoiseFactor * noise) {
      found.push({
        kind: 'restart',
        startHours: tHours[i - 1],
        endHours: tHours[i],
        index: i,
        endIndex: i + 1,
        detail: `no data for ${fmt(dt, 2)} h, then the voltage stepped ${stepText} (local noise ${fmt(noise * 1000, 2)} mV): restart`,
        voltageStep: step,
      });
    } else if (isGap) {
      found.push({
        kind: 'gap',
        startHours: tHours[i - 1],
        endHours: tHours[i],
        index: i,
        endIndex: i + 1,
        detail: `no data for ${fmt(dt, 2)} h (typical step ${fmt(medianStep * 60, 1)} min); voltage step ${stepText} is within noise`,
        voltageStep: step,
      });
    }
  }

  // Sustained departures of the current density from its median.
  const medianCurrent = median(j);
  const currentThreshold = Math.max(currentFraction * Math.abs(medianCurrent), minCurrentStep);
  let runStart = -1;
  for (let i = 0; i <= n; i++) {
    const off = i < n && Math.abs(j[i] - medianCurrent) > currentThreshold;
    if (off && runStart < 0) runStart = i;
    // A run ends at the first row back at the set-point, at a time reset, or at the end of the log.
    const reset = i < n && runStart >= 0 && i > runStart && tHours[i] < tHours[i - 1];
    if (runStart >= 0 && (!off || reset)) {
      const last = i - 1;
      const duration = tHours[last] - tHours[runStart] + medianStep;
      if (last - runStart + 1 >= 3 && duration >= minCurrentHours) {
        const level = median(j, runStart, last + 1);
        found.push({
          kind: 'current-change',
          startHours: tHours[runStart],
          endHours: tHours[last],
          index: runStart,
          endIndex: last + 1,
          detail: `current density ${fmt(level, 3)} A/cm² instead of ${fmt(medianCurrent, 3)} A/cm² for ${fmt(duration, 2)} h`,
          voltageStep: null,
        });
      }
      runStart = off && reset ? i : -1;
    }
  }

  found.sort((a, b) => a.index - b.index);
  return found;
}

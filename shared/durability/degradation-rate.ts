// Durability metrics of a constant-current log (or an open-circuit hold): the degradation rate after
// break-in with an honest interval, voltage lost, hours to a stated loss, per-window rates, and the
// interruptions and segments the fit had to respect.
import type { CurveData } from '../curves/types';
import { detectBreakIn, type BreakInOptions } from './detect-break-in';
import { detectInterruptions, type Interruption, type InterruptionOptions } from './detect-interruptions';
import { fitTrend, prepareTrendSeries, type TrendFit, type TrendSeries } from './trend-fit';
import { checkBreakInTransient, type TransientCheck } from './break-in-transient';
import { lowerBound, upperBound } from './sorted-search';

export interface HoursWindow {
  fromHours: number;
  toHours: number;
}

export interface DurabilityOptions {
  /** end of break-in set by the user, h on the run clock (skips detection) */
  breakInHours?: number;
  /** extra windows to report a rate for, h on the run clock */
  windows?: HoursWindow[];
  /** loss that counts as "end of life", as a fraction of the post-break-in fitted voltage; default 0.1 */
  lossFraction?: number;
  /** confidence level of the intervals; default 0.95 */
  confidence?: number;
  /** averaging block for the fits, h; default 1 */
  blockHours?: number;
  breakIn?: Omit<BreakInOptions, 'segmentStarts' | 'blockHours'>;
  interruptions?: InterruptionOptions;
}

export interface DurabilityWindow {
  fromHours: number;
  toHours: number;
  /** µV/h, positive = losing voltage; null when the window has too few points */
  rate: number | null;
  low: number | null;
  high: number | null;
  /** points in the window */
  n: number;
}

export interface DurabilitySegment {
  fromHours: number;
  toHours: number;
  /** points in the segment (within the fit window) */
  n: number;
  /** what began the segment */
  startedBy: 'start' | 'restart' | 'current-change';
  /** the segment fitted on its own, µV/h, null when too short */
  rate: number | null;
  low: number | null;
  high: number | null;
  /** fitted voltage at the segment's first and last point under the common-slope fit, V */
  startV: number;
  endV: number;
}

export interface DurabilityMetrics {
  /** µV/h, positive = losing voltage; null when it cannot be fitted (see notes) */
  degradationRate: number | null;
  /** interval of the rate at `confidence` (t quantile, df = effective n − segments − 1) */
  low: number | null;
  high: number | null;
  confidence: number;
  /** end of break-in used for the fit, h on the run clock */
  breakInHours: number;
  breakInRule: string;
  breakInSource: 'detected' | 'user' | 'fallback';
  /** hours fitted; null when nothing could be fitted */
  fitWindow: HoursWindow | null;
  /** first to last logged hour on the run clock, h */
  hoursRun: number;
  /** fitted V at the start of the fit window minus fitted V at its end, mV (includes steps at restarts) */
  voltageLossMv: number | null;
  lossFraction: number;
  /** run-clock hour at which the fitted voltage has fallen by lossFraction of its post-break-in start; null = not reached */
  hoursToLoss: number | null;
  /** when not reached: the straight line carried past the data — an extrapolation, marked as such */
  projectedHoursToLoss: { hours: number; projected: true } | null;
  windows: DurabilityWindow[];
  /** on the run clock (a time reset is turned into a continuing clock) */
  interruptions: Interruption[];
  segments: DurabilitySegment[];
  /** lag-1 autocorrelation of the 1 h block residuals and what it did to the standard error */
  autocorrelation: { lag1: number; effectiveN: number; blocks: number; seInflation: number } | null;
  /**
   * the straight line checked against its own two halves: slopes of the first and second half of
   * the fit window (µV/h, positive = losing voltage), and the verdict. 'still-in-break-in' = the
   * voltage was still settling (no rate given); 'accelerating' = the loss speeds up (rate given, said)
   */
  linearity: { firstHalfRate: number; secondHalfRate: number; standardError: number; verdict: 'straight' | 'still-in-break-in' | 'accelerating' } | null;
  /** the break-in transient fitted over the whole log (line + one exponential), when one is visible */
  transient: TransientCheck | null;
  /** true when the voltage is still settling: no rate and no interval are given */
  stillInBreakIn: boolean;
  /** the assumptions behind the interval, in words */
  intervalAssumptions: string;
  /** the method in one sentence, for hover text */
  method: string;
  notes: string[];
}

const fmt = (value: number, digits: number): string => value.toFixed(digits);

/** How many standard errors apart the two halves' slopes must be to call the line bent. */
const BEND_STANDARD_ERRORS = 3;
/** …and by at least this much, V/h (1 µV/h): smaller bends do not matter for a rate. */
const BEND_MIN_SLOPE = 1e-6;

const INTERVAL_ASSUMPTIONS =
  'the voltage after break-in is a straight line (one per segment, common slope) plus noise whose 1 h block ' +
  'means follow an AR(1) process; the lag-1 correlation is estimated from the residuals with its small-sample ' +
  'bias added back, and the effective number of independent blocks sets the standard error and the t degrees of ' +
  'freedom; drifts slower than the fit window cannot be told from the slope';

function rateOf(fit: TrendFit | null): { rate: number | null; low: number | null; high: number | null } {
  if (!fit) return { rate: null, low: null, high: null };
  // The rate is the negated slope, so the slope's upper bound becomes the rate's lower bound.
  return { rate: -fit.slope * 1e6, low: -fit.high * 1e6, high: -fit.low * 1e6 };
}

/** The options, checked, with their defaults. */
interface CheckedOptions {
  lossFraction: number;
  confidence: number;
  blockHours: number;
}

/** Step 1: the curve and the options are usable, or a RangeError says which is not. */
function checkOptions(curve: CurveData, options: DurabilityOptions): CheckedOptions & { tIn: Float64Array } {
  if (curve.kind !== 'durability' && curve.kind !== 'hold') {
    throw new RangeError(`durabilityMetrics: curve kind must be 'durability' or 'hold', got '${curve.kind}'`);
  }
  const tIn = curve.tHours;
  if (!tIn) throw new RangeError('durabilityMetrics: curve must have a time column (tHours), got none');
  if (tIn.length !== curve.v.length || tIn.length !== curve.j.length) {
    throw new RangeError(
      `durabilityMetrics: time, current and voltage must have the same length, got ${tIn.length}, ${curve.j.length} and ${curve.v.length}`,
    );
  }
  const lossFraction = options.lossFraction ?? 0.1;
  if (!(lossFraction > 0 && lossFraction < 1)) throw new RangeError(`durabilityMetrics: lossFraction must be in (0, 1), got ${lossFraction}`);
  const confidence = options.confidence ?? 0.95;
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`durabilityMetrics: confidence must be in (0, 1), got ${confidence}`);
  const blockHours = options.blockHours ?? 1;
  if (!(Number.isFinite(blockHours) && blockHours >= 0)) throw new RangeError(`durabilityMetrics: blockHours must be ≥ 0, got ${blockHours}`);
  if (options.breakInHours !== undefined && !(Number.isFinite(options.breakInHours) && options.breakInHours >= 0)) {
    throw new RangeError(`durabilityMetrics: breakInHours must be a number ≥ 0, got ${options.breakInHours}`);
  }
  for (const window of options.windows ?? []) {
    if (!(Number.isFinite(window.fromHours) && Number.isFinite(window.toHours) && window.toHours > window.fromHours)) {
      throw new RangeError(`durabilityMetrics: a window needs finite fromHours < toHours, got ${window.fromHours} to ${window.toHours}`);
    }
  }
  return { tIn, lossFraction, confidence, blockHours };
}

/** Step 2: rows with a non-finite value cannot be placed on the line; drop them and say so. */
function dropNonFiniteRows(curve: CurveData, tIn: Float64Array, notes: string[]): { t: Float64Array; v: Float64Array; j: Float64Array } {
  let t: Float64Array = tIn;
  let v: Float64Array = curve.v;
  let j: Float64Array = curve.j;
  let finiteRows = 0;
  for (let i = 0; i < tIn.length; i++) {
    if (Number.isFinite(tIn[i]) && Number.isFinite(curve.v[i]) && Number.isFinite(curve.j[i])) finiteRows++;
  }
  if (finiteRows < tIn.length) {
    t = new Float64Array(finiteRows);
    v = new Float64Array(finiteRows);
    j = new Float64Array(finiteRows);
    let kept = 0;
    for (let i = 0; i < tIn.length; i++) {
      if (Number.isFinite(tIn[i]) && Number.isFinite(curve.v[i]) && Number.isFinite(curve.j[i])) {
        t[kept] = tIn[i];
        v[kept] = curve.v[i];
        j[kept] = curve.j[i];
        kept++;
      }
    }
    notes.push(`${tIn.length - finiteRows} rows with a missing or non-numeric value were left out`);
  }
  return { t, v, j };
}

/** The result when no rate can be given: everything empty but the reason, the options and what is known of the run. */
function noRate(t: Float64Array, options: DurabilityOptions, checked: CheckedOptions, notes: readonly string[], reason: string, breakInRule: string): DurabilityMetrics {
  const n = t.length;
  return {
    degradationRate: null,
    low: null,
    high: null,
    confidence: checked.confidence,
    breakInHours: options.breakInHours ?? (n > 0 ? t[0] : 0),
    breakInRule,
    breakInSource: options.breakInHours !== undefined ? 'user' : 'fallback',
    fitWindow: null,
    hoursRun: n > 1 ? t[n - 1] - t[0] : 0,
    voltageLossMv: null,
    lossFraction: checked.lossFraction,
    hoursToLoss: null,
    projectedHoursToLoss: null,
    windows: (options.windows ?? []).map((w) => ({ ...w, rate: null, low: null, high: null, n: 0 })),
    interruptions: [],
    segments: [],
    autocorrelation: null,
    linearity: null,
    transient: null,
    stillInBreakIn: false,
    intervalAssumptions: INTERVAL_ASSUMPTIONS,
    method: '',
    notes: [...notes, reason],
  };
}

/** Step 3: a time reset (a second run appended) becomes a continuing clock, so that hours keep adding up. */
function continueClock(tIn: Float64Array, interruptions: Interruption[], notes: string[]): Float64Array {
  let t = tIn;
  const n = t.length;
  let hasReset = false;
  for (const event of interruptions) if (event.kind === 'restart' && event.voltageStep === null) hasReset = true;
  if (hasReset) {
    const run = new Float64Array(n);
    let offset = 0;
    run[0] = t[0];
    for (let i = 1; i < n; i++) {
      if (t[i] < t[i - 1]) {
        const nextStep = i + 1 < n && t[i + 1] > t[i] ? t[i + 1] - t[i] : 0;
        offset = run[i - 1] - t[i] + nextStep;
        notes.push(`time went back at row ${i + 1}; later rows were moved on by ${fmt(offset, 2)} h to continue the run clock`);
      }
      run[i] = t[i] + offset;
    }
    t = run;
    for (const event of interruptions) {
      if (event.kind === 'current-change') {
        event.startHours = t[event.index];
        event.endHours = t[event.endIndex - 1];
      } else {
        event.startHours = t[event.index - 1];
        event.endHours = t[event.index];
      }
    }
  }
  return t;
}

/** The rows the line is fitted to, and where its segments start (restarts, returns from another current). */
interface FitRows {
  tFit: Float64Array;
  vFit: Float64Array;
  segmentStarts: number[];
  segmentKind: Map<number, 'restart' | 'current-change'>;
  /** tFit and vFit checked once, with running sums, shared by every fit below */
  series: TrendSeries;
}

/**
 * Step 4: rows at another current do not belong to this constant-current line; restarts and the
 * return from another current begin new segments.
 */
function rowsToFit(t: Float64Array, v: Float64Array, interruptions: Interruption[], notes: string[]): FitRows {
  const n = t.length;
  const excluded = new Uint8Array(n);
  const boundaryKind = new Map<number, 'restart' | 'current-change'>();
  let excludedRows = 0;
  for (const event of interruptions) {
    if (event.kind === 'current-change') {
      for (let i = event.index; i < event.endIndex; i++) {
        if (!excluded[i]) excludedRows++;
        excluded[i] = 1;
      }
      if (event.endIndex < n) boundaryKind.set(event.endIndex, 'current-change');
    } else if (event.kind === 'restart') {
      boundaryKind.set(event.index, 'restart');
    }
  }
  let tFit = t;
  let vFit = v;
  const segmentStarts: number[] = [];
  const segmentKind = new Map<number, 'restart' | 'current-change'>();
  if (excludedRows > 0) {
    tFit = new Float64Array(n - excludedRows);
    vFit = new Float64Array(n - excludedRows);
    let kept = 0;
    let pending: 'restart' | 'current-change' | null = null;
    for (let i = 0; i < n; i++) {
      const kind = boundaryKind.get(i);
      if (kind) pending = kind;
      if (excluded[i]) continue;
      if (pending) {
        if (kept > 0 && !segmentKind.has(kept)) {
          segmentStarts.push(kept);
          segmentKind.set(kept, pending);
        }
        pending = null;
      }
      tFit[kept] = t[i];
      vFit[kept] = v[i];
      kept++;
    }
    notes.push(`${excludedRows} rows at another current density were left out of the fit`);
  } else {
    for (const [index, kind] of boundaryKind) {
      segmentStarts.push(index);
      segmentKind.set(index, kind);
    }
    segmentStarts.sort((a, b) => a - b);
  }
  return { tFit, vFit, segmentStarts, segmentKind, series: prepareTrendSeries(tFit, vFit) };
}

const BREAK_IN_RULE_USER = 'set by the user';

/** Step 5: break-in: the user's value wins; otherwise the moving-window rule; otherwise a stated fallback. */
function chooseBreakIn(rows: FitRows, options: DurabilityOptions, blockHours: number, notes: string[]) {
  const { tFit, vFit, segmentStarts, series } = rows;
  let breakInHours: number;
  let breakInRule: string;
  let breakInSource: DurabilityMetrics['breakInSource'];
  if (options.breakInHours !== undefined) {
    breakInHours = options.breakInHours;
    breakInRule = BREAK_IN_RULE_USER;
    breakInSource = 'user';
  } else {
    const detected = detectBreakIn(tFit, vFit, { ...options.breakIn, segmentStarts, blockHours, series });
    breakInRule = detected.rule;
    if (detected.breakInHours !== null) {
      breakInHours = detected.breakInHours;
      breakInSource = 'detected';
      notes.push(detected.note ?? `break-in detected: ends at ${fmt(breakInHours, 1)} h`);
    } else if (detected.status === 'not-settled') {
      breakInHours = tFit[0] + (tFit[tFit.length - 1] - tFit[0]) / 2;
      breakInSource = 'fallback';
      notes.push(`break-in not found (${detected.note}); fitted over the second half of the run, from ${fmt(breakInHours, 1)} h`);
    } else {
      breakInHours = tFit[0];
      breakInSource = 'fallback';
      notes.push(`break-in rule not applied (${detected.note}); fitted from the first row`);
    }
  }
  return { breakInHours, breakInRule, breakInSource };
}

/**
 * Step 6: a transient still under way at the chosen end biases the rate: move the end later
 * (detected or fallback break-in) or warn (set by the user); stillSettling when it never settles
 * inside the run (then no rate is given).
 */
function settleBreakIn(rows: FitRows, chosen: ReturnType<typeof chooseBreakIn>, blockHours: number, notes: string[]) {
  const { tFit, vFit, segmentStarts } = rows;
  let { breakInHours, breakInRule } = chosen;
  const { breakInSource } = chosen;
  const transient = checkBreakInTransient(tFit, vFit, breakInHours, { blockHours, segmentStarts });
  const transientText = transient
    ? `a fitted break-in transient (${fmt(transient.amplitudeV * 1000, 1)} mV, time constant ${fmt(transient.tauHours, 0)} h) would bias a rate fitted from ` +
      `${fmt(breakInHours, 1)} h by ${fmt(transient.biasAtBreakIn, 1)} µV/h (its standard error ${fmt(transient.rateStandardErrorAtBreakIn, 1)} µV/h)`
    : '';
  let stillSettling = false;
  if (transient && transient.settledAtHours !== breakInHours) {
    if (breakInSource === 'user') {
      notes.push(`${transientText}; consider a later break-in`);
    } else if (transient.settledAtHours === null) {
      stillSettling = true;
    } else {
      notes.push(`break-in moved from ${fmt(breakInHours, 1)} h to ${fmt(transient.settledAtHours, 1)} h: ${transientText}`);
      breakInHours = transient.settledAtHours;
      breakInRule += '; moved later to where a line-plus-exponential fit of the whole log shows the transient biasing the rate by at most half its standard error';
    }
  }
  return { breakInHours, breakInRule, breakInSource, transient, transientText, stillSettling };
}

/** Step 8: each segment's own rate and its ends on the common-slope line. */
function segmentsOf(trend: TrendFit, rows: FitRows, from: number, blockHours: number, confidence: number): DurabilitySegment[] {
  const { tFit, vFit, segmentKind, series } = rows;
  const slope = trend.slope;
  return trend.segments.map((segment) => {
    const alone = segment.points >= 3 ? fitTrend(tFit, vFit, { from: segment.fromIndex, to: segment.toIndex, blockHours, confidence, series }) : null;
    return {
      fromHours: segment.fromHours,
      toHours: segment.toHours,
      n: segment.points,
      startedBy: segment.fromIndex === from ? 'start' : (segmentKind.get(segment.fromIndex) ?? 'start'),
      ...rateOf(alone),
      startV: segment.meanV + slope * (segment.fromHours - segment.meanT),
      endV: segment.meanV + slope * (segment.toHours - segment.meanT),
    };
  });
}

/** Step 9: the straight line checked against its halves: a break-in still under way bends it. */
function checkHalves(rows: FitRows, from: number, blockHours: number, confidence: number) {
  const { tFit, vFit, segmentStarts, series } = rows;
  let linearity: DurabilityMetrics['linearity'] = null;
  const fitFromHours = tFit[from];
  const fitToHours = tFit[tFit.length - 1];
  const middle = lowerBound(tFit, fitFromHours + (fitToHours - fitFromHours) / 2);
  const firstHalf = fitTrend(tFit, vFit, { from, to: middle, segmentStarts, blockHours, confidence, series });
  const secondHalf = fitTrend(tFit, vFit, { from: middle, to: tFit.length, segmentStarts, blockHours, confidence, series });
  if (firstHalf && secondHalf) {
    const difference = firstHalf.slope - secondHalf.slope;
    const standardError = Math.sqrt(firstHalf.slopeSE ** 2 + secondHalf.slopeSE ** 2);
    const bent = Math.abs(difference) > Math.max(BEND_STANDARD_ERRORS * standardError, BEND_MIN_SLOPE);
    // A settling transient: the voltage falls faster early on, or rises early on (conditioning gain).
    const settling = bent && (firstHalf.slope < secondHalf.slope || firstHalf.slope > 0);
    linearity = {
      firstHalfRate: -firstHalf.slope * 1e6,
      secondHalfRate: -secondHalf.slope * 1e6,
      standardError: standardError * 1e6,
      verdict: !bent ? 'straight' : settling ? 'still-in-break-in' : 'accelerating',
    };
  }
  const halvesText = linearity
    ? `first half of the fit window ${fmt(linearity.firstHalfRate, 1)} µV/h, second half ${fmt(linearity.secondHalfRate, 1)} µV/h (±${fmt(linearity.standardError, 1)} µV/h)`
    : '';
  return { linearity, halvesText, fitFromHours, fitToHours };
}

/** Step 10: hours to a stated loss, read off the fitted lines inside the data only; a projection beyond it is kept apart. */
function hoursToLossOf(trend: TrendFit, segments: DurabilitySegment[], lossFraction: number, notes: string[]) {
  const first = segments[0];
  const slope = trend.slope;
  const target = first.startV * (1 - lossFraction);
  let hoursToLoss: number | null = null;
  for (let s = 0; s < trend.segments.length && hoursToLoss === null; s++) {
    const segment = segments[s];
    if (segment.startV <= target) hoursToLoss = segment.fromHours;
    else if (segment.endV <= target) hoursToLoss = trend.segments[s].meanT + (target - trend.segments[s].meanV) / slope;
  }
  let projectedHoursToLoss: DurabilityMetrics['projectedHoursToLoss'] = null;
  if (hoursToLoss === null) {
    if (slope < 0) {
      const lastTrend = trend.segments[trend.segments.length - 1];
      projectedHoursToLoss = { hours: lastTrend.meanT + (target - lastTrend.meanV) / slope, projected: true };
      notes.push(
        `${fmt(lossFraction * 100, 0)} % voltage loss not reached in the data; the straight line would reach it at ` +
          `${fmt(projectedHoursToLoss.hours, 0)} h (projected — an extrapolation)`,
      );
    } else {
      notes.push(`${fmt(lossFraction * 100, 0)} % voltage loss not reached, and the fitted voltage is not falling`);
    }
  }
  return { hoursToLoss, projectedHoursToLoss };
}

/**
 * Durability metrics: degradation rate = −slope of V against time after break-in, µV/h.
 * Steps: drop rows with non-finite values; find interruptions (gaps, restarts, current changes); turn
 * time resets into a continuing clock; leave out rows at another current; split the run into segments
 * at restarts and current changes; find (or take) the end of break-in; fit one common slope with a
 * separate intercept per segment on 1 h block means (a restart shifts V, it must not be fitted
 * through); widen the slope's standard error for lag-1 autocorrelation of the block residuals
 * (effective n = N·(1 − ρ)/(1 + ρ)) and take the t quantile with df = effective n − segments − 1.
 * Hours to loss are read only inside the data; beyond it the projected value is reported separately.
 * An open-circuit hold ('hold', current ≈ 0) goes through the same steps.
 * Reference: degradation rate as −dV/dt after break-in (common practice in the trade); Santer et al. (2000) J. Geophys. Res. 105,
 * 7337 (effective sample size); Draper & Smith, "Applied Regression Analysis" (common-slope model).
 * Cost: O(n) time (break-in search O(4n)); O(n) memory only when rows must be dropped or re-timed.
 * @throws RangeError when the curve is a polarization curve, has no time column, its arrays differ in
 *   length, or an option is out of range.
 * @example durabilityMetrics(curve).degradationRate // e.g. 8.1 (µV/h)
 */
export function durabilityMetrics(curve: CurveData, options: DurabilityOptions = {}): DurabilityMetrics {
  const checked = checkOptions(curve, options);
  const { tIn, lossFraction, confidence, blockHours } = checked;
  const notes: string[] = [];
  if (curve.kind === 'hold') notes.push('open-circuit hold: the rate is the loss of open-circuit voltage, fitted the same way');
  const rowsIn = dropNonFiniteRows(curve, tIn, notes);
  const { v, j } = rowsIn;
  const n = rowsIn.t.length;
  const empty = (reason: string, breakInRule: string) => noRate(rowsIn.t, options, checked, notes, reason, breakInRule);
  if (n < 3) return empty(`degradation rate not computed: ${n} usable rows, at least 3 needed`, options.breakInHours !== undefined ? BREAK_IN_RULE_USER : '');

  // every row left is finite (dropNonFiniteRows), so the detection need not check them again
  const interruptions = detectInterruptions(rowsIn.t, v, j, { ...options.interruptions, valuesChecked: true });
  const t = continueClock(rowsIn.t, interruptions, notes);
  const hoursRun = t[n - 1] - t[0];
  const rows = rowsToFit(t, v, interruptions, notes);
  const { tFit, vFit, segmentStarts, series } = rows;
  for (const event of interruptions) notes.push(`${event.kind} at ${fmt(event.startHours, 1)} h: ${event.detail}`);
  if (tFit.length < 3) return { ...empty('degradation rate not computed: fewer than 3 rows at the held current', ''), interruptions, hoursRun };

  const { breakInHours, breakInRule, breakInSource, transient, transientText, stillSettling } = settleBreakIn(rows, chooseBreakIn(rows, options, blockHours, notes), blockHours, notes);
  if (stillSettling) {
    const fitFrom = lowerBound(tFit, breakInHours);
    notes.push(`still in break-in: ${transientText}, and it does not fade enough before the end of the run; no degradation rate is given`);
    return {
      ...empty('degradation rate not given: still in break-in', breakInRule),
      notes,
      breakInHours,
      breakInSource,
      fitWindow: { fromHours: tFit[fitFrom], toHours: tFit[tFit.length - 1] },
      interruptions,
      hoursRun,
      transient,
      stillInBreakIn: true,
      method: 'straight line of V against time after break-in, checked against a line-plus-exponential fit of the whole log: the transient has not faded, so no rate',
    };
  }

  const from = lowerBound(tFit, breakInHours);
  const trend = fitTrend(tFit, vFit, { from, to: tFit.length, segmentStarts, blockHours, confidence, series });
  const windows: DurabilityWindow[] = (options.windows ?? []).map((window) => {
    const windowFrom = lowerBound(tFit, window.fromHours);
    const windowTo = upperBound(tFit, window.toHours);
    const windowFit = fitTrend(tFit, vFit, { from: windowFrom, to: windowTo, segmentStarts, blockHours, confidence, series });
    return { fromHours: window.fromHours, toHours: window.toHours, ...rateOf(windowFit), n: windowTo - windowFrom };
  });
  if (!trend) {
    return {
      ...empty(`degradation rate not computed: too few ${blockHours} h blocks after break-in (${fmt(breakInHours, 1)} h)`, breakInRule),
      breakInHours,
      breakInSource,
      interruptions,
      hoursRun,
      windows,
    };
  }

  const { rate, low, high } = rateOf(trend);
  const segments = segmentsOf(trend, rows, from, blockHours, confidence);
  const first = segments[0];
  const last = segments[segments.length - 1];
  const voltageLossMv = (first.startV - last.endV) * 1000;
  if (segments.length > 1) {
    let stepSum = 0;
    for (let s = 1; s < segments.length; s++) stepSum += segments[s].startV - segments[s - 1].endV;
    notes.push(
      `${segments.length} segments fitted with one common slope and separate intercepts; the voltage loss includes ` +
        `${stepSum >= 0 ? '+' : '−'}${fmt(Math.abs(stepSum) * 1000, 1)} mV of steps between segments`,
    );
  }

  const { linearity, halvesText, fitFromHours, fitToHours } = checkHalves(rows, from, blockHours, confidence);
  if (linearity?.verdict === 'accelerating') notes.push(`the loss accelerates: ${halvesText}; the rate is the average over the fit window`);
  if (linearity?.verdict === 'still-in-break-in') {
    notes.push(
      `still in break-in: the voltage is still settling after ${fmt(breakInHours, 1)} h (${halvesText}, more than ` +
        `${BEND_STANDARD_ERRORS} standard errors apart), so no degradation rate is given` +
        (breakInSource === 'user' ? '; set a later break-in or wait for a longer run' : '; the run is too short to separate the break-in from the long-run loss'),
    );
    return {
      ...empty(`degradation rate not given: still in break-in`, breakInRule),
      notes,
      breakInHours,
      breakInSource,
      fitWindow: { fromHours: fitFromHours, toHours: fitToHours },
      interruptions,
      hoursRun,
      windows,
      segments,
      autocorrelation: { lag1: trend.lag1, effectiveN: trend.effectiveN, blocks: trend.blocks, seInflation: trend.slopeSE / trend.slopeSEUncorrected },
      linearity,
      transient,
      stillInBreakIn: true,
      method: `straight line of V against time after break-in (${fmt(breakInHours, 1)} h) checked against its two halves: they differ, the voltage is still settling`,
    };
  }

  const { hoursToLoss, projectedHoursToLoss } = hoursToLossOf(trend, segments, lossFraction, notes);

  const seInflation = trend.slopeSE / trend.slopeSEUncorrected;
  notes.push(
    `residuals of the ${blockHours} h block means have lag-1 autocorrelation ${fmt(trend.lag1, 2)}: ` +
      `effective n ${fmt(trend.effectiveN, 0)} of ${trend.blocks} blocks, standard error ×${fmt(seInflation, 2)}`,
  );
  const method =
    `straight line of V against time after break-in (${fmt(breakInHours, 1)} h), fitted to ${blockHours} h block means` +
    (segments.length > 1 ? ' with a common slope and a separate intercept per segment' : '') +
    `; ${fmt(confidence * 100, 0)} % interval from an AR(1) error model: the slope standard error widened for the ` +
    `lag-1 autocorrelation of the block residuals (bias-corrected, effective n ${fmt(trend.effectiveN, 0)} of ${trend.blocks} blocks) ` +
    `and Student's t with ${fmt(trend.df, 1)} df; the line was checked against its two halves`;

  return {
    degradationRate: rate,
    low,
    high,
    confidence,
    breakInHours,
    breakInRule,
    breakInSource,
    fitWindow: { fromHours: tFit[from], toHours: tFit[tFit.length - 1] },
    hoursRun,
    voltageLossMv,
    lossFraction,
    hoursToLoss,
    projectedHoursToLoss,
    windows,
    interruptions,
    segments,
    autocorrelation: { lag1: trend.lag1, effectiveN: trend.effectiveN, blocks: trend.blocks, seInflation },
    linearity,
    transient,
    stillInBreakIn: false,
    intervalAssumptions: INTERVAL_ASSUMPTIONS,
    method,
    notes,
  };
}

// Finds the end of the break-in (conditioning) period of a durability log: the early hours in which
// the voltage moves much faster than its long-run trend and must be left out of the degradation fit.
import { fitTrend, type TrendSeries } from './trend-fit';
import { lowerBound } from './sorted-search';
import { robustSd } from '../stats/robust-sd';

export interface BreakInOptions {
  /** width of the moving straight-line window, h; default 24 */
  windowHours?: number;
  /** spacing of the window starts, h; default windowHours / 4 */
  stepHours?: number;
  /** window slopes must stay within this multiple of the long-run slope; default 3 */
  slopeFactor?: number;
  /** ...or within this many robust SDs of the window slopes of the second half, whichever is wider; default 4 */
  spreadMultiplier?: number;
  /** ...and never tighter than this, µV/h (a near-flat run would otherwise never "settle"); default 5 */
  minToleranceUvPerH?: number;
  /** block width for the fits, h; default 1 */
  blockHours?: number;
  /** row indices where a new segment starts (restart, current change): separate intercepts there */
  segmentStarts?: readonly number[];
  /** the same t and v, checked, with running sums (prepareTrendSeries): every window fit reads them */
  series?: TrendSeries;
}

export interface BreakInResult {
  /** end of break-in on the log's time axis, h; null when the rule could not be applied or never settled */
  breakInHours: number | null;
  /** the rule, with its numbers, in words */
  rule: string;
  /** degradation rate of the second half of the run, µV/h (positive = losing voltage); null if not fitted */
  longRunRateUvPerH: number | null;
  /** found = break-in end detected; none-visible = agrees from the start; not-settled = still moving at mid-run;
   *  not-applicable = run too short or too sparse for the rule */
  status: 'found' | 'none-visible' | 'not-settled' | 'not-applicable';
  /** why breakInHours is null, or a caveat */
  note: string | null;
}

/**
 * End of the break-in period by a moving-window rule.
 * Rule: fit the long-run slope b_L to the second half of the run. Slide a 24 h straight-line window in
 * 6 h steps over the whole run. The windows that start in the second half show how far a settled
 * window slope wanders from b_L (drifts, autocorrelated noise): call their robust SD σ_w. A window
 * starting in the first half "agrees" when |b_w − b_L| ≤ max(2·|b_L|, 4·σ_w, 5 µV/h) — its slope lies
 * within 3× the long-run slope, unless the log is too noisy to tell that closely. Break-in ends at
 * the END of the last window up to mid-run that disagrees — deliberately conservative: a window's slope
 * averages 24 h, so the transient may still be visible right up to that window's end, and a little
 * break-in left in the fit biases the rate more than a few hours left out cost. If none disagrees, the
 * run has no visible break-in (result = first time); if the last one still disagrees, it "did not
 * settle" (null). Windows too sparse to fit (gaps) are skipped.
 * Why this shape: an empirical σ_w is honest for any noise structure, where a per-window standard error
 * from 24 blocks understates autocorrelated noise; searching only the first half keeps one noisy late
 * window from moving the answer to the end of a long run.
 * Reference: none single — common practice judges "voltage stabilised" by eye on a moving slope; the
 * spread is the MAD-based robust SD (Rousseeuw & Croux 1993).
 * Cost: O(n · windowHours / stepHours) time, O(blocks) memory.
 * @throws RangeError on mismatched lengths, non-finite values, decreasing time, or options out of range.
 * @example detectBreakIn(curve.tHours, curve.v).breakInHours // e.g. 54
 */
export function detectBreakIn(t: ArrayLike<number>, v: ArrayLike<number>, options: BreakInOptions = {}): BreakInResult {
  if (t.length !== v.length) throw new RangeError(`detectBreakIn: t and v must have the same length, got ${t.length} and ${v.length}`);
  const windowHours = options.windowHours ?? 24;
  const stepHours = options.stepHours ?? windowHours / 4;
  const slopeFactor = options.slopeFactor ?? 3;
  const spreadMultiplier = options.spreadMultiplier ?? 4;
  const minTolerance = options.minToleranceUvPerH ?? 5;
  const blockHours = options.blockHours ?? 1;
  const checks: [string, number, boolean][] = [
    ['windowHours', windowHours, windowHours > 0],
    ['stepHours', stepHours, stepHours > 0],
    ['slopeFactor', slopeFactor, slopeFactor >= 1],
    ['spreadMultiplier', spreadMultiplier, spreadMultiplier >= 0],
    ['minToleranceUvPerH', minTolerance, minTolerance >= 0],
    ['blockHours', blockHours, blockHours >= 0],
  ];
  for (const [name, value, ok] of checks) {
    if (!Number.isFinite(value) || !ok) throw new RangeError(`detectBreakIn: ${name} is out of range, got ${value}`);
  }
  const series = options.series?.t === t && options.series.v === v ? options.series : undefined;
  // a prepared series was checked when it was made
  for (let i = series ? t.length : 0; i < t.length; i++) {
    if (!Number.isFinite(t[i]) || !Number.isFinite(v[i])) {
      throw new RangeError(`detectBreakIn: values must be finite numbers, got t[${i}] = ${t[i]}, v[${i}] = ${v[i]}`);
    }
    if (i > 0 && t[i] < t[i - 1]) throw new RangeError(`detectBreakIn: time must not decrease, got t[${i}] = ${t[i]} after ${t[i - 1]}`);
  }

  const rule =
    `break-in ends at the end of the last ${windowHours} h straight-line window (windows started every ` +
    `${stepHours} h up to mid-run) whose slope is not within ` +
    `max(${slopeFactor - 1}× |long-run slope|, ${spreadMultiplier}× the robust spread of the same windows over the ` +
    `second half, ${minTolerance} µV/h) of the long-run slope (the fit over the second half of the run), ` +
    `i.e. within ${slopeFactor}× the long-run rate unless the log is noisier than that`;
  const n = t.length;
  if (n < 3) return { breakInHours: null, rule, longRunRateUvPerH: null, status: 'not-applicable', note: `too few points (${n})` };
  const t0 = t[0];
  const tEnd = t[n - 1];
  const span = tEnd - t0;
  if (span < 2 * windowHours) {
    return {
      breakInHours: null,
      rule,
      longRunRateUvPerH: null,
      status: 'not-applicable',
      note: `run of ${span.toFixed(1)} h is shorter than two ${windowHours} h windows`,
    };
  }
  const segmentStarts = options.segmentStarts ?? [];
  const midHours = t0 + span / 2;
  const longRun = fitTrend(t, v, { from: lowerBound(t, midHours), to: n, segmentStarts, blockHours, series });
  if (!longRun) {
    return { breakInHours: null, rule, longRunRateUvPerH: null, status: 'not-applicable', note: 'too few points in the second half to fit the long-run slope' };
  }
  const baseTolerance = Math.max((slopeFactor - 1) * Math.abs(longRun.slope), minTolerance * 1e-6);

  // Window slopes, from the start to the end; those starting in the second half measure how much a
  // settled window slope wanders (drifts, autocorrelated noise) and set the noise part of the tolerance.
  const starts: number[] = [];
  const slopes: number[] = [];
  const standardErrors: number[] = [];
  for (let k = 0; ; k++) {
    const start = t0 + k * stepHours;
    if (start + windowHours > tEnd + 1e-9) break;
    const from = lowerBound(t, start);
    const to = lowerBound(t, start + windowHours);
    if (to - from < 3) continue;
    const windowFit = fitTrend(t, v, { from, to, segmentStarts, blockHours, series });
    // A window must cover most of its width to count; a gap would otherwise leave a short, noisy fit.
    if (!windowFit || t[to - 1] - t[from] < windowHours / 2) continue;
    starts.push(start);
    slopes.push(windowFit.slope);
    standardErrors.push(windowFit.slopeSE);
  }
  const settledDeviations: number[] = [];
  let largestSettledSE = 0;
  for (let k = 0; k < starts.length; k++) {
    if (starts[k] < midHours - 1e-9) continue;
    settledDeviations.push(slopes[k] - longRun.slope);
    largestSettledSE = Math.max(largestSettledSE, standardErrors[k]);
  }
  // Too few settled windows for a spread: fall back on the largest (autocorrelation-widened) standard error.
  const spread = settledDeviations.length >= 5 ? robustSd(settledDeviations) : largestSettledSE;
  const tolerance = Math.max(baseTolerance, spreadMultiplier * spread);
  const agrees: boolean[] = [];
  let examined = 0;
  for (let k = 0; k < starts.length && starts[k] <= midHours + 1e-9; k++) {
    agrees.push(Math.abs(slopes[k] - longRun.slope) <= tolerance);
    examined++;
  }
  const longRunRateUvPerH = -longRun.slope * 1e6;
  if (examined === 0) {
    return { breakInHours: null, rule, longRunRateUvPerH, status: 'not-applicable', note: 'no window in the first half had enough points to fit' };
  }
  let lastDisagree = -1;
  for (let k = 0; k < agrees.length; k++) if (!agrees[k]) lastDisagree = k;
  if (lastDisagree < 0) return { breakInHours: t0, rule, longRunRateUvPerH, status: 'none-visible', note: 'no break-in visible: every window agrees from the start' };
  if (lastDisagree === agrees.length - 1) {
    return {
      breakInHours: null,
      rule,
      longRunRateUvPerH,
      status: 'not-settled',
      note: `the voltage had not settled by mid-run (${midHours.toFixed(1)} h): the window starting at ${starts[lastDisagree].toFixed(1)} h still disagrees`,
    };
  }
  return { breakInHours: Math.min(starts[lastDisagree] + windowHours, tEnd), rule, longRunRateUvPerH, status: 'found', note: null };
}

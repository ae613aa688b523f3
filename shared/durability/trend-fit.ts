// Straight-line trend of a voltage log with an honest standard error: durability residuals are
// autocorrelated (slow drifts of temperature, humidity, gas supply), so the textbook OLS standard
// error of the slope is too small and its 95 % interval would miss the true rate far too often.
import { tQuantile } from '../stats/distributions';

export interface TrendFitOptions {
  /** index range [from, to) of the points to use; default all */
  from?: number;
  to?: number;
  /** indices where a new segment starts (after a restart or a current change); each segment gets its own intercept */
  segmentStarts?: readonly number[];
  /** width of the averaging blocks, h; 0 = every point is its own block. Default 1 */
  blockHours?: number;
  /** confidence level of the slope interval; default 0.95 */
  confidence?: number;
  /**
   * running sums of the same t and v (prepareTrendSeries): block means are then read from them in
   * O(blocks · log n) instead of a pass over every point, and the points are not checked again
   */
  series?: TrendSeries;
}

/** t and v checked once, with their running sums, for many fits over ranges of one long log. */
export interface TrendSeries {
  t: ArrayLike<number>;
  v: ArrayLike<number>;
  /** sumT[k] = Σ_{i<k·SUM_STRIDE} (t[i] − t[0]); sumV likewise about v[0] (compensated summation) */
  sumT: Float64Array;
  sumV: Float64Array;
}

/** Running sums are kept every this many rows; a range's ends are summed from the rows themselves. */
const SUM_STRIDE = 16;

/**
 * Checks t and v once (finite, time not decreasing) and keeps their running sums, so that every
 * later fitTrend over a range of them (break-in windows, halves, segments) reads a block's sum as a
 * difference of two running sums. Sums are about the first point; each group of 16 rows is summed
 * directly and the groups are added with Kahan's compensation, so a block mean is within a few units
 * in the last place of the running sum (≈ 1e-9 h and 1e-12 V for a 5,000 h, 10⁶-row log) of the
 * direct sum — far below any slope it feeds.
 * Cost: O(n) time, 2(n / 16 + 2) doubles.
 * @throws RangeError as fitTrend does (mismatched lengths, non-finite values, decreasing time).
 */
export function prepareTrendSeries(t: ArrayLike<number>, v: ArrayLike<number>): TrendSeries {
  const n = t.length;
  if (n !== v.length) throw new RangeError(`fitTrend: t and v must have the same length, got ${n} and ${v.length}`);
  const groups = Math.floor(n / SUM_STRIDE);
  const sumT = new Float64Array(groups + 2);
  const sumV = new Float64Array(groups + 2);
  const t0 = n > 0 ? t[0] : 0;
  const v0 = n > 0 ? v[0] : 0;
  let st = 0;
  let ct = 0;
  let sv = 0;
  let cv = 0;
  let previousT = -Infinity;
  for (let g = 0; g * SUM_STRIDE < n; g++) {
    const end = Math.min(n, (g + 1) * SUM_STRIDE);
    let groupT = 0;
    let groupV = 0;
    for (let i = g * SUM_STRIDE; i < end; i++) {
      const ti = t[i];
      const vi = v[i];
      // ti − ti is 0 for a finite number and NaN otherwise: one test for both
      if (ti - ti !== 0 || vi - vi !== 0) throw new RangeError(`fitTrend: values must be finite numbers, got t[${i}] = ${ti}, v[${i}] = ${vi}`);
      if (ti < previousT) throw new RangeError(`fitTrend: time must not decrease, got t[${i}] = ${ti} after ${previousT}`);
      previousT = ti;
      groupT += ti - t0;
      groupV += vi - v0;
    }
    // Kahan's compensated sum over the groups: the rounding error of each addition is carried in ct / cv
    const yt = groupT - ct;
    let next = st + yt;
    ct = next - st - yt;
    st = next;
    const yv = groupV - cv;
    next = sv + yv;
    cv = next - sv - yv;
    sv = next;
    sumT[g + 1] = st;
    sumV[g + 1] = sv;
  }
  return { t, v, sumT, sumV };
}

/** Σ_{i<k} (values[i] − base), from the group sums and the rows after the last whole group. */
function sumBefore(sums: Float64Array, values: ArrayLike<number>, base: number, k: number): number {
  const group = Math.floor(k / SUM_STRIDE);
  let rest = 0;
  for (let i = group * SUM_STRIDE; i < k; i++) rest += values[i] - base;
  return sums[group] + rest;
}

/**
 * One past the last index of the block that starts at `at`: the first index whose block key is larger,
 * found by galloping then halving (keys never decrease along a non-decreasing t).
 */
function blockEnd(t: ArrayLike<number>, at: number, to: number, anchor: number, blockHours: number): number {
  const key = Math.floor((t[at] - anchor) / blockHours);
  let low = at;
  let step = 1;
  let high = at + 1;
  while (high < to && Math.floor((t[high] - anchor) / blockHours) <= key) {
    low = high;
    step *= 2;
    high = at + step;
  }
  if (high > to) high = to;
  while (high - low > 1) {
    const mid = (low + high) >>> 1;
    if (Math.floor((t[mid] - anchor) / blockHours) > key) high = mid;
    else low = mid;
  }
  return high;
}

export interface TrendSegment {
  fromIndex: number;
  /** exclusive */
  toIndex: number;
  fromHours: number;
  toHours: number;
  points: number;
  blocks: number;
  /** centre of the segment's line: the fitted line is V = meanV + slope·(t − meanT) */
  meanT: number;
  meanV: number;
}

export interface TrendFit {
  /** dV/dt, V/h */
  slope: number;
  /** standard error of the slope, corrected for lag-1 autocorrelation, V/h */
  slopeSE: number;
  /** the uncorrected OLS standard error on the block means, V/h (for comparison) */
  slopeSEUncorrected: number;
  /** degrees of freedom of the interval: effective n − segments − 1 (at least 1) */
  df: number;
  /** interval of the slope, V/h */
  low: number;
  high: number;
  confidence: number;
  /** lag-1 autocorrelation of the block residuals, small-sample bias added back, clipped to [0, 0.99] */
  lag1: number;
  /** effective number of independent blocks, blocks·(1 − ρ)/(1 + ρ) */
  effectiveN: number;
  blocks: number;
  points: number;
  blockHours: number;
  segments: TrendSegment[];
}

/**
 * Largest lag-1 correlation used. Block residuals of a log with a drift time constant τ have
 * ρ ≈ e^(−block/τ): 0.99 for 1 h blocks at τ = 100 h. Clipping lower (0.95 was used before) makes
 * the interval far too narrow for slow drifts.
 */
const MAX_LAG1 = 0.99;

/**
 * Common-slope straight-line fit of v against t, with a separate intercept per segment, on block means.
 * Method: (1) average the points in consecutive blocks of blockHours within each segment (this removes
 * short-range noise and makes the cost independent of the logging rate); (2) pooled least squares on the
 * block means: slope = Σ_s Sxy_s / Σ_s Sxx_s (a restart shifts V; a separate intercept per segment keeps
 * that step out of the slope); (3) lag-1 autocorrelation ρ of the residuals of consecutive blocks within
 * a segment, with its small-sample bias (2 + 4ρ)/N added back, clipped to [0, 0.99]; effective
 * n_e = N·(1 − ρ)/(1 + ρ); residual variance RSS / (n_e − S − 1) and the t interval with df = n_e − S − 1
 * (S segments). Assumption: the block residuals follow an AR(1) process (a drift with one time constant)
 * about the straight line; a drift slower than the run itself cannot be told from a slope.
 * Reference: Santer et al. (2000), "Statistical significance of trends and trend differences in
 * layer-average atmospheric temperature time series", J. Geophys. Res. 105(D6), 7337–7356 (effective
 * sample size for AR(1) residuals); Wilks, "Statistical Methods in the Atmospheric Sciences", §5.2;
 * bias of the lag-1 estimate: Kendall (1954), Biometrika 41, 403 and Marriott & Pope (1954), Biometrika
 * 41, 390 give (1 + 3ρ)/N about a fitted mean; (2 + 4ρ)/N about a fitted line is from memory, and the
 * coverage it gives is checked by Monte Carlo (tests/unit/durability/interval-coverage.test.ts).
 * Cost: O(n) time; memory O(number of blocks). With `series`: O(blocks · log n).
 * @returns null when there are too few blocks to estimate a slope and its error (fewer than S + 2).
 * @throws RangeError on mismatched lengths, a bad range or options, non-finite values, or decreasing time.
 * @example fitTrend(tHours, volts, { segmentStarts: [5000] })?.slope // V/h
 */
export function fitTrend(t: ArrayLike<number>, v: ArrayLike<number>, options: TrendFitOptions = {}): TrendFit | null {
  if (t.length !== v.length) throw new RangeError(`fitTrend: t and v must have the same length, got ${t.length} and ${v.length}`);
  const from = options.from ?? 0;
  const to = options.to ?? t.length;
  if (!Number.isInteger(from) || !Number.isInteger(to) || from < 0 || to > t.length || from > to) {
    throw new RangeError(`fitTrend: range must satisfy 0 ≤ from ≤ to ≤ ${t.length} (integers), got from ${from}, to ${to}`);
  }
  const blockHours = options.blockHours ?? 1;
  if (!Number.isFinite(blockHours) || blockHours < 0) throw new RangeError(`fitTrend: blockHours must be ≥ 0, got ${blockHours}`);
  const confidence = options.confidence ?? 0.95;
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`fitTrend: confidence must be in (0, 1), got ${confidence}`);

  const starts: number[] = [from];
  const sortedStarts = [...(options.segmentStarts ?? [])].sort((a, b) => a - b);
  for (const start of sortedStarts) {
    if (!Number.isInteger(start)) throw new RangeError(`fitTrend: segment starts must be integer indices, got ${start}`);
    if (start > from && start < to && start !== starts[starts.length - 1]) starts.push(start);
  }

  // (1) Block means, per segment. Offsets from the block's first point keep the sums small.
  const blockT: number[] = [];
  const blockV: number[] = [];
  const blockSegment: number[] = [];
  const segments: TrendSegment[] = [];
  for (let s = 0; s < starts.length; s++) {
    const segFrom = starts[s];
    const segTo = s + 1 < starts.length ? starts[s + 1] : to;
    if (segFrom >= segTo) continue;
    const segmentIndex = segments.length;
    const segT0 = t[segFrom];
    const series = options.series;
    if (series && blockHours > 0) {
      // the same blocks as the pass below, their sums read off the running sums
      if (series.t !== t || series.v !== v) throw new RangeError('fitTrend: the prepared series belongs to other arrays');
      const tBase = t[0];
      const vBase = v[0];
      let blocksHere = 0;
      for (let i = segFrom; i < segTo; ) {
        const end = blockEnd(t, i, segTo, segT0, blockHours);
        const count = end - i;
        blockT.push(tBase + (sumBefore(series.sumT, t, tBase, end) - sumBefore(series.sumT, t, tBase, i)) / count);
        blockV.push(vBase + (sumBefore(series.sumV, v, vBase, end) - sumBefore(series.sumV, v, vBase, i)) / count);
        blockSegment.push(segmentIndex);
        blocksHere++;
        i = end;
      }
      segments.push({ fromIndex: segFrom, toIndex: segTo, fromHours: t[segFrom], toHours: t[segTo - 1], points: segTo - segFrom, blocks: blocksHere, meanT: 0, meanV: 0 });
      continue;
    }
    let blockKey = NaN;
    let refT = 0;
    let refV = 0;
    let sumDt = 0;
    let sumDv = 0;
    let count = 0;
    let blocksHere = 0;
    let previousT = -Infinity;
    for (let i = segFrom; i < segTo; i++) {
      const ti = t[i];
      const vi = v[i];
      if (!Number.isFinite(ti) || !Number.isFinite(vi)) {
        throw new RangeError(`fitTrend: values must be finite numbers, got t[${i}] = ${ti}, v[${i}] = ${vi}`);
      }
      if (ti < previousT) throw new RangeError(`fitTrend: time must not decrease, got t[${i}] = ${ti} after ${previousT}`);
      previousT = ti;
      const key = blockHours > 0 ? Math.floor((ti - segT0) / blockHours) : i;
      if (key !== blockKey) {
        if (count > 0) {
          blockT.push(refT + sumDt / count);
          blockV.push(refV + sumDv / count);
          blockSegment.push(segmentIndex);
          blocksHere++;
        }
        blockKey = key;
        refT = ti;
        refV = vi;
        sumDt = 0;
        sumDv = 0;
        count = 0;
      }
      sumDt += ti - refT;
      sumDv += vi - refV;
      count++;
    }
    if (count > 0) {
      blockT.push(refT + sumDt / count);
      blockV.push(refV + sumDv / count);
      blockSegment.push(segmentIndex);
      blocksHere++;
    }
    segments.push({
      fromIndex: segFrom,
      toIndex: segTo,
      fromHours: t[segFrom],
      toHours: t[segTo - 1],
      points: segTo - segFrom,
      blocks: blocksHere,
      meanT: 0,
      meanV: 0,
    });
  }

  const blocks = blockT.length;
  const segmentCount = segments.length;
  const dfOls = blocks - segmentCount - 1;
  if (segmentCount === 0 || dfOls < 1) return null;

  // (2) Pooled least squares: centre each segment on its own means.
  let firstBlock = 0;
  let sxx = 0;
  let sxy = 0;
  for (const segment of segments) {
    const lastBlock = firstBlock + segment.blocks;
    let meanT = 0;
    let meanV = 0;
    for (let b = firstBlock; b < lastBlock; b++) {
      meanT += blockT[b];
      meanV += blockV[b];
    }
    meanT /= segment.blocks;
    meanV /= segment.blocks;
    segment.meanT = meanT;
    segment.meanV = meanV;
    for (let b = firstBlock; b < lastBlock; b++) {
      const dt = blockT[b] - meanT;
      sxx += dt * dt;
      sxy += dt * (blockV[b] - meanV);
    }
    firstBlock = lastBlock;
  }
  if (!(sxx > 0)) return null;
  const slope = sxy / sxx;

  // (3) Residuals, their lag-1 autocorrelation within segments, and the effective sample size.
  let rss = 0;
  let lagProduct = 0;
  let previousResidual = 0;
  let previousSegment = -1;
  for (let b = 0; b < blocks; b++) {
    const segment = segments[blockSegment[b]];
    const residual = blockV[b] - segment.meanV - slope * (blockT[b] - segment.meanT);
    rss += residual * residual;
    if (blockSegment[b] === previousSegment) lagProduct += residual * previousResidual;
    previousResidual = residual;
    previousSegment = blockSegment[b];
  }
  const rawLag1 = rss > 0 ? lagProduct / rss : 0;
  // The lag-1 estimate from residuals of a fitted line runs low by about (2 + 4ρ)/N in short
  // series; adding it back keeps the effective n honest when the correlation is long.
  const lag1 = Math.min(MAX_LAG1, Math.max(0, rawLag1 + (2 + 4 * Math.max(0, rawLag1)) / blocks));
  const effectiveN = (blocks * (1 - lag1)) / (1 + lag1);
  const df = Math.max(1, effectiveN - segmentCount - 1);
  const slopeSEUncorrected = Math.sqrt(rss / dfOls / sxx);
  const slopeSE = Math.sqrt(rss / df / sxx);
  const quantile = tQuantile(1 - (1 - confidence) / 2, df);
  let points = 0;
  for (const segment of segments) points += segment.points;
  return {
    slope,
    slopeSE,
    slopeSEUncorrected,
    df,
    low: slope - quantile * slopeSE,
    high: slope + quantile * slopeSE,
    confidence,
    lag1,
    effectiveN,
    blocks,
    points,
    blockHours,
    segments,
  };
}

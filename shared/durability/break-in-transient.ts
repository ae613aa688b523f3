// Whether a break-in is over: fits the whole log with a straight line plus one decaying
// exponential (the usual shape of a conditioning transient) and asks how much of the fitted
// transient would still leak into a straight-line rate fitted after a given break-in end.
import { lowerBound } from './sorted-search';
import { fitTrend } from './trend-fit';
import { lineSlope } from '../stats/linear-fit';

export interface TransientOptions {
  /** averaging block, h; default 1 */
  blockHours?: number;
  /** indices where a new segment starts: separate intercepts there */
  segmentStarts?: readonly number[];
  /** the transient counts when its amplitude is this many standard errors from 0; default 4 */
  significance?: number;
  /** the rate is clean when the transient biases it by at most this fraction of its standard error; default 0.5 */
  biasFraction?: number;
  /** …or by at most this many µV/h, whichever is larger (a floor for nearly noise-free logs); default 0.01 */
  minBiasUvPerH?: number;
  /** shortest fit window left after a later break-in end, h; default max(24 h, 10 blocks) */
  minFitHours?: number;
}

export interface TransientCheck {
  /** fitted transient amplitude, V (positive = voltage above the line early on, i.e. falling during break-in) */
  amplitudeV: number;
  /** fitted time constant, h */
  tauHours: number;
  /** amplitude ÷ its standard error (AR(1)-widened) */
  tStatistic: number;
  /** slope the remaining transient adds to a straight line fitted from the given break-in end, µV/h of rate */
  biasAtBreakIn: number;
  /** the rate's standard error over that window, µV/h */
  rateStandardErrorAtBreakIn: number;
  /** earliest break-in end (h, on the log's clock) from which the bias is small enough; null = none inside the run */
  settledAtHours: number | null;
}

/** Largest lag-1 correlation used (as in fitTrend). */
const MAX_LAG1 = 0.99;

interface Blocks {
  t: number[];
  v: number[];
  segment: number[];
  segments: number;
}

function blockMeans(t: ArrayLike<number>, v: ArrayLike<number>, starts: readonly number[], blockHours: number): Blocks {
  const out: Blocks = { t: [], v: [], segment: [], segments: 0 };
  const bounds = [0, ...starts.filter((start) => start > 0 && start < t.length), t.length];
  for (let s = 0; s + 1 < bounds.length; s++) {
    const [from, to] = [bounds[s], bounds[s + 1]];
    if (from >= to) continue;
    const segment = out.segments++;
    let key = Number.NaN;
    let sumT = 0;
    let sumV = 0;
    let count = 0;
    for (let i = from; i < to; i++) {
      const k = blockHours > 0 ? Math.floor((t[i] - t[from]) / blockHours) : i;
      if (k !== key && count > 0) {
        out.t.push(sumT / count);
        out.v.push(sumV / count);
        out.segment.push(segment);
        sumT = 0;
        sumV = 0;
        count = 0;
      }
      key = k;
      sumT += t[i];
      sumV += v[i];
      count++;
    }
    if (count > 0) {
      out.t.push(sumT / count);
      out.v.push(sumV / count);
      out.segment.push(segment);
    }
  }
  return out;
}

interface ExponentialFit {
  slope: number;
  amplitude: number;
  rss: number;
  residuals: number[];
  /** inverse of the centred normal matrix, the (amplitude, amplitude) entry */
  amplitudeVarianceFactor: number;
}

// V = a_s + slope·t + amplitude·e^(−(t − t0)/τ), a separate intercept a_s per segment: centre
// every column on its segment mean, then a 2 × 2 least-squares problem.
function fitExponential(blocks: Blocks, t0: number, tau: number): ExponentialFit | null {
  const n = blocks.t.length;
  const q = blocks.t.map((time) => Math.exp(-(time - t0) / tau));
  const meanT = new Array<number>(blocks.segments).fill(0);
  const meanQ = new Array<number>(blocks.segments).fill(0);
  const meanV = new Array<number>(blocks.segments).fill(0);
  const count = new Array<number>(blocks.segments).fill(0);
  for (let i = 0; i < n; i++) {
    const s = blocks.segment[i];
    meanT[s] += blocks.t[i];
    meanQ[s] += q[i];
    meanV[s] += blocks.v[i];
    count[s]++;
  }
  for (let s = 0; s < blocks.segments; s++) {
    meanT[s] /= count[s] || 1;
    meanQ[s] /= count[s] || 1;
    meanV[s] /= count[s] || 1;
  }
  let stt = 0;
  let stq = 0;
  let sqq = 0;
  let stv = 0;
  let sqv = 0;
  for (let i = 0; i < n; i++) {
    const s = blocks.segment[i];
    const dt = blocks.t[i] - meanT[s];
    const dq = q[i] - meanQ[s];
    const dv = blocks.v[i] - meanV[s];
    stt += dt * dt;
    stq += dt * dq;
    sqq += dq * dq;
    stv += dt * dv;
    sqv += dq * dv;
  }
  const determinant = stt * sqq - stq * stq;
  if (!(determinant > 1e-12 * stt * sqq) || !(sqq > 0)) return null;
  const slope = (sqq * stv - stq * sqv) / determinant;
  const amplitude = (stt * sqv - stq * stv) / determinant;
  const residuals: number[] = [];
  let rss = 0;
  for (let i = 0; i < n; i++) {
    const s = blocks.segment[i];
    const r = blocks.v[i] - meanV[s] - slope * (blocks.t[i] - meanT[s]) - amplitude * (q[i] - meanQ[s]);
    residuals.push(r);
    rss += r * r;
  }
  return { slope, amplitude, rss, residuals, amplitudeVarianceFactor: stt / determinant };
}

// Least-squares slope of f(t) over the given block times (one line, no segments); 0 when the times do not spread.
function slopeOf(times: readonly number[], values: readonly number[]): number {
  return lineSlope(times, values) ?? 0;
}

/**
 * Break-in transient check. Fit V = a_s + b·t + A·e^(−t/τ) to the block means of the whole log
 * (τ on a geometric grid of 48 values from one block to twice the run); the transient is "visible"
 * when |A| exceeds 4 standard errors (residual variance and degrees of freedom from the effective
 * number of blocks under AR(1) residuals, as in fitTrend). For a candidate break-in end t_b, the part
 * of the fitted transient left after t_b biases a straight-line rate by the least-squares slope of
 * A·e^(−t/τ) over [t_b, end]; the break-in is over at the first t_b (from the given one, in steps of
 * a tenth of the remaining span) where that bias is at most half the rate's standard error (fitTrend
 * over [t_b, end]) or 0.01 µV/h, and at least max(24 h, 10 blocks) remain.
 * Why: a straight line fitted while the cell still conditions confuses the transient with the
 * loss; the early hours pin down the transient's shape far better than the short tail could.
 * Reference: the exponential-plus-linear shape of break-in is common practice in the trade; the
 * effective sample size after Santer et al. (2000), J. Geophys. Res. 105, 7337.
 * Cost: O(n) for the block means, O(48 · blocks) for the fit and O(10 · blocks) for the search.
 * @returns null when no transient is visible (or the log is too short to fit one).
 * @throws RangeError on mismatched lengths or options out of range.
 * @example checkBreakInTransient(t, v, 54)?.settledAtHours // e.g. 140 (h)
 */
export function checkBreakInTransient(t: ArrayLike<number>, v: ArrayLike<number>, breakInHours: number, options: TransientOptions = {}): TransientCheck | null {
  if (t.length !== v.length) throw new RangeError(`checkBreakInTransient: t and v must have the same length, got ${t.length} and ${v.length}`);
  const blockHours = options.blockHours ?? 1;
  const significance = options.significance ?? 4;
  const biasFraction = options.biasFraction ?? 0.5;
  const minBias = options.minBiasUvPerH ?? 0.01;
  if (!(blockHours >= 0) || !(significance > 0) || !(biasFraction > 0)) throw new RangeError('checkBreakInTransient: options out of range');
  const n = t.length;
  if (n < 10) return null;
  const t0 = t[0];
  const tEnd = t[n - 1];
  const span = tEnd - t0;
  if (!(span > 0)) return null;
  const starts = [...(options.segmentStarts ?? [])].sort((a, b) => a - b);
  const blocks = blockMeans(t, v, starts, blockHours);
  if (blocks.t.length < blocks.segments + 8) return null;
  const minFitHours = options.minFitHours ?? Math.max(24, 10 * blockHours);

  let best: { fit: ExponentialFit; tau: number } | null = null;
  const tauLow = Math.max(blockHours, span / 1000);
  const tauHigh = 2 * span;
  const steps = 48;
  for (let k = 0; k < steps; k++) {
    const tau = tauLow * Math.pow(tauHigh / tauLow, k / (steps - 1));
    const fit = fitExponential(blocks, t0, tau);
    if (fit && (best === null || fit.rss < best.fit.rss)) best = { fit, tau };
  }
  if (best === null) return null;
  const { fit, tau } = best;
  // AR(1) residuals: lag-1 within segments, bias added back, effective n
  let lag = 0;
  for (let i = 1; i < fit.residuals.length; i++) if (blocks.segment[i] === blocks.segment[i - 1]) lag += fit.residuals[i] * fit.residuals[i - 1];
  const raw = fit.rss > 0 ? lag / fit.rss : 0;
  const N = fit.residuals.length;
  const rho = Math.min(MAX_LAG1, Math.max(0, raw + (2 + 4 * Math.max(0, raw)) / N));
  const effectiveN = (N * (1 - rho)) / (1 + rho);
  const df = Math.max(1, effectiveN - blocks.segments - 2);
  const amplitudeSE = Math.sqrt((fit.rss / df) * fit.amplitudeVarianceFactor);
  const tStatistic = amplitudeSE > 0 ? fit.amplitude / amplitudeSE : Number.POSITIVE_INFINITY;
  if (!(Math.abs(tStatistic) > significance)) return null;

  const transientAt = (time: number): number => fit.amplitude * Math.exp(-(time - t0) / tau);
  // the rate's standard error from the block means themselves (each block its own point): O(blocks)
  const blockStarts: number[] = [];
  for (let b = 1; b < blocks.t.length; b++) if (blocks.segment[b] !== blocks.segment[b - 1]) blockStarts.push(b);
  const assess = (from: number): { bias: number; se: number } | null => {
    const trend = fitTrend(blocks.t, blocks.v, { from: lowerBound(blocks.t, from), to: blocks.t.length, segmentStarts: blockStarts, blockHours: 0 });
    if (!trend) return null;
    const times: number[] = [];
    const values: number[] = [];
    for (let i = 0; i < blocks.t.length; i++) {
      if (blocks.t[i] >= from) {
        times.push(blocks.t[i]);
        values.push(transientAt(blocks.t[i]));
      }
    }
    if (times.length < 3) return null;
    // the rate is −slope, so the transient's slope enters the rate with the opposite sign
    return { bias: -slopeOf(times, values) * 1e6, se: trend.slopeSE * 1e6 };
  };
  const first = assess(breakInHours);
  if (!first) return null;
  const result: TransientCheck = {
    amplitudeV: fit.amplitude,
    tauHours: tau,
    tStatistic,
    biasAtBreakIn: first.bias,
    rateStandardErrorAtBreakIn: first.se,
    settledAtHours: null,
  };
  const lastStart = tEnd - minFitHours;
  const stride = Math.max(blockHours, (tEnd - breakInHours) / 10);
  for (let from = breakInHours; from <= lastStart + 1e-9; from += stride) {
    const candidate = from === breakInHours ? first : assess(from);
    if (candidate && Math.abs(candidate.bias) <= Math.max(biasFraction * candidate.se, minBias)) {
      result.settledAtHours = from;
      break;
    }
  }
  return result;
}

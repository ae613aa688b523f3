// Onset of rapid failure in an accelerated test: the time after which the voltage-loss rate
// rises well above the stable rate, found by a two-piece (hinged) straight-line fit under a stated,
// editable rule; `null` when the log shows no such change.
import { tQuantile, tTwoSidedP } from '../stats/distributions';
import { kthSmallest } from '../stats/median';

/** The stated, editable rule. Rates are loss rates in µV/h (positive = voltage falling). */
export interface OnsetRule {
  /** hours before this are left out (break-in); default 0 */
  startHours: number;
  /** the log is averaged in blocks of this many hours before fitting; default 1 */
  blockHours: number;
  /** the loss rate after the onset must be at least this multiple of the stable rate; default 3 */
  minRateRatio: number;
  /** ...and at least this much above it, µV/h (guards a near-zero stable rate); default 20 */
  minRateIncreaseUvPerH: number;
  /** one-sided significance the rise in rate must reach, AR(1)-corrected; default 0.001 */
  alpha: number;
  /** at least this many hours of stable operation before an onset; default 48 */
  minStableHours: number;
  /** at least this many hours of log after an onset; default 24 */
  minTailHours: number;
  /** rows whose current differs from the median by more than this fraction are left out; default 0.05 */
  currentTolerance: number;
}

export const DEFAULT_ONSET_RULE: OnsetRule = {
  startHours: 0,
  blockHours: 1,
  minRateRatio: 3,
  minRateIncreaseUvPerH: 20,
  alpha: 0.001,
  minStableHours: 48,
  minTailHours: 24,
  currentTolerance: 0.05,
};

export interface OnsetResult {
  /** hours to onset of rapid failure on the log's clock, or null when the rule finds none */
  onsetHours: number | null;
  /** approximate range of the change point (profile of the residual sum of squares), h; null without an onset */
  onsetLowHours: number | null;
  onsetHighHours: number | null;
  /** loss rate before the onset (or over the whole window when there is none), µV/h */
  stableRateUvPerH: number | null;
  /** loss rate after the onset, µV/h; null without an onset */
  failureRateUvPerH: number | null;
  /** the best hinge found, whether or not the rule accepted it */
  candidate: { hours: number; stableRateUvPerH: number; failureRateUvPerH: number; rateRatio: number | null; pValue: number; tStatistic: number } | null;
  /** lag-1 autocorrelation of the block residuals (clipped to [0, 0.99]) and the effective number of blocks */
  lag1: number | null;
  effectiveBlocks: number | null;
  blocks: number;
  /** hours of log analysed (startHours to the last reading) */
  window: { fromHours: number; toHours: number } | null;
  /** last reading of the log, h: the censoring time when there is no onset */
  hoursRun: number;
  rowsLeftOut: number;
  rule: OnsetRule;
  /** one sentence: found at …, or why not */
  verdict: string;
  method: string;
  notes: string[];
}

interface Blocks {
  t: number[];
  v: number[];
}

function blockMeans(t: ArrayLike<number>, v: ArrayLike<number>, keep: Uint8Array, from: number, blockHours: number): Blocks {
  const bt: number[] = [];
  const bv: number[] = [];
  let key = NaN;
  let sumT = 0;
  let sumV = 0;
  let count = 0;
  for (let i = 0; i < t.length; i++) {
    if (!keep[i] || t[i] < from) continue;
    const k = Math.floor((t[i] - from) / blockHours);
    if (k !== key) {
      if (count > 0) {
        bt.push(sumT / count);
        bv.push(sumV / count);
      }
      key = k;
      sumT = 0;
      sumV = 0;
      count = 0;
    }
    sumT += t[i];
    sumV += v[i];
    count++;
  }
  if (count > 0) {
    bt.push(sumT / count);
    bv.push(sumV / count);
  }
  return { t: bt, v: bv };
}

// The passes over every reading are small functions of their own: each is compiled on its own
// (a log's one long call otherwise waits on the compiler inside one large function).

/** Finite time and voltage, time never going back. */
function checkReadings(t: ArrayLike<number>, v: ArrayLike<number>): void {
  for (let i = 0; i < t.length; i++) {
    if (!Number.isFinite(t[i]) || !Number.isFinite(v[i])) throw new RangeError(`detectFailureOnset: reading ${i}: time and voltage must be finite, got ${t[i]} h and ${v[i]} V`);
    if (i > 0 && t[i] < t[i - 1]) throw new RangeError(`detectFailureOnset: time goes backwards at reading ${i} (${t[i]} h after ${t[i - 1]} h)`);
  }
}

/** The held current: the middle of the finite readings (the upper one of an even count), by selection. */
function heldCurrent(j: ArrayLike<number>): number {
  const n = j.length;
  // the usual log has no blank current: the selection checks that as it goes (and may know the rank already)
  if (n > 0) {
    try {
      return kthSmallest(j, n >> 1);
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
    }
  }
  let m = 0;
  for (let i = 0; i < n; i++) if (Number.isFinite(j[i])) m++;
  if (m === 0) return NaN;
  const finite = new Float64Array(m);
  for (let i = 0, k = 0; i < n; i++) if (Number.isFinite(j[i])) finite[k++] = j[i];
  return kthSmallest(finite, m >> 1);
}

/** Marks (keep = 0) the readings off the held current by more than `tolerance` of it; returns how many. */
function leaveOutOtherCurrents(j: ArrayLike<number>, held: number, tolerance: number, keep: Uint8Array): number {
  const limit = tolerance * Math.abs(held);
  let out = 0;
  for (let i = 0; i < j.length; i++) {
    const value = j[i];
    if (!Number.isFinite(value) || Math.abs(value - held) > limit) {
      keep[i] = 0;
      out++;
    }
  }
  return out;
}

/** Solves the 3 × 3 normal equations a·β = b; returns β and a⁻¹, or null when a is singular. */
function solveThree(a: number[][], b: readonly number[]): { beta: [number, number, number]; inverse: number[][] } | null {
  const det =
    a[0][0] * (a[1][1] * a[2][2] - a[1][2] * a[2][1]) - a[0][1] * (a[1][0] * a[2][2] - a[1][2] * a[2][0]) + a[0][2] * (a[1][0] * a[2][1] - a[1][1] * a[2][0]);
  if (!(Math.abs(det) > 0) || !Number.isFinite(det)) return null;
  const inverse = [
    [(a[1][1] * a[2][2] - a[1][2] * a[2][1]) / det, (a[0][2] * a[2][1] - a[0][1] * a[2][2]) / det, (a[0][1] * a[1][2] - a[0][2] * a[1][1]) / det],
    [(a[1][2] * a[2][0] - a[1][0] * a[2][2]) / det, (a[0][0] * a[2][2] - a[0][2] * a[2][0]) / det, (a[0][2] * a[1][0] - a[0][0] * a[1][2]) / det],
    [(a[1][0] * a[2][1] - a[1][1] * a[2][0]) / det, (a[0][1] * a[2][0] - a[0][0] * a[2][1]) / det, (a[0][0] * a[1][1] - a[0][1] * a[1][0]) / det],
  ];
  const beta: [number, number, number] = [0, 0, 0];
  for (let p = 0; p < 3; p++) beta[p] = inverse[p][0] * b[0] + inverse[p][1] * b[1] + inverse[p][2] * b[2];
  return { beta, inverse };
}

/**
 * Onset of rapid failure in a constant-current log.
 * Method (the rule, every number editable in `rule`): rows at another current are left out and the
 * log from startHours on is averaged in blockHours blocks. For every block time τ that leaves at
 * least minStableHours before it and minTailHours after it, the continuous two-piece line
 * V = a + b₁·t + b₂·max(0, t − τ) is fitted by least squares; the τ with the smallest residual sum of
 * squares is the candidate. Loss rates: stable = −b₁, after = −(b₁ + b₂), in µV/h. The candidate is
 * the onset when (1) after ≥ minRateRatio × stable (when stable > 0), (2) after − stable ≥
 * minRateIncreaseUvPerH, and (3) the rise is significant: t = −b₂/SE(b₂) with SE from s²(XᵀX)⁻¹,
 * s² = RSS/(n_e − 3), n_e = N(1 − ρ)/(1 + ρ) for the lag-1 autocorrelation ρ of the block residuals
 * (bias (2 + 4ρ)/N added back, clipped to [0, 0.99]), one-sided p < alpha on n_e − 3 degrees of
 * freedom. Searching over τ makes the nominal level optimistic; the small default alpha (0.001)
 * and the rate conditions allow for that. The range of τ is where the RSS stays within an F(1, n_e −
 * 3) 95 % quantile of its minimum (scaled by N/n_e): an approximate guide, change points being irregular.
 * Reference: two-phase (segmented) regression — Hinkley (1969), Biometrika 56, 495–504; Muggeo
 * (2003), Statistics in Medicine 22, 3055–3071; effective sample size under AR(1) errors as
 * fitTrend (Santer et al. 2000). The rate conditions are a stated convention of Cellwright.
 * Cost: O(n + B) for n readings and B blocks (each candidate fitted in O(1) from suffix sums).
 * @throws RangeError when the arrays differ in length, a value is not finite, time decreases, or the
 *   rule is malformed.
 * @example detectFailureOnset({ tHours, v, j }).onsetHours // e.g. 1104, or null
 */
export function detectFailureOnset(curve: { tHours: ArrayLike<number>; v: ArrayLike<number>; j?: ArrayLike<number> }, rule: Partial<OnsetRule> = {}): OnsetResult {
  if (curve === null || typeof curve !== 'object' || !curve.tHours || !curve.v) throw new RangeError('detectFailureOnset: the log needs tHours and v');
  const { tHours: t, v } = curve;
  const n = t.length;
  if (v.length !== n) throw new RangeError(`detectFailureOnset: tHours has ${n} readings but v has ${v.length}`);
  if (curve.j !== undefined && curve.j.length !== n) throw new RangeError(`detectFailureOnset: tHours has ${n} readings but j has ${curve.j.length}`);
  const applied: OnsetRule = { ...DEFAULT_ONSET_RULE, ...rule };
  const positiveKeys: (keyof OnsetRule)[] = ['blockHours', 'minRateRatio'];
  for (const key of positiveKeys) if (!(Number.isFinite(applied[key]) && applied[key] > 0)) throw new RangeError(`detectFailureOnset: rule.${key} must be > 0, got ${applied[key]}`);
  const nonNegativeKeys: (keyof OnsetRule)[] = ['startHours', 'minRateIncreaseUvPerH', 'minStableHours', 'minTailHours', 'currentTolerance'];
  for (const key of nonNegativeKeys) if (!(Number.isFinite(applied[key]) && applied[key] >= 0)) throw new RangeError(`detectFailureOnset: rule.${key} must be ≥ 0, got ${applied[key]}`);
  if (!(applied.alpha > 0 && applied.alpha < 1)) throw new RangeError(`detectFailureOnset: rule.alpha must be in (0, 1), got ${applied.alpha}`);
  checkReadings(t, v);
  const hoursRun = n > 0 ? t[n - 1] : 0;
  const notes: string[] = [];
  const keep = new Uint8Array(n).fill(1);
  let rowsLeftOut = 0;
  if (curve.j !== undefined && n > 0) {
    const median = heldCurrent(curve.j);
    rowsLeftOut = leaveOutOtherCurrents(curve.j, median, applied.currentTolerance, keep);
    if (rowsLeftOut > 0) notes.push(`${rowsLeftOut} row${rowsLeftOut === 1 ? '' : 's'} at another current than the held ${Number(median.toPrecision(3))} A/cm² left out`);
  }
  const method =
    `two-piece straight line V = a + b₁t + b₂·max(0, t − τ) on ${applied.blockHours} h block means from ${applied.startHours} h, τ searched over the blocks leaving ≥ ${applied.minStableHours} h before and ≥ ${applied.minTailHours} h after; ` +
    `onset when the loss rate after τ is ≥ ${applied.minRateRatio}× the stable rate and ≥ ${applied.minRateIncreaseUvPerH} µV/h above it, with one-sided p < ${applied.alpha} (AR(1)-corrected)`;
  const base: OnsetResult = {
    onsetHours: null,
    onsetLowHours: null,
    onsetHighHours: null,
    stableRateUvPerH: null,
    failureRateUvPerH: null,
    candidate: null,
    lag1: null,
    effectiveBlocks: null,
    blocks: 0,
    window: null,
    hoursRun,
    rowsLeftOut,
    rule: applied,
    verdict: '',
    method,
    notes,
  };
  const blocks = blockMeans(t, v, keep, applied.startHours, applied.blockHours);
  const count = blocks.t.length;
  base.blocks = count;
  if (count < 6) {
    base.verdict = `too short to judge: ${count} blocks of ${applied.blockHours} h after ${applied.startHours} h (at least 6 needed)`;
    return base;
  }
  const first = blocks.t[0];
  const last = blocks.t[count - 1];
  base.window = { fromHours: first, toHours: last };
  // centre time and voltage so the 3 × 3 normal equations stay well conditioned
  const meanT = blocks.t.reduce((s, x) => s + x, 0) / count;
  const meanV = blocks.v.reduce((s, x) => s + x, 0) / count;
  const x = blocks.t.map((value) => value - meanT);
  const y = blocks.v.map((value) => (value - meanV) * 1000); // mV
  // whole-window straight line: the stable rate when there is no onset
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < count; i++) {
    sxx += x[i] * x[i];
    sxy += x[i] * y[i];
  }
  const singleSlope = sxy / sxx; // mV/h
  base.stableRateUvPerH = -singleSlope * 1000;

  // Every candidate τ = blocks.t[k] in O(1) from suffix sums over the blocks after k: with the hinge
  // h = x − x_k there, Σh, Σh², Σxh and Σhy follow from Σ1, Σx, Σx², Σy, Σxy over those blocks.
  let sumX = 0;
  let sumXX = 0;
  let sumY = 0;
  let sumYY = 0;
  for (let i = 0; i < count; i++) {
    sumX += x[i];
    sumXX += x[i] * x[i];
    sumY += y[i];
    sumYY += y[i] * y[i];
  }
  const tail = { n: 0, x: 0, xx: 0, y: 0, xy: 0 };
  const candidates: { index: number; rss: number }[] = [];
  let best: { index: number; rss: number } | null = null;
  for (let k = count - 2; k >= 1; k--) {
    const i = k + 1;
    tail.n += 1;
    tail.x += x[i];
    tail.xx += x[i] * x[i];
    tail.y += y[i];
    tail.xy += x[i] * y[i];
    const tau = blocks.t[k];
    if (tau - first < applied.minStableHours || last - tau < applied.minTailHours) continue;
    const xk = x[k];
    const sh = tail.x - xk * tail.n;
    const shh = tail.xx - 2 * xk * tail.x + xk * xk * tail.n;
    const sxh = tail.xx - xk * tail.x;
    const shy = tail.xy - xk * tail.y;
    const rhs = [sumY, sxy, shy];
    const solved = solveThree(
      [
        [count, sumX, sh],
        [sumX, sumXX, sxh],
        [sh, sxh, shh],
      ],
      rhs,
    );
    if (solved === null) continue;
    const rss = Math.max(0, sumYY - (solved.beta[0] * rhs[0] + solved.beta[1] * rhs[1] + solved.beta[2] * rhs[2]));
    candidates.push({ index: k, rss });
    if (best === null || rss < best.rss) best = { index: k, rss };
  }
  if (best === null) {
    base.verdict = `no onset: the ${(last - first).toFixed(0)} h analysed leave no room for ${applied.minStableHours} h stable plus ${applied.minTailHours} h after a change`;
    return base;
  }
  const tau = blocks.t[best.index];
  // the chosen hinge refitted with its residuals summed directly (the suffix-sum RSS can cancel)
  const hinge = x.map((value, i) => (blocks.t[i] > tau ? value - x[best.index] : 0));
  const normal = [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  const right = [0, 0, 0];
  for (let i = 0; i < count; i++) {
    const row = [1, x[i], hinge[i]];
    for (let p = 0; p < 3; p++) {
      right[p] += row[p] * y[i];
      for (let q = 0; q < 3; q++) normal[p][q] += row[p] * row[q];
    }
  }
  const fit = solveThree(normal, right);
  if (fit === null) {
    base.verdict = 'no onset: the two-piece fit is degenerate on these blocks';
    return base;
  }
  const [a0, b1, b2] = fit.beta;
  const residuals = y.map((value, i) => value - a0 - b1 * x[i] - b2 * hinge[i]);
  const rssBest = residuals.reduce((sum, r) => sum + r * r, 0);
  let lagProduct = 0;
  let squares = 0;
  for (let i = 0; i < count; i++) {
    squares += residuals[i] * residuals[i];
    if (i > 0) lagProduct += residuals[i] * residuals[i - 1];
  }
  const rawRho = squares > 0 ? lagProduct / squares : 0;
  const rho = Math.min(0.99, Math.max(0, rawRho + (2 + 4 * Math.max(rawRho, 0)) / count));
  const effective = (count * (1 - rho)) / (1 + rho);
  const df = Math.max(1, effective - 3);
  const variance = rssBest / df;
  const se = Math.sqrt(variance * fit.inverse[2][2]);
  const tStatistic = se > 0 ? -b2 / se : b2 < 0 ? Infinity : -Infinity;
  const twoSided = tTwoSidedP(tStatistic, df);
  const pValue = tStatistic > 0 ? twoSided / 2 : 1 - twoSided / 2;
  const stable = -b1 * 1000;
  const after = -(b1 + b2) * 1000;
  const ratio = stable > 0 ? after / stable : null;
  base.candidate = { hours: tau, stableRateUvPerH: stable, failureRateUvPerH: after, rateRatio: ratio, pValue, tStatistic };
  base.lag1 = rho;
  base.effectiveBlocks = effective;

  const reasons: string[] = [];
  if (stable > 0 && after < applied.minRateRatio * stable) reasons.push(`the rate after ${tau.toFixed(0)} h (${after.toFixed(1)} µV/h) is only ${(after / stable).toFixed(2)}× the stable ${stable.toFixed(1)} µV/h (rule: ≥ ${applied.minRateRatio}×)`);
  if (after - stable < applied.minRateIncreaseUvPerH) reasons.push(`the rate rises by ${(after - stable).toFixed(1)} µV/h (rule: ≥ ${applied.minRateIncreaseUvPerH} µV/h)`);
  if (!(pValue < applied.alpha)) reasons.push(`the rise is not significant (p = ${pValue.toPrecision(2)}, rule: < ${applied.alpha})`);
  if (reasons.length > 0) {
    base.verdict = `no onset of rapid failure within ${hoursRun.toFixed(0)} h: best candidate at ${tau.toFixed(0)} h rejected — ${reasons.join('; ')}`;
    return base;
  }
  // approximate range: τ whose RSS stays within the F-quantile band of the minimum
  // F(1, df) at 95 % is t(0.975, df)²
  const threshold = best.rss * (1 + ((count / effective) * tQuantile(0.975, df) ** 2) / df);
  let low = tau;
  let high = tau;
  for (const candidate of candidates) {
    if (candidate.rss <= threshold) {
      low = Math.min(low, blocks.t[candidate.index]);
      high = Math.max(high, blocks.t[candidate.index]);
    }
  }
  base.onsetHours = tau;
  base.onsetLowHours = low;
  base.onsetHighHours = high;
  base.stableRateUvPerH = stable;
  base.failureRateUvPerH = after;
  base.verdict = `onset of rapid failure at ${tau.toFixed(0)} h (about ${low.toFixed(0)}–${high.toFixed(0)} h): loss rate ${stable.toFixed(1)} → ${after.toFixed(1)} µV/h`;
  return base;
}

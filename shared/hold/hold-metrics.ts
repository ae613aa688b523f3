// Open-circuit hold: how fast the voltage decays over the hold (mV/h) and how much it lost (mV),
// after a stated settling rule.
import { fitLine } from '../stats/linear-fit';
import { fitTrend } from '../durability/trend-fit';

/** The stated, editable rule for reading a hold. */
export interface HoldRule {
  /** readings in the first minutes after the hold starts are skipped while the voltage settles; default 15 */
  settleMinutes: number;
  /** the loss compares the mean voltage of the first and the last this-many minutes of the window; default 10 */
  edgeMinutes: number;
  /** confidence level of the decay interval; default 0.95 */
  confidence: number;
}

export const DEFAULT_HOLD_RULE: HoldRule = { settleMinutes: 15, edgeMinutes: 10, confidence: 0.95 };

/** Above this median |j| the curve is not read as open circuit (a note, not a refusal), A/cm². */
const OPEN_CIRCUIT_LIMIT = 0.005;

export interface HoldInput {
  /** elapsed time, h */
  tHours: ArrayLike<number>;
  /** cell voltage, V */
  v: ArrayLike<number>;
  /** current density, A/cm² (optional: only checked to be near zero) */
  j?: ArrayLike<number>;
}

export interface HoldMetrics {
  /** mV/h, positive = voltage falling; null when the window holds too few readings */
  holdDecay: number | null;
  /** interval of the decay (AR(1)-corrected, see method), mV/h */
  decayLow: number | null;
  decayHigh: number | null;
  /** mV, positive = voltage lost: mean of the first edge of the window minus mean of the last edge */
  holdLoss: number | null;
  /** mV: the first reading of the whole hold minus the mean of the last edge (settling included) */
  lossFromStartMv: number | null;
  /** the readings fitted: from the end of settling to the last reading, h */
  window: { fromHours: number; toHours: number } | null;
  readingsUsed: number;
  readingsSettling: number;
  /** mean voltage at the start and end edges of the window, V */
  startV: number | null;
  endV: number | null;
  rule: HoldRule;
  method: string;
  notes: string[];
}

function meanBetween(t: ArrayLike<number>, v: ArrayLike<number>, from: number, to: number, fromIndex: number, toIndex: number): number {
  let sum = 0;
  let count = 0;
  // ends included, with a slack of ~4 ms for clocks written in round minutes (25/60 vs 15/60 + 10/60)
  const slack = 1e-6;
  for (let i = fromIndex; i < toIndex; i++) {
    if (t[i] >= from - slack && t[i] <= to + slack) {
      sum += v[i];
      count++;
    }
  }
  return sum / count;
}

/**
 * Decay and loss of an open-circuit hold.
 * Definition: readings before t₀ + settleMinutes are skipped (settling after the load is removed);
 * holdDecay = −slope of the least-squares line of V against t over the rest (fitLine), in mV/h;
 * holdLoss = mean V over the window's first edgeMinutes − mean V over its last edgeMinutes (edge
 * shrunk to a quarter of the window when the window is shorter than 4 edges), in mV. The decay's
 * interval widens the OLS error for the lag-1 autocorrelation of the residuals (fitTrend with one
 * reading per block, the same slope): hold logs drift, and independent-error intervals would be
 * far too narrow.
 * Reference: least squares as fitLine (checked against NIST StRD Norris); the interval as fitTrend
 * (Santer et al. 2000, J. Geophys. Res. 105, 7337 — effective sample size under AR(1) errors).
 * The settling rule is a stated convention (common practice: skip the first minutes), editable.
 * Cost: O(n).
 * @throws RangeError when the arrays differ in length, hold fewer than 3 readings, a value is not
 *   finite, time decreases, or the rule is malformed.
 * @example holdMetrics({ tHours, v }).holdDecay // mV/h, e.g. 0.8
 */
export function holdMetrics(curve: HoldInput, rule: Partial<HoldRule> = {}): HoldMetrics {
  if (curve === null || typeof curve !== 'object' || !curve.tHours || !curve.v) throw new RangeError('holdMetrics: the hold needs tHours and v');
  const { tHours: t, v } = curve;
  const n = t.length;
  if (v.length !== n) throw new RangeError(`holdMetrics: tHours has ${n} readings but v has ${v.length}`);
  if (curve.j !== undefined && curve.j.length !== n) throw new RangeError(`holdMetrics: tHours has ${n} readings but j has ${curve.j.length}`);
  if (n < 3) throw new RangeError(`holdMetrics: at least 3 readings are needed, got ${n}`);
  const settleMinutes = rule.settleMinutes ?? DEFAULT_HOLD_RULE.settleMinutes;
  const edgeMinutes = rule.edgeMinutes ?? DEFAULT_HOLD_RULE.edgeMinutes;
  const confidence = rule.confidence ?? DEFAULT_HOLD_RULE.confidence;
  if (!(Number.isFinite(settleMinutes) && settleMinutes >= 0)) throw new RangeError(`holdMetrics: settleMinutes must be ≥ 0, got ${settleMinutes}`);
  if (!(Number.isFinite(edgeMinutes) && edgeMinutes > 0)) throw new RangeError(`holdMetrics: edgeMinutes must be > 0, got ${edgeMinutes}`);
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`holdMetrics: confidence must be in (0, 1), got ${confidence}`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(t[i]) || !Number.isFinite(v[i])) throw new RangeError(`holdMetrics: reading ${i}: time and voltage must be finite, got ${t[i]} h and ${v[i]} V`);
    if (i > 0 && t[i] < t[i - 1]) throw new RangeError(`holdMetrics: time goes backwards at reading ${i} (${t[i]} h after ${t[i - 1]} h)`);
  }
  const appliedRule: HoldRule = { settleMinutes, edgeMinutes, confidence };
  const notes: string[] = [];
  if (curve.j !== undefined) {
    const magnitudes = Array.from(curve.j, Math.abs).sort((a, b) => a - b);
    const median = magnitudes[magnitudes.length >> 1];
    if (median > OPEN_CIRCUIT_LIMIT) notes.push(`the current is ${Number((median * 1000).toPrecision(3))} mA/cm² (median): this is not an open-circuit hold`);
  }
  const start = t[0] + settleMinutes / 60;
  let first = 0;
  while (first < n && t[first] < start - 1e-6) first++;
  const used = n - first;
  const method =
    `readings from ${settleMinutes} min after the start of the hold (settling skipped) to the end; decay = −least-squares slope of V against t (mV/h, positive = falling), ` +
    `${Number((confidence * 100).toPrecision(4))} % interval widened for lag-1 autocorrelation; loss = mean V of the first ${edgeMinutes} min of that window − mean of its last ${edgeMinutes} min (mV)`;
  const empty: HoldMetrics = {
    holdDecay: null,
    decayLow: null,
    decayHigh: null,
    holdLoss: null,
    lossFromStartMv: null,
    window: null,
    readingsUsed: used,
    readingsSettling: first,
    startV: null,
    endV: null,
    rule: appliedRule,
    method,
    notes,
  };
  if (used < 3 || t[n - 1] <= t[first]) {
    notes.push(`only ${used} reading${used === 1 ? '' : 's'} after the ${settleMinutes} min settling time (hold ${((t[n - 1] - t[0]) * 60).toFixed(0)} min long): at least 3 over a time span are needed`);
    return empty;
  }
  const line = fitLine(t, v, { from: first, to: n });
  const trend = fitTrend(t, v, { from: first, to: n, blockHours: 0, confidence });
  const from = t[first];
  const to = t[n - 1];
  const windowHours = to - from;
  let edgeHours = edgeMinutes / 60;
  if (windowHours < 4 * edgeHours) {
    edgeHours = windowHours / 4;
    notes.push(`the window is shorter than 4 × ${edgeMinutes} min: the loss compares its first and last quarter (${(edgeHours * 60).toFixed(1)} min each)`);
  }
  const startV = meanBetween(t, v, from, from + edgeHours, first, n);
  const endV = meanBetween(t, v, to - edgeHours, to, first, n);
  return {
    holdDecay: -line.slope * 1000,
    decayLow: trend ? -trend.high * 1000 : null,
    decayHigh: trend ? -trend.low * 1000 : null,
    holdLoss: (startV - endV) * 1000,
    lossFromStartMv: (v[0] - endV) * 1000,
    window: { fromHours: from, toHours: to },
    readingsUsed: used,
    readingsSettling: first,
    startV,
    endV,
    rule: appliedRule,
    method,
    notes,
  };
}

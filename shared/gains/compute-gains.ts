// The gains waterfall: how much a response changed at each step along a chain of builds, with an
// interval that says whether each step is bigger than build-to-build noise.
import { tQuantile } from '../stats/distributions';
import { summarizeSample, type SampleSummary } from './sample-summary';
import { welchInterval } from './welch';

export interface GainStepInput {
  buildId: number;
  code: string;
  changeNote: string | null;
  /** the response measured on this build, one value per replicate */
  values: number[];
}

export interface GainsInput {
  /** builds in chain order; the first is the baseline */
  steps: GainStepInput[];
  /** pooled replicate SD of the response over the project (pooledReplicateSd), or null */
  pooled: { sd: number; df: number } | null;
  /** default 0.95 */
  confidence?: number;
}

export type GainMethod = 'welch' | 'pooled' | 'none';

export interface GainStep {
  buildId: number;
  code: string;
  changeNote: string | null;
  /** mean of the values */
  value: number;
  n: number;
  /** replicate SD; null when n < 2 */
  sd: number | null;
  /** value − previous value; null for the baseline */
  gain: number | null;
  low: number | null;
  high: number | null;
  /** the interval contains zero; null when there is no interval */
  withinNoise: boolean | null;
  /** 'none' for the baseline */
  method: GainMethod;
  note: string | null;
}

export interface GainsResult {
  steps: GainStep[];
  /** last vs baseline; gain is the sum of the step gains (the waterfall closes exactly) */
  total: { gain: number; low: number | null; high: number | null; withinNoise: boolean | null; method: GainMethod; note: string | null };
  baseline: { buildId: number; code: string; value: number };
}

interface Comparison {
  low: number | null;
  high: number | null;
  withinNoise: boolean | null;
  method: GainMethod;
  note: string | null;
}

const show = (value: number): string => Number(value.toPrecision(3)).toString();

/** Interval for after − before, by the first method the data allow. */
function compare(
  before: SampleSummary,
  beforeValues: number[],
  beforeCode: string,
  after: SampleSummary,
  afterValues: number[],
  afterCode: string,
  gain: number,
  pooled: { sd: number; df: number } | null,
  confidence: number,
): Comparison {
  if (before.n >= 2 && after.n >= 2) {
    const welch = welchInterval(beforeValues, afterValues, confidence);
    // Centre on the telescoping gain (identical to welch.diff up to rounding) so the bars line up.
    const low = gain - (welch.diff - welch.low);
    const high = gain + (welch.high - welch.diff);
    return { low, high, withinNoise: low <= 0 && high >= 0, method: 'welch', note: `Welch interval, ${show(welch.df)} df` };
  }
  // One side unreplicated: a replicate SD from elsewhere stands in for the missing spread.
  let sd: number | null = null;
  let df = 0;
  let note: string | null = null;
  if (pooled) {
    sd = pooled.sd;
    df = pooled.df;
    note = `no replicates: pooled replicate SD (${show(pooled.sd)}, df ${pooled.df}) used`;
  } else if (before.sd !== null || after.sd !== null) {
    const replicated = before.sd !== null ? before : after;
    sd = replicated.sd as number;
    df = replicated.n - 1;
    note = `no pooled SD: replicate SD of ${before.sd !== null ? beforeCode : afterCode} (${show(sd)}, df ${df}) used for both`;
  }
  if (sd === null || !(df > 0)) {
    return { low: null, high: null, withinNoise: null, method: 'none', note: 'no replicates and no pooled replicate SD: no interval' };
  }
  const halfWidth = tQuantile(1 - (1 - confidence) / 2, df) * sd * Math.sqrt(1 / before.n + 1 / after.n);
  const low = gain - halfWidth;
  const high = gain + halfWidth;
  return { low, high, withinNoise: low <= 0 && high >= 0, method: 'pooled', note };
}

/**
 * Step-by-step gains along a chain of builds (a waterfall) with intervals.
 * value = mean of a build's replicates; gain_k = value_k − value_(k−1); total = Σ gain_k (= last − baseline
 * up to rounding, and exactly the sum of the bars drawn). Interval of each gain (and of the total, last vs
 * baseline): Welch when both builds have n ≥ 2; otherwise the pooled replicate SD s_p with its df:
 * gain ± t(1 − α/2, df)·s_p·sqrt(1/n₁ + 1/n₂); with neither, no interval. "Within noise" = the interval
 * contains zero.
 * Reference: Welch (1947) Biometrika 34, 28; NIST/SEMATECH e-Handbook 7.4.3 (pooled variance).
 * Cost: O(total values).
 * @throws RangeError when there are no steps, a step has no values or a non-finite value, the pooled SD is
 *   not a non-negative number with df > 0, or confidence is outside (0, 1).
 * @example computeGains({ steps: [{ buildId: 1, code: 'B-001', changeNote: null, values: [0.60] }, { buildId: 2, code: 'B-002', changeNote: 'PTFE 20 → 30 %', values: [0.603] }], pooled: { sd: 0.005, df: 10 } }).steps[1].withinNoise // true
 */
export function computeGains(input: GainsInput): GainsResult {
  const confidence = input.confidence ?? 0.95;
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`computeGains: confidence must be in (0, 1), got ${confidence}`);
  if (input.steps.length === 0) throw new RangeError('computeGains: at least 1 step (the baseline) is needed, got 0');
  const pooled = input.pooled;
  if (pooled && !(Number.isFinite(pooled.sd) && pooled.sd >= 0 && Number.isFinite(pooled.df) && pooled.df > 0)) {
    throw new RangeError(`computeGains: pooled SD must be ≥ 0 with df > 0, got sd ${pooled.sd}, df ${pooled.df}`);
  }
  const summaries = input.steps.map((step, position) => {
    if (step.values.length === 0) {
      throw new RangeError(`computeGains: step ${position + 1} (${step.code}) has no values, got 0`);
    }
    return summarizeSample(step.values, `computeGains: step ${position + 1} (${step.code})`);
  });

  const steps: GainStep[] = [];
  let total = 0;
  for (let k = 0; k < input.steps.length; k++) {
    const step = input.steps[k];
    const summary = summaries[k];
    const base = { buildId: step.buildId, code: step.code, changeNote: step.changeNote, value: summary.mean, n: summary.n, sd: summary.sd };
    if (k === 0) {
      steps.push({ ...base, gain: null, low: null, high: null, withinNoise: null, method: 'none', note: 'baseline' });
      continue;
    }
    const gain = summary.mean - summaries[k - 1].mean;
    total += gain;
    const previous = input.steps[k - 1];
    const comparison = compare(summaries[k - 1], previous.values, previous.code, summary, step.values, step.code, gain, pooled, confidence);
    steps.push({ ...base, gain, ...comparison });
  }

  const first = input.steps[0];
  const last = input.steps[input.steps.length - 1];
  const totalComparison =
    input.steps.length > 1
      ? compare(summaries[0], first.values, first.code, summaries[summaries.length - 1], last.values, last.code, total, pooled, confidence)
      : { low: null, high: null, withinNoise: null, method: 'none' as const, note: 'only the baseline: no change to show' };
  return {
    steps,
    total: { gain: total, ...totalComparison },
    baseline: { buildId: first.buildId, code: first.code, value: summaries[0].mean },
  };
}

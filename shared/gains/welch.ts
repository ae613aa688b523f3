// Interval for the difference of two builds' means when each has its own replicates and the two
// spreads need not be equal (a new recipe is often less reproducible than the baseline).
import { tQuantile } from '../stats/distributions';
import { summarizeSample } from './sample-summary';

export interface WelchInterval {
  /** mean(b) − mean(a) */
  diff: number;
  low: number;
  high: number;
  /** Welch–Satterthwaite degrees of freedom */
  df: number;
  /** standard error of the difference, sqrt(s_a²/n_a + s_b²/n_b) */
  se: number;
}

/**
 * Welch interval for mean(b) − mean(a): diff ± t(1 − α/2, ν)·se, se² = s_a²/n_a + s_b²/n_b,
 * ν = se⁴ / ((s_a²/n_a)²/(n_a − 1) + (s_b²/n_b)²/(n_b − 1)).
 * When both samples have zero spread, se = 0 and ν = n_a + n_b − 2 (the interval is the point).
 * Reference: Welch (1947), Biometrika 34, 28–35; Satterthwaite (1946), Biometrics Bull. 2, 110–114;
 * NIST/SEMATECH e-Handbook 1.3.5.3 (two-sample t-test, unequal variances).
 * Cost: O(n_a + n_b).
 * @throws RangeError when a sample has fewer than 2 values or a non-finite value, or confidence is outside (0, 1).
 * @example welchInterval([10, 12, 14], [14, 18, 22, 26]).df // 216/53 ≈ 4.075
 */
export function welchInterval(a: readonly number[], b: readonly number[], confidence = 0.95): WelchInterval {
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`welchInterval: confidence must be in (0, 1), got ${confidence}`);
  if (a.length < 2 || b.length < 2) {
    throw new RangeError(`welchInterval: each sample needs at least 2 values, got ${a.length} and ${b.length}`);
  }
  const first = summarizeSample(a, 'welchInterval');
  const second = summarizeSample(b, 'welchInterval');
  const diff = second.mean - first.mean;
  const shareA = (first.variance as number) / first.n;
  const shareB = (second.variance as number) / second.n;
  const se = Math.sqrt(shareA + shareB);
  if (se === 0) return { diff, low: diff, high: diff, df: first.n + second.n - 2, se };
  const df = (shareA + shareB) ** 2 / ((shareA * shareA) / (first.n - 1) + (shareB * shareB) / (second.n - 1));
  const halfWidth = tQuantile(1 - (1 - confidence) / 2, df) * se;
  return { diff, low: diff - halfWidth, high: diff + halfWidth, df, se };
}

// Mean and spread of one build's replicate values, computed carefully (values such as 0.6123 V
// differ only in the fourth digit, so a one-pass Σx² − (Σx)²/n formula would cancel).
import { compensatedSum } from '../stats/compensated-sum';

export interface SampleSummary {
  n: number;
  mean: number;
  /** sample variance with n − 1 in the denominator; null when n < 2 */
  variance: number | null;
  /** sample standard deviation; null when n < 2 */
  sd: number | null;
}

/**
 * n, mean and sample variance/SD of a list of numbers.
 * Two passes: a compensated (Neumaier) sum for the mean, then Σ(x − x̄)² with the corrected two-pass
 * term −(Σ(x − x̄))²/n.
 * Reference: Chan, Golub & LeVeque (1983), Am. Stat. 37, 242–247.
 * Cost: O(n) time, no allocation.
 * @throws RangeError when the list is empty or holds a non-finite value.
 * @example summarizeSample([1, 2, 3]) // { n: 3, mean: 2, variance: 1, sd: 1 }
 */
export function summarizeSample(values: readonly number[], name = 'summarizeSample'): SampleSummary {
  const n = values.length;
  if (n === 0) throw new RangeError(`${name}: at least 1 value is needed, got 0`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(values[i])) throw new RangeError(`${name}: values must be finite numbers, got ${values[i]} at position ${i + 1}`);
  }
  const mean = compensatedSum(values) / n;
  if (n < 2) return { n, mean, variance: null, sd: null };
  let squares = 0;
  let deviations = 0;
  for (let i = 0; i < n; i++) {
    const deviation = values[i] - mean;
    deviations += deviation;
    squares += deviation * deviation;
  }
  const variance = Math.max(0, (squares - (deviations * deviations) / n) / (n - 1));
  return { n, mean, variance, sd: Math.sqrt(variance) };
}

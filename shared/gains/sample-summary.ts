// Mean and spread of one build's replicate values, computed carefully (values such as 0.6123 V
// differ only in the fourth digit, so a one-pass Σx² − (Σx)²/n formula would cancel).
import { mean as meanOf, sampleVariance } from 'simple-statistics';

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
 * simple-statistics' mean (a compensated Kahan–Babuška–Neumaier sum) and sampleVariance
 * (two passes: Σ(x − x̄)² about that mean, divided by n − 1).
 * Reference: Chan, Golub & LeVeque (1983), Am. Stat. 37, 242–247 (two-pass variance).
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
  const mean = meanOf(values as number[]);
  if (n < 2) return { n, mean, variance: null, sd: null };
  const variance = sampleVariance(values as number[]);
  return { n, mean, variance, sd: Math.sqrt(variance) };
}

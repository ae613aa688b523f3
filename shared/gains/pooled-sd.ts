// Build-to-build noise of a response, pooled over every build that was made more than once: the
// yardstick for gains on builds that were made only once.
import { summarizeSample } from './sample-summary';

export interface PooledSd {
  /** pooled standard deviation, sqrt(Σ(n_i − 1)s_i² / Σ(n_i − 1)) */
  sd: number;
  /** Σ(n_i − 1) */
  df: number;
  /** number of groups that counted (n ≥ 2) */
  groups: number;
}

/**
 * Pooled replicate standard deviation of groups of replicate values (one group per build).
 * Only groups with at least 2 values count; each contributes its n − 1 degrees of freedom.
 * Reference: NIST/SEMATECH e-Handbook 7.4.3 (pooled variance in one-way ANOVA, MSE = Σ(n_i − 1)s_i² / (N − k)).
 * Cost: O(total values).
 * @returns null when no group has 2 or more values.
 * @throws RangeError when a value is not finite.
 * @example pooledReplicateSd([[1, 3], [10, 12, 14], [7]]) // { sd: sqrt(10/3), df: 3, groups: 2 }
 */
export function pooledReplicateSd(groups: readonly (readonly number[])[]): PooledSd | null {
  let sumSquares = 0;
  let df = 0;
  let counted = 0;
  for (const group of groups) {
    if (group.length === 0) continue;
    const summary = summarizeSample(group, 'pooledReplicateSd');
    if (summary.variance === null) continue;
    sumSquares += (summary.n - 1) * summary.variance;
    df += summary.n - 1;
    counted++;
  }
  if (counted === 0) return null;
  return { sd: Math.sqrt(sumSquares / df), df, groups: counted };
}

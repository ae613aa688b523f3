// Median of a slice of numbers without sorting the whole slice (durability logs reach 10⁶ rows):
// the checks and the slice are ours, the selection is simple-statistics' quantile (Floyd–Rivest
// selection on a copy, O(n) expected).
import { quantile } from 'simple-statistics';

/**
 * Median of values[from..to): the middle value, or the mean of the two middle values.
 * Reference: selection as in Floyd & Rivest, Comm. ACM 18 (1975), Algorithm 489, via simple-statistics.
 * Cost: O(n) expected time, two copies of the slice (n doubles each).
 * @throws RangeError when the slice is empty, outside the array, or holds a non-finite value.
 * @example median([3, 1, 2]) // 2
 */
export function median(values: ArrayLike<number>, from = 0, to = values.length): number {
  if (!Number.isInteger(from) || !Number.isInteger(to) || from < 0 || to > values.length || from >= to) {
    throw new RangeError(`median: need a non-empty slice 0 ≤ from < to ≤ ${values.length}, got from ${from}, to ${to}`);
  }
  const count = to - from;
  const scratch = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const value = values[from + i];
    if (!Number.isFinite(value)) throw new RangeError(`median: values must be finite numbers, got ${value} at index ${from + i}`);
    scratch[i] = value;
  }
  return quantile(scratch as unknown as number[], 0.5);
}

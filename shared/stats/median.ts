// Median of a slice of numbers without sorting the whole slice (durability logs reach 10⁶ rows):
// the checks and the copy are ours, the selection is simple-statistics' quickselect (Floyd–Rivest,
// O(n) expected), done in place on our one copy.
import { quickselect } from 'simple-statistics';

/**
 * Median of values[from..to): the middle value, or the mean of the two middle values.
 * Reference: selection as in Floyd & Rivest, Comm. ACM 18 (1975), Algorithm 489, via simple-statistics.
 * Cost: O(n) expected time, one copy of the slice (n doubles).
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
  const middle = count >> 1;
  quickselect(scratch as unknown as number[], middle);
  if (count % 2 === 1) return scratch[middle];
  // even count: the other middle value is the largest of the lower part, which selection left below it
  let below = scratch[0];
  for (let i = 1; i < middle; i++) if (scratch[i] > below) below = scratch[i];
  return (below + scratch[middle]) / 2;
}

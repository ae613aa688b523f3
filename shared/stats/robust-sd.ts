// Spread of noisy data that ignores a few wild points: the scaled median absolute deviation.
import { medianAbsoluteDeviation } from 'simple-statistics';
import { median } from './median';

/**
 * Robust standard deviation of values[from..to): 1.4826 · median(|x − median(x)|), which equals the
 * standard deviation for normal data and is unmoved by a minority of outliers.
 * Reference: Rousseeuw & Croux (1993), J. Am. Stat. Assoc. 88, 1273–1283 (MAD, consistency factor 1.4826).
 * Cost: O(n) expected time, a few copies of the slice (simple-statistics' medianAbsoluteDeviation).
 * @throws RangeError when the slice is empty, outside the array, or holds a non-finite value.
 * @example robustSd([1, 2, 3, 4, 100]) // 1.4826
 */
export function robustSd(values: ArrayLike<number>, from = 0, to = values.length): number {
  median(values, from, to); // checks the slice and its values
  return 1.4826 * medianAbsoluteDeviation(Array.prototype.slice.call(values, from, to) as number[]);
}

// Binary search on a non-decreasing time column, for turning hour ranges into row ranges.

/**
 * First index i with t[i] ≥ value (t.length when none), for non-decreasing t.
 * Reference: Knuth, TAOCP vol. 3, §6.2.1 (binary search). Cost: O(log n).
 * @throws never (unsorted input gives an unspecified index).
 * @example lowerBound([0, 1, 1, 2], 1) // 1
 */
export function lowerBound(t: ArrayLike<number>, value: number): number {
  let low = 0;
  let high = t.length;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if (t[middle] < value) low = middle + 1;
    else high = middle;
  }
  return low;
}

/**
 * First index i with t[i] > value (t.length when none), for non-decreasing t.
 * Reference: Knuth, TAOCP vol. 3, §6.2.1. Cost: O(log n).
 * @throws never.
 * @example upperBound([0, 1, 1, 2], 1) // 3
 */
export function upperBound(t: ArrayLike<number>, value: number): number {
  let low = 0;
  let high = t.length;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if (t[middle] <= value) low = middle + 1;
    else high = middle;
  }
  return low;
}

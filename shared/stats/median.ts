// Median of a slice of numbers without sorting the whole slice (durability logs reach 10⁶ rows).

/**
 * Median of values[from..to): the middle value, or the mean of the two middle values.
 * Reference: Hoare's selection algorithm (quickselect), Comm. ACM 4 (1961), Algorithm 65 "FIND".
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
  const upper = selectKth(scratch, count >> 1);
  if (count % 2 === 1) return upper;
  // For even counts the lower middle is the largest value left of the upper middle after selection.
  let lower = -Infinity;
  for (let i = 0; i < count >> 1; i++) if (scratch[i] > lower) lower = scratch[i];
  return (lower + upper) / 2;
}

/** k-th smallest (0-based) of the array, reordering it in place so that smaller values sit left of k. */
function selectKth(data: Float64Array, k: number): number {
  let left = 0;
  let right = data.length - 1;
  while (right > left) {
    // Median-of-three pivot guards against sorted input, the usual shape of time-like columns.
    const middle = (left + right) >> 1;
    const a = data[left];
    const b = data[middle];
    const c = data[right];
    const pivot = a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
    let i = left;
    let j = right;
    while (i <= j) {
      while (data[i] < pivot) i++;
      while (data[j] > pivot) j--;
      if (i <= j) {
        const swap = data[i];
        data[i] = data[j];
        data[j] = swap;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return data[k];
  }
  return data[k];
}

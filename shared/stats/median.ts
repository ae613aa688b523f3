// Median of a slice of numbers without sorting the whole slice (durability logs reach 10⁶ rows):
// the checks and the copy are ours, the selection is simple-statistics' quickselect (Floyd–Rivest,
// O(n) expected), done in place on our one copy. A long slice first tries one counting pass
// bracketed by a sample's quantiles, which keeps only the few values near the middle.
import { quickselect } from 'simple-statistics';

/** Below this many values the copy and selection are cheap enough; above, the bracketed pass first. */
const BRACKET_FROM = 16384;
/** values sampled (evenly spaced) to bracket the middle */
const SAMPLE = 8192;
/** sample ranks either side of the middle's: 6 standard deviations of the sample median's rank, 6·√(SAMPLE/4) */
const MARGIN = 272;

function checkSlice(name: string, length: number, from: number, to: number) {
  if (!Number.isInteger(from) || !Number.isInteger(to) || from < 0 || to > length || from >= to) {
    throw new RangeError(`${name}: need a non-empty slice 0 ≤ from < to ≤ ${length}, got from ${from}, to ${to}`);
  }
}

function notFinite(value: number, index: number): RangeError {
  return new RangeError(`median: values must be finite numbers, got ${value} at index ${index}`);
}

/** The values of ranks `low` and `high` (0-based, low ≤ high ≤ low + 1) of values[from..to), by copy and selection. */
function bySelection(values: ArrayLike<number>, from: number, to: number, low: number, high: number): [number, number] {
  const count = to - from;
  const scratch = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const value = values[from + i];
    if (!Number.isFinite(value)) throw notFinite(value, from + i);
    scratch[i] = value;
  }
  quickselect(scratch as unknown as number[], high);
  if (low === high) return [scratch[high], scratch[high]];
  // the other middle value is the largest of the lower part, which selection left below it
  let below = scratch[0];
  for (let i = 1; i < high; i++) if (scratch[i] > below) below = scratch[i];
  return [below, scratch[high]];
}

/**
 * The same two ranks from one counting pass: a sorted, evenly spaced sample gives bounds lo ≤ hi
 * around the middle; the pass counts the values below lo, equal to lo, equal to hi and above hi,
 * and keeps only those strictly between. The ranks are exact whenever they fall at lo, at hi or
 * among the kept values; otherwise (or when too many are kept) null, and the caller selects.
 */
function byBracket(values: ArrayLike<number>, from: number, to: number, low: number, high: number): [number, number] | null {
  const count = to - from;
  const sample = new Float64Array(SAMPLE);
  for (let s = 0; s < SAMPLE; s++) sample[s] = values[from + Math.floor(((s + 0.5) * count) / SAMPLE)];
  for (let s = 0; s < SAMPLE; s++) if (!Number.isFinite(sample[s])) return null;
  sample.sort();
  const at = (high / count) * SAMPLE;
  const lo = sample[Math.max(0, Math.floor(at) - MARGIN)];
  const hi = sample[Math.min(SAMPLE - 1, Math.ceil(at) + MARGIN)];
  // about 2·MARGIN/SAMPLE ≈ 7 % of the values fall between the bounds; room for 12.5 %
  const room = Math.max(BRACKET_FROM, count >> 3);
  const kept = new Float64Array(room);
  let below = 0;
  let atLo = 0;
  let between = 0;
  let atHi = 0;
  for (let i = from; i < to; i++) {
    const value = values[i];
    // lo and hi are finite, so only the two outer branches can meet a non-finite value
    if (value < lo) {
      if (value === -Infinity) throw notFinite(value, i);
      below++;
    } else if (value === lo) atLo++;
    else if (value < hi) {
      if (between === room) return null;
      kept[between++] = value;
    } else if (value === hi) atHi++;
    else if (!(value < Infinity)) throw notFinite(value, i);
  }
  const pick = (rank: number): number | 'kept' | null => {
    if (rank < below) return null;
    if (rank < below + atLo) return lo;
    if (rank < below + atLo + between) return 'kept';
    if (rank < below + atLo + between + atHi) return hi;
    return null;
  };
  const a = pick(low);
  const b = pick(high);
  if (a === null || b === null) return null;
  const inKept = kept.subarray(0, between);
  if (b === 'kept') {
    const k = high - below - atLo;
    quickselect(inKept as unknown as number[], k);
    const upper = inKept[k];
    if (low === high) return [upper, upper];
    if (a !== 'kept') return [a, upper];
    let lower = inKept[0];
    for (let i = 1; i < k; i++) if (inKept[i] > lower) lower = inKept[i];
    return [lower, upper];
  }
  if (a === 'kept') {
    // the upper middle is hi, the lower one the largest kept value
    let lower = inKept[0];
    for (let i = 1; i < between; i++) if (inKept[i] > lower) lower = inKept[i];
    return [lower, b];
  }
  return [a, b];
}

function middleRanks(values: ArrayLike<number>, from: number, to: number, low: number, high: number): [number, number] {
  if (to - from >= BRACKET_FROM) {
    const found = byBracket(values, from, to, low, high);
    if (found) return found;
  }
  return bySelection(values, from, to, low, high);
}

/**
 * Median of values[from..to): the middle value, or the mean of the two middle values.
 * Reference: selection as in Floyd & Rivest, Comm. ACM 18 (1975), Algorithm 489 (sampled bounds,
 * then selection among the few values between them), via simple-statistics' quickselect.
 * Cost: O(n) expected time; one pass and a small buffer for a long slice whose middle the sample
 * brackets, else one copy of the slice (n doubles).
 * @throws RangeError when the slice is empty, outside the array, or holds a non-finite value.
 * @example median([3, 1, 2]) // 2
 */
export function median(values: ArrayLike<number>, from = 0, to = values.length): number {
  checkSlice('median', values.length, from, to);
  const count = to - from;
  const middle = count >> 1;
  const [lower, upper] = middleRanks(values, from, to, count % 2 === 1 ? middle : middle - 1, middle);
  return count % 2 === 1 ? upper : (lower + upper) / 2;
}

/**
 * The value of rank `rank` (0-based, in ascending order) of values[from..to), e.g. the upper middle
 * of an even count: rank = count >> 1. Same method, cost and refusals as median.
 * @example kthSmallest([5, 1, 4, 2], 2) // 4
 */
export function kthSmallest(values: ArrayLike<number>, rank: number, from = 0, to = values.length): number {
  checkSlice('kthSmallest', values.length, from, to);
  if (!Number.isInteger(rank) || rank < 0 || rank >= to - from) throw new RangeError(`kthSmallest: rank must be an integer in [0, ${to - from}), got ${rank}`);
  return middleRanks(values, from, to, rank, rank)[1];
}

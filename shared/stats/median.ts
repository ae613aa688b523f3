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

/** Bounds lo ≤ hi around rank `high` of `count` values, from a sample of them (sorted here). */
function bracketBounds(sample: Float64Array, count: number, high: number): { lo: number; hi: number } {
  sample.sort();
  const at = (high / count) * sample.length;
  const margin = Math.round((MARGIN * sample.length) / SAMPLE);
  return { lo: sample[Math.max(0, Math.floor(at) - margin)], hi: sample[Math.min(sample.length - 1, Math.ceil(at) + margin)] };
}

/** What one counting pass found about bounds lo and hi: counts below, at and above, and the values between. */
interface BracketCount {
  lo: number;
  hi: number;
  below: number;
  atLo: number;
  between: number;
  atHi: number;
  kept: Float64Array;
}

/** The values of ranks `low` and `high` from a counting pass, or null when they are not among what it kept. */
function pickFromBracket({ lo, hi, below, atLo, between, atHi, kept }: BracketCount, low: number, high: number): [number, number] | null {
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
  const { lo, hi } = bracketBounds(sample, count, high);
  // about 2·MARGIN/SAMPLE ≈ 7 % of the values fall between the bounds; room for 12.5 %
  const room = Math.max(BRACKET_FROM, count >> 3);
  const kept = new Float64Array(room + 1);
  let below = 0;
  let atLo = 0;
  let between = 0;
  let atHi = 0;
  for (let i = from; i < to; i++) {
    const value = values[i];
    // value − value is 0 for a finite number, NaN otherwise (a test that is never taken in a clean log)
    if (value - value !== 0) throw notFinite(value, i);
    // counted without branching on the value (a log's values fall either side of the bounds at random)
    below += +(value < lo);
    atLo += +(value === lo);
    atHi += +(value === hi);
    kept[between] = value;
    between += +(value > lo) & +(value < hi);
    if (between > room) return null;
  }
  return pickFromBracket({ lo, hi, below, atLo, between, atHi, kept }, low, high);
}

/**
 * Median of the forward steps of a time column (t[i] − t[i−1] for each i with t[i] > t[i−1]) without
 * a copy of them: the same sampled bracket and counting pass as median, the steps worked out as it
 * goes; a copy and selection only when the sample misses the middle. NaN when no step goes forward.
 * Cost: O(n) expected time, one pass over t (and a sample) and a buffer of an eighth of it at most.
 * @throws RangeError when t holds a non-finite value.
 * @example medianForwardStep([0, 1, 3, 3, 4]) // 1 (forward steps 1, 2, 1)
 */
export function medianForwardStep(t: ArrayLike<number>): number {
  const n = t.length;
  if (n > 0 && t[0] - t[0] !== 0) throw notFinite(t[0], 0);
  let found: [number, number] | null = null;
  let count = 0;
  if (n > BRACKET_FROM) {
    // bounds about the middle of a sample of the steps (the median's rank is half the count, whatever it is)
    const sample = new Float64Array(SAMPLE);
    let taken = 0;
    for (let s = 0; s < SAMPLE; s++) {
      const i = 1 + Math.floor(((s + 0.5) * (n - 1)) / SAMPLE);
      const step = t[i] - t[i - 1];
      if (step > 0) sample[taken++] = step;
    }
    const { lo, hi } = bracketBounds(sample.subarray(0, Math.max(1, taken)), 2, 1);
    // one pass: the check, the count of forward steps and the bracket together
    const room = Math.max(BRACKET_FROM, n >> 3);
    const kept = new Float64Array(room + 1);
    let below = 0;
    let atLo = 0;
    let between = 0;
    let atHi = 0;
    let previous = t[0];
    for (let i = 1; i < n; i++) {
      const value = t[i];
      if (value - value !== 0) throw notFinite(value, i);
      const step = value - previous;
      previous = value;
      if (!(step > 0)) continue;
      count++;
      below += +(step < lo);
      atLo += +(step === lo);
      atHi += +(step === hi);
      kept[between] = step;
      between += +(step > lo) & +(step < hi);
      // too many between the bounds: the count goes on, the selection below takes over
      if (between > room) between = room;
    }
    if (count === 0) return NaN;
    const middle = count >> 1;
    if (taken >= SAMPLE / 2 && between < room) found = pickFromBracket({ lo, hi, below, atLo, between, atHi, kept }, count % 2 === 1 ? middle : middle - 1, middle);
  } else {
    for (let i = 1; i < n; i++) {
      const value = t[i];
      if (value - value !== 0) throw notFinite(value, i);
      count += +(value > t[i - 1]);
    }
    if (count === 0) return NaN;
  }
  const middle = count >> 1;
  const low = count % 2 === 1 ? middle : middle - 1;
  if (!found) {
    const steps = new Float64Array(count);
    for (let i = 1, k = 0; i < n; i++) if (t[i] > t[i - 1]) steps[k++] = t[i] - t[i - 1];
    found = bySelection(steps, 0, count, low, middle);
  }
  return count % 2 === 1 ? found[1] : (found[0] + found[1]) / 2;
}

/** Ranks already selected within withSelectionMemo: by array, then slice, then rank. */
let memo: WeakMap<object, Map<string, number>> | null = null;

/**
 * Runs `measure` with the ranks it selects from long slices remembered, so that a second median or
 * kthSmallest of the same slice (the durability fit's median current and the onset search's held
 * current are the same selection) is read back instead of selected again. The arrays must not be
 * changed inside `measure`; the memory goes when it returns.
 */
export function withSelectionMemo<T>(measure: () => T): T {
  const outer = memo;
  memo = new WeakMap();
  try {
    return measure();
  } finally {
    memo = outer;
  }
}

function middleRanks(values: ArrayLike<number>, from: number, to: number, low: number, high: number): [number, number] {
  if (to - from < BRACKET_FROM) return bySelection(values, from, to, low, high);
  let known: Map<string, number> | undefined;
  if (memo && typeof values === 'object') {
    known = memo.get(values);
    if (!known) memo.set(values, (known = new Map()));
    const a = known.get(`${from}:${to}:${low}`);
    const b = known.get(`${from}:${to}:${high}`);
    if (a !== undefined && b !== undefined) return [a, b];
  }
  const found = byBracket(values, from, to, low, high) ?? bySelection(values, from, to, low, high);
  known?.set(`${from}:${to}:${low}`, found[0]);
  known?.set(`${from}:${to}:${high}`, found[1]);
  return found;
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

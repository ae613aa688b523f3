// median and kthSmallest against the definition (sort a copy, take the middle), on short slices
// (copy and selection) and long ones (the sampled bracket and its fallback): random values, heavy
// ties as station logs have them (a held current written to 5 decimals, a fixed time step), sorted
// and reversed runs, sub-slices, and the refusal of a non-finite value naming its index.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { kthSmallest, median, medianForwardStep, withSelectionMemo } from '../../../shared/stats/median';

/** The definition: sort a copy; odd count → the middle, even → the mean of the two middle values. */
function sortedMedian(values: ArrayLike<number>, from: number, to: number): number {
  const sorted = Array.from(values).slice(from, to).sort((a, b) => a - b);
  const m = sorted.length >> 1;
  return sorted.length % 2 ? sorted[m]! : (sorted[m - 1]! + sorted[m]!) / 2;
}

const finite = fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true });
/** few distinct values: ties at and around the middle */
const tied = fc.integer({ min: -3, max: 3 }).map((k) => 0.2 + k * 1e-5);

describe('median', () => {
  it('is the sorted middle for short and long slices of any finite values', () => {
    fc.assert(fc.property(fc.array(finite, { minLength: 1, maxLength: 30000 }), (values) => {
      expect(median(values)).toBe(sortedMedian(values, 0, values.length));
    }), { numRuns: 150, seed: 16 });
  });

  it('is the sorted middle when most values are tied (held current, fixed step)', () => {
    fc.assert(fc.property(fc.array(tied, { minLength: 16384, maxLength: 40000 }), (values) => {
      const typed = Float64Array.from(values);
      expect(median(typed)).toBe(sortedMedian(typed, 0, typed.length));
    }), { numRuns: 60, seed: 17 });
  });

  it('is the sorted middle of sorted, reversed and shuffled long runs, and of sub-slices', () => {
    const n = 50_001;
    const up = Float64Array.from({ length: n }, (_, i) => i * 0.0042);
    const down = up.slice().reverse();
    expect(median(up)).toBe(sortedMedian(up, 0, n)); // 25,000 × 0.0042 = 105 by hand
    expect(median(up)).toBeCloseTo(105, 9);
    expect(median(down)).toBe(sortedMedian(down, 0, n));
    expect(median(up, 1, n)).toBe(sortedMedian(up, 1, n)); // even count: mean of the two middles
    expect(median(down, 123, 40_000)).toBe(sortedMedian(down, 123, 40_000));
    // two clusters, the middle falling between them (the bracket must not guess)
    const split = Float64Array.from({ length: 40_000 }, (_, i) => (i % 2 ? 1 + i * 1e-9 : -1 - i * 1e-9));
    expect(median(split)).toBe(sortedMedian(split, 0, split.length));
  });

  it('refuses a non-finite value, naming its index, on either path', () => {
    for (const length of [100, 30_000]) {
      for (const bad of [NaN, Infinity, -Infinity]) {
        const values = Float64Array.from({ length }, (_, i) => i);
        values[length - 7] = bad;
        expect(() => median(values)).toThrow(`median: values must be finite numbers, got ${bad} at index ${length - 7}`);
      }
    }
  });
});

describe('kthSmallest', () => {
  it('is the sorted value of every rank asked for', () => {
    fc.assert(fc.property(fc.array(fc.oneof(finite, tied), { minLength: 1, maxLength: 30000 }), fc.double({ min: 0, max: 1, noNaN: true }), (values, at) => {
      const rank = Math.min(values.length - 1, Math.floor(at * values.length));
      const sorted = values.slice().sort((a, b) => a - b);
      expect(kthSmallest(values, rank)).toBe(sorted[rank]);
    }), { numRuns: 120, seed: 18 });
  });

  it('refuses a rank outside the slice', () => {
    expect(() => kthSmallest([1, 2, 3], 3)).toThrow(RangeError);
    expect(kthSmallest([5, 1, 4, 2], 2)).toBe(4); // sorted 1, 2, 4, 5
  });
});

describe('medianForwardStep', () => {
  /** The definition: the forward steps written out, then their sorted middle. */
  const byDefinition = (t: ArrayLike<number>) => {
    const steps: number[] = [];
    for (let i = 1; i < t.length; i++) if (t[i] > t[i - 1]) steps.push(t[i] - t[i - 1]);
    return steps.length ? sortedMedian(steps, 0, steps.length) : NaN;
  };
  // a station clock: a fixed step written to 4 decimals (steps of 0.0041 / 0.0042 h), some rows
  // repeated, some missing, a reset to 0 (a second run appended)
  const clock = fc.array(fc.oneof({ weight: 20, arbitrary: fc.constant(1) }, fc.constant(0), fc.integer({ min: 2, max: 40 }), fc.constant(-1)), { minLength: 1, maxLength: 40000 }).map((moves) => {
    const t = new Float64Array(moves.length);
    let minutes = 0;
    moves.forEach((move, i) => {
      minutes = move < 0 ? 0 : minutes + move * 0.25;
      t[i] = Number((minutes / 60).toFixed(4));
    });
    return t;
  });

  it('is the sorted middle of the forward steps, short and long, ties and resets included', () => {
    fc.assert(fc.property(clock, (t) => {
      expect(medianForwardStep(t)).toBe(byDefinition(t));
    }), { numRuns: 120, seed: 19 });
    fc.assert(fc.property(fc.array(finite, { minLength: 1, maxLength: 30000 }), (values) => {
      expect(medianForwardStep(values)).toBe(byDefinition(values));
    }), { numRuns: 60, seed: 20 });
  });

  it('is NaN when no step goes forward, and refuses a non-finite time naming its index', () => {
    expect(medianForwardStep([3, 3, 2, 1])).toBeNaN();
    expect(medianForwardStep([0, 1, 3, 3, 4])).toBe(1); // forward steps 1, 2, 1 by hand
    const t = Float64Array.from({ length: 30_000 }, (_, i) => i / 240);
    t[20_000] = NaN;
    expect(() => medianForwardStep(t)).toThrow('median: values must be finite numbers, got NaN at index 20000');
  });
});

describe('withSelectionMemo', () => {
  it('reads a slice\'s selected ranks back inside it, and forgets them when it returns', () => {
    const values = Float64Array.from({ length: 40_000 }, (_, i) => (i * 7919) % 40_000); // a permutation of 0…39,999
    const inside = withSelectionMemo(() => {
      const m = median(values); // ranks 19,999 and 20,000 → (19,999 + 20,000) / 2 by hand
      values[0] = 1e9; // a change inside is not seen: the memo holds the ranks as first selected
      return [m, kthSmallest(values, 20_000), kthSmallest(values, 39_999)];
    });
    expect(inside).toEqual([19_999.5, 20_000, 1e9]); // the largest was not selected before, so it is read afresh
    expect(kthSmallest(values, 20_000)).toBe(20_001); // outside: 0 became 1e9, so every rank moved up by one
  });
});

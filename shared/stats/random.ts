// Seeded pseudo-random numbers, one generator and one seed rule for the whole code base:
// designed experiments (Latin hypercubes, D-optimal starts, run order), proposals, Monte Carlo
// checks, synthetic curves and durability logs, the demo seed and the tests all draw from it, so a
// seed gives the same numbers on the server, in the browser and in a year's time. Math.random
// (unseeded, engine-specific) is never used for anything that is stored or compared.
//
// Seed rule: a seed is an integer (any sign); it is reduced modulo 2³² the way `seed >>> 0`
// does, so -1 and 4294967295 give the same stream. Anything else (a fraction, NaN, ±Infinity, a
// string) is refused with a RangeError naming the function. Streams are pinned by
// tests/unit/stats/random.test.ts against an independent Python reimplementation
// (tests/reference/mulberry32.py); changing the generator or the rule changes every stored design.

/** A source of uniform numbers in [0, 1). */
export type RandomSource = () => number;

function checkSeed(functionName: string, seed: number): void {
  if (typeof seed !== 'number' || !Number.isInteger(seed)) {
    throw new RangeError(`${functionName}: seed: must be an integer, got ${String(seed)}`);
  }
}

/**
 * mulberry32: a 32-bit-state generator returning uniform numbers in [0, 1).
 * Each call adds the Weyl constant 0x6D2B79F5 to the state and mixes it with two
 * multiply-xorshift rounds; the mixed 32-bit value divided by 2³² is the result.
 * Reference: the public-domain "mulberry32" generator (2017; period 2³²). Good enough for test
 * noise, demo data, shuffling run orders, drawing Latin hypercubes and candidate sets; NOT for
 * cryptography nor for statistics that need long periods.
 * Cost: O(1) per draw.
 * @throws RangeError when the seed is not an integer (see the seed rule above).
 * @example mulberry32(42)() // 0.6011037519201636 on every run and platform
 */
export function mulberry32(seed: number): RandomSource {
  checkSeed('mulberry32', seed);
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A second, independent seed derived from a seed and a stream number, so that one
 * user-visible seed can drive several random steps (Latin hypercube points, run order)
 * without one step's draws shifting the other's when an option changes.
 * Reference: the 32-bit finaliser of MurmurHash3 (public domain) applied to seed + stream·golden ratio.
 * Cost: O(1).
 * @throws RangeError when seed or stream is not an integer.
 * @example deriveSeed(42, 2) // an integer in [0, 2³²)
 */
export function deriveSeed(seed: number, stream: number): number {
  checkSeed('deriveSeed', seed);
  checkSeed('deriveSeed', stream);
  let hash = ((seed >>> 0) + Math.imul(stream >>> 0, 0x9e3779b9)) >>> 0;
  hash ^= hash >>> 16;
  hash = Math.imul(hash, 0x85ebca6b);
  hash ^= hash >>> 13;
  hash = Math.imul(hash, 0xc2b2ae35);
  hash ^= hash >>> 16;
  return hash >>> 0;
}

/**
 * A fresh seed for callers that gave none; it is recorded in the design so the result can
 * be reproduced. Uses Math.random only to pick the seed, never for the design itself.
 * Cost: O(1).
 * @example freshSeed() // e.g. 3184021977
 */
export function freshSeed(): number {
  return Math.floor(Math.random() * 4294967296) >>> 0;
}

/**
 * Fisher–Yates shuffle: walks the array from the end, swapping each slot with a uniformly
 * chosen slot at or before it, which makes every permutation equally likely.
 * Returns a new array; the input is not changed.
 * Reference: Knuth, The Art of Computer Programming vol. 2, §3.4.2, Algorithm P.
 * Cost: O(n) time, O(n) memory.
 * @throws RangeError when random is not a function.
 * @example shuffle([1, 2, 3, 4], mulberry32(7)) // a permutation of 1..4, the same for seed 7
 */
export function shuffle<T>(items: readonly T[], random: RandomSource): T[] {
  if (typeof random !== 'function') throw new RangeError('shuffle: random: must be a function returning numbers in [0, 1)');
  const result = items.slice();
  for (let index = result.length - 1; index > 0; index--) {
    // Math.min guards against a source that returns exactly 1.
    const other = Math.min(index, Math.floor(random() * (index + 1)));
    const held = result[index] as T;
    result[index] = result[other] as T;
    result[other] = held;
  }
  return result;
}

/**
 * Shuffle with a seed: the same seed gives the same order.
 * Cost: O(n).
 * @throws RangeError when the seed is not an integer.
 * @example seededShuffle(['a', 'b', 'c'], 2024) // the same order every time
 */
export function seededShuffle<T>(items: readonly T[], seed: number): T[] {
  checkSeed('seededShuffle', seed);
  return shuffle(items, mulberry32(seed));
}

/**
 * Standard normal draws from a uniform generator (Box–Muller, both values of each pair used).
 * Reference: Box & Muller (1958), Ann. Math. Stat. 29, 610–611.
 * Cost: O(1) per draw.
 * @throws never.
 * @example const gauss = normalGenerator(mulberry32(7)); gauss() // ~N(0, 1)
 */
export function normalGenerator(uniform: () => number): () => number {
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const value = spare;
      spare = null;
      return value;
    }
    let u = 0;
    while (u <= Number.MIN_VALUE) u = uniform(); // log(0) guard
    const w = uniform();
    const radius = Math.sqrt(-2 * Math.log(u));
    spare = radius * Math.sin(2 * Math.PI * w);
    return radius * Math.cos(2 * Math.PI * w);
  };
}

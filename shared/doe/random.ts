// Seeded pseudo-random numbers for designed experiments: the same seed must give the same
// Latin hypercube and the same run order on the server, in the browser and in a year's time,
// so Math.random (unseeded, engine-specific) is never used for anything that is stored.
import { mulberry32 as uniformFromSeed } from '../stats/mulberry32';

/** A source of uniform numbers in [0, 1). */
export type RandomSource = () => number;

function checkSeed(functionName: string, seed: number): void {
  if (typeof seed !== 'number' || !Number.isInteger(seed)) {
    throw new RangeError(`${functionName}: seed: must be an integer, got ${String(seed)}`);
  }
}

/**
 * mulberry32 (the one implementation, shared/stats/mulberry32) with this module's seed rule:
 * uniform numbers in [0, 1), the same for a seed on every platform.
 * Cost: O(1) per draw.
 * @throws RangeError when the seed is not an integer (any integer is reduced modulo 2³²).
 * @example const random = mulberry32(42); random() // same number on every platform
 */
export function mulberry32(seed: number): RandomSource {
  checkSeed('mulberry32', seed);
  return uniformFromSeed(seed);
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

// Seeded pseudo-random numbers, one implementation for the whole code base: synthetic curves and
// durability logs, designed experiments, proposals and the demo seed all draw from it, so the same
// seed gives the same numbers on the server, in the browser and in the tests. Math.random
// (unseeded, engine-specific) is never used for anything that is stored or compared.

/**
 * mulberry32: a 32-bit-state generator returning uniform numbers in [0, 1).
 * Each call adds the Weyl constant 0x6D2B79F5 to the state and mixes it with two
 * multiply-xorshift rounds; the mixed 32-bit value divided by 2³² is the result.
 * Reference: the public-domain "mulberry32" generator (2017; period 2³²). Good enough for test
 * noise, demo data, shuffling run orders and drawing Latin hypercubes; NOT for cryptography
 * nor for statistics that need long periods.
 * Cost: O(1) per draw.
 * @throws never: the seed is reduced modulo 2³² the way `seed >>> 0` does (fraction dropped
 *   toward zero, negatives wrapped, NaN and ±Infinity read as 0). Callers with a stricter seed
 *   rule check it first (shared/doe/random, shared/durability/seeded-random).
 * @example const random = mulberry32(42); random() // the same number on every run and platform
 */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

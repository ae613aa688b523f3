// Seeded pseudo-random numbers for synthetic logs and demo seeds: the same seed gives the same log
// in the browser, the server and the tests.

/**
 * mulberry32: a 32-bit-state generator returning uniform numbers in [0, 1).
 * Reference: the public-domain mulberry32 generator (Tommy Ettinger, 2017). Good enough for test
 * data and demo seeds, not for cryptography.
 * Cost: O(1) per draw.
 * @throws RangeError when the seed is not a finite number.
 * @example mulberry32(1)() // same value every time
 */
export function mulberry32(seed: number): () => number {
  if (!Number.isFinite(seed)) throw new RangeError(`mulberry32: seed must be a finite number, got ${seed}`);
  let state = Math.trunc(seed) >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
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

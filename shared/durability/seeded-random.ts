// Seeded pseudo-random numbers for synthetic logs and demo seeds: the same seed gives the same log
// in the browser, the server and the tests.
import { mulberry32 as uniformFromSeed } from '../stats/mulberry32';

/**
 * mulberry32 (the one implementation, shared/stats/mulberry32) with this module's seed rule:
 * uniform numbers in [0, 1); a fractional seed is truncated toward zero, then reduced modulo 2³².
 * Cost: O(1) per draw.
 * @throws RangeError when the seed is not a finite number.
 * @example mulberry32(1)() // same value every time
 */
export function mulberry32(seed: number): () => number {
  if (!Number.isFinite(seed)) throw new RangeError(`mulberry32: seed must be a finite number, got ${seed}`);
  return uniformFromSeed(Math.trunc(seed));
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

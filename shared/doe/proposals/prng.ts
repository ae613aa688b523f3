// A seeded pseudo-random generator, so the same seed gives the same proposals on the server and
// in the browser. Not for cryptography.
import { mulberry32 } from '../../stats/mulberry32';

/**
 * Uniform numbers in [0, 1) from mulberry32 (shared/stats/mulberry32), with this module's seed
 * rule: the seed is floored, reduced modulo 2³², a non-finite seed reads as 0, and a seed of 0
 * becomes 0x9E3779B9 (so seed 0 does not give the same stream as mulberry32(0)).
 * Cost: O(1) per draw.
 * @throws never.
 * @example const next = seededUniform(42); next() // 0.6011…
 */
export function seededUniform(seed: number): () => number {
  return mulberry32((Math.floor(Number.isFinite(seed) ? seed : 0) >>> 0) || 0x9e3779b9);
}

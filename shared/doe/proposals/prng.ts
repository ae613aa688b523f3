// A tiny seeded pseudo-random generator, so the same seed gives the same proposals on the
// server and in the browser. Not for cryptography.

/**
 * Mulberry32: a 32-bit state generator returning uniform numbers in [0, 1).
 * Reference: T. Ettinger's public-domain mulberry32 (2017); passes gjrand's tests for its size.
 * Cost: O(1) per draw.
 * @example const next = seededUniform(42); next() // 0.6011…
 */
export function seededUniform(seed: number): () => number {
  let state = (Math.floor(Number.isFinite(seed) ? seed : 0) >>> 0) || 0x9e3779b9;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

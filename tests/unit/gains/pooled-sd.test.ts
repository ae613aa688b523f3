import { describe, it, expect } from 'vitest';
import { pooledReplicateSd, summarizeSample } from '../../../shared/gains';

describe('pooledReplicateSd', () => {
  it('pools the variances of replicated groups with n − 1 weights', () => {
    // derived by hand: [1, 3] s² = 2 (df 1); [10, 12, 14] s² = 4 (df 2); [7] does not count.
    // pooled s² = (1·2 + 2·4) / 3 = 10/3
    const pooled = pooledReplicateSd([[1, 3], [10, 12, 14], [7]]);
    expect(pooled).not.toBeNull();
    expect(pooled!.sd).toBeCloseTo(Math.sqrt(10 / 3), 12); // derived by hand: sqrt(10/3)
    expect(pooled!.df).toBe(3); // derived by hand: 1 + 2
    expect(pooled!.groups).toBe(2); // derived by hand: two groups with n ≥ 2
  });

  it('returns null when no group is replicated', () => {
    expect(pooledReplicateSd([[0.61], [0.62], []])).toBeNull();
    expect(pooledReplicateSd([])).toBeNull();
  });

  it('stays accurate for voltages that differ in the fourth digit', () => {
    // derived by hand: 0.6121, 0.6123, 0.6125 → s = 0.0002; 0.6, 0.6 → s = 0 ; pooled s² = 2·0.0002²/3
    const pooled = pooledReplicateSd([[0.6121, 0.6123, 0.6125], [0.6, 0.6]]);
    expect(pooled!.sd).toBeCloseTo(Math.sqrt((2 * 0.0002 ** 2) / 3), 12); // derived by hand above
  });

  it('throws on non-finite values', () => {
    expect(() => pooledReplicateSd([[1, Infinity]])).toThrow(/finite/);
  });
});

describe('summarizeSample', () => {
  it('gives n, mean and SD', () => {
    const summary = summarizeSample([1, 2, 3]);
    expect(summary.mean).toBe(2); // derived by hand
    expect(summary.sd).toBeCloseTo(1, 14); // derived by hand: s² = (1 + 0 + 1)/2
  });
  it('has no SD for one value and throws on none', () => {
    expect(summarizeSample([5]).sd).toBeNull();
    expect(() => summarizeSample([])).toThrow(/at least 1 value/);
  });
});

import { describe, expect, it } from 'vitest';
import { CompensatedSum, compensatedDot, compensatedSum, compensatedSumOfSquares } from '../../../shared/stats/compensated-sum';

describe('compensated (Neumaier) sums', () => {
  it('keeps the small term that plain addition loses (derived by hand: 1e16 + 1 − 1e16 = 1)', () => {
    expect([1e16, 1, -1e16].reduce((a, b) => a + b, 0)).toBe(0); // plain summation loses it
    expect(compensatedSum([1e16, 1, -1e16])).toBe(1);
    const s = new CompensatedSum();
    for (const v of [1, 1e100, 1, -1e100]) s.add(v);
    expect(s.value()).toBe(2); // Neumaier (1974): Kahan's form gives 0 here, Neumaier's 2
  });

  it('sums a million 0.1 as the correctly rounded sum does (Python math.fsum: 100000.0; plain sum: 100000.00000133288)', () => {
    const values = new Float64Array(1_000_000).fill(0.1);
    expect(compensatedSum(values)).toBe(100000);
    expect(Math.abs(values.reduce((a, b) => a + b, 0) - 100000)).toBeGreaterThan(1e-7); // plain summation drifts
  });

  it('dot product and sum of squares (derived by hand)', () => {
    expect(compensatedDot([1e16, 1, -1e16], [1, 1, 1])).toBe(1);
    expect(compensatedDot([1, 2, 3], [4, 5, 6])).toBe(32);
    expect(compensatedSumOfSquares([3, 4])).toBe(25);
  });
});

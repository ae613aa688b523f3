import { describe, it, expect } from 'vitest';
import { welchInterval } from '../../../shared/gains';

describe('welchInterval', () => {
  // Worked example, derived by hand:
  //   a = [10, 12, 14]: mean 12, s² = (4 + 0 + 4)/2 = 4, s²/n = 4/3
  //   b = [14, 18, 22, 26]: mean 20, s² = (36 + 4 + 4 + 36)/3 = 80/3, s²/n = 20/3
  //   diff = 20 − 12 = 8; se² = 4/3 + 20/3 = 8, se = 2√2 = 2.828427…
  //   ν = 8² / ((4/3)²/2 + (20/3)²/3) = 64 / (8/9 + 400/27) = 64·27/424 = 216/53 = 4.0754717…
  //   t(0.975, 4.0755) lies between the table values 2.776 (4 df) and 2.571 (5 df) (NIST/SEMATECH
  //   e-Handbook 1.3.6.7.2); scipy.stats.t.ppf(0.975, 216/53) = 2.756285 (run locally, scipy 1.17).
  //   Interval 8 ± 2.756285·2.828427 = [0.204049, 15.795951]; scipy.stats.ttest_ind(b, a,
  //   equal_var=False).confidence_interval() gives the same (run locally).
  const result = welchInterval([10, 12, 14], [14, 18, 22, 26]);

  it('gives the difference b − a and its standard error', () => {
    expect(result.diff).toBeCloseTo(8, 12); // derived by hand: 20 − 12
    expect(result.se).toBeCloseTo(2 * Math.SQRT2, 12); // derived by hand: √8
  });

  it('gives the Welch–Satterthwaite degrees of freedom', () => {
    expect(result.df).toBeCloseTo(216 / 53, 12); // derived by hand: 64·27/424 = 216/53
  });

  it('gives the interval', () => {
    expect(result.low).toBeCloseTo(0.204049, 5); // derived by hand above; scipy ttest_ind confidence_interval
    expect(result.high).toBeCloseTo(15.795951, 5); // derived by hand above; scipy ttest_ind confidence_interval
    const t = (result.high - result.diff) / result.se;
    expect(t).toBeLessThan(2.776); // NIST/SEMATECH 1.3.6.7.2: t(0.975, 4) = 2.776
    expect(t).toBeGreaterThan(2.571); // NIST/SEMATECH 1.3.6.7.2: t(0.975, 5) = 2.571
  });

  it('is antisymmetric in its arguments', () => {
    const swapped = welchInterval([14, 18, 22, 26], [10, 12, 14]);
    expect(swapped.diff).toBeCloseTo(-8, 12); // derived by hand: 12 − 20
    expect(swapped.low).toBeCloseTo(-result.high, 12); // derived by hand: mirror image
  });

  it('collapses to the point when neither sample varies', () => {
    const flat = welchInterval([1, 1], [3, 3, 3]);
    expect(flat.low).toBe(2); // derived by hand: 3 − 1, zero spread
    expect(flat.high).toBe(2); // derived by hand: 3 − 1, zero spread
  });

  it('throws on too few values, non-finite values and a bad confidence', () => {
    expect(() => welchInterval([1], [1, 2])).toThrow(/at least 2 values/);
    expect(() => welchInterval([1, NaN], [1, 2])).toThrow(/finite/);
    expect(() => welchInterval([1, 2], [1, 2], 1)).toThrow(/confidence/);
  });
});

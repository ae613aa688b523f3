import { describe, it, expect } from 'vitest';
import { linearRegression } from 'simple-statistics';
import { fitLine } from '../../../shared/stats/linear-fit';
import { tQuantile } from '../../../shared/stats/distributions';

// NIST StRD linear least squares, dataset "Norris" (calibration of ozone monitors, 36 observations,
// lower difficulty): https://www.itl.nist.gov/div898/strd/lls/data/Norris.shtml (file Norris.dat).
// Pairs typed from a public copy of Norris.dat (the NIST file's data block, y then x).
const NORRIS_Y = [
  0.1, 338.8, 118.1, 888.0, 9.2, 228.1, 668.5, 998.5, 449.1, 778.9, 559.2, 0.3, 0.1, 778.1, 668.8, 339.3,
  448.9, 10.8, 557.7, 228.3, 998.0, 888.8, 119.6, 0.3, 0.6, 557.6, 339.3, 888.0, 998.5, 778.9, 10.2, 117.6,
  228.9, 668.4, 449.2, 0.2,
];
const NORRIS_X = [
  0.2, 337.4, 118.2, 884.6, 10.1, 226.5, 666.3, 996.3, 448.6, 777.0, 558.2, 0.4, 0.6, 775.5, 666.9, 338.0,
  447.5, 11.6, 556.0, 228.1, 995.8, 887.6, 120.2, 0.3, 0.3, 556.8, 339.1, 887.2, 999.0, 779.0, 11.1, 118.3,
  229.2, 669.1, 448.9, 0.5,
];

/** Number of agreeing significant digits, −log10 of the relative error. */
function digits(actual: number, certified: number): number {
  const rel = Math.abs(actual - certified) / Math.abs(certified);
  return rel === 0 ? 16 : -Math.log10(rel);
}

/** Deterministic PRNG (mulberry32) so the random comparison is reproducible. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('fitLine on NIST StRD Norris', () => {
  const fit = fitLine(NORRIS_X, NORRIS_Y);

  it('uses all 36 observations', () => {
    expect(fit.n).toBe(36); // Norris.dat: 36 observations
  });

  it('reproduces the certified coefficients to at least 10 significant digits', () => {
    expect(digits(fit.intercept, -0.262323073774029)).toBeGreaterThanOrEqual(10); // Norris.dat certified B0
    expect(digits(fit.slope, 1.00211681802045)).toBeGreaterThanOrEqual(10); // Norris.dat certified B1
  });

  it('reproduces the certified standard errors, residual SD and R²', () => {
    expect(digits(fit.interceptSE, 0.232818234301152)).toBeGreaterThanOrEqual(10); // Norris.dat SD of B0
    expect(digits(fit.slopeSE, 0.429796848199937e-3)).toBeGreaterThanOrEqual(10); // Norris.dat SD of B1
    expect(digits(fit.residualSD, 0.884796396144373)).toBeGreaterThanOrEqual(10); // Norris.dat residual SD
    expect(digits(fit.r2, 0.999993745883712)).toBeGreaterThanOrEqual(10); // Norris.dat R-squared
  });

  it('reproduces the certified residual sum of squares', () => {
    expect(digits(fit.rss, 26.6173985294224)).toBeGreaterThanOrEqual(10); // Norris.dat ANOVA residual SS
  });

  it('gives the same answer when the data are shifted by a large offset (centring)', () => {
    // derived by hand: adding 1e6 to every x leaves the slope unchanged and moves the intercept
    // by −slope·1e6; a naive Σx² − (Σx)²/n formula loses about 6 digits here.
    const shifted = NORRIS_X.map((value) => value + 1e6);
    const shiftedFit = fitLine(shifted, NORRIS_Y);
    expect(digits(shiftedFit.slope, 1.00211681802045)).toBeGreaterThanOrEqual(9); // Norris.dat certified B1
    expect(digits(shiftedFit.slopeSE, 0.429796848199937e-3)).toBeGreaterThanOrEqual(9); // Norris.dat SD of B1
  });

  it('honours an index range', () => {
    const padded = new Float64Array([NaN, ...NORRIS_X, NaN]);
    const paddedY = new Float64Array([NaN, ...NORRIS_Y, NaN]);
    const ranged = fitLine(padded, paddedY, { from: 1, to: 37 });
    expect(digits(ranged.slope, 1.00211681802045)).toBeGreaterThanOrEqual(10); // Norris.dat certified B1
  });
});

describe('fitLine against simple-statistics and a t table', () => {
  it('matches simple-statistics linearRegression on random data', () => {
    const random = mulberry32(42);
    for (let trial = 0; trial < 5; trial++) {
      const count = 50 + trial * 37;
      const xs: number[] = [];
      const ys: number[] = [];
      const pairs: [number, number][] = [];
      for (let i = 0; i < count; i++) {
        const xi = random() * 100;
        const yi = 0.7 - 0.003 * xi + (random() - 0.5) * 0.02;
        xs.push(xi);
        ys.push(yi);
        pairs.push([xi, yi]);
      }
      const ours = fitLine(xs, ys);
      const theirs = linearRegression(pairs); // simple-statistics, independent implementation
      expect(ours.slope).toBeCloseTo(theirs.m, 12);
      expect(ours.intercept).toBeCloseTo(theirs.b, 12);
    }
  });

  it('recovers an exact line with zero residuals', () => {
    const fit = fitLine([0, 1, 2, 3], [1, 3, 5, 7]);
    expect(fit.slope).toBeCloseTo(2, 14); // derived by hand: y = 1 + 2x
    expect(fit.intercept).toBeCloseTo(1, 14); // derived by hand: y = 1 + 2x
    expect(fit.residualSD).toBeCloseTo(0, 14); // derived by hand: exact line, no residuals
    expect(fit.r2).toBeCloseTo(1, 14); // derived by hand: exact line
  });

  it('fits a million-point Float64Array', () => {
    const count = 1_000_000;
    const t = new Float64Array(count);
    const v = new Float64Array(count);
    for (let i = 0; i < count; i++) {
      t[i] = i / 60; // one point a minute, hours
      v[i] = 0.65 - 8e-6 * t[i] + ((i * 7919) % 13) * 1e-5; // deterministic ripple
    }
    const fit = fitLine(t, v);
    expect(fit.n).toBe(count);
    expect(fit.slope).toBeCloseTo(-8e-6, 8); // derived by hand: generated with −8 µV/h
  });

  it('t quantiles agree with the NIST/SEMATECH e-Handbook t table (1.3.6.7.2)', () => {
    expect(tQuantile(0.975, 2)).toBeCloseTo(4.303, 3); // NIST/SEMATECH e-Handbook 1.3.6.7.2, df 2
    expect(tQuantile(0.975, 4)).toBeCloseTo(2.776, 3); // NIST/SEMATECH e-Handbook 1.3.6.7.2, df 4
    expect(tQuantile(0.975, 10)).toBeCloseTo(2.228, 3); // NIST/SEMATECH e-Handbook 1.3.6.7.2, df 10
  });
});

describe('fitLine throws', () => {
  it('on mismatched lengths', () => {
    expect(() => fitLine([1, 2, 3], [1, 2])).toThrow(/same length/);
  });
  it('on fewer than 3 points', () => {
    expect(() => fitLine([1, 2], [1, 2])).toThrow(/at least 3 points/);
    expect(() => fitLine([1, 2, 3, 4], [1, 2, 3, 4], { from: 1, to: 3 })).toThrow(/at least 3 points/);
  });
  it('on non-finite values', () => {
    expect(() => fitLine([1, 2, NaN], [1, 2, 3])).toThrow(/finite/);
    expect(() => fitLine([1, 2, 3], [1, Infinity, 3])).toThrow(/finite/);
  });
  it('on a bad range', () => {
    expect(() => fitLine([1, 2, 3], [1, 2, 3], { from: 0, to: 4 })).toThrow(/range/);
    expect(() => fitLine([1, 2, 3], [1, 2, 3], { from: 2, to: 1 })).toThrow(/range/);
  });
  it('on constant x', () => {
    expect(() => fitLine([2, 2, 2], [1, 2, 3])).toThrow(/constant/);
  });
});

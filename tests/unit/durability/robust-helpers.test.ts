import { describe, it, expect } from 'vitest';
import { median as ssMedian, medianAbsoluteDeviation } from 'simple-statistics';
import { median } from '../../../shared/stats/median';
import { robustSd } from '../../../shared/stats/robust-sd';
import { fitTrend, lowerBound, upperBound, mulberry32 } from '../../../shared/durability';

describe('median and robustSd (used by the durability code)', () => {
  it('agree with simple-statistics on random data, odd and even counts', () => {
    const random = mulberry32(9);
    for (const count of [1, 2, 7, 50, 101, 1000]) {
      const values = Array.from({ length: count }, () => Math.round(random() * 40) / 4); // ties on purpose
      expect(median(values)).toBeCloseTo(ssMedian(values), 14); // simple-statistics, independent implementation
      if (count > 2) expect(robustSd(values)).toBeCloseTo(1.4826 * medianAbsoluteDeviation(values), 12); // same
    }
  });

  it('handle a slice and sorted input', () => {
    const sorted = Float64Array.from({ length: 1001 }, (_, i) => i);
    expect(median(sorted)).toBe(500); // derived by hand: middle of 0…1000
    expect(median(sorted, 10, 13)).toBe(11); // derived by hand: 10, 11, 12
    expect(robustSd([1, 2, 3, 4, 100])).toBeCloseTo(1.4826, 12); // derived by hand: MAD = 1
  });

  it('throw on an empty slice and non-finite values', () => {
    expect(() => median([])).toThrow(/non-empty/);
    expect(() => median([1, NaN])).toThrow(/finite/);
  });
});

describe('lowerBound / upperBound', () => {
  it('find the row range of an hour range', () => {
    const t = [0, 1, 1, 2];
    expect(lowerBound(t, 1)).toBe(1); // derived by hand
    expect(upperBound(t, 1)).toBe(3); // derived by hand
    expect(lowerBound(t, 5)).toBe(4); // derived by hand: past the end
  });
});

describe('fitTrend', () => {
  it('equals ordinary least squares when every row is its own block and noise is white', () => {
    // derived by hand: exact line V = 0.7 − 1e-4·t plus a ±1e-4 alternation (lag-1 correlation −1,
    // clipped to 0, so no widening)
    const t = Array.from({ length: 20 }, (_, i) => i);
    const v = t.map((hour, i) => 0.7 - 1e-4 * hour + (i % 2 === 0 ? 1e-4 : -1e-4));
    const fit = fitTrend(t, v, { blockHours: 0 })!;
    expect(fit.lag1).toBe(0); // clipped at 0
    expect(fit.slopeSE).toBeCloseTo(fit.slopeSEUncorrected, 15);
    // derived by hand: Sxx = 20·(20² − 1)/12 = 665; the alternation adds Σ(t − 9.5)·(±1e-4) = −10·1e-4
    // to Sxy, so the slope is −1e-4 − 1e-3/665
    expect(fit.slope).toBeCloseTo(-1e-4 - 1e-3 / 665, 12);
  });

  it('gives each segment its own intercept', () => {
    const t = [0, 1, 2, 3, 4, 5, 6, 7];
    const v = [1, 0.9, 0.8, 0.7, 2, 1.9, 1.8, 1.7]; // derived by hand: slope −0.1 in both, +1.4 step
    const fit = fitTrend(t, v, { blockHours: 0, segmentStarts: [4] })!;
    expect(fit.slope).toBeCloseTo(-0.1, 12); // derived by hand
    expect(fit.segments).toHaveLength(2);
    expect(fit.segments[1].meanV - fit.segments[0].meanV).toBeCloseTo(1.4 - 0.4, 12); // derived by hand: step − 4 h × 0.1
  });

  it('returns null with too few blocks and throws on bad input', () => {
    expect(fitTrend([0, 0.1, 0.2], [1, 1, 1])).toBeNull(); // one 1 h block
    expect(() => fitTrend([0, 1], [1])).toThrow(/same length/);
    expect(() => fitTrend([0, 2, 1], [1, 1, 1])).toThrow(/must not decrease/);
    expect(() => fitTrend([0, 1, 2], [1, Infinity, 1])).toThrow(/finite/);
  });
});

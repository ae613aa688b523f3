import { describe, it, expect } from 'vitest';
import { detectBreakIn, generateSyntheticLog } from '../../../shared/durability';

// Invented logs: 600 h at 0.2 A/cm², a row every 10 min, 8 µV/h, 1 mV noise.
const base = { hours: 600, stepMinutes: 10, v0: 0.65, breakInHours: 50, breakInDropMv: 30, rateUvPerH: 8, noiseMv: 1, currentDensity: 0.2 };

describe('detectBreakIn', () => {
  it('finds a 50 h break-in (voltage falling) within ±15 h over several seeds', () => {
    for (const seed of [1, 2, 3, 4, 5]) {
      const log = generateSyntheticLog({ ...base, seed });
      const result = detectBreakIn(log.tHours!, log.v);
      expect(result.status).toBe('found');
      // generator: transient at 1 % of its size at 50 h; tolerance ±15 h chosen for 24 h windows in 6 h steps
      expect(Math.abs(result.breakInHours! - 50)).toBeLessThanOrEqual(15);
      expect(result.longRunRateUvPerH!).toBeCloseTo(8, 0); // generator: 8 µV/h
    }
  });

  it('finds a break-in where the voltage rises while the cell conditions', () => {
    const log = generateSyntheticLog({ ...base, breakInDropMv: -25, seed: 11 });
    const result = detectBreakIn(log.tHours!, log.v);
    expect(Math.abs(result.breakInHours! - 50)).toBeLessThanOrEqual(15); // generator: 50 h; ±15 h as above
  });

  it('still finds it when the noise is autocorrelated', () => {
    const log = generateSyntheticLog({ ...base, noiseCorrelation: 0.96, seed: 12 });
    const result = detectBreakIn(log.tHours!, log.v);
    expect(result.status).toBe('found');
    expect(Math.abs(result.breakInHours! - 50)).toBeLessThanOrEqual(25); // generator: 50 h; wider for wandering noise
  });

  it('reports no visible break-in for a log without one', () => {
    const log = generateSyntheticLog({ ...base, breakInHours: 0, breakInDropMv: 0, seed: 13 });
    const result = detectBreakIn(log.tHours!, log.v);
    expect(result.status).toBe('none-visible');
    expect(result.breakInHours).toBe(0); // generator: no break-in, first row at 0 h
  });

  it('states its rule and declines runs too short for it', () => {
    const log = generateSyntheticLog({ ...base, hours: 40, seed: 14 });
    const result = detectBreakIn(log.tHours!, log.v);
    expect(result.breakInHours).toBeNull();
    expect(result.status).toBe('not-applicable');
    expect(result.rule).toMatch(/24 h/);
    expect(result.rule).toMatch(/3× the long-run rate/);
  });

  it('says when the voltage has not settled by mid-run', () => {
    // Hand-built log: −300 µV/h until 110 h, then −8 µV/h, 200 h in 0.1 h rows. Mid-run is 100 h, so
    // the last window examined (100–124 h) still holds 10 h of the steep part and disagrees.
    const count = 2001;
    const t = new Float64Array(count);
    const v = new Float64Array(count);
    for (let i = 0; i < count; i++) {
      t[i] = i / 10;
      v[i] = 0.7 - 300e-6 * Math.min(t[i], 110) - 8e-6 * Math.max(t[i] - 110, 0) + 2e-4 * Math.sin(i * 1.7);
    }
    const result = detectBreakIn(t, v);
    expect(result.status).toBe('not-settled');
    expect(result.breakInHours).toBeNull();
  });

  it('throws on mismatched lengths, decreasing time and bad options', () => {
    const t = new Float64Array([0, 1, 2]);
    expect(() => detectBreakIn(t, new Float64Array(2))).toThrow(/same length/);
    expect(() => detectBreakIn(new Float64Array([0, 2, 1]), t)).toThrow(/must not decrease/);
    expect(() => detectBreakIn(t, new Float64Array([1, NaN, 1]))).toThrow(/finite/);
    expect(() => detectBreakIn(t, t, { windowHours: 0 })).toThrow(/windowHours/);
  });
});

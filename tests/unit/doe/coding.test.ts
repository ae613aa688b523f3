import { describe, it, expect } from 'vitest';
import { fromCoded, toCoded } from '../../../shared/doe/coding';

describe('toCoded / fromCoded', () => {
  it('maps low, centre and high to −1, 0, +1', () => {
    // derived by hand: centre (160 + 180)/2 = 170, half-range 10
    expect(toCoded(160, 160, 180)).toBe(-1);
    expect(toCoded(170, 160, 180)).toBe(0);
    expect(toCoded(180, 160, 180)).toBe(1);
    // derived by hand: (175 − 170)/10 = 0.5
    expect(toCoded(175, 160, 180)).toBeCloseTo(0.5, 15);
    // derived by hand: axial point of a rotatable two-factor CCD at α = √2: 170 + 10·√2
    expect(fromCoded(Math.SQRT2, 160, 180)).toBeCloseTo(184.14213562373095, 12);
  });

  it('round-trips', () => {
    // derived by hand: fromCoded is the inverse of toCoded
    for (const value of [0.05, 0.2, 0.37, 0.6]) {
      expect(fromCoded(toCoded(value, 0.1, 0.5), 0.1, 0.5)).toBeCloseTo(value, 14);
    }
  });

  it('throws on an empty or reversed range and on non-finite input', () => {
    expect(() => toCoded(1, 2, 2)).toThrow(RangeError);
    expect(() => toCoded(1, 3, 2)).toThrow(/low must be below high/);
    expect(() => fromCoded(0, 5, 1)).toThrow(RangeError);
    expect(() => toCoded(Number.NaN, 0, 1)).toThrow(/finite/);
    expect(() => fromCoded(0, 0, Number.POSITIVE_INFINITY)).toThrow(/finite/);
  });
});

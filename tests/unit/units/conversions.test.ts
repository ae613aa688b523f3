import { describe, it, expect } from 'vitest';
import {
  currentDensityFactor,
  toCurrentDensity,
  fromCurrentDensity,
  toVolts,
  fromVolts,
  voltageFactor,
  hfrFactor,
  toOhmCm2,
  fromOhmCm2,
  hoursFactor,
  toHours,
  elapsedHours,
  toCelsius,
  toKelvin,
  ZERO_CELSIUS_K,
} from '../../../shared/units/index';

describe('current density', () => {
  it('scales densities and divides total currents by the area', () => {
    expect(toCurrentDensity(200, 'mA/cm2')).toBeCloseTo(0.2, 15); // derived by hand: 200 mA/cm² × 1e-3 = 0.2 A/cm² (SI prefix)
    expect(toCurrentDensity(0.2, 'A/cm2')).toBe(0.2); // identity
    expect(toCurrentDensity(5, 'A', 25)).toBeCloseTo(0.2, 15); // derived by hand: 5 A / 25 cm² = 0.2 A/cm²
    expect(toCurrentDensity(5000, 'mA', 25)).toBeCloseTo(0.2, 15); // derived by hand: 5000 mA = 5 A; 5 A / 25 cm² = 0.2 A/cm²
    expect(currentDensityFactor('mA', 25)).toBeCloseTo(4e-5, 18); // derived by hand: 1e-3 / 25 = 4e-5
  });
  it('inverts', () => {
    expect(fromCurrentDensity(0.2, 'A', 25)).toBeCloseTo(5, 12); // derived by hand: 0.2 A/cm² × 25 cm² = 5 A
    expect(fromCurrentDensity(0.2, 'mA/cm2')).toBeCloseTo(200, 12); // derived by hand: 0.2 / 1e-3 = 200
  });
  it('throws without a usable area for total current, and on non-finite values', () => {
    expect(() => toCurrentDensity(5, 'A')).toThrow(RangeError);
    expect(() => toCurrentDensity(5, 'mA', 0)).toThrow(/positive active area/);
    expect(() => toCurrentDensity(5, 'A', Number.NaN)).toThrow(RangeError);
    expect(() => toCurrentDensity(Number.NaN, 'A/cm2')).toThrow(/finite/);
    expect(() => currentDensityFactor('kA' as never)).toThrow(/unknown current unit/);
  });
});

describe('voltage', () => {
  it('converts mV and V', () => {
    expect(toVolts(652, 'mV')).toBeCloseTo(0.652, 15); // derived by hand: 652 × 1e-3
    expect(toVolts(0.652, 'V')).toBe(0.652); // identity
    expect(fromVolts(0.652, 'mV')).toBeCloseTo(652, 10); // derived by hand: 0.652 / 1e-3
    expect(voltageFactor('mV')).toBe(1e-3); // SI prefix milli
  });
  it('throws on unknown units and non-finite values', () => {
    expect(() => voltageFactor('kV' as never)).toThrow(/unknown voltage unit/);
    expect(() => toVolts(Number.POSITIVE_INFINITY, 'V')).toThrow(/finite/);
  });
});

describe('HFR', () => {
  it('scales area-specific values and multiplies cell resistance by the area', () => {
    expect(toOhmCm2(180, 'mohm*cm2')).toBeCloseTo(0.18, 15); // derived by hand: 180 mΩ·cm² × 1e-3
    expect(toOhmCm2(0.008, 'ohm', 25)).toBeCloseTo(0.2, 15); // derived by hand: 0.008 Ω × 25 cm² = 0.2 Ω·cm²
    expect(toOhmCm2(8, 'mohm', 25)).toBeCloseTo(0.2, 15); // derived by hand: 8 mΩ = 0.008 Ω; × 25 cm² = 0.2 Ω·cm²
    expect(hfrFactor('mohm', 25)).toBeCloseTo(0.025, 15); // derived by hand: 1e-3 × 25
    expect(fromOhmCm2(0.2, 'mohm', 25)).toBeCloseTo(8, 12); // derived by hand: inverse of the above
  });
  it('throws without an area for cell resistance', () => {
    expect(() => toOhmCm2(8, 'mohm')).toThrow(/needs a positive active area/);
    expect(() => hfrFactor('ohm', -1)).toThrow(RangeError);
    expect(() => toOhmCm2(Number.NaN, 'ohm*cm2')).toThrow(/finite/);
  });
});

describe('time', () => {
  it('converts to hours', () => {
    expect(toHours(90, 'min')).toBeCloseTo(1.5, 15); // derived by hand: 90 / 60
    expect(toHours(5400, 's')).toBeCloseTo(1.5, 15); // derived by hand: 5400 / 3600
    expect(toHours(1.5, 'h')).toBe(1.5); // identity
    expect(hoursFactor('timestamp')).toBeCloseTo(1 / 3600, 18); // timestamps are epoch seconds
  });
  it('gives hours elapsed from the first reading, precisely for epoch seconds', () => {
    // 2024-05-01T10:00:00Z = 1714557600 s (derived by hand: Date.UTC(2024, 4, 1, 10) / 1000)
    const hours = elapsedHours(Float64Array.of(1714557600, 1714557601, 1714561200), 'timestamp');
    expect(hours[0]).toBe(0); // first row is the origin
    expect(hours[1]).toBeCloseTo(1 / 3600, 12); // derived by hand: 1 s = 1/3600 h
    expect(hours[2]).toBeCloseTo(1, 12); // derived by hand: 3600 s later
    expect(elapsedHours(Float64Array.of(30, 90), 'min')[1]).toBeCloseTo(1, 15); // derived by hand: (90 − 30) / 60
    expect(elapsedHours(new Float64Array(0), 'h').length).toBe(0); // empty in, empty out
  });
  it('throws on unknown units and non-finite values', () => {
    expect(() => hoursFactor('d' as never)).toThrow(/unknown time unit/);
    expect(() => elapsedHours([0, Number.NaN], 's')).toThrow(/value 1/);
    expect(() => toHours(Number.NaN, 'h')).toThrow(/finite/);
  });
});

describe('temperature', () => {
  it('converts K to °C and back', () => {
    expect(ZERO_CELSIUS_K).toBe(273.15); // BIPM SI Brochure, 9th ed.: 0 °C = 273.15 K exactly
    expect(toCelsius(433.15, 'K')).toBeCloseTo(160, 12); // derived by hand: 433.15 − 273.15
    expect(toCelsius(180, 'C')).toBe(180); // identity
    expect(toKelvin(160)).toBeCloseTo(433.15, 12); // derived by hand: 160 + 273.15
  });
  it('throws below absolute zero and on unknown units', () => {
    expect(() => toCelsius(-1, 'K')).toThrow(/absolute zero/);
    expect(() => toKelvin(-300)).toThrow(/absolute zero/);
    expect(() => toCelsius(100, 'F' as never)).toThrow(/unknown temperature unit/);
  });
});

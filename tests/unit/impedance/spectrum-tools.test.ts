import { describe, it, expect } from 'vitest';
import { detectSignConvention, normaliseSpectrum, highFrequencyIntercept, bode, circuitImpedance, impedanceMetrics } from '../../../shared/impedance';

describe('detectSignConvention', () => {
  it('reads a column that is negative on the arc as Z″, and a positive one as −Z″', () => {
    expect(detectSignConvention([0.002, -0.01, -0.05, -0.08, -0.03]).convention).toBe('imaginary');
    const negated = detectSignConvention([-0.002, 0.01, 0.05, 0.08, 0.03]);
    expect(negated.convention).toBe('negated');
    expect(negated.capacitiveShare).toBeCloseTo(0.17 / 0.172, 12); // hand-worked: Σ positive / Σ |values|
    expect(negated.ambiguous).toBe(false);
  });

  it('flags a column whose two sides are close', () => {
    expect(detectSignConvention([0.05, -0.04, 0.03, -0.03]).ambiguous).toBe(true);
  });

  it('refuses an empty, non-finite or all-zero column', () => {
    expect(() => detectSignConvention([])).toThrow(/non-empty/);
    expect(() => detectSignConvention([0, NaN])).toThrow(/value 1/);
    expect(() => detectSignConvention([0, 0, 0])).toThrow(/zero throughout/);
  });
});

describe('normaliseSpectrum', () => {
  it('turns −Z″ in total mΩ into Z″ in Ω·cm², sorted from high to low frequency', () => {
    const result = normaliseSpectrum({ frequencyHz: [1, 1e4, 10], zReal: [14, 4.8, 12], imaginaryColumn: [1, -0.1, 3] }, { unit: 'mohm', areaCm2: 25 });
    expect(result.convention).toBe('negated');
    expect(Array.from(result.spectrum.frequencyHz)).toEqual([1e4, 10, 1]);
    // hand-worked: 4.8 mΩ × 25 cm² = 0.12 Ω·cm²; −3 mΩ × 25 cm² = −0.075 Ω·cm²
    expect(result.spectrum.zReal[0]).toBeCloseTo(0.12, 15);
    expect(result.spectrum.zImag[1]).toBeCloseTo(-0.075, 15);
    expect(result.spectrum.zImag[0]).toBeCloseTo(0.0025, 15); // the inductive point keeps its physical sign
    expect(result.notes.join(' ')).toContain('sign turned');
  });

  it('keeps a stated convention and needs the area for a total impedance', () => {
    const stated = normaliseSpectrum({ frequencyHz: [10, 1], zReal: [0.2, 0.3], imaginaryColumn: [-0.05, -0.02] }, { convention: 'imaginary' });
    expect(stated.detection).toBeNull();
    expect(stated.spectrum.zImag[0]).toBe(-0.05);
    expect(() => normaliseSpectrum({ frequencyHz: [10], zReal: [5], imaginaryColumn: [-1] }, { unit: 'ohm' })).toThrow(/active area/);
    expect(() => normaliseSpectrum({ frequencyHz: [10, 1], zReal: [5], imaginaryColumn: [-1, -2] })).toThrow(/zReal has 1/);
  });
});

describe('highFrequencyIntercept', () => {
  it('interpolates Z′ where Z″ crosses zero', () => {
    // hand-worked: between (0.119, +0.002) and (0.121, −0.002) the axis is met half-way, at 0.120
    const result = highFrequencyIntercept({ frequencyHz: [2e4, 1e5, 5e4], zReal: [0.125, 0.119, 0.121], zImag: [-0.006, 0.002, -0.002] });
    expect(result.method).toBe('crossing');
    expect(result.hfr!).toBeCloseTo(0.12, 15);
    expect(result.frequencyHz!).toBeCloseTo(Math.sqrt(1e5 * 5e4), 6); // log-interpolated half-way
  });

  it('uses a point measured at Z″ = 0 as it is', () => {
    expect(highFrequencyIntercept({ frequencyHz: [1e5, 1e4], zReal: [0.118, 0.13], zImag: [0, -0.01] }).method).toBe('measured-zero');
  });

  it('gives null when the spectrum starts capacitive (no crossing at its high end)', () => {
    const result = highFrequencyIntercept({ frequencyHz: [1e4, 1e3], zReal: [0.13, 0.15], zImag: [-0.01, -0.04] });
    expect(result.hfr).toBeNull();
    expect(result.note).toContain('does not cross');
  });

  it('is exact on an R + R∥C circuit with an ideal lead inductance where the axis is met', () => {
    // hand-worked: with Z = jωL + R_Ω + R/(1 + jωRC), Z″ = 0 at ω² = 1/(L·C) − 1/(R·C)²; there Z′ = R_Ω + R/(1 + ω²R²C²)
    const [r0, r, c, l] = [0.1, 0.2, 0.01, 1e-7];
    const omega = Math.sqrt(1 / (l * c) - 1 / (r * c) ** 2);
    const exact = r0 + r / (1 + (omega * r * c) ** 2);
    const f = [omega / (2 * Math.PI) * 1.0001, omega / (2 * Math.PI) / 1.0001];
    const z = circuitImpedance('charge-transfer', { rOhm: r0, rCt: r, cpeQ: c, cpeN: 1 }, f);
    const zImag = z.imag.map((value, k) => value + 2 * Math.PI * f[k] * l);
    expect(Math.abs(highFrequencyIntercept({ frequencyHz: f, zReal: z.real, zImag }).hfr! - exact)).toBeLessThan(1e-9);
  });
});

describe('bode', () => {
  it('gives |Z| and the phase in degrees', () => {
    const result = bode({ frequencyHz: [1, 10, 100], zReal: [1, 0, 3], zImag: [-1, -2, 0] });
    expect(Array.from(result.frequencyHz)).toEqual([100, 10, 1]);
    expect(result.modulus[2]).toBeCloseTo(Math.SQRT2, 15); // hand-worked: |1 − j| = √2
    expect(result.phaseDeg[2]).toBeCloseTo(-45, 12); // hand-worked: atan2(−1, 1)
    expect(result.phaseDeg[1]).toBeCloseTo(-90, 12); // a pure capacitor
    expect(result.phaseDeg[0]).toBe(0); // a resistor
  });
});

describe('impedanceMetrics', () => {
  const f = Array.from({ length: 51 }, (_, k) => 1e4 * Math.pow(10, -k / 10));
  const params = { rOhm: 0.12, rCt: 0.25, cpeQ: 0.02, cpeN: 0.85 };
  const z = circuitImpedance('charge-transfer', params, f);

  it('falls back on the fitted series resistance when the spectrum never crosses, and says so', () => {
    const result = impedanceMetrics({ frequencyHz: f, zReal: z.real, zImag: z.imag });
    expect(result.metrics.hfr!).toBeCloseTo(0.12, 9); // generator input (fitted R_Ω)
    expect(result.metricNotes.hfr).toContain('fitted series resistance');
    expect(result.metrics.rct!).toBeCloseTo(0.25, 9);
    expect(result.metrics.cpeQ!).toBeCloseTo(0.02, 9);
    expect(result.metrics.cpeN!).toBeCloseTo(0.85, 9);
    expect(result.method.rct!.method).toContain('complex nonlinear least squares');
    expect(result.summary.hfrSource).toBe('fitted series resistance');
  });

  it('gives null fit metrics with the reason for a spectrum too short to fit', () => {
    const result = impedanceMetrics({ frequencyHz: [1e4, 1e3], zReal: [0.13, 0.2], zImag: [0.001, -0.05] });
    expect(result.metrics.hfr).not.toBeNull(); // the crossing is still read
    expect(result.metrics.rct).toBeNull();
    expect(result.metricNotes.rct).toMatch(/no equivalent-circuit fit: 1 points left to fit/);
  });
});

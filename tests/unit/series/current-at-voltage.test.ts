import { describe, it, expect } from 'vitest';
import { currentAtIrFreeVoltage } from '../../../shared/series';
import { generatePolarizationCurve, semiEmpiricalVoltage } from '../../../shared/curves/semi-empirical';
import type { SemiEmpiricalParams } from '../../../shared/curves/semi-empirical';

// Fixture from the project's semi-empirical model (invented HT-PEM cell, no mass-transport term so
// the iR-free voltage is an exact Tafel line: E0 − b·log10(j/j0)).
const PARAMS: SemiEmpiricalParams = { e0: 1.0, tafelSlope: 0.09, exchangeCurrentDensity: 1e-4, resistance: 0.15, massTransportCoefficient: 0, limitingCurrentDensity: 2 };
const curve = generatePolarizationCurve(PARAMS, { jPoints: [0, 0.002, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.4, 0.8] });

describe('currentAtIrFreeVoltage', () => {
  it('reads j at the iR-free voltage exactly on a Tafel line (log-j interpolation)', () => {
    const result = currentAtIrFreeVoltage(curve, 0.85);
    // hand-worked: 0.85 = 1.0 − 0.09·log10(j/1e-4) → j = 1e-4·10^(0.15/0.09) = 4.6416e-3 A/cm²
    expect(result.currentDensity!).toBeCloseTo(1e-4 * Math.pow(10, 0.15 / 0.09), 12);
    expect(result.basis).toBe('iR-free');
    expect(result.note).toContain('no limiting current');
  });

  it('matches the model where the mass-transport term is on (linear interpolation error bounded)', () => {
    const withTransport: SemiEmpiricalParams = { ...PARAMS, massTransportCoefficient: 0.05, limitingCurrentDensity: 1.5 };
    const points = [0, 0.01, 0.02, 0.03, 0.05, 0.1, 0.2];
    const c = generatePolarizationCurve(withTransport, { jPoints: points });
    const result = currentAtIrFreeVoltage(c, 0.8);
    // the model's iR-free voltage (V + R·j) at the result must be 0.8 V within 0.2 mV (interpolation between steps)
    const irFree = semiEmpiricalVoltage(withTransport, result.currentDensity!) + withTransport.resistance * result.currentDensity!;
    expect(Math.abs(irFree - 0.8)).toBeLessThan(2e-4);
  });

  it('gives the kinetic current where a limiting current is stated and the curve allows', () => {
    const result = currentAtIrFreeVoltage(curve, 0.85, { limitingCurrentDensity: 0.5 });
    const j = 1e-4 * Math.pow(10, 0.15 / 0.09);
    expect(result.basis).toBe('kinetic');
    expect(result.irFreeCurrentDensity!).toBeCloseTo(j, 12);
    expect(result.currentDensity!).toBeCloseTo((j * 0.5) / (0.5 - j), 12); // Koutecký–Levich form, hand-worked
    expect(result.note).toContain('kinetic current');
  });

  it('falls back to the iR-free current close to the limiting current, saying why', () => {
    const result = currentAtIrFreeVoltage(curve, 0.85, { limitingCurrentDensity: 0.006 });
    expect(result.basis).toBe('iR-free');
    expect(result.note).toMatch(/77 % of the limiting current/); // hand-worked: 4.64e-3 / 6e-3
  });

  it('says "not reached" instead of extrapolating', () => {
    const result = currentAtIrFreeVoltage(curve, 0.98);
    expect(result.currentDensity).toBeNull();
    expect(result.basis).toBeNull();
    expect(result.note).toContain('not reached');
  });

  it('refuses a curve without HFR or iR-free voltage, and bad voltages', () => {
    expect(() => currentAtIrFreeVoltage({ j: curve.j, v: curve.v }, 0.85)).toThrow(/HFR or an iR-free/);
    expect(() => currentAtIrFreeVoltage(curve, 2.5)).toThrow(/between 0 and 2 V/);
    expect(() => currentAtIrFreeVoltage({ j: [0.1, 0.2], v: [0.7] , hfr: [0.1, 0.1] }, 0.85)).toThrow(/v has 1/);
    expect(() => currentAtIrFreeVoltage(curve, 0.85, { limitingCurrentDensity: -1 })).toThrow(/limitingCurrentDensity/);
  });
});

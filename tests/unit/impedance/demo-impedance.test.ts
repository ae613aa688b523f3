import { describe, it, expect } from 'vitest';
import { demoImpedanceSpectrum } from '../../../shared/demo';
import { impedanceMetrics } from '../../../shared/impedance';
import { generatePolarizationCurve, polarizationMetrics } from '../../../shared/curves';
import type { SemiEmpiricalParams } from '../../../shared/curves';

// Three invented builds' polarization models (HT-PEM, 160–180 °C).
const BUILDS: SemiEmpiricalParams[] = [
  { e0: 1.0, tafelSlope: 0.09, exchangeCurrentDensity: 2e-7, resistance: 0.11, massTransportCoefficient: 0.05, limitingCurrentDensity: 1.5 },
  { e0: 0.99, tafelSlope: 0.095, exchangeCurrentDensity: 1e-7, resistance: 0.14, massTransportCoefficient: 0.06, limitingCurrentDensity: 1.4 },
  { e0: 1.0, tafelSlope: 0.088, exchangeCurrentDensity: 3e-7, resistance: 0.18, massTransportCoefficient: 0.05, limitingCurrentDensity: 1.6 },
];
const REF = { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' as const };

describe('demo impedance spectra agree with the builds’ polarization files', () => {
  BUILDS.forEach((params, index) => {
    it(`build ${index + 1}: HFR from the spectrum within 3 % of the polarization file's HFR column, R_ct within 3 % of the model's`, () => {
      const demo = demoImpedanceSpectrum(params, { seed: 40 + index });
      const spectrum = impedanceMetrics(demo.spectrum);
      const curve = polarizationMetrics(generatePolarizationCurve(params, { jPoints: [0, 0.05, 0.1, 0.2, 0.4, 0.6, 0.8], noiseV: 0.001, seed: index }), REF, { loadingMgCm2: 1 });
      // stated tolerance 3 %: the real-axis crossing sits a little right of R_Ω because the
      // lead inductance meets the arc's tail at a finite frequency (≈ 1 % here), plus 0.5 % noise
      expect(spectrum.intercept.method).toBe('crossing');
      expect(Math.abs(spectrum.metrics.hfr! - curve.metrics.hfr!) / curve.metrics.hfr!).toBeLessThan(0.03);
      // the fitted R_ct is the model's Tafel slope at 0.2 A/cm², b/(ln10·j) (generator input), within 3 %:
      // the circuit has no inductor, so the inductance still bends the first capacitive points a little
      // (a bias the noise-only interval does not cover)
      expect(Math.abs(spectrum.metrics.rct! - demo.parameters.rCt) / demo.parameters.rCt).toBeLessThan(0.03);
    });
  });

  it('sets R_Ω to the model resistance and R_ct to b/(ln10·j)', () => {
    const demo = demoImpedanceSpectrum(BUILDS[0], { dcCurrentDensity: 0.2, noiseFraction: 0 });
    expect(demo.parameters.rOhm).toBe(0.11);
    expect(demo.parameters.rCt).toBeCloseTo(0.09 / (Math.LN10 * 0.2), 15); // hand-worked: 0.1954 Ω·cm²
    expect(demo.spectrum.frequencyHz.length).toBe(61); // 6 decades × 10 + 1
  });

  it('refuses a DC current at or above the limiting current', () => {
    expect(() => demoImpedanceSpectrum(BUILDS[0], { dcCurrentDensity: 2 })).toThrow(/dcCurrentDensity/);
  });
});

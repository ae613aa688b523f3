import { describe, it, expect } from 'vitest';
import { linearRegression } from 'simple-statistics';
import { polarizationMetrics, generatePolarizationCurve, semiEmpiricalVoltage } from '../../../shared/curves/index';
import type { CurveData, ReferencePoint, SemiEmpiricalParams } from '../../../shared/curves/index';
import { FIXTURE_MODEL } from '../../fixtures/curves/model-parameters';

// Invented HT-PEM-like model at 160 °C with the theoretical Tafel slope for αn = 1, the same one
// the fixture files come from (source of every expected value below: the model itself).
const MODEL: SemiEmpiricalParams = FIXTURE_MODEL;
const J_POINTS = [0, 0.005, 0.0075, 0.01, 0.015, 0.02, 0.03, 0.04, 0.05, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0, 1.1, 1.2];
const REF: ReferencePoint = { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' };
const LOADING = { loadingMgCm2: 1.0, metalLoadingMgCm2: 0.4 };
const model = (j: number): number => semiEmpiricalVoltage(MODEL, j);

const curveOf = (j: number[], v: number[], hfr?: number[]): CurveData => ({
  kind: 'polarization',
  j: Float64Array.from(j),
  v: Float64Array.from(v),
  ...(hfr ? { hfr: Float64Array.from(hfr) } : {}),
});

describe('polarizationMetrics on the noise-free model', () => {
  const curve = generatePolarizationCurve(MODEL, { jPoints: J_POINTS });
  const result = polarizationMetrics(curve, REF, LOADING);

  it('V at j_ref equals the model at a measured step', () => {
    expect(result.metrics.vAtRef).toBeCloseTo(model(0.2), 12); // the model at 0.2 A/cm², a step of the curve
    expect(result.metrics.vAtRefIrFree).toBeCloseTo(model(0.2) + 0.2 * MODEL.resistance, 12); // V + j·HFR with HFR = R
    expect(result.method.vAtRef?.method).toMatch(/single up sweep/);
    expect(result.method.vAtRef?.method).toMatch(/open-circuit reading is never interpolated from/);
  });
  it('V between steps is the linear interpolation of the model points, close to the model', () => {
    const between = polarizationMetrics(curve, { ...REF, refCurrentDensity: 0.25 }, LOADING);
    const linear = (model(0.2) + model(0.3)) / 2; // derived by hand: midpoint of the two steps 0.2 and 0.3 A/cm²
    expect(between.metrics.vAtRef).toBeCloseTo(linear, 12);
    // interpolation error ≤ h²/8 · max|V''| on [0.2, 0.3]; the curve is nearly straight there: < 1 mV
    expect(Math.abs((between.metrics.vAtRef as number) - model(0.25))).toBeLessThan(0.001);
  });
  it('j at V_ref is the crossing of the interpolated model points, close to the model root', () => {
    // bracket and interpolate the model points by hand (source: the model itself)
    let crossing = Number.NaN;
    for (let index = 0; index + 1 < J_POINTS.length; index++) {
      const [j1, j2] = [J_POINTS[index], J_POINTS[index + 1]];
      if (model(j1) >= 0.6 && model(j2) < 0.6) crossing = j1 + ((0.6 - model(j1)) * (j2 - j1)) / (model(j2) - model(j1));
    }
    expect(result.metrics.jAtRef).toBeCloseTo(crossing, 12);
    // model root by bisection on the formula itself
    let low = 0.2;
    let high = 0.4;
    for (let iteration = 0; iteration < 60; iteration++) {
      const middle = (low + high) / 2;
      if (model(middle) > 0.6) low = middle;
      else high = middle;
    }
    expect(Math.abs((result.metrics.jAtRef as number) - low)).toBeLessThan(0.002); // within interpolation error (2 mA/cm²)
  });
  it('peak power is the largest j·V of the model points', () => {
    const expected = Math.max(...J_POINTS.map((j) => j * model(j))); // source: the model itself
    expect(result.metrics.peakPower).toBeCloseTo(expected, 12);
  });
  it('Tafel slope is the least-squares slope of the model iR-free points in 0.005–0.05 A/cm²', () => {
    const window = J_POINTS.filter((j) => j >= 0.005 && j <= 0.05);
    const points = window.map((j) => [Math.log10(j), model(j) + j * MODEL.resistance]);
    const expected = -linearRegression(points).m * 1000; // independent fit with simple-statistics, mV/dec
    expect(result.metrics.tafelSlope).toBeCloseTo(expected, 9);
    // and close to the model's b: the mass-transport term bends the line by ~1 mV/dec in this window
    expect(Math.abs((result.metrics.tafelSlope as number) - MODEL.tafelSlope * 1000)).toBeLessThan(2);
    expect(result.method.tafelSlope?.inputs.window).toBe('0.005–0.050 A/cm²');
    expect(result.method.tafelSlope?.inputs.points).toBe(window.length);
  });
  it('OCV, HFR and mass activity', () => {
    expect(result.metrics.ocv).toBe(MODEL.e0); // the model's V(0) = E0
    expect(result.metrics.hfr).toBe(MODEL.resistance); // HFR column = R
    // mass activity = jAtRefIrFree / (1.0 mg/cm² × 1e-3 g/mg) (definition of mass-specific activity)
    expect(result.metrics.massActivity).toBeCloseTo((result.metrics.jAtRefIrFree as number) / 1e-3, 9);
  });
  it('peak note only when the highest power is at the highest current', () => {
    const peakJ = J_POINTS.reduce((best, j) => (j * model(j) > best * model(best) ? j : best), 0);
    expect(peakJ).toBeLessThan(1.2); // the model's power turns over before 1.2 A/cm² (source: the model itself)
    expect(result.metricNotes.peakPower).toMatch(/^highest measured \(at /); // always labelled as the highest measured point
    const truncated = generatePolarizationCurve(MODEL, { jPoints: J_POINTS.filter((j) => j <= 0.6) });
    const early = polarizationMetrics(truncated, REF, LOADING);
    expect(early.metrics.peakPower).toBeCloseTo(0.6 * model(0.6), 12); // the last point (source: the model)
    expect(early.metricNotes.peakPower).toMatch(/^highest measured, at the highest current/);
  });
});

describe('polarizationMetrics: sweeps, noise, limits', () => {
  it('averages up and down sweeps and reports the hysteresis', () => {
    const curve = generatePolarizationCurve(MODEL, { jPoints: J_POINTS, readingsPerStep: 3, sweeps: 'up-down', downSweepOffsetV: 0.01 });
    const result = polarizationMetrics(curve, REF, LOADING);
    expect(result.metrics.vAtRef).toBeCloseTo(model(0.2) + 0.005, 12); // derived by hand: mean of V and V + 10 mV
    expect(result.summary.vAtRefUp).toBeCloseTo(model(0.2), 12);
    expect(result.summary.vAtRefDown).toBeCloseTo(model(0.2) + 0.01, 12);
    expect(result.summary.hysteresisMv).toBeCloseTo(10, 9); // the 10 mV offset given to the generator
    expect(result.summary.hysteresisHigherSweep).toBe('down');
    expect(result.summary.sweeps).toBe(2); // generator: up and down
    // loaded up steps + loaded down steps (the top held once) + one open-circuit step (start and end merged)
    expect(result.summary.steps).toBe(2 * (J_POINTS.length - 1) - 1 + 1);
    expect(result.summary.readingsPerStepMedian).toBe(3); // generator: readingsPerStep 3
    expect(result.method.vAtRef?.method).toMatch(/both sweeps \(up and down\) averaged at common j/);
  });
  it('with noise, V at j_ref stays within 4 σ/√n of the model', () => {
    const noise = 0.002;
    for (const seed of [1, 2, 3]) {
      const curve = generatePolarizationCurve(MODEL, { jPoints: J_POINTS, readingsPerStep: 5, noiseV: noise, seed });
      const value = polarizationMetrics(curve, REF, LOADING).metrics.vAtRef as number;
      expect(Math.abs(value - model(0.2))).toBeLessThan((4 * noise) / Math.sqrt(5)); // mean of 5 Gaussian readings
    }
  });
  it('excludes points past the limiting current', () => {
    const curve = curveOf([0, 0.2, 0.4, 0.6, 0.5], [0.95, 0.65, 0.55, 0.4, 0.3]);
    const result = polarizationMetrics(curve, REF, LOADING);
    expect(result.summary.pastLimitSteps).toBe(1); // the 0.5 A/cm² step after 0.6, at lower voltage
    expect(result.metrics.peakPower).toBeCloseTo(0.24, 12); // derived by hand: 0.6 × 0.4 (0.5 × 0.3 excluded)
  });
});

describe('polarizationMetrics: nulls and notes', () => {
  it('never extrapolates V at j_ref', () => {
    const result = polarizationMetrics(curveOf([0, 0.05, 0.1, 0.15], [0.95, 0.8, 0.75, 0.72], [0.2, 0.2, 0.2, 0.2]), REF, LOADING);
    expect(result.metrics.vAtRef).toBeNull();
    expect(result.metricNotes.vAtRef).toBe('not reached: curve spans 0.05–0.15 A/cm²'); // loaded steps only (the open-circuit point is not interpolated from)
    expect(result.metrics.jAtRef).toBeNull();
    expect(result.metricNotes.jAtRef).toMatch(/^not reached: lowest voltage 0.720 V/);
  });
  it('without HFR: iR-free metrics and the Tafel slope are null with a reason', () => {
    const result = polarizationMetrics(curveOf([0, 0.005, 0.01, 0.02, 0.05, 0.2, 0.4], [0.95, 0.82, 0.79, 0.76, 0.72, 0.62, 0.54]), REF, LOADING);
    expect(result.metrics.vAtRefIrFree).toBeNull();
    expect(result.metricNotes.vAtRefIrFree).toMatch(/no HFR or iR-free voltage column/);
    expect(result.metrics.massActivity).toBeNull(); // ref.irFree needs the iR-free crossing
    expect(result.metrics.hfr).toBeNull();
    // the Tafel slope is fitted on iR-free voltage only (the measured slope includes the ohmic loss)
    expect(result.metrics.tafelSlope).toBeNull();
    expect(result.metricNotes.tafelSlope).toMatch(/no HFR or iR-free voltage column.*5–50 mA\/cm²/);
  });
  it('mass activity worked by hand: 0.05 A/cm² at V_ref on 4.0 mg/cm² → 12.5 A/g', () => {
    const curve = curveOf([0, 0.05, 0.1], [0.9, 0.8, 0.7]);
    const ref: ReferencePoint = { refCurrentDensity: 0.05, refVoltage: 0.8, irFree: false, loadingBasis: 'catalyst' };
    const result = polarizationMetrics(curve, ref, { loadingMgCm2: 4.0 });
    expect(result.metrics.jAtRef).toBeCloseTo(0.05, 12); // the step at 0.8 V
    expect(result.metrics.massActivity).toBeCloseTo(12.5, 12); // derived by hand: 0.05 A/cm² / (4.0 mg/cm² × 1e-3 g/mg) = 12.5 A/g
    const metal = polarizationMetrics(curve, { ...ref, loadingBasis: 'metal' }, { loadingMgCm2: 4.0, metalLoadingMgCm2: 2.0 });
    expect(metal.metrics.massActivity).toBeCloseTo(25, 12); // derived by hand: 0.05 / (2.0 × 1e-3)
    expect(metal.method.massActivity?.inputs.basis).toBe('metal');
  });
  it('missing loading → mass activity null with a note', () => {
    const result = polarizationMetrics(curveOf([0, 0.05, 0.1], [0.9, 0.8, 0.7]), { ...REF, refVoltage: 0.8, irFree: false, loadingBasis: 'metal' }, { loadingMgCm2: 4.0 });
    expect(result.metrics.massActivity).toBeNull();
    expect(result.metricNotes.massActivity).toMatch(/no metal loading/);
  });
  it('no open-circuit reading → OCV null; fewer than 3 kinetic points → Tafel null', () => {
    const result = polarizationMetrics(curveOf([0.2, 0.4], [0.65, 0.55]), REF, LOADING);
    expect(result.metrics.ocv).toBeNull();
    expect(result.metricNotes.ocv).toMatch(/no reading at zero current/);
    expect(result.metrics.tafelSlope).toBeNull();
    expect(result.metricNotes.tafelSlope).toMatch(/no HFR or iR-free/);
  });
  it('never falls back to a higher-current decade for the Tafel slope', () => {
    const j = [0, 0.06, 0.1, 0.3, 0.5];
    const v = j.map(model);
    const result = polarizationMetrics(curveOf(j, v, j.map(() => MODEL.resistance)), REF, LOADING);
    expect(result.metrics.tafelSlope).toBeNull(); // no step in 5–50 mA/cm²
    expect(result.metricNotes.tafelSlope).toBe('only 0 loaded steps with an iR-free voltage in the kinetic window 5–50 mA/cm²; at least 3 needed');
    expect(result.method.tafelSlope?.inputs.window).toBe('0.005–0.050 A/cm²');
  });
  it('throws on malformed input', () => {
    const curve = curveOf([0, 0.1], [0.9, 0.8]);
    expect(() => polarizationMetrics(curveOf([], []), REF, LOADING)).toThrow(RangeError);
    expect(() => polarizationMetrics(curveOf([0, Number.NaN], [0.9, 0.8]), REF, LOADING)).toThrow(/non-finite/);
    expect(() => polarizationMetrics(curve, { ...REF, refCurrentDensity: 0 }, LOADING)).toThrow(/refCurrentDensity/);
    expect(() => polarizationMetrics(curve, { ...REF, refVoltage: 3 }, LOADING)).toThrow(/refVoltage/);
    expect(() => polarizationMetrics(curve, { ...REF, loadingBasis: 'ink' as never }, LOADING)).toThrow(/loadingBasis/);
    expect(() => polarizationMetrics(curve, REF, LOADING, { tafelWindow: [0.05, 0.005] })).toThrow(/tafelWindow/);
  });
});

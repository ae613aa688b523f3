import { describe, it, expect } from 'vitest';
import {
  GAS_CONSTANT,
  FARADAY_CONSTANT,
  tafelSlopeTheory,
  semiEmpiricalVoltage,
  mulberry32,
  generatePolarizationCurve,
  writeCurveCsv,
  parseDelimitedText,
  detectMapping,
  applyMapping,
} from '../../../shared/curves/index';
import type { CurveCsvShape, SemiEmpiricalParams } from '../../../shared/curves/index';

// Invented HT-PEM-like parameters (source: the model itself; values chosen for the test).
const PARAMS: SemiEmpiricalParams = {
  e0: 0.95,
  tafelSlope: 0.09,
  exchangeCurrentDensity: 1e-4,
  resistance: 0.2,
  massTransportCoefficient: 0.05,
  limitingCurrentDensity: 1.5,
};

describe('tafelSlopeTheory', () => {
  it('uses CODATA 2018 constants', () => {
    expect(GAS_CONSTANT).toBe(8.314462618); // CODATA 2018, J/(mol·K)
    expect(FARADAY_CONSTANT).toBe(96485.33212); // CODATA 2018, C/mol
  });
  it('is 85.95 mV/dec at 433.15 K for αn = 1', () => {
    // derived by hand: 2.302585 × 8.314462618 × 433.15 / 96485.33212 = 0.0859462 V/dec
    expect(tafelSlopeTheory(433.15, 1) * 1000).toBeCloseTo(85.946, 2);
    expect(Math.abs(tafelSlopeTheory(433.15, 1) * 1000 - 85.95)).toBeLessThan(0.01);
  });
  it('scales with T and 1/(αn)', () => {
    expect(tafelSlopeTheory(866.3, 2)).toBeCloseTo(tafelSlopeTheory(433.15, 1), 15); // derived by hand: doubling T and αn cancels
  });
  it('throws on non-positive inputs', () => {
    expect(() => tafelSlopeTheory(0, 1)).toThrow(RangeError);
    expect(() => tafelSlopeTheory(433.15, -1)).toThrow(RangeError);
    expect(() => tafelSlopeTheory(Number.NaN, 1)).toThrow(RangeError);
  });
});

describe('semiEmpiricalVoltage', () => {
  it('follows the formula', () => {
    // derived by hand: 0.95 − 0.09·log10(0.2/1e-4) − 0.2·0.2 + 0.05·ln(1 − 0.2/1.5)
    //   = 0.95 − 0.09·3.30103 − 0.04 − 0.05·0.143101 = 0.95 − 0.297093 − 0.04 − 0.007155 = 0.605752
    expect(semiEmpiricalVoltage(PARAMS, 0.2)).toBeCloseTo(0.605752, 6);
    expect(semiEmpiricalVoltage(PARAMS, 0)).toBe(0.95); // the model's definition: no activation loss at j ≤ j0
  });
  it('throws outside [0, jL) and for bad parameters', () => {
    expect(() => semiEmpiricalVoltage(PARAMS, 1.5)).toThrow(RangeError);
    expect(() => semiEmpiricalVoltage(PARAMS, -0.1)).toThrow(RangeError);
    expect(() => semiEmpiricalVoltage({ ...PARAMS, exchangeCurrentDensity: 0 }, 0.1)).toThrow(RangeError);
    expect(() => semiEmpiricalVoltage({ ...PARAMS, resistance: Number.NaN }, 0.1)).toThrow(RangeError);
  });
});

describe('mulberry32', () => {
  it('is reproducible for a seed and stays in [0, 1)', () => {
    const first = mulberry32(7);
    const second = mulberry32(7);
    const other = mulberry32(8);
    const a = Array.from({ length: 1000 }, () => first());
    const b = Array.from({ length: 1000 }, () => second());
    expect(a).toEqual(b);
    expect(Array.from({ length: 5 }, () => other())).not.toEqual(a.slice(0, 5));
    expect(Math.min(...a)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...a)).toBeLessThan(1); // mulberry32 divides a 32-bit integer by 2^32
    const mean = a.reduce((sum, value) => sum + value, 0) / a.length;
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.05); // uniform mean 1/2, SD of the mean √(1/12/1000) ≈ 0.009
  });
});

describe('generatePolarizationCurve', () => {
  it('repeats readings, sweeps up and down, and adds the down-sweep offset', () => {
    const curve = generatePolarizationCurve(PARAMS, { jPoints: [0, 0.1, 0.2], readingsPerStep: 2, sweeps: 'up-down', downSweepOffsetV: 0.01 });
    expect(Array.from(curve.j)).toEqual([0, 0, 0.1, 0.1, 0.2, 0.2, 0.1, 0.1, 0, 0]); // 3 up steps + 2 down steps, 2 readings each
    expect(curve.v[6] - curve.v[2]).toBeCloseTo(0.01, 12); // the offset given
    expect(curve.hfr?.[0]).toBe(0.2); // default HFR = the model's R
    expect(generatePolarizationCurve(PARAMS, { jPoints: [0.1], hfr: null }).hfr).toBeUndefined();
  });
  it('is reproducible with noise and a seed', () => {
    const options = { jPoints: [0, 0.1, 0.2], readingsPerStep: 5, noiseV: 0.002, seed: 11 };
    expect(Array.from(generatePolarizationCurve(PARAMS, options).v)).toEqual(Array.from(generatePolarizationCurve(PARAMS, options).v));
  });
  it('throws on bad options', () => {
    expect(() => generatePolarizationCurve(PARAMS, { jPoints: [] })).toThrow(RangeError);
    expect(() => generatePolarizationCurve(PARAMS, { jPoints: [0.1], readingsPerStep: 0 })).toThrow(RangeError);
    expect(() => generatePolarizationCurve(PARAMS, { jPoints: [2] })).toThrow(RangeError);
    expect(() => generatePolarizationCurve(PARAMS, { jPoints: [0.1], noiseV: -1 })).toThrow(RangeError);
  });
});

describe('writeCurveCsv', () => {
  const curve = generatePolarizationCurve(PARAMS, { jPoints: [0, 0.01, 0.05, 0.1, 0.2, 0.4, 0.8] });
  const shapes: CurveCsvShape[] = ['comma-plain', 'semicolon-decimal-comma', 'tab-total-current-mA', 'metadata-header', 'whitespace-mV', 'bom-crlf'];
  for (const shape of shapes) {
    it(`${shape} reads back to the same curve (to the written precision)`, () => {
      const text = writeCurveCsv(curve, shape, { areaCm2: 25 });
      const table = parseDelimitedText(text);
      const detection = detectMapping(table);
      expect(detection.mapping).not.toBeNull();
      const back = applyMapping(table, detection.mapping!, { kind: 'polarization', areaCm2: shape === 'tab-total-current-mA' ? 25 : undefined });
      for (let index = 0; index < curve.j.length; index++) {
        expect(Math.abs(back.j[index] - curve.j[index])).toBeLessThan(1e-4); // written with 4 decimals of A/cm² (or finer)
        expect(Math.abs(back.v[index] - curve.v[index])).toBeLessThan(1e-4); // written with 0.1 mV resolution
        expect(Math.abs((back.hfr?.[index] ?? 0) - 0.2)).toBeLessThan(1e-4); // the model's R
      }
    });
  }
  it('needs an area for total current and knows its shapes', () => {
    expect(() => writeCurveCsv(curve, 'tab-total-current-mA')).toThrow(/needs areaCm2/);
    expect(() => writeCurveCsv(curve, 'xml' as never)).toThrow(/unknown shape/);
  });
});

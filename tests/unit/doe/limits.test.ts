import { describe, expect, it } from 'vitest';
import { boundPrediction, limitsAt, reversibleCellVoltage } from '../../../shared/doe/limits';

describe('reversibleCellVoltage', () => {
  it('follows the handbook table of the Gibbs energy of formation of water', () => {
    // Larminie & Dicks, Fuel Cell Systems Explained, 2nd ed., Table 2.2: 1.23 V at 25 °C (liquid),
    // 1.17 V at 100 °C and 1.14 V at 200 °C (vapour), 1.09 V at 400 °C
    expect(reversibleCellVoltage(25)).toBeCloseTo(1.23, 2);
    expect(reversibleCellVoltage(100)).toBeCloseTo(1.17, 2);
    expect(reversibleCellVoltage(200)).toBeCloseTo(1.14, 2);
    expect(reversibleCellVoltage(400)).toBeCloseTo(1.09, 2);
    // derived by hand: −Δg_f/2F with Δg_f = −237.2 kJ/mol, F = 96485.33212 C/mol (CODATA 2018)
    expect(reversibleCellVoltage(25)).toBeCloseTo(237200 / (2 * 96485.33212), 12);
    // linear in Δg between table rows: 180 °C sits 4/5 of the way from 100 to 200 °C
    expect(reversibleCellVoltage(180)).toBeCloseTo((225200 - 0.8 * 4800) / (2 * 96485.33212), 12);
    // falls with temperature across the HT-PEM range (common practice in the trade)
    expect(reversibleCellVoltage(160)).toBeGreaterThan(reversibleCellVoltage(200));
    expect(() => reversibleCellVoltage(10)).toThrow(RangeError);
    expect(() => reversibleCellVoltage(Number.NaN)).toThrow(/25–1000 °C/);
  });
});

describe('limitsAt and boundPrediction', () => {
  it('caps a cell voltage at E_rev(T) of the recipe, or at the highest OCV measured when lower', () => {
    const byFactor = limitsAt({ response: 'vAtRef', cellTemperatureFactor: 'cellTemp' }, { cellTemp: 200 });
    expect(byFactor.upper).toBeCloseTo(reversibleCellVoltage(200), 12);
    expect(byFactor.upperWhy).toBe('the reversible voltage at 200 °C');
    const byOcv = limitsAt({ response: 'vAtRef', cellTemperatureFactor: 'cellTemp', highestOcvV: 1.01 }, { cellTemp: 180 });
    expect(byOcv.upper).toBe(1.01);
    expect(byOcv.upperWhy).toBe('the highest open-circuit voltage measured');
    // the OCV itself is only held below E_rev
    expect(limitsAt({ response: 'ocv', testTemperatureC: 160, highestOcvV: 1.01 }, {}).upper).toBeCloseTo(reversibleCellVoltage(160), 12);
    // currents, activities and power cannot be negative; hand-entered responses have no limits
    expect(limitsAt({ response: 'jAtRef' }, {}).lower).toBe(0);
    expect(limitsAt({ response: 'massActivity' }, {})).toMatchObject({ lower: 0, upper: null });
    expect(limitsAt({ response: 'costPerCm2' }, {})).toMatchObject({ lower: null, upper: null });
  });

  it('holds a prediction past a limit at the limit and says so', () => {
    const limits = limitsAt({ response: 'vAtRef', cellTemperatureFactor: 'cellTemp', highestOcvV: 1.01 }, { cellTemp: 180 });
    const past = boundPrediction(limits, 1.048, 0.99, 1.1, (v) => `${Math.round(v * 1000)} mV`);
    expect(past.hitsLimit).toBe(true);
    expect(past.value).toBe(limits.upper);
    expect(past.modelValue).toBe(1.048);
    expect(past.high).toBe(limits.upper);
    expect(past.note).toBe('The model gives 1048 mV, above the highest open-circuit voltage measured (1010 mV): physically impossible, so this is not a prediction to trust.');
    const reversible = limitsAt({ response: 'vAtRef', cellTemperatureFactor: 'cellTemp' }, { cellTemp: 180 });
    expect(boundPrediction(reversible, 1.2, 1.1, 1.3, (v) => `${Math.round(v * 1000)} mV`).note).toMatch(/^The model gives 1200 mV, above the reversible voltage at 180 °C \(1147 mV\)/);
    const near = boundPrediction(reversible, 1.1, 1.0, 1.2);
    expect(near.hitsLimit).toBe(false);
    expect(near.intervalCut).toBe(true);
    expect(near.high).toBe(reversible.upper);
    const fine = boundPrediction(limits, 0.6, 0.58, 0.62);
    expect(fine).toMatchObject({ value: 0.6, low: 0.58, high: 0.62, hitsLimit: false, intervalCut: false, note: null });
    const negative = boundPrediction(limitsAt({ response: 'jAtRef' }, {}), -0.01, -0.05, 0.03);
    expect(negative).toMatchObject({ value: 0, low: 0, high: 0.03, hitsLimit: true });
  });
});

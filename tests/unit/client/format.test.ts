// The one formatter for values with units: metric values, method inputs and stored fields read as
// labels with units and sensible digits, never as keys, raw floats or "undefined".
import { describe, expect, it } from 'vitest';
import { describeQuantity, fieldLabel, formatFieldValue, formatMetric, formatQuantity, formatSignificant, humanKey, responseDisplay } from '@/lib/format';
import { polarizationMetrics } from '@shared/curves';

describe('formatQuantity', () => {
  it('writes a method input with its label, unit and three decimals in A/cm²', () => {
    // a raw float once seen on screen: jAtVRef = 0.1850336322869956
    expect(formatQuantity('jAtVRef', 0.1850336322869956)).toBe('j at V_ref 0.185 A/cm²');
    expect(formatQuantity('vRef', 0.6)).toBe('V_ref 0.600 V');
    expect(formatQuantity('loadingMgCm2', 3)).toBe('loading 3.00 mg/cm²');
  });

  it('says yes/no for flags, counts without decimals, text as it is', () => {
    expect(formatQuantity('hfrAvailable', true)).toBe('HFR in the file yes');
    expect(formatQuantity('irFree', false)).toBe('iR-free no');
    expect(formatQuantity('readings', 1234)).toBe('readings 1,234');
    expect(formatQuantity('basis', 'metal')).toBe('loading basis metal');
  });

  it('says "not available" for null, undefined and NaN instead of printing them', () => {
    for (const v of [null, undefined, Number.NaN]) expect(describeQuantity('jAtVRef', v).text).toBe('not available');
  });

  it('gives an unknown key a readable label and three significant digits', () => {
    expect(formatQuantity('someNewInput', 12.3456)).toBe('some new input 12.3');
  });

  it('uses the metric table for metric keys (display unit and digits)', () => {
    expect(describeQuantity('vAtRef', 0.6043)).toEqual({ label: 'V at j_ref', text: '604 mV' });
    expect(formatMetric('hfr', 0.1261)).toBe('126 mΩ·cm²');
    expect(formatMetric('vAtRef', Number.NaN)).toBe('—');
  });

  it('leaves no key or long float in the method text of a real curve', () => {
    // a small curve from the textbook shape (hand-made points), reference 0.2 A/cm² and 0.6 V
    const j = Float64Array.from([0, 0.05, 0.1, 0.2, 0.3, 0.4]);
    const v = Float64Array.from([0.98, 0.74, 0.69, 0.62, 0.57, 0.52]);
    const hfr = Float64Array.from([0.12, 0.12, 0.12, 0.12, 0.12, 0.12]);
    const result = polarizationMetrics({ kind: 'polarization', j, v, hfr }, { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' }, { loadingMgCm2: 3, metalLoadingMgCm2: null });
    for (const method of Object.values(result.method)) {
      for (const [key, value] of Object.entries(method!.inputs)) {
        const text = formatQuantity(key, value);
        expect(text).not.toMatch(/\b[a-z][a-z0-9]*[A-Z][a-z]\w*/); // no camelCase key (iR-free is a term)
        expect(text).not.toMatch(/\d\.\d{5,}/); // no raw float
        expect(text).not.toMatch(/undefined|NaN/);
      }
    }
  });
});

describe('formatSignificant', () => {
  it('keeps three significant digits across sizes', () => {
    expect(formatSignificant(0.000123456)).toBe('0.000123');
    expect(formatSignificant(123456)).toBe('123,456');
    expect(formatSignificant(1.5e-7)).toBe('1.50 × 10⁻⁷');
    expect(formatSignificant(0)).toBe('0');
  });
});

describe('stored fields', () => {
  it('names fields for people and writes objects as label–value pairs', () => {
    expect(fieldLabel('loadingMgCm2')).toBe('catalyst loading (mg/cm²)');
    expect(fieldLabel('binderWt', { binderWt: 'PTFE binder' })).toBe('PTFE binder');
    expect(humanKey('activationTemp')).toBe('activation temp');
    expect(formatFieldValue({ temperatureC: 180, anodeGas: 'H2' })).toBe('cell temperature (°C) 180; anode gas H2');
    expect(formatFieldValue(0.30000000000000004)).toBe('0.3');
    expect(formatFieldValue(null)).toBe('—');
  });

  it('shows responses in display units', () => {
    expect(responseDisplay({ key: 'vAtRef', label: 'V at j_ref', unit: 'V' })).toEqual({ label: 'V at j_ref', unit: 'mV', scale: 1000, digits: 0 });
    expect(responseDisplay({ key: 'thicknessUm', label: 'Electrode thickness', unit: 'µm' }).unit).toBe('µm');
  });
});

import { describe, it, expect } from 'vitest';
import { parseDelimitedText, detectMapping } from '../../../shared/curves/index';

const detect = (text: string, kind?: 'polarization' | 'durability' | 'hold') => detectMapping(parseDelimitedText(text), kind);

describe('detectMapping from header units', () => {
  it('maps named columns with units, unambiguously', () => {
    const result = detect('Current density (mA/cm2),Cell voltage (V),HFR (mOhm cm2),T_cell (°C)\n0,0.95,200,160\n200,0.65,210,160\n');
    expect(result.mapping).toEqual({
      current: { column: 0, unit: 'mA/cm2' },
      voltage: { column: 1, unit: 'V' },
      hfr: { column: 2, unit: 'mohm*cm2' },
      temperature: { column: 3, unit: 'C' },
    });
    expect(result.ambiguous).toBe(false);
    expect(result.kind).toBe('polarization');
  });
  it('notes that a total current needs an area when the file gives none', () => {
    const result = detect('I [A],U [V]\n0,0.95\n5,0.65\n');
    expect(result.mapping?.current).toEqual({ column: 0, unit: 'A' }); // column 0 of the text above
    expect(result.reasons.join(' ')).toMatch(/active area/);
  });
});

describe('detectMapping from magnitudes', () => {
  it('reads a unit-less voltage column in V or mV by its values', () => {
    expect(detect('Current density (A/cm2),Voltage\n0,0.95\n0.2,0.65\n').mapping?.voltage?.unit).toBe('V'); // 0.65–0.95: volts (common practice)
    expect(detect('Current density (A/cm2),Voltage\n0,950\n0.2,650\n').mapping?.voltage?.unit).toBe('mV'); // 650–950: millivolts
  });
  it('reads a unit-less current column by its values, but asks the user to confirm', () => {
    const small = detect('Current,Voltage (V)\n0,0.95\n0.2,0.65\n1.2,0.4\n');
    expect(small.mapping?.current?.unit).toBe('A/cm2'); // up to ~3: A/cm² (common practice in the trade)
    expect(small.ambiguous).toBe(true);
    const large = detect('Current,Voltage (V)\n0,0.95\n200,0.65\n1200,0.4\n');
    expect(large.mapping?.current?.unit).toBe('mA/cm2'); // up to ~3000: mA/cm²
    expect(large.ambiguous).toBe(true);
    expect(large.reasons.join(' ')).toMatch(/total current/);
  });
  it('guesses unnamed columns, voltage being the one that stays away from zero', () => {
    const result = detect('col1,col2\n0,0.95\n0.2,0.65\n0.6,0.5\n');
    expect(result.mapping).toEqual({ current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' } }); // column order of the text above
    expect(result.ambiguous).toBe(true);
  });
  it('reads a unit-less HFR by its median and asks to confirm', () => {
    const result = detect('j (A/cm2),U (V),HFR\n0,0.95,0.2\n0.2,0.65,0.21\n');
    expect(result.mapping?.hfr?.unit).toBe('ohm*cm2'); // 0.2: Ω·cm² (common practice: HT-PEM HFR ~0.1–0.3 Ω·cm²)
    expect(result.ambiguous).toBe(true);
  });
});

describe('detectMapping: ambiguities and kinds', () => {
  it('a measured and an iR-free voltage column → both mapped, no question', () => {
    const result = detect('j (A/cm2),E_cell (V),E_iR-free (V)\n0,0.95,0.95\n0.2,0.65,0.7\n');
    expect(result.mapping?.voltage?.column).toBe(1); // "E_cell (V)" is column 1
    expect(result.mapping?.voltageIrFree).toEqual({ column: 2, unit: 'V' }); // "E_iR-free (V)" is column 2
    expect(result.ambiguous).toBe(false);
  });
  it('two measured voltage columns → the first, ambiguous', () => {
    const result = detect('j (A/cm2),E_cell (V),E_anode (V)\n0,0.95,0.01\n0.2,0.65,0.05\n');
    expect(result.mapping?.voltage?.column).toBe(1); // "E_cell (V)" is column 1
    expect(result.ambiguous).toBe(true);
    expect(result.reasons[0]).toMatch(/"E_cell \(V\)" and "E_anode \(V\)"/);
  });
  it('a time column with constant current → durability', () => {
    const result = detect('Time (h),Current density (A/cm2),Voltage (V)\n0,0.2,0.65\n1,0.2,0.6499\n2,0.2,0.6498\n');
    expect(result.kind).toBe('durability');
    expect(result.mapping?.time).toEqual({ column: 0, unit: 'h' }); // column 0, "Time (h)"
  });
  it('a time column, voltage only → durability; with kind given → that kind', () => {
    expect(detect('Time (h),Voltage (V)\n0,0.65\n1,0.649\n').kind).toBe('durability');
    expect(detect('Time (h),Voltage (V)\n0,0.95\n1,0.949\n', 'hold').kind).toBe('hold');
  });
  it('a time column with a current stepping over its whole range → polarization, without asking', () => {
    const result = detect('Time (s),I (A/cm2),U (V)\n0,0,0.95\n30,0.1,0.72\n60,0.2,0.65\n90,0.4,0.55\n120,0.6,0.48\n');
    expect(result.kind).toBe('polarization');
    expect(result.ambiguous).toBe(false);
  });
  it('a time column with current ≈ 0 → hold', () => {
    expect(detect('Time (h),j (A/cm2),U (V)\n0,0,0.95\n1,0.0001,0.949\n').kind).toBe('hold');
  });
  it('timestamps are time columns whatever their name', () => {
    const result = detect('When,j (A/cm2),U (V)\n2024-05-01 10:00:00,0.2,0.65\n2024-05-01 11:00:00,0.2,0.649\n');
    expect(result.mapping?.time).toEqual({ column: 0, unit: 'timestamp' }); // column 0 holds date-times
  });
  it('no voltage at all → mapping null', () => {
    const result = detect('Step,Label\n1,a\n2,b\n');
    expect(result.mapping).toBeNull();
    expect(result.reasons.join(' ')).toMatch(/no voltage column/);
  });
  it('a polarization file without current → mapping null', () => {
    const result = detect('Voltage (V),HFR (Ohm cm2)\n0.95,0.2\n0.65,0.2\n', 'polarization');
    expect(result.mapping).toBeNull();
  });
  it('checks its argument', () => {
    expect(() => detectMapping(null as never)).toThrow(TypeError);
  });
});

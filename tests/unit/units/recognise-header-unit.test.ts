import { describe, it, expect } from 'vitest';
import { recogniseHeaderUnit, lookUpUnit, normaliseUnitKey } from '../../../shared/units/index';

// Header spellings as labs write them (from memory of the trade's habits; none copied from a product).
const CASES: [string, string | null, string | null][] = [
  ['Current density (mA/cm²)', 'current', 'mA/cm2'],
  ['Current density (mA/cm^2)', 'current', 'mA/cm2'],
  ['Current density mA/cm2', 'current', 'mA/cm2'],
  ['I [A]', 'current', 'A'],
  ['I (mA)', 'current', 'mA'],
  ['j/mA cm-2', 'current', 'mA/cm2'],
  ['j [A cm⁻²]', 'current', 'A/cm2'],
  ['I (mA per cm2)', 'current', 'mA/cm2'],
  ['Current_mA_cm2', 'current', 'mA/cm2'],
  ['U_cell / mV', 'voltage', 'mV'],
  ['Voltage (V)', 'voltage', 'V'],
  ['Voltage_V', 'voltage', 'V'],
  ['Cell voltage V', 'voltage', 'V'],
  ['E_cell [mV]', 'voltage', 'mV'],
  ['HFR (mOhm cm2)', 'hfr', 'mohm*cm2'],
  ['HFR (mΩ·cm²)', 'hfr', 'mohm*cm2'],
  ['HFR [Ohm*cm^2]', 'hfr', 'ohm*cm2'],
  ['R_HF [mΩ]', 'hfr', 'mohm'],
  ['R (ohm)', 'hfr', 'ohm'],
  ['HFR (Ω/cm²)', 'hfr', 'ohm*cm2'],
  ['Time (h)', 'time', 'h'],
  ['Elapsed time [s]', 'time', 's'],
  ['Test time / min', 'time', 'min'],
  ['Timestamp', 'time', 'timestamp'],
  ['Date/Time', 'time', 'timestamp'],
  ['Elapsed hours', 'time', 'h'],
  ['T_cell (°C)', 'temperature', 'C'],
  ['Cell temperature [degC]', 'temperature', 'C'],
  ['T (K)', 'temperature', 'K'],
  ['Power density (mW/cm2)', 'power', 'mW/cm2'],
  ['Back pressure (kPa)', 'pressure', 'kPa'],
  ['Step', null, null],
  ['Phase A', null, null],
  ['Comment', null, null],
];

describe('recogniseHeaderUnit', () => {
  for (const [header, quantity, unit] of CASES) {
    it(`reads ${JSON.stringify(header)}`, () => {
      const match = recogniseHeaderUnit(header);
      expect(match.quantity).toBe(quantity);
      expect(match.unit).toBe(unit);
    });
  }
  it('names the quantity without a unit when none is written', () => {
    const match = recogniseHeaderUnit('Cell voltage');
    expect(match.quantity).toBe('voltage');
    expect(match.unit).toBeNull();
    expect(recogniseHeaderUnit('Current (uA/cm2)')).toMatchObject({ quantity: 'current', unit: null, unitText: 'uA/cm2' });
  });
  it('spots iR-corrected voltages', () => {
    expect(recogniseHeaderUnit('E_iR-free (V)')).toMatchObject({ quantity: 'voltage', unit: 'V', irFree: true });
    expect(recogniseHeaderUnit('V iR-corrected [mV]')).toMatchObject({ quantity: 'voltage', irFree: true });
    expect(recogniseHeaderUnit('E_cell (V)').irFree).toBe(false);
  });
  it.each([
    ['E_iR-free (V)', 'V'],
    ['V_iR-corrected', null],
    ['IR-free voltage', null],
    ['IR-free voltage (mV)', 'mV'],
    ['Voltage (iR-free)', null],
    ['HFR-free voltage (V)', 'V'],
    ['iR-compensated potential / V', 'V'],
    ['U_iRfree [V]', 'V'],
  ])('"%s" is an iR-free voltage (unit %s), not an HFR', (header, unit) => {
    expect(recogniseHeaderUnit(header)).toMatchObject({ quantity: 'voltage', unit, irFree: true });
  });
  it('an HFR column and a measured voltage stay what they are', () => {
    expect(recogniseHeaderUnit('HFR (mOhm cm2)')).toMatchObject({ quantity: 'hfr', irFree: false });
    expect(recogniseHeaderUnit('Cell voltage (V)')).toMatchObject({ quantity: 'voltage', irFree: false });
    expect(recogniseHeaderUnit('Air flow (sccm)').quantity).toBeNull();
  });
  it('lets the unit win over a contradicting name', () => {
    expect(recogniseHeaderUnit('Voltage (A)').quantity).toBe('current');
  });
  it('normalises unit spellings to one key', () => {
    expect(normaliseUnitKey('mΩ·cm²')).toBe('mohmcm2'); // normalisation rules of normaliseUnitKey
    expect(normaliseUnitKey('mOhm cm^2')).toBe('mohmcm2');
    expect(normaliseUnitKey('A cm-2')).toBe('acm2');
    expect(lookUpUnit('µA')).toBeNull();
    expect(lookUpUnit('')).toBeNull();
  });
});

// The same four-point curve written in four unit sets must read back identically.
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseDelimitedText, detectMapping, applyMapping, CurveFileError } from '../../../shared/curves/index';

const read = (name: string): string => readFileSync(new URL(`../../fixtures/curves/${name}`, import.meta.url), 'utf8');

// The curve in internal units, typed into units-a-cm2.csv (invented data).
const J = [0, 0.1, 0.2, 0.4]; // A/cm²
const V = [0.95, 0.72, 0.65, 0.55]; // V
const HFR = [0.2, 0.2, 0.21, 0.22]; // Ω·cm²

function load(name: string, areaCm2?: number) {
  const table = parseDelimitedText(read(name));
  const detection = detectMapping(table);
  if (detection.mapping === null) throw new Error(`no mapping for ${name}`);
  return { table, detection, curve: applyMapping(table, detection.mapping, { kind: detection.kind, areaCm2 }) };
}

function expectSameCurve(curve: { j: Float64Array; v: Float64Array; hfr?: Float64Array }): void {
  for (let index = 0; index < J.length; index++) {
    expect(curve.j[index]).toBeCloseTo(J[index], 12);
    expect(curve.v[index]).toBeCloseTo(V[index], 12);
    expect(curve.hfr?.[index]).toBeCloseTo(HFR[index], 12);
  }
}

describe('unit fixtures', () => {
  it('A/cm², V, Ω·cm² (internal units)', () => {
    const { detection, curve } = load('units-a-cm2.csv');
    expect(detection.mapping).toEqual({ current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' }, hfr: { column: 2, unit: 'ohm*cm2' } });
    expectSameCurve(curve);
  });
  it('mA/cm², mV, mΩ·cm² (derived by hand: 100 mA/cm² = 0.1 A/cm², 720 mV = 0.72 V, 200 mΩ·cm² = 0.2 Ω·cm²)', () => {
    const { detection, curve } = load('units-ma-cm2.csv');
    expect(detection.mapping).toEqual({ current: { column: 0, unit: 'mA/cm2' }, voltage: { column: 1, unit: 'mV' }, hfr: { column: 2, unit: 'mohm*cm2' } });
    expectSameCurve(curve);
  });
  it('total A and Ω with the area from the file (derived by hand: 2.5 A / 25 cm² = 0.1 A/cm²; 0.008 Ω × 25 cm² = 0.2 Ω·cm²)', () => {
    const { table, curve } = load('units-total-a-with-area.csv');
    expect(table.conditions.areaCm2).toBe(25); // "Active area: 25 cm2" in the fixture
    expect(curve.areaCm2).toBe(25);
    expectSameCurve(curve);
  });
  it('total mA and mΩ with the area given at upload (derived by hand: 2500 mA / 25 cm² = 0.1 A/cm²; 8 mΩ × 25 cm² = 0.2 Ω·cm²)', () => {
    const { curve } = load('units-total-ma-no-area.csv', 25);
    expectSameCurve(curve);
  });
  it('total mA without any area → area-required, naming the column', () => {
    try {
      load('units-total-ma-no-area.csv');
      expect.unreachable('should have thrown');
    } catch (error) {
      expect(error).toBeInstanceOf(CurveFileError);
      expect((error as CurveFileError).code).toBe('area-required');
      expect((error as CurveFileError).message).toMatch(/line 1, column "I \(mA\)"/);
    }
  });
});

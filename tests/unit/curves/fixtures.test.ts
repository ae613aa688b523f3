// Invented labs' station exports (tests/fixtures/curves, written by generate-fixtures.ts from
// the semi-empirical model) read end to end: bytes → text → table → mapping → curve → metrics.
import { describe, it, expect } from 'vitest';
import { sniffBytes, decodeText, parseDelimitedText, detectMapping, applyMapping, polarizationMetrics, semiEmpiricalVoltage } from '../../../shared/curves/index';
import type { ReferencePoint } from '../../../shared/curves/index';
import { fixtureBytes } from './fixture-files';
import { FIXTURE_MODEL, FIXTURE_J_POINTS, FIXTURE_AREA_CM2, FIXTURE_HFR_OHM_CM2 } from '../../fixtures/curves/model-parameters';

const REF: ReferencePoint = { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' };
const WRITTEN_V = 5e-5; // files hold V to 0.1 mV: rounding ≤ 0.05 mV

function load(name: string, areaCm2?: number) {
  const bytes = fixtureBytes(name);
  const sniffed = sniffBytes(bytes);
  const table = parseDelimitedText(decodeText(bytes));
  const detection = detectMapping(table);
  if (detection.mapping === null) throw new Error(`no mapping for ${name}: ${detection.reasons.join('; ')}`);
  const curve = applyMapping(table, detection.mapping, { kind: detection.kind, areaCm2 });
  return { sniffed, table, detection, curve };
}

function expectModelCurve(curve: { j: Float64Array; v: Float64Array; hfr?: Float64Array }): void {
  expect(curve.j.length).toBe(FIXTURE_J_POINTS.length);
  for (let index = 0; index < FIXTURE_J_POINTS.length; index++) {
    expect(Math.abs(curve.j[index] - FIXTURE_J_POINTS[index])).toBeLessThan(1e-9); // the fixture's j points
    expect(Math.abs(curve.v[index] - semiEmpiricalVoltage(FIXTURE_MODEL, FIXTURE_J_POINTS[index]))).toBeLessThanOrEqual(WRITTEN_V + 1e-12); // the model
    expect(Math.abs((curve.hfr?.[index] ?? Number.NaN) - FIXTURE_HFR_OHM_CM2)).toBeLessThan(1e-9); // the fixture's HFR
  }
}

describe('invented lab exports', () => {
  it('lab A: semicolon, decimal comma, area and temperature lines, mΩ·cm²', () => {
    const { sniffed, table, detection, curve } = load('lab-a-semicolon-decimal-comma.csv');
    expect(sniffed).toBe('text');
    expect(table.delimiter).toBe(';');
    expect(table.decimalComma).toBe(true);
    expect(table.conditions.areaCm2).toBe(FIXTURE_AREA_CM2); // "Area;25,0;cm2"
    expect(table.conditions.temperatureC).toBe(160); // "Temperature;160;°C"
    expect(detection.mapping?.hfr?.unit).toBe('mohm*cm2');
    expect(detection.ambiguous).toBe(false);
    expectModelCurve(curve);
  });
  it('lab B: tab, point counter, total mA and mΩ, needs the area from the upload', () => {
    expect(() => load('lab-b-tab-mA-total-current.txt')).toThrow(/total current in mA needs the active area/);
    const { table, detection, curve } = load('lab-b-tab-mA-total-current.txt', FIXTURE_AREA_CM2);
    expect(table.delimiter).toBe('\t');
    expect(detection.mapping?.current).toEqual({ column: 1, unit: 'mA' }); // column 1 "I [mA]" of the fixture
    expect(detection.mapping?.hfr).toEqual({ column: 3, unit: 'mohm' }); // column 3 "R_cell [mOhm]" of the fixture
    expectModelCurve(curve);
  });
  it('lab C: metadata header lines → conditions', () => {
    const { table, curve } = load('lab-c-metadata-header.csv');
    expect(table.conditions).toMatchObject({ areaCm2: 16, temperatureC: 180, anodeGas: 'H2', cathodeGas: 'air', backPressureKPa: 101 }); // written by generate-fixtures.ts
    expect(table.headerLine).toBe(7); // six metadata lines above the header
    expectModelCurve(curve);
  });
  it('lab D: whitespace, mV, Ω·cm²', () => {
    const { table, detection, curve } = load('lab-d-whitespace-mV.txt');
    expect(table.delimiter).toBe('whitespace');
    expect(detection.mapping?.voltage?.unit).toBe('mV');
    expectModelCurve(curve);
  });
  it('lab E: BOM + CRLF, up and down sweeps, 3 readings per step, hysteresis reported', () => {
    const bytes = fixtureBytes('lab-e-bom-crlf.csv');
    expect(Array.from(bytes.subarray(0, 3))).toEqual([0xef, 0xbb, 0xbf]); // UTF-8 BOM (Unicode §23.8)
    const { table, curve } = load('lab-e-bom-crlf.csv');
    expect(table.header[0]).toBe('Current density [A/cm2]');
    const result = polarizationMetrics(curve, REF, { loadingMgCm2: 1 });
    expect(result.summary.sweeps).toBe(2); // generate-fixtures.ts: up-down sweeps
    expect(result.summary.readingsPerStepMedian).toBe(3); // generate-fixtures.ts: 3 readings per step
    // the down sweep was written 8 mV higher, plus 1 mV noise per reading (mean of 3: σ ≈ 0.58 mV per sweep)
    expect(result.summary.hysteresisHigherSweep).toBe('down');
    expect(Math.abs((result.summary.hysteresisMv as number) - 8)).toBeLessThan(4); // generate-fixtures.ts: 8 mV offset; 4 mV ≈ 5 σ of the difference of two 3-reading means (σ ≈ 0.82 mV)
    expect(Math.abs((result.metrics.vAtRef as number) - (semiEmpiricalVoltage(FIXTURE_MODEL, 0.2) + 0.004))).toBeLessThan(0.003); // model + half the offset
  });
  it('lab F: timestamps, step labels, total A and mΩ with the file area; a polarization curve with a clock', () => {
    const { table, detection, curve } = load('lab-f-timestamps-steps.csv');
    expect(table.columnKinds).toEqual(['timestamp', 'text', 'number', 'number', 'number']);
    expect(table.ignoredColumns).toEqual([1]); // column 1 "Step" holds labels
    expect(table.conditions.areaCm2).toBe(25); // "Area,25,cm2"
    expect(detection.kind).toBe('polarization');
    expect(detection.ambiguous).toBe(false); // the current steps through 15 levels: no question
    expect(curve.tHours?.[1]).toBeCloseTo(30 / 3600, 12); // 30 s between readings (generate-fixtures.ts)
    const result = polarizationMetrics(curve, REF, { loadingMgCm2: 1 });
    expect(result.summary.readingsPerStepMedian).toBe(2); // generate-fixtures.ts: 2 readings per step
    expect(result.metrics.vAtRef).toBeCloseTo(semiEmpiricalVoltage(FIXTURE_MODEL, 0.2), 4); // the model, written to 0.1 mV
    expect(result.metrics.hfr).toBeCloseTo(FIXTURE_HFR_OHM_CM2, 4); // 10 mΩ × 25 cm² = 0.25 Ω·cm²
  });
  it('durability in minutes with a restart at t = 0', () => {
    const { detection, curve } = load('durability-minutes.csv');
    expect(detection.kind).toBe('durability');
    expect(detection.mapping?.time?.unit).toBe('min');
    expect(detection.mapping?.temperature?.unit).toBe('C');
    expect(curve.tHours?.length).toBe(401); // 200 h every 30 min, both ends
    expect(curve.tHours?.[400]).toBeCloseTo(200, 9); // the restart carried on: 0.5 h steps throughout
    expect(curve.timeResets.length).toBe(1); // generate-fixtures.ts: one restart at 100 h
    expect(curve.timeResets[0].line).toBe(203); // comment + header + 200 rows before it
  });
});

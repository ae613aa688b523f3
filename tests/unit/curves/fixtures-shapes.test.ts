// Export shapes partner labs send (tests/fixtures/curves/shape-*, written by
// generate-shape-fixtures.ts from the semi-empirical model of model-parameters.ts): each goes
// straight in with the right numbers, asks once for real ambiguity, or is refused naming
// line and column. Expected values are recomputed outside the code under test by
// tests/reference/import-shapes.py (numpy): V(0.2 A/cm²) = 0.6247 V as written (4 decimals),
// V + j·HFR there = 0.6747 V, HFR 0.25 Ω·cm², V(1.0) = 0.3223 V.
import { describe, it, expect } from 'vitest';
import { decodeText, parseDelimitedText, detectMapping, applyMapping, checkEnoughData, importNotes, CurveFileError } from '../../../shared/curves/index';
import type { CurveKind } from '../../../shared/curves/index';
import { fixtureBytes } from './fixture-files';

const V_AT_02 = 0.6247; // tests/reference/import-shapes.py, V(0.2) as written
const V_IRFREE_AT_02 = 0.6747; // tests/reference/import-shapes.py, V(0.2) + 0.2 × 0.25, as written
const HFR = 0.25; // model-parameters.ts, Ω·cm²

function load(name: string, options: { areaCm2?: number; kind?: CurveKind } = {}) {
  const table = parseDelimitedText(decodeText(fixtureBytes(name)));
  const detection = detectMapping(table, options.kind, { areaCm2: options.areaCm2 ?? table.conditions.areaCm2 ?? null });
  return { table, detection };
}

function apply(name: string, options: { areaCm2?: number } = {}) {
  const { table, detection } = load(name, options);
  if (detection.mapping === null) throw new Error(`no mapping for ${name}: ${detection.reasons.join('; ')}`);
  const curve = applyMapping(table, detection.mapping, { kind: detection.kind, areaCm2: options.areaCm2 });
  checkEnoughData(curve);
  return { table, detection, curve, notes: importNotes(table, curve.notes) };
}

// the row read at j = 0.2 A/cm² (a step of every fixture)
function at02(curve: { j: Float64Array }): number {
  const row = Array.from(curve.j).findIndex((j) => Math.abs(j - 0.2) < 1e-9);
  if (row < 0) throw new Error('no row at 0.2 A/cm²');
  return row;
}

function refusal(run: () => unknown): CurveFileError {
  try {
    run();
  } catch (error) {
    if (error instanceof CurveFileError) return error;
    throw error;
  }
  throw new Error('expected a CurveFileError');
}

describe('export shapes that go straight in', () => {
  it('load current logged negative: flipped, with a note, no question', () => {
    const { detection, curve, notes } = apply('shape-negative-current.csv');
    expect(detection.ambiguous).toBe(false);
    expect(detection.mapping?.current).toEqual({ column: 0, unit: 'A', negated: true }); // "Current (A)", logged −I
    const row = at02(curve); // −5.000 A on 25 cm² read as +0.2 A/cm² (by hand: 5/25)
    expect(curve.v[row]).toBeCloseTo(V_AT_02, 12);
    expect(curve.j[0]).toBe(0); // open circuit stays a plain 0, not −0
    expect(Object.is(curve.j[0], -0)).toBe(false);
    expect(curve.hfr?.[row]).toBeCloseTo(HFR, 12); // 10 mΩ × 25 cm² = 0.25 Ω·cm², by hand
    expect(notes.join(' ')).toMatch(/logged negative.*values × −1/);
  });

  it('a current that changes sign mid-curve asks, naming the line where it does', () => {
    const { detection } = load('shape-sign-change.csv');
    expect(detection.ambiguous).toBe(true);
    expect(detection.reasons.join(' ')).toMatch(/changes sign mid-curve \(first at line 11\), from -1\.000 to 0\.200 A\/cm²/); // line 11: the 0.3 A/cm² row, the first written negative
    // confirmed as it is, the negative part is refused on its line
    const table = parseDelimitedText(decodeText(fixtureBytes('shape-sign-change.csv')));
    const error = refusal(() => applyMapping(table, detection.mapping!, { kind: 'polarization' }));
    expect(error.line).toBe(11);
    expect(error.column).toBe('Current density (A/cm2)');
  });

  it('a summary block after the data: the table ends there, the lines are named, a condition in it is read', () => {
    const { table, curve, notes } = apply('shape-summary-after-table.csv');
    expect(table.rowCount).toBe(15); // FIXTURE_J_POINTS: 15 steps
    expect(table.afterTable).toEqual({ firstLine: 18, lastLine: 22, lineCount: 5, samples: ['Test summary', 'Peak power density,0.3223,W/cm2', 'OCV,0.9500,V'] }); // lines 18–22 of the file
    expect(table.conditions.temperatureC).toBe(180); // "Cell temperature,180,C" under the table
    expect(curve.v[at02(curve)]).toBeCloseTo(V_AT_02, 12);
    expect(notes.join(' ')).toMatch(/table ends at line 16: lines 18–22 below it \(5 lines, starting "Test summary"\) were left out/);
  });

  it('comment lines of every style, a repeated header and a text line inside the data are skipped', () => {
    const { table, curve, notes } = apply('shape-comments-inside.txt');
    expect(table.rowCount).toBe(15);
    expect(table.skippedLines).toEqual({ count: 1, lines: [14], samples: ['Sweep 2'] }); // line 14: "Sweep 2", then the header again
    expect(curve.v[at02(curve)]).toBeCloseTo(V_AT_02, 12);
    expect(notes.join(' ')).toMatch(/1 text line inside the data skipped \(line 14\) \("Sweep 2"\)/);
  });

  it('decimal comma with points as thousands separators ("1.000,0" mA/cm²)', () => {
    const { table, curve, notes } = apply('shape-thousands-decimal-comma.csv');
    expect(table.decimalComma).toBe(true);
    [1, 1.2, 1.4].forEach((j, k) => expect(curve.j[curve.j.length - 3 + k]).toBeCloseTo(j, 12)); // "1.000,0", "1.200,0", "1.400,0" mA/cm² → A/cm², by hand
    expect(curve.v[curve.j.length - 3]).toBeCloseTo(0.3223, 12); // V(1.0) = 322,3 mV (tests/reference/import-shapes.py)
    expect(curve.v[at02(curve)]).toBeCloseTo(V_AT_02, 12);
    expect(curve.hfr?.[0]).toBeCloseTo(HFR, 12); // 250,0 mΩ·cm²
    expect(notes.join(' ')).toMatch(/"j \(mA\/cm2\)": 3 numbers written with thousands separators/);
  });

  it('point decimal with commas as thousands separators ("1,000.0" mA/cm²)', () => {
    const { table, curve } = apply('shape-thousands-point.tsv');
    expect(table.decimalComma).toBe(false);
    expect(table.groupedCells?.[0]).toBe(3); // 1,000.0, 1,200.0, 1,400.0
    [1, 1.2, 1.4].forEach((j, k) => expect(curve.j[curve.j.length - 3 + k]).toBeCloseTo(j, 12)); // "1,000.0" … mA/cm², by hand
    expect(curve.v[at02(curve)]).toBeCloseTo(V_AT_02, 12);
  });

  it('a polarization curve logged against time is a polarization curve, without asking', () => {
    const { detection, curve } = apply('shape-time-stepped-polarization.csv');
    expect(detection.kind).toBe('polarization');
    expect(detection.ambiguous).toBe(false);
    expect(curve.tHours?.[3]).toBeCloseTo(30 / 3600, 12); // 10 s per reading (generator)
    expect(curve.v[at02(curve)]).toBeCloseTo(V_AT_02, 12);
  });

  it('the active area written as dimensions is multiplied; a specific surface area is never the area', () => {
    const { table, curve, notes } = apply('shape-area-dimensions.txt');
    expect(table.conditions.areaCm2).toBe(25); // "5 cm x 5 cm" = 25 cm², by hand (not 5, not 45 m²/g)
    expect(curve.areaCm2).toBe(25);
    expect(curve.v[at02(curve)]).toBeCloseTo(V_AT_02, 12); // 5 A on 25 cm² = 0.2 A/cm²; on 5 cm² it would be 1 A/cm²
    expect(notes.join(' ')).toMatch(/25 cm² from the dimensions "5 cm x 5 cm"/);
    expect(notes.join(' ')).toMatch(/"Electrochemical surface area: 45 m2\/g" is a specific or electrochemical surface area/);
  });

  it('an iR-free voltage as the only voltage, with HFR: V = V_iR-free − j·HFR, said so', () => {
    const { detection, curve, notes } = apply('shape-irfree-only-with-hfr.csv');
    expect(detection.ambiguous).toBe(false);
    expect(detection.mapping?.voltage).toBeUndefined();
    expect(detection.mapping?.voltageIrFree).toEqual({ column: 1, unit: 'V' }); // "E_iR-free (V)"
    const row = at02(curve);
    expect(curve.vIrFree?.[row]).toBeCloseTo(V_IRFREE_AT_02, 12);
    expect(curve.v[row]).toBeCloseTo(V_IRFREE_AT_02 - 0.2 * HFR, 12); // = 0.6247 (tests/reference/import-shapes.py)
    expect(notes.join(' ')).toMatch(/computed as V_iR-free − j·HFR/);
  });

  it('an iR-free voltage beside the measured one: both kept, no question', () => {
    const { detection, curve } = apply('shape-irfree-and-measured.csv');
    expect(detection.ambiguous).toBe(false);
    expect(detection.mapping?.voltage).toEqual({ column: 1, unit: 'V' }); // "V_cell (V)"
    expect(detection.mapping?.voltageIrFree).toEqual({ column: 2, unit: 'V' }); // "V_iR-corrected (V)"
    const row = at02(curve);
    expect(curve.v[row]).toBeCloseTo(V_AT_02, 12);
    expect(curve.vIrFree?.[row]).toBeCloseTo(V_IRFREE_AT_02, 12);
  });

  it('an iR-free voltage alone, no HFR: the measured voltage is unknown (NaN), never the iR-free one', () => {
    const { curve, notes } = apply('shape-irfree-only-no-hfr.csv');
    expect(curve.v.every((value) => Number.isNaN(value))).toBe(true);
    expect(curve.vIrFree?.[at02(curve)]).toBeCloseTo(V_IRFREE_AT_02, 12);
    expect(notes.join(' ')).toMatch(/only iR-free metrics can be read/);
  });

  it('HFR logged as 0 between readings and blank at open circuit: missing (NaN), noted, not refused', () => {
    const { table, curve, notes } = apply('shape-hfr-zeros-blank-ocv.csv');
    expect(table.missingCells?.[2]).toEqual({ count: 2, firstLine: 2, firstText: '' }); // the two open-circuit rows
    const hfr = Array.from(curve.hfr!);
    expect(hfr.filter((value) => Number.isNaN(value)).length).toBe(16); // 14 zeros + 2 blanks (generator: every second loaded reading is 0)
    expect(hfr.filter((value) => !Number.isNaN(value)).every((value) => Math.abs(value - HFR) < 1e-12)).toBe(true);
    expect(notes.join(' ')).toMatch(/logged as 0 on 14 rows.*read as missing/);
    expect(notes.join(' ')).toMatch(/HFR blank on 2 open-circuit rows/);
  });
});

describe('unit slips in both directions: the right unit proposed, or refused with line and column', () => {
  it.each([
    ['shape-volts-under-mV.csv', 'voltage', 'V', 2, /highest value is 0\.95 mV.*choose V/], // line 2: the 0.9500 open-circuit row
    ['shape-mV-under-V.csv', 'voltage', 'mV', 2, /values up to 950 V are not cell voltages.*choose mV/],
    ['shape-total-current-as-A.csv', 'current', 'mA', 17, /25000 A on 25 cm² is 1000 A\/cm².*is the unit mA\?/], // line 17: the 1.0 A/cm² row
    ['shape-hfr-ohmcm2-as-mohmcm2.csv', 'hfr', 'ohm*cm2', 9, /0\.00025 Ω·cm², outside what any cell shows.*is the unit Ω·cm²\?/],
  ] as const)('%s: the %s column is proposed in %s, the message names line %i', (name, role, proposed, line, message) => {
    const { table, detection } = load(name);
    expect(detection.ambiguous).toBe(true);
    expect((detection.mapping as Record<string, { unit: string }>)[role].unit).toBe(proposed);
    expect(detection.reasons.join(' ')).toMatch(new RegExp(`^line ${line}, column "`));
    expect(detection.reasons.join(' ')).toMatch(message);
    // confirmed with the unit the header states, the same slip is refused
    const stated = parseDelimitedText(decodeText(fixtureBytes(name)));
    const asStated = JSON.parse(JSON.stringify(detection.mapping)) as Record<string, { column: number; unit: string }>;
    asStated[role].unit = role === 'voltage' ? (proposed === 'V' ? 'mV' : 'V') : role === 'current' ? 'A' : 'mohm*cm2';
    const error = refusal(() => applyMapping(stated, asStated as never, { kind: 'polarization' }));
    expect(error.code).toBe('unit-slip');
    expect(error.line).toBe(line);
    expect(error.column).toBe(table.header[asStated[role].column]);
    // and with the proposed unit the curve is the model's
    const curve = applyMapping(parseDelimitedText(decodeText(fixtureBytes(name))), detection.mapping!, { kind: 'polarization' });
    expect(curve.v[at02(curve)]).toBeCloseTo(V_AT_02, 12);
  });

  it('a total cell resistance under a mΩ·cm² header: mΩ on the build’s area proposed', () => {
    const { detection } = load('shape-hfr-total-as-mohmcm2.csv', { areaCm2: 25 });
    expect(detection.mapping?.hfr?.unit).toBe('mohm'); // 10 mΩ × 25 cm² = 0.25 Ω·cm² (by hand); 10 mΩ·cm² = 0.01 is no cell's
    expect(detection.reasons.join(' ')).toMatch(/is the unit mΩ \(a total resistance, × 25 cm²\)\?/);
    const curve = applyMapping(parseDelimitedText(decodeText(fixtureBytes('shape-hfr-total-as-mohmcm2.csv'))), detection.mapping!, { kind: 'polarization', areaCm2: 25 });
    expect(curve.hfr?.[at02(curve)]).toBeCloseTo(HFR, 12);
  });
});

describe('too little data is refused with what is missing', () => {
  it('a polarization curve with two current steps', () => {
    const error = refusal(() => apply('shape-too-few-steps.csv'));
    expect(error.code).toBe('too-few-steps');
    expect(error.message).toMatch(/at least 3 distinct current steps under load; this file has 2 \(0\.10 A\/cm² and 0\.20 A\/cm²\) besides open circuit/);
  });
  it('a durability log of 12 readings', () => {
    const error = refusal(() => apply('shape-durability-few-points.csv'));
    expect(error.code).toBe('too-few-points');
    expect(error.message).toMatch(/at least 20 readings.*this file has 12/);
  });
});

import { describe, it, expect } from 'vitest';
import { parseDelimitedText, applyMapping, CurveFileError } from '../../../shared/curves/index';
import type { ColumnMapping } from '../../../shared/curves/index';

function errorOf(action: () => unknown): CurveFileError {
  try {
    action();
  } catch (error) {
    if (error instanceof CurveFileError) return error;
    throw error;
  }
  throw new Error('expected a CurveFileError');
}

const polarization = parseDelimitedText('I (mA),U (mV),R (mOhm)\n0,950,8\n2500,720,8\n5000,650,8.4\n');
const mapping: ColumnMapping = { current: { column: 0, unit: 'mA' }, voltage: { column: 1, unit: 'mV' }, hfr: { column: 2, unit: 'mohm' } };

describe('applyMapping conversions', () => {
  it('converts total current and cell resistance with the given area', () => {
    const curve = applyMapping(polarization, mapping, { kind: 'polarization', areaCm2: 25 });
    expect(curve.j[1]).toBeCloseTo(0.1, 12); // derived by hand: 2500 mA = 2.5 A; / 25 cm² = 0.1 A/cm²
    expect(curve.v[2]).toBeCloseTo(0.65, 12); // derived by hand: 650 mV
    expect(curve.hfr?.[2]).toBeCloseTo(0.21, 12); // derived by hand: 8.4 mΩ × 25 cm² = 210 mΩ·cm² = 0.21 Ω·cm²
    expect(curve.areaCm2).toBe(25); // the area given
    expect(Array.from(curve.dataLines)).toEqual([2, 3, 4]); // lines of the three rows
  });
  it('prefers the upload area over the file area, and says so', () => {
    const table = parseDelimitedText('Area: 20 cm2\nI (A),U (V)\n0,0.95\n5,0.65\n');
    const curve = applyMapping(table, { current: { column: 0, unit: 'A' }, voltage: { column: 1, unit: 'V' } }, { kind: 'polarization', areaCm2: 25 });
    expect(curve.j[1]).toBeCloseTo(0.2, 12); // derived by hand: 5 A / 25 cm²
    expect(curve.notes.join(' ')).toMatch(/file says 20 cm²/);
  });
  it('turns times into hours elapsed and K into °C', () => {
    const table = parseDelimitedText('t (min),U (V),T (K)\n30,0.65,433.15\n90,0.649,433.15\n');
    const curve = applyMapping(table, { voltage: { column: 1, unit: 'V' }, time: { column: 0, unit: 'min' }, temperature: { column: 2, unit: 'K' } }, { kind: 'durability' });
    expect(Array.from(curve.tHours ?? [])).toEqual([0, 1]); // derived by hand: (90 − 30) / 60 = 1 h from the first row
    expect(curve.temperatureC?.[0]).toBeCloseTo(160, 9); // derived by hand: 433.15 − 273.15
    expect(Number.isNaN(curve.j[0])).toBe(true); // no current column in a durability log: unknown
  });
  it('turns timestamps into hours elapsed', () => {
    const table = parseDelimitedText('Timestamp,U (V)\n2024-05-01 10:00:00,0.65\n2024-05-01 11:30:00,0.649\n');
    const curve = applyMapping(table, { voltage: { column: 1, unit: 'V' }, time: { column: 0, unit: 'timestamp' } }, { kind: 'durability' });
    expect(curve.tHours?.[1]).toBeCloseTo(1.5, 12); // derived by hand: 90 min
  });
  it('records a restart at t = 0 and carries the hours on', () => {
    const table = parseDelimitedText('Time (h),j (A/cm2),U (V)\n0,0.2,0.65\n1,0.2,0.65\n2,0.2,0.65\n0,0.2,0.64\n1,0.2,0.64\n');
    const curve = applyMapping(table, { current: { column: 1, unit: 'A/cm2' }, voltage: { column: 2, unit: 'V' }, time: { column: 0, unit: 'h' } }, { kind: 'durability' });
    expect(Array.from(curve.tHours ?? [])).toEqual([0, 1, 2, 3, 4]); // derived by hand: restart logged at 0 → one interval (1 h) after 2 h
    expect(curve.timeResets).toEqual([{ row: 3, line: 5, atHours: 3, fromHours: 2, toHours: 0 }]); // derived by hand: 4th row (index 3) on file line 5, from 2 h back to 0 h, placed at 3 h
  });
  it('a hold without current gets j = 0', () => {
    const table = parseDelimitedText('Time (h),U (V)\n0,0.95\n1,0.949\n');
    const curve = applyMapping(table, { voltage: { column: 1, unit: 'V' }, time: { column: 0, unit: 'h' } }, { kind: 'hold' });
    expect(Array.from(curve.j)).toEqual([0, 0]); // an open-circuit hold has j = 0 (definition)
  });
});

describe('applyMapping errors', () => {
  it('total current without an area → area-required naming line and column', () => {
    const error = errorOf(() => applyMapping(polarization, mapping, { kind: 'polarization' }));
    expect(error.code).toBe('area-required');
    expect(error.message).toMatch(/^line 1, column "I \(mA\)": total current in mA needs the active area/);
    expect(error.line).toBe(1); // header line
  });
  it('Ω HFR without an area → area-required', () => {
    const table = parseDelimitedText('j (A/cm2),U (V),R (Ohm)\n0,0.95,0.008\n');
    const error = errorOf(() => applyMapping(table, { current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' }, hfr: { column: 2, unit: 'ohm' } }, { kind: 'polarization' }));
    expect(error.code).toBe('area-required');
    expect(error.column).toBe('R (Ohm)');
  });
  it('700 "V" → impossible-value, suggesting mV', () => {
    const table = parseDelimitedText('j (A/cm2),U (V)\n0,0.95\n0.1,0.8\n0.2,0.7\n0.3,700\n');
    const error = errorOf(() => applyMapping(table, { current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' } }, { kind: 'polarization' }));
    expect(error.code).toBe('impossible-value');
    expect(error.message).toBe('line 5, column "U (V)": 700 V is not a possible cell voltage; is the column in mV?'); // the message names line, column and the likely unit
  });
  it('current density out of range → impossible-value', () => {
    // a column that changes sign is not flipped: its negative reading is refused
    const table = parseDelimitedText('j (A/cm2),U (V)\n-0.3,0.95\n0.2,0.7\n');
    expect(errorOf(() => applyMapping(table, { current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' } }, { kind: 'polarization' })).message).toMatch(
      /^line 2, column "j \(A\/cm2\)": -0.3 A\/cm² is a negative current density below −0.05 A\/cm²/,
    );
    const high = parseDelimitedText('j (A/cm2),U (V)\n0.2,0.95\n200,0.65\n');
    const slip = errorOf(() => applyMapping(high, { current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' } }, { kind: 'polarization' }));
    expect(slip.code).toBe('unit-slip');
    expect(slip.message).toMatch(/^line 3, column "j \(A\/cm2\)": 200 A\/cm² is 200 A\/cm², more than any cell carries.*is the unit mA\/cm²\?/);
  });
  it('HFR out of range → impossible-value', () => {
    const table = parseDelimitedText('j (A/cm2),U (V),HFR (Ohm cm2)\n0,0.95,210\n');
    const error = errorOf(() => applyMapping(table, { current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' }, hfr: { column: 2, unit: 'ohm*cm2' } }, { kind: 'polarization' }));
    expect(error.code).toBe('unit-slip');
    expect(error.message).toMatch(/^line 2, column "HFR \(Ohm cm2\)": the typical HFR 210 Ω·cm² is 210 Ω·cm², outside what any cell shows.*is the unit mΩ·cm²\?/);
    // one stray reading among plausible ones is still refused on its own line
    const stray = parseDelimitedText('j (A/cm2),U (V),HFR (Ohm cm2)\n0,0.95,0.2\n0.1,0.8,0.2\n0.2,0.7,21\n');
    const strayError = errorOf(() => applyMapping(stray, { current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' }, hfr: { column: 2, unit: 'ohm*cm2' } }, { kind: 'polarization' }));
    expect(strayError.code).toBe('impossible-value');
    expect(strayError.message).toMatch(/^line 4, column "HFR \(Ohm cm2\)": 21 Ω·cm² is not a possible HFR/);
  });
  it('time going backwards (not a restart) → time-backwards', () => {
    const table = parseDelimitedText('Time (h),U (V)\n0,0.65\n10,0.65\n6,0.65\n');
    const error = errorOf(() => applyMapping(table, { voltage: { column: 1, unit: 'V' }, time: { column: 0, unit: 'h' } }, { kind: 'durability' }));
    expect(error.code).toBe('time-backwards');
    expect(error.message).toMatch(/^line 4, column "Time \(h\)": time goes back from 10 to 6 h/);
  });
  it('timestamps going backwards → time-backwards', () => {
    const table = parseDelimitedText('Timestamp,U (V)\n2024-05-01 10:00:00,0.65\n2024-05-01 09:00:00,0.65\n');
    expect(errorOf(() => applyMapping(table, { voltage: { column: 1, unit: 'V' }, time: { column: 0, unit: 'timestamp' } }, { kind: 'durability' })).code).toBe('time-backwards');
  });
  it('a polarization mapping without current → missing-current', () => {
    const table = parseDelimitedText('U (V),x\n0.95,1\n');
    expect(errorOf(() => applyMapping(table, { voltage: { column: 0, unit: 'V' } }, { kind: 'polarization' })).code).toBe('missing-current');
  });
  it('malformed mappings and areas → bad-mapping, bad-area', () => {
    const table = parseDelimitedText('j (A/cm2),U (V),Note\n0,0.95,ok\n');
    expect(errorOf(() => applyMapping(table, { voltage: { column: 7, unit: 'V' } }, { kind: 'polarization' })).code).toBe('bad-mapping');
    expect(errorOf(() => applyMapping(table, { voltage: { column: 1, unit: 'kV' as never } }, { kind: 'polarization' })).code).toBe('bad-mapping');
    expect(errorOf(() => applyMapping(table, { current: { column: 0, unit: 'A/cm2' }, voltage: { column: 2, unit: 'V' } }, { kind: 'polarization' })).message).toMatch(/holds text/);
    expect(errorOf(() => applyMapping(table, { voltage: { column: 1, unit: 'V' } }, { kind: 'curve' as never })).code).toBe('bad-mapping');
    expect(errorOf(() => applyMapping(table, { current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' } }, { kind: 'polarization', areaCm2: -4 })).code).toBe('bad-area');
  });
});

describe('applyMapping with reuseColumns (in-place conversion for big logs)', () => {
  it('gives the same curve as the copying path, including a restarted clock', () => {
    // invented log: minutes with a restart from 0, mA/cm², mV; expected values are the copying path's
    const text = 'Time (min),j (mA/cm2),U (mV)\n0,200,650\n60,200,649\n120,200,648\n0,200,655\n60,200,654\n';
    const copy = applyMapping(parseDelimitedText(text), { time: { column: 0, unit: 'min' }, current: { column: 1, unit: 'mA/cm2' }, voltage: { column: 2, unit: 'mV' } }, { kind: 'durability' });
    const table = parseDelimitedText(text);
    const inPlace = applyMapping(table, { time: { column: 0, unit: 'min' }, current: { column: 1, unit: 'mA/cm2' }, voltage: { column: 2, unit: 'mV' } }, { kind: 'durability', reuseColumns: true });
    expect(Array.from(inPlace.tHours!)).toEqual(Array.from(copy.tHours!));
    expect(Array.from(inPlace.j)).toEqual(Array.from(copy.j));
    expect(Array.from(inPlace.v)).toEqual(Array.from(copy.v));
    expect(inPlace.timeResets).toEqual(copy.timeResets);
    expect(inPlace.v).toBe(table.columns[2]); // converted where it stood, no copy
  });

  it('copies a column that feeds two quantities', () => {
    const table = parseDelimitedText('a (V),b (A/cm2)\n0.6,0.2\n0.5,0.4\n');
    const curve = applyMapping(table, { current: { column: 1, unit: 'A/cm2' }, voltage: { column: 0, unit: 'V' }, hfr: { column: 1, unit: 'ohm*cm2' } }, { kind: 'polarization', reuseColumns: true });
    expect(Array.from(curve.j)).toEqual([0.2, 0.4]); // input values, derived by hand
    expect(Array.from(curve.hfr!)).toEqual([0.2, 0.4]);
  });
});

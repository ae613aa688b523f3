// Conditions a file states (area, temperature, gases, back-pressure), how they are read, and how
// they are compared with the build's record; the end of a table; thousands separators.
import { describe, it, expect } from 'vitest';
import { readConditions, parseDelimitedText, compareConditions, canonicalGas, countCurrentLevels, checkHoursAfterBreakIn, CurveFileError } from '../../../shared/curves/index';

const read = (line: string) => readConditions([line], ',');

describe('active area', () => {
  it.each([
    ['Active area: 5 cm x 5 cm', 25], // 5 × 5, by hand
    ['Area: 5x5 cm', 25],
    ['Cell area: 5 × 5 cm²', 25],
    ['Active area = 50 mm x 50 mm', 25], // 5 cm × 5 cm
    ['Active area: 2,24 x 2,24 cm', 5.0176], // 2.24² = 5.0176, by hand
    ['Geometric area: 25 cm2', 25],
    ['Area: 2500 mm2', 25], // 2500 / 100
    ['Area: 0.0025 m2', 25], // 0.0025 × 10⁴
  ])('%s → %f cm²', (line, cm2) => {
    expect(read(line).areaCm2).toBeCloseTo(cm2, 12);
  });
  it.each(['Electrochemical surface area: 45 m2/g', 'Area, 45, m2/g', 'ECSA: 60 m2/g', 'Specific surface area: 800 m2 g-1', 'Pt area: 25 cm2_Pt'])('%s is never the geometric area', (line) => {
    const conditions = read(line);
    expect(conditions.areaCm2).toBeUndefined();
    if (conditions.notes) expect(conditions.notes.join(' ')).toMatch(/not used as the active area/);
  });
  it('flags an area outside 0.5–1,000 cm²', () => {
    expect(read('Active area: 2000 cm2').notes?.join(' ')).toMatch(/outside the 0\.5–1,000 cm² of single test cells/);
    expect(read('Active area: 0.2 cm2').notes?.join(' ')).toMatch(/outside/);
    expect(read('Active area: 25 cm2').notes).toBeUndefined();
  });
});

describe('back-pressure: gauge and absolute kept apart, stored absolute', () => {
  // 1 atm = 101.325 kPa exactly; 1 bar = 100 kPa exactly; 1 psi = 6.894757 kPa (NIST SP 811, B.8)
  it.each([
    ['Back pressure: 50 kPag', 151.325, 'gauge', '50 kPag'],
    ['Back pressure: 150 kPa(a)', 150, 'absolute', '150 kPa(a)'],
    ['Back pressure 1.5 barg', 251.325, 'gauge', '1.5 barg'],
    ['Back pressure: 2 bar abs', 200, 'absolute', '2 bar abs'],
    ['Back pressure: 1.5 bar(g)', 251.325, 'gauge', '1.5 bar(g)'],
    ['Back pressure: 10 psig', 10 * 6.894757 + 101.325, 'gauge', '10 psig'],
    ['Back pressure (gauge): 50 kPa', 151.325, 'gauge', '50 kPa (gauge)'],
    ['Pressure: 1 atm', 101.325, 'absolute', '1 atm'],
  ])('%s → %f kPa absolute (%s)', (line, absolute, basis, stated) => {
    const conditions = read(line);
    expect(conditions.backPressureKPa).toBeCloseTo(absolute, 9);
    expect(conditions.backPressureBasis).toBe(basis);
    expect(conditions.backPressureStated).toBe(stated);
  });
  it('an unmarked value below 80 kPa can only be gauge; above, it is read as absolute and said so', () => {
    const low = read('Back pressure 0 kPa');
    expect(low.backPressureKPa).toBeCloseTo(101.325, 12);
    expect(low.backPressureBasis).toBe('unstated');
    expect(low.notes?.join(' ')).toMatch(/can only be gauge/);
    const high = read('Back pressure 101 kPa');
    expect(high.backPressureKPa).toBe(101);
    expect(high.notes?.join(' ')).toMatch(/read as absolute.*if it is gauge, the absolute pressure is 202\.3 kPa/);
  });
});

describe('file conditions against the build record', () => {
  const build = { areaCm2: 25, testConditions: { temperatureC: 170, anodeGas: 'H2', cathodeGas: 'air', backPressureKPa: 0 } };
  it('a file at 180 °C on a build at 170 °C, oxygen instead of air, 50 kPa(g) instead of 0', () => {
    const file = { ...readConditions(['Cell temperature: 180 °C', 'Active area: 5 cm x 5 cm', 'Anode gas: hydrogen', 'Cathode gas: O2', 'Back pressure: 50 kPag'], ','), raw: {} };
    const { mismatches } = compareConditions(file, build);
    expect(mismatches.map((m) => m.field)).toEqual(['temperatureC', 'cathodeGas', 'backPressureKPa']); // area 25 = 25; hydrogen = H2
    expect(mismatches[0]).toMatchObject({ fileValue: 180, buildValue: 170, unit: '°C' });
    expect(mismatches[2]).toMatchObject({ fileValue: 151.3, buildValue: 101.3, unit: 'kPa absolute', fileStated: '50 kPag', buildStated: '0 kPa(g)' }); // 0 + 101.325
  });
  it('differences within tolerance (1 °C, 2 % of the area, 5 kPa) and the same gas by another name are no mismatch', () => {
    const file = { raw: {}, temperatureC: 170.6, areaCm2: 25.3, anodeGas: 'Hydrogen', cathodeGas: 'synthetic air', backPressureKPa: 103, backPressureBasis: 'absolute' as const };
    expect(compareConditions(file, build).mismatches).toEqual([]);
  });
  it('an unmarked back-pressure matches when either reading does', () => {
    const file = { raw: {}, backPressureKPa: 101, backPressureBasis: 'unstated' as const };
    expect(compareConditions(file, { ...build, testConditions: { backPressureKPa: 101 } }).mismatches).toEqual([]); // as gauge: 101 + 101.325 ≈ 202.3
    expect(compareConditions(file, build).mismatches).toEqual([]); // as absolute: 101 ≈ 0 + 101.325
  });
  it('a condition the build does not record is a note, not a mismatch', () => {
    const { mismatches, notes } = compareConditions({ raw: {}, temperatureC: 180 }, { areaCm2: null, testConditions: {} });
    expect(mismatches).toEqual([]);
    expect(notes.join(' ')).toMatch(/cell temperature of 180 °C; the build records none/);
  });
  it('gas names', () => {
    expect(canonicalGas('Hydrogen')).toBe('H2');
    expect(canonicalGas('H₂')).toBe('H2');
    expect(canonicalGas('MeOH/H2O vapour')).toBe('methanol');
    expect(canonicalGas('Synthetic air')).toBe('air');
  });
});

describe('where the table ends', () => {
  it('a bad cell inside the data is still refused on its line, though a word row at the end is left out', () => {
    expect(() => parseDelimitedText('j,V\n0.1,0.8\n0.2,0.7x\n0.3,0.6\n')).toThrow(/^line 3, column "V": not a number \("0\.7x"\)/);
    const table = parseDelimitedText('j,V\n0.1,0.8\n0.2,0.7\n0.3,0.6\nEnd of test\n');
    expect(table.rowCount).toBe(3);
    expect(table.afterTable?.firstLine).toBe(5);
  });
  it('a second table under the first (its own header) is left out with the summary above it', () => {
    const table = parseDelimitedText('j,V\n0.1,0.8\n0.2,0.7\n0.3,0.6\n\nStep means\nstep,mean V\n1,0.8\n2,0.7\n');
    expect(table.rowCount).toBe(3);
    expect(table.afterTable).toMatchObject({ firstLine: 6, lastLine: 9, lineCount: 4 });
  });
  it('key–value results after a blank line, in a two-column file', () => {
    const table = parseDelimitedText('j,V\n0.1,0.8\n0.2,0.7\n0.3,0.6\n\nOCV,0.95\nPeak power,0.31\n');
    expect(table.rowCount).toBe(3);
    expect(table.afterTable?.lineCount).toBe(2);
  });
  it('empty spreadsheet rows (",,,") are blank lines', () => {
    expect(parseDelimitedText('j,V,HFR\n0.1,0.8,0.2\n,,\n0.2,0.7,0.2\n,,\n').rowCount).toBe(2);
  });
});

describe('thousands separators', () => {
  it('"1.000,0" in a decimal-comma file and "1,000.0" in a point-decimal one, quoted in a CSV', () => {
    expect(Array.from(parseDelimitedText('j (mA/cm2);U (V)\n950,0;0,35\n1.000,0;0,32\n').columns[0]!)).toEqual([950, 1000]);
    expect(Array.from(parseDelimitedText('j (mA/cm2)\tU (V)\n950.0\t0.35\n1,000.0\t0.32\n').columns[0]!)).toEqual([950, 1000]);
    expect(Array.from(parseDelimitedText('j (mA/cm2),U (V)\n950.0,0.35\n"1,000.0",0.32\n').columns[0]!)).toEqual([950, 1000]);
  });
  it('a leading zero group is a decimal, never thousands ("0,652", "0.652")', () => {
    expect(parseDelimitedText('j;U\n0,2;0,652\n0,4;0,552\n').columns[1]![0]).toBeCloseTo(0.652, 12);
  });
  it('cells that cannot tell ("1,500" only) are read as decimal commas and flagged', () => {
    const table = parseDelimitedText('a;b\n1,500;2,250\n1,250;2,750\n');
    expect(table.decimalComma).toBe(true);
    expect(table.decimalMarkAmbiguous).toBe(true);
    expect(table.columns[0]![0]).toBeCloseTo(1.5, 12);
  });
});

describe('current levels and durability length', () => {
  it('counts set points, not readings', () => {
    const { levels, modalShare } = countCurrentLevels(Float64Array.of(0, 0, 0.1, 0.1005, 0.0998, 0.2, 0.2, 0.4));
    expect(levels.map((level) => level.count)).toEqual([2, 3, 2, 1]); // 0; 0.1 ± 0.5 %; 0.2; 0.4
    expect(modalShare).toBeCloseTo(3 / 8, 12);
  });
  it('a 2-hour log with 41 readings has too few hours after break-in for a rate', () => {
    const tHours = Float64Array.from({ length: 41 }, (_, i) => (i * 3) / 60);
    const curve = { kind: 'durability' as const, j: new Float64Array(41).fill(0.2), v: new Float64Array(41).fill(0.62), tHours };
    expect(() => checkHoursAfterBreakIn(curve, 0)).toThrow(CurveFileError);
    expect(() => checkHoursAfterBreakIn(curve, 0)).toThrow(/needs at least 3 h and 20 readings after break-in for a degradation rate; this one runs 2\.0 h/);
    const long = { ...curve, tHours: Float64Array.from({ length: 41 }, (_, i) => i * 0.75) }; // 30 h
    expect(() => checkHoursAfterBreakIn(long, 29)).not.toThrow(); // longer than a day: kept, the rate says why it is missing
  });
});

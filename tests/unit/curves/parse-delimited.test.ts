import { describe, it, expect } from 'vitest';
import { createDelimitedParser, parseDelimitedText, applyMapping, CurveFileError } from '../../../shared/curves/index';
import type { ParsedTable } from '../../../shared/curves/index';

function codeOf(action: () => unknown): string {
  try {
    action();
  } catch (error) {
    if (error instanceof CurveFileError) return error.code;
    throw error;
  }
  throw new Error('expected a CurveFileError');
}

function column(table: ParsedTable, index: number): number[] {
  const values = table.columns[index];
  if (values === null) throw new Error(`column ${index} is not numeric`);
  return Array.from(values);
}

describe('parseDelimitedText: delimiters and decimal marks', () => {
  it('reads a plain comma file', () => {
    const table = parseDelimitedText('Current density (A/cm2),Voltage (V)\n0.0,0.95\n0.2,0.65\n');
    expect(table.delimiter).toBe(',');
    expect(table.decimalComma).toBe(false);
    expect(table.header).toEqual(['Current density (A/cm2)', 'Voltage (V)']);
    expect(table.headerLine).toBe(1); // line 1 of the text above
    expect(table.firstDataLine).toBe(2); // line 2 of the text above
    expect(table.rowCount).toBe(2); // two data lines above
    expect(column(table, 1)).toEqual([0.95, 0.65]); // typed above
  });
  it('reads semicolons with decimal commas', () => {
    const table = parseDelimitedText('j (A/cm2);U (V)\n0,2;0,652\n0,4;0,581\n');
    expect(table.delimiter).toBe(';');
    expect(table.decimalComma).toBe(true);
    expect(column(table, 0)).toEqual([0.2, 0.4]); // typed above with decimal commas
    expect(column(table, 1)).toEqual([0.652, 0.581]); // typed above
  });
  it('reads tabs with decimal commas', () => {
    const table = parseDelimitedText('j (A/cm2)\tU (V)\tHFR (Ohm cm2)\n0,2\t0,652\t0,21\n0,4\t0,581\t0,22\n');
    expect(table.delimiter).toBe('\t');
    expect(table.decimalComma).toBe(true);
    expect(column(table, 2)).toEqual([0.21, 0.22]); // typed above
  });
  it('reads whitespace-separated columns, header names with spaces in brackets', () => {
    const table = parseDelimitedText('  j [A/cm2]     U [mV]     HFR [Ohm cm2]\n   0.1   800.5   0.20\n   0.2   700.0   0.21\n');
    expect(table.delimiter).toBe('whitespace');
    expect(table.header).toEqual(['j [A/cm2]', 'U [mV]', 'HFR [Ohm cm2]']);
    expect(column(table, 1)).toEqual([800.5, 700]); // typed above
  });
  it('reads a bar-separated file and RFC 4180 quotes', () => {
    expect(parseDelimitedText('j|V\n0.1|0.8\n0.2|0.7\n').delimiter).toBe('|');
    const quoted = parseDelimitedText('"Current density, A/cm2","Voltage, V"\n"0.1","0.8"\n"0.2","0.7"\n');
    expect(quoted.header).toEqual(['Current density, A/cm2', 'Voltage, V']);
    expect(column(quoted, 1)).toEqual([0.8, 0.7]); // typed above
  });
  it('reads a unit row under the header into the names', () => {
    const table = parseDelimitedText('Current density,Voltage,HFR\nmA/cm2,V,mOhm cm2\n100,0.72,200\n200,0.65,210\n');
    expect(table.unitLine).toBe(2); // the second line of the text above
    expect(table.header).toEqual(['Current density (mA/cm2)', 'Voltage (V)', 'HFR (mOhm cm2)']);
    expect(table.firstDataLine).toBe(3); // third line above
  });
});

describe('parseDelimitedText: encodings, line ends, chunks', () => {
  const body = 'j (A/cm2),V (V)\n0.1,0.8\n0.2,0.7\n0.3,0.6\n';
  it('drops a BOM and reads CRLF and CR line ends', () => {
    for (const text of ['\uFEFF' + body, body.replace(/\n/g, '\r\n'), body.replace(/\n/g, '\r')]) {
      const table = parseDelimitedText(text);
      expect(table.header[0]).toBe('j (A/cm2)');
      expect(table.rowCount).toBe(3); // three data lines in body
      expect(Array.from(table.dataLines)).toEqual([2, 3, 4]); // lines 2–4 of body
    }
  });
  it('gives the same table whatever the chunk boundaries (CRLF split across chunks)', () => {
    const text = 'Area: 25 cm2\r\n' + body.replace(/\n/g, '\r\n');
    const whole = parseDelimitedText(text);
    for (const size of [1, 2, 3, 7]) {
      const parser = createDelimitedParser();
      for (let offset = 0; offset < text.length; offset += size) parser.push(text.slice(offset, offset + size));
      const table = parser.finish();
      expect(table.header).toEqual(whole.header);
      expect(Array.from(table.dataLines)).toEqual(Array.from(whole.dataLines));
      expect(column(table, 1)).toEqual(column(whole, 1));
      expect(table.conditions.areaCm2).toBe(25); // "Area: 25 cm2" above
    }
  });
  it('reads a last line without a line end', () => {
    expect(parseDelimitedText('j,V\n0.1,0.8\n0.2,0.7').rowCount).toBe(2); // two data lines
  });
});

describe('parseDelimitedText: metadata above the header', () => {
  it('reads area, temperature, gases and back pressure in several spellings', () => {
    const text = [
      '# Invented bench export',
      'Active area: 25 cm2',
      '# Cell temperature = 180 °C',
      'Anode: H2',
      'Cathode gas; air',
      'Back pressure 101 kPa',
      '',
      'j (A/cm2),U (V)',
      '0.2,0.65',
    ].join('\n');
    const table = parseDelimitedText(text);
    expect(table.headerLine).toBe(8); // eighth line above
    expect(table.conditions).toMatchObject({ areaCm2: 25, temperatureC: 180, anodeGas: 'H2', cathodeGas: 'air', backPressureKPa: 101 }); // typed above
    expect(table.conditions.raw['Back pressure']).toBe('101 kPa');
  });
  it('reads "Area,25,cm2" key-value rows and converts K, bar, mm²', () => {
    const text = ['Area,2500,mm2', 'Temperature,453.15,K', 'Back pressure,1.5,bar', 'Gases,H2/O2', '', 'j,V', '0.1,0.8'].join('\n');
    const conditions = parseDelimitedText(text).conditions;
    expect(conditions.areaCm2).toBeCloseTo(25, 12); // derived by hand: 2500 mm² / 100 = 25 cm²
    expect(conditions.temperatureC).toBeCloseTo(180, 9); // derived by hand: 453.15 − 273.15
    expect(conditions.backPressureKPa).toBeCloseTo(150, 12); // derived by hand: 1.5 bar × 100 kPa/bar (exact)
    expect(conditions.anodeGas).toBe('H2');
    expect(conditions.cathodeGas).toBe('O2');
  });
  it('prefers the cell temperature over other temperatures', () => {
    const text = ['Humidifier temperature: 80 °C', 'Temperature: 150 °C', 'Cell temperature: 160 °C', 'j,V', '0.1,0.8'].join('\n');
    expect(parseDelimitedText(text).conditions.temperatureC).toBe(160); // the "Cell temperature" line
  });
});

describe('parseDelimitedText: columns that are not plain numbers', () => {
  it('keeps timestamps as epoch seconds and lists text columns as ignored', () => {
    const text = 'Timestamp,Step,I (A),U (V)\n2024-05-01 10:00:00,hold 1,0,0.95\n2024-05-01T10:00:30Z,hold 1,0,0.95\n2024-05-01 10:01:00,hold 2,5,0.65\n';
    const table = parseDelimitedText(text);
    expect(table.columnKinds).toEqual(['timestamp', 'text', 'number', 'number']);
    expect(table.columns[1]).toBeNull();
    expect(table.ignoredColumns).toEqual([1]); // column 1 "Step" holds labels
    const stamps = column(table, 0);
    expect(stamps[0]).toBe(Date.UTC(2024, 4, 1, 10, 0, 0) / 1000); // ECMA-262 Date.UTC, read as UTC
    expect(stamps[2] - stamps[0]).toBe(60); // derived by hand: one minute
  });
  it('keeps H:MM:SS elapsed times as seconds', () => {
    const table = parseDelimitedText('Elapsed,U (V)\n0:00:00,0.65\n1:30:00,0.649\n');
    expect(table.columnKinds[0]).toBe('duration');
    expect(column(table, 0)).toEqual([0, 5400]); // derived by hand: 1.5 h = 5400 s
  });
  it('keeps timestamps with spaces in whitespace-separated files', () => {
    const table = parseDelimitedText('Time  I  U\n2024-05-01 10:00:00  0.2  0.65\n2024-05-01 10:00:10  0.2  0.65\n');
    expect(table.columnKinds[0]).toBe('timestamp');
    expect(table.rowCount).toBe(2); // two data lines
  });
  it('skips blank lines, # comments and a repeated header inside the data; allows trailing empty cells', () => {
    const text = 'j,V,\n0.1,0.8,\n\n# restart\nj,V,\n0.2,0.7,,\n   \n0.3,0.6\n';
    const table = parseDelimitedText(text);
    expect(table.header).toEqual(['j', 'V']);
    expect(Array.from(table.dataLines)).toEqual([2, 6, 8]); // lines of the three data rows above
  });
  it('keeps a preview of the first ten rows as text', () => {
    const rows = Array.from({ length: 15 }, (_, index) => `${index / 10},${(0.9 - index / 100).toFixed(2)}`);
    const table = parseDelimitedText(['j,V', ...rows].join('\n'));
    expect(table.preview.length).toBe(10); // the preview holds the first 10 data rows
    expect(table.preview[0]).toEqual(['0', '0.90']); // first data row: 0/10 and 0.9 − 0 written with 2 decimals
  });
});

describe('parseDelimitedText: errors', () => {
  it('empty and whitespace-only text → empty', () => {
    expect(codeOf(() => parseDelimitedText(''))).toBe('empty');
    expect(codeOf(() => parseDelimitedText('  \n\t\n\r\n'))).toBe('empty');
    expect(codeOf(() => parseDelimitedText('\uFEFF'))).toBe('empty');
  });
  it('header without data → header-only', () => {
    expect(codeOf(() => parseDelimitedText('Current density (A/cm2),Voltage (V)\n'))).toBe('header-only');
  });
  it('text without numbers → no-numbers', () => {
    expect(codeOf(() => parseDelimitedText('hello there\nnothing to see here\n'))).toBe('no-numbers');
  });
  it('a single column → one-column', () => {
    expect(codeOf(() => parseDelimitedText('Voltage (V)\n0.9\n0.8\n'))).toBe('one-column');
  });
  it('numbers without a header → no-header', () => {
    expect(codeOf(() => parseDelimitedText('0.1,0.8\n0.2,0.7\n'))).toBe('no-header');
  });
  it('a blank numeric cell is kept as missing, and refused by the mapping where a value is needed', () => {
    const table = parseDelimitedText('j (A/cm2),Voltage (V),HFR (Ohm cm2)\n0.1,0.8,0.2\n0.2,,0.2\n');
    expect(table.missingCells?.[1]).toEqual({ count: 1, firstLine: 3, firstText: '' }); // the blank voltage on line 3
    try {
      applyMapping(table, { current: { column: 0, unit: 'A/cm2' }, voltage: { column: 1, unit: 'V' } }, { kind: 'polarization' });
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(CurveFileError);
      const fileError = error as CurveFileError;
      expect(fileError.code).toBe('bad-number');
      expect(fileError.message).toBe('line 3, column "Voltage (V)": empty cell');
      expect(fileError.line).toBe(3); // third line of the text above
      expect(fileError.column).toBe('Voltage (V)');
    }
  });
  it('a decimal comma in a comma-less, point-decimal file is named as such', () => {
    expect(() => parseDelimitedText('j;V\n0.1;0.8\n0.2;0.7\n0.3;0,6\n')).toThrow(/line 4, column "V": not a number \("0,6"\) \(decimal comma/);
  });
  it('refuses hexadecimal and other Number() forms', () => {
    expect(() => parseDelimitedText('j,V\n0.1,0.8\n0.2,0x1\n')).toThrow(/line 3, column "V": not a number/);
  });
  it('a short row → ragged-row with its line', () => {
    expect(() => parseDelimitedText('j,V,HFR\n0.1,0.8,0.2\n0.2,0.7\n')).toThrow(/^line 3: 2 cells, but the header \(line 1\) has 3/);
    expect(codeOf(() => parseDelimitedText('j,V\n0.1,0.8\n0.2,0.7,0.5\n'))).toBe('ragged-row');
  });
  it('maxRows → too-many-rows naming the limit, thrown while pushing', () => {
    const parser = createDelimitedParser({ maxRows: 300 });
    const rows = Array.from({ length: 400 }, (_, index) => `${index},0.7`).join('\n');
    expect(() => {
      parser.push(`t (s),V (V)\n${rows}\n`);
      parser.finish();
    }).toThrow(/more than 300 data rows; the limit is 300/);
    expect(() => parser.finish()).toThrow(CurveFileError);
  });
  it('checks options', () => {
    expect(() => createDelimitedParser({ maxRows: 0 })).toThrow(RangeError);
  });
});

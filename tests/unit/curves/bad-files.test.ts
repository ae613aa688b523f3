// Files that must be refused, each with its code and a message naming the line/column.
import { describe, it, expect } from 'vitest';
import { sniffBytes, decodeText, parseDelimitedText, detectMapping, applyMapping, CurveFileError } from '../../../shared/curves/index';
import { fixtureBytes } from './fixture-files';

function refuse(name: string, areaCm2?: number): CurveFileError {
  try {
    const table = parseDelimitedText(decodeText(fixtureBytes(name)));
    const detection = detectMapping(table);
    if (detection.mapping === null) throw new Error(`no mapping for ${name}`);
    applyMapping(table, detection.mapping, { kind: detection.kind, areaCm2 });
  } catch (error) {
    if (error instanceof CurveFileError) return error;
    throw error;
  }
  throw new Error(`${name} was accepted`);
}

describe('bad files', () => {
  it('empty file', () => {
    expect(sniffBytes(fixtureBytes('bad-empty.csv'))).toBe('empty');
    expect(refuse('bad-empty.csv').code).toBe('empty');
    expect(refuse('bad-whitespace-only.csv').code).toBe('empty');
  });
  it('header only', () => {
    const error = refuse('bad-header-only.csv');
    expect(error.code).toBe('header-only');
    expect(error.message).toMatch(/^line 1: a header but no data rows/);
    expect(error.line).toBe(1); // the fixture header is on line 1
  });
  it('text without numbers', () => {
    expect(refuse('bad-text-only.txt').code).toBe('no-numbers');
  });
  it('one column', () => {
    const error = refuse('bad-one-column.csv');
    expect(error.code).toBe('one-column');
    expect(error.message).toMatch(/^line 2: only one column/);
  });
  it('numbers without header', () => {
    const error = refuse('bad-no-header.csv');
    expect(error.code).toBe('no-header');
    expect(error.line).toBe(1); // the fixture starts with numbers on line 1
  });
  it('blank cell names line 14 and the column', () => {
    const error = refuse('bad-blank-cell.csv');
    expect(error.code).toBe('bad-number');
    expect(error.message).toBe('line 14, column "Voltage (V)": empty cell'); // line and column of the fixture's empty cell (line 14)
    expect(error.line).toBe(14); // the fixture's line 14
    expect(error.column).toBe('Voltage (V)');
  });
  it('NaN cell names line and column', () => {
    const error = refuse('bad-nan-cell.csv');
    expect(error.code).toBe('bad-number');
    expect(error.message).toBe('line 9, column "Voltage (V)": not a number ("NaN")'); // the fixture's line 9
  });
  it('a word in a number column names line and column', () => {
    expect(refuse('bad-not-a-number.csv').message).toBe('line 6, column "Voltage (V)": not a number ("0.6x")'); // the fixture's line 6
  });
  it('ragged row names its line and the missing column', () => {
    const error = refuse('bad-ragged-row.csv');
    expect(error.code).toBe('ragged-row');
    expect(error.message).toMatch(/^line 11: 2 cells, but the header \(line 1\) has 3; column "HFR \(Ohm cm2\)" is missing/);
  });
  it('700 "V" is not a cell voltage', () => {
    const error = refuse('bad-700-volts.csv');
    expect(error.code).toBe('impossible-value');
    expect(error.message).toBe('line 5, column "U (V)": 700 V is not a possible cell voltage; is the column in mV?'); // the message names line, column and the likely unit
  });
  it('total current without area', () => {
    const error = refuse('units-total-ma-no-area.csv');
    expect(error.code).toBe('area-required');
    expect(error.message).toMatch(/^line 1, column "I \(mA\)"/);
  });
  it('time going backwards', () => {
    const error = refuse('bad-time-backwards.csv');
    expect(error.code).toBe('time-backwards');
    expect(error.message).toMatch(/^line 6, column "Time \(h\)": time goes back from 3 to 1.5 h/);
  });
});

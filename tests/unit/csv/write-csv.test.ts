// The shared CSV writer: RFC 4180 quoting and OWASP CSV-injection neutralising.
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { needsNeutralizing, writeCsv } from '../../../shared/csv/write-csv';

describe('writeCsv', () => {
  it('quotes delimiters, quotes and line breaks (RFC 4180 §2.6–2.7)', () => {
    expect(writeCsv([['a,b', 'say "hi"', 'two\nlines', ' edge '], [1, 2, 3, 4]])).toBe('"a,b","say ""hi""","two\nlines"," edge "\n1,2,3,4\n');
  });

  it('writes numbers as numbers, negative ones included, and empties for null, undefined and non-finite values', () => {
    expect(writeCsv([[-0.52, 0, 1e-6, null, undefined, Number.NaN, Number.POSITIVE_INFINITY, '-0.52', '+3', '1e-6']])).toBe('-0.52,0,0.000001,,,,,-0.52,+3,1e-6\n');
  });

  // OWASP "CSV Injection": cells starting with = + - @, tab or carriage return are prefixed with an
  // apostrophe and quoted; the minus sign U+2212 and the full-width forms are treated the same way.
  it.each([
    ['=HYPERLINK("http://x.example","y")', `"'=HYPERLINK(""http://x.example"",""y"")"`],
    ['+1+cmd|x', `"'+1+cmd|x"`],
    ['-2+3', `"'-2+3"`],
    ['@SUM(A1)', `"'@SUM(A1)"`],
    ['\t=1', `"'\t=1"`],
    ['\r=1', `"'\r=1"`],
    ['\u22121+1', `"'\u22121+1"`],
    ['\uFF1D1+1', `"'\uFF1D1+1"`],
  ])('neutralises %j', (cell, written) => {
    expect(needsNeutralizing(cell)).toBe(true);
    expect(writeCsv([[cell]])).toBe(`${written}\n`);
    // read back by a CSV parser the cell is the text with its apostrophe, not a formula
    expect(Papa.parse<string[]>(writeCsv([[cell]]).trimEnd()).data[0]![0]).toBe(`'${cell}`);
  });

  it('leaves ordinary text alone and uses the line end asked for', () => {
    expect(needsNeutralizing('B-014 → B-015')).toBe(false);
    expect(writeCsv([['step', 'build'], ['baseline', 'B-001']], { lineEnd: '\r\n' })).toBe('step,build\r\nbaseline,B-001\r\n');
    expect(writeCsv([])).toBe('');
  });

  it('refuses rows that are not arrays', () => {
    expect(() => writeCsv([{}] as never)).toThrow('writeCsv: rows must be an array of arrays of cells');
  });
});

// The one CSV writer behind every export (gains, designs, compared curves, durability logs):
// RFC 4180 quoting through papaparse, and text that a spreadsheet would run as a formula made
// inert. Pure: used by the server and the browser alike.
import Papa from 'papaparse';

export type CsvCell = string | number | boolean | null | undefined;

export interface WriteCsvOptions {
  /** line end between rows; a trailing one is always written. Default "\n". */
  lineEnd?: '\n' | '\r\n';
}

/**
 * Leading characters that make a spreadsheet treat a cell as a formula or a command: = + - @
 * (and their Unicode look-alikes the minus sign U+2212 and the full-width ＝ ＋ － ＠), tab and
 * carriage return. Plain decimal numbers written as text ("-0.52", "+3", "1e-6") are exempt: a
 * spreadsheet reads them as numbers, so negative values stay numbers.
 */
export const FORMULA_TRIGGER = /^(?![+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$)[=+\-@\t\r\u2212\uFF1D\uFF0B\uFF0D\uFF20]/;

/**
 * True when a spreadsheet opening the CSV would treat this text as a formula.
 * @example needsNeutralizing('=HYPERLINK("x")') // true; needsNeutralizing('-0.5') // false
 */
export function needsNeutralizing(text: string): boolean {
  return FORMULA_TRIGGER.test(text);
}

function cellValue(value: CsvCell): string | number | boolean {
  if (value == null) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? value : '';
  return value;
}

/**
 * Rows of cells → CSV text. Numbers as JavaScript prints them (non-finite → empty), null and
 * undefined → empty, text quoted when it holds the delimiter, a quote, a line break or edge
 * spaces (RFC 4180). Text starting with = + − @, tab or CR gets a leading apostrophe and quotes,
 * so spreadsheets show it as text instead of running it.
 * Reference: RFC 4180 (CSV format); OWASP "CSV Injection" guidance (leading apostrophe, quoted).
 * Cost: O(total characters).
 * @throws RangeError when rows is not an array of arrays.
 * @example writeCsv([['build', 'V (V)'], ['=1+1', -0.52]]) // "build,V (V)\n\"'=1+1\",-0.52\n"
 */
export function writeCsv(rows: readonly (readonly CsvCell[])[], options: WriteCsvOptions = {}): string {
  if (!Array.isArray(rows) || rows.some((row) => !Array.isArray(row))) throw new RangeError('writeCsv: rows must be an array of arrays of cells');
  const lineEnd = options.lineEnd ?? '\n';
  if (rows.length === 0) return '';
  const data = rows.map((row) => row.map(cellValue));
  return Papa.unparse(data, { newline: lineEnd, escapeFormulae: FORMULA_TRIGGER, header: false }) + lineEnd;
}

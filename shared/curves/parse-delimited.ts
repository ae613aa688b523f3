// Chunked parser for delimited text curve files: finds the delimiter, the decimal mark, the
// metadata lines, the header and the numeric rows, and keeps numbers in growable Float64Arrays
// (no object per row) so a 1,000,000-row durability log parses in a few seconds.
import { CurveFileError } from './types';
import type { ColumnKind, ColumnSummary, Delimiter, FileConditions, ParsedTable } from './types';
import { mergeConditions, readConditions } from './read-conditions';
import { parseDuration, parseTimestamp } from '../units/parse-timestamp';
import { lookUpUnit, recogniseHeaderUnit } from '../units/recognise-header-unit';

export interface DelimitedParserOptions {
  /** refuse files with more data rows than this (CurveFileError `too-many-rows`); default 5,000,000 */
  maxRows?: number;
  /** size of the whole input in bytes (a file's size), when known: the columns are sized once for the rows it holds */
  sizeHintBytes?: number;
  /** how many data rows to keep as text in `preview`; default 10 */
  previewRows?: number;
}

export interface DelimitedParser {
  /** feed the next piece of text; may throw CurveFileError as soon as a bad row is seen */
  push(chunk: string): void;
  /**
   * feed the next bytes of a text in an ASCII-compatible encoding (UTF-8, Windows-1252): whole
   * lines of plain numbers in the table are read straight from the bytes; everything else goes
   * through `decode` (a streaming decoder of the same text) and push — the table is the same as
   * push(decode(bytes)) would give
   */
  pushBytes(bytes: Uint8Array, decode: (bytes: Uint8Array) => string): void;
  /** end of input: returns the table or throws CurveFileError */
  finish(): ParsedTable;
}

const DEFAULT_MAX_ROWS = 5_000_000;

// ---- Line bounds: a hostile file (one 45 MB line, a million cells in a row) is refused where
// lines are split, before a cell is read. Honest station logs stay far below both.
/** longest line read, characters */
export const MAX_LINE_CHARS = 262_144;
/** most cells in one row (= the column limit) */
export const MAX_CELLS_PER_ROW = 1024;

function lineTooLong(line: number): CurveFileError {
  return new CurveFileError('line-too-long', `line ${line}: longer than ${MAX_LINE_CHARS.toLocaleString('en-US')} characters, the limit per line; is this a table with one row per line?`, { line });
}

/** Throws when a line is too long or, counting the most frequent separator, holds too many cells. */
function checkLineBounds(text: string, line: number): void {
  if (text.length > MAX_LINE_CHARS) throw lineTooLong(line);
  // fewer characters than the cell limit cannot hold more cells: the common case costs nothing
  if (text.length <= MAX_CELLS_PER_ROW) return;
  let commas = 0;
  let semicolons = 0;
  let tabs = 0;
  let bars = 0;
  for (let index = 0; index < text.length; index++) {
    const code = text.charCodeAt(index);
    if (code === 44) commas++;
    else if (code === 59) semicolons++;
    else if (code === 9) tabs++;
    else if (code === 124) bars++;
  }
  if (Math.max(commas, semicolons, tabs, bars) >= MAX_CELLS_PER_ROW) {
    throw new CurveFileError('too-many-cells', `line ${line}: more than ${MAX_CELLS_PER_ROW.toLocaleString('en-US')} cells, the limit per row`, { line });
  }
}
// ---- end of line bounds
// The header is looked for in the first lines only; metadata blocks are short.
const DETECTION_MAX_LINES = 256;
const DETECTION_MAX_CHARS = 1 << 20;
const DETECTION_DATA_ROWS = 64;
/** bytes fed at a time while the layout is still being found (pushBytes) */
const DETECTION_PIECE_BYTES = 32_768;
// ---- The numeric fast path: a station log's data line of plain numbers ("12.5,0.2,0.6512") read
// straight from its character codes, without splitting it into cell strings. Any line it does not
// recognise at once (quotes, spaces, units, grouping marks, empty cells, a different cell count)
// goes the general way, so every rule and message stays the general path's.

const POWERS_OF_TEN = Array.from({ length: 23 }, (_, exponent) => Number(`1e${exponent}`));

/**
 * Reads one line of `cells` plain numbers separated by `delimiterCode` into `out`: the line's
 * character codes are copied to bytes (a code above 127 cannot be in such a row) and read by
 * readPlainBytes.
 * @returns false (and `out` partly written) when the line is not such a row.
 * @example readPlainNumbers('1.5,-2e3', 44, 46, 2, out) // true; out = [1.5, -2000]
 */
export function readPlainNumbers(text: string, delimiterCode: number, markCode: number, cells: number, out: Float64Array): boolean {
  const length = text.length;
  if (lineBytes.length <= length) lineBytes = new Uint8Array(Math.max(length + 1, lineBytes.length * 2));
  for (let index = 0; index < length; index++) {
    const code = text.charCodeAt(index);
    if (code > 127) return false;
    lineBytes[index] = code;
  }
  lineBytes[length] = 10;
  return readPlainBytes(lineBytes, 0, length, delimiterCode, markCode, cells, out);
}
let lineBytes = new Uint8Array(256);

/** The text of bytes[from, to) of ASCII: only for a rare long cell. */
function asciiText(bytes: Uint8Array, from: number, to: number): string {
  let text = '';
  for (let index = from; index < to; index++) text += String.fromCharCode(bytes[index]);
  return text;
}

/** Digits of the mantissa that starts at `index`, leading zeros (and the decimal mark) left out. */
function significantDigits(bytes: Uint8Array, index: number, markCode: number): number {
  let significant = 0;
  for (let code = bytes[index]; (code >= 48 && code <= 57) || code === markCode; code = bytes[++index]) {
    if (code !== markCode && (significant > 0 || code !== 48)) significant++;
  }
  return significant;
}

/** Where the last readPlainCell stopped: the index of the byte after the cell (kept here, not in an object per cell). */
let cellEnd = 0;

/**
 * One plain number cell from bytes[index..end): [+-]digits[mark digits][(e|E)[+-]digits] with
 * `markCode` the decimal mark, read straight from the bytes; its value is exactly `Number()` of the
 * cell (Clinger's fast path — an integer mantissa below 2^53 scaled by an exact power of ten
 * 10^0…10^22 rounds correctly in one operation; other cells are handed to Number()). Sets cellEnd.
 * Precondition: a byte that cannot be part of a number (a line feed) follows somewhere after
 * `index` inside `bytes`, so the reading stops there without a bounds check on every byte.
 * Reference: W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990.
 * The value is written to out[at] rather than returned: a double returned from a call that is not
 * inlined is boxed on the heap, and a million-row log would make four million such boxes.
 * @returns false when no such number starts at `index` (or it is not finite); out[at] is then unchanged
 */
function readPlainCell(bytes: Uint8Array, index: number, markCode: number, out: Float64Array, at: number): boolean {
  const cellStart = index;
  let negative = false;
  let code = bytes[index];
  if (code === 45 || code === 43) {
    negative = code === 45;
    index++;
    code = bytes[index];
  }
  const digitsStart = index;
  let mantissa = 0;
  // digits and scale follow from where the digit runs start and end (nothing counted per digit)
  while (code >= 48 && code <= 57) {
    mantissa = mantissa * 10 + (code - 48);
    code = bytes[++index];
  }
  let digits = index - digitsStart;
  let scale = 0;
  if (code === markCode) {
    const fractionStart = ++index;
    code = bytes[index];
    while (code >= 48 && code <= 57) {
      mantissa = mantissa * 10 + (code - 48);
      code = bytes[++index];
    }
    scale = fractionStart - index;
    digits -= scale;
  }
  if (digits === 0) return false;
  let exponent = 0;
  if (code === 101 || code === 69) {
    index++;
    code = bytes[index];
    let exponentNegative = false;
    if (code === 45 || code === 43) {
      exponentNegative = code === 45;
      index++;
      code = bytes[index];
    }
    let exponentDigits = 0;
    while (code >= 48 && code <= 57) {
      exponent = exponent * 10 + (code - 48);
      exponentDigits++;
      index++;
      code = bytes[index];
    }
    if (exponentDigits === 0 || exponentDigits > 4) return false;
    if (exponentNegative) exponent = -exponent;
  }
  cellEnd = index;
  const power = scale + exponent;
  let value: number;
  // significant digits (leading zeros left out) matter only for a long mantissa
  if ((digits <= 15 || significantDigits(bytes, digitsStart, markCode) <= 15) && power >= -22 && power <= 22) {
    value = power < 0 ? mantissa / POWERS_OF_TEN[-power] : mantissa * POWERS_OF_TEN[power];
  } else {
    let cellText = asciiText(bytes, negative || bytes[cellStart] === 43 ? cellStart + 1 : cellStart, index);
    if (markCode !== 46) cellText = cellText.replace(String.fromCharCode(markCode), '.');
    value = Number(cellText);
    if (value - value !== 0) return false;
  }
  out[at] = negative ? -value : value;
  return true;
}

/**
 * Reads bytes[start, end) — one line, without its line break — as `cells` plain numbers (see
 * readPlainCell) separated by `delimiterCode` into `out`, straight from the bytes. bytes[end] must be
 * a line feed (readPlainCell's precondition).
 * Cost: O(line length), no allocation for cells of at most 15 significant digits.
 * @returns false (and `out` partly written) when the line is not such a row.
 */
function readPlainBytes(bytes: Uint8Array, start: number, end: number, delimiterCode: number, markCode: number, cells: number, out: Float64Array): boolean {
  let index = start;
  for (let cell = 0; cell < cells; cell++) {
    if (!readPlainCell(bytes, index, markCode, out, cell)) return false;
    if (cell === cells - 1 ? cellEnd !== end : cellEnd >= end || bytes[cellEnd] !== delimiterCode) return false;
    index = cellEnd + 1;
  }
  return true;
}

const KIND_SAMPLE_ROWS = 200;
const MESSAGE_CELL_MAX = 40;

const DOT_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const COMMA_NUMBER = /^[+-]?(?:\d+(?:,\d*)?|,\d+)(?:[eE][+-]?\d+)?$/;
// Thousands separators: "1,000.0" / "12,500" (point decimal), "1.000,0" / "12.500" (decimal
// comma). A leading group never starts with 0, so "0,652" and "0.652" are plain decimals.
const GROUPED_POINT_DECIMAL = /^[+-]?[1-9]\d{0,2}(?:,\d{3})+(?:\.\d*)?$/;
const GROUPED_COMMA_DECIMAL = /^[+-]?[1-9]\d{0,2}(?:\.\d{3})+(?:,\d*)?$/;
// One separator followed by exactly three digits ("1,500", "2.250"): a decimal or a thousands
// separator, which a single cell cannot tell.
const GROUP_OR_DECIMAL = /^[+-]?[1-9]\d{0,2}[.,]\d{3}$/;
const NOT_A_NUMBER_TOKEN = /^(?:nan|na|n\/a|#n\/a|null|none|inf|[+-]inf|infinity|[+-]infinity|#value!|#div\/0!|#num!|-+|—|error|err)$/i;
const DATE_TOKEN = /^\d{4}[-/]\d{1,2}[-/]\d{1,2}$/;
const TIME_TOKEN = /^\d{1,2}:\d{2}(?::\d{2}(?:[.,]\d+)?)?(?:Z|[+-]\d{2}:?\d{2})?$/i;

type CellClass = 'empty' | 'number' | 'nan' | 'timestamp' | 'duration' | 'text';

const CANDIDATE_DELIMITERS: readonly Delimiter[] = [',', ';', '\t', '|', 'whitespace'];

function delimiterLabel(delimiter: Delimiter): string {
  if (delimiter === '\t') return 'tab';
  if (delimiter === 'whitespace') return 'spaces';
  return `"${delimiter}"`;
}

function stripCellQuotes(cell: string): string {
  const trimmed = cell.trim();
  if (trimmed.length >= 2 && trimmed.charCodeAt(0) === 34 && trimmed.charCodeAt(trimmed.length - 1) === 34) {
    return trimmed.slice(1, -1).replace(/""/g, '"').trim();
  }
  return trimmed;
}

// RFC 4180 quoting (fields in double quotes, "" for a quote) for lines that contain a quote.
function splitQuoted(line: string, delimiter: string): string[] {
  const cells: string[] = [];
  let current = '';
  let inQuotes = false;
  for (let index = 0; index < line.length; index++) {
    const char = line[index];
    if (inQuotes) {
      if (char === '"') {
        if (line[index + 1] === '"') {
          current += '"';
          index++;
        } else {
          inQuotes = false;
        }
      } else {
        current += char;
      }
    } else if (char === '"') {
      inQuotes = true;
    } else if (char === delimiter) {
      cells.push(current);
      current = '';
    } else {
      current += char;
    }
  }
  cells.push(current);
  return cells;
}

// Whitespace runs separate cells, except between a date and a time ("2024-05-01 10:00:00").
function splitWhitespace(line: string): string[] {
  const trimmed = line.trim();
  if (trimmed.length === 0) return [];
  const tokens = trimmed.split(/\s+/);
  if (!trimmed.includes(':')) return tokens;
  const merged: string[] = [];
  for (let index = 0; index < tokens.length; index++) {
    const token = tokens[index];
    if (index + 1 < tokens.length && DATE_TOKEN.test(token) && TIME_TOKEN.test(tokens[index + 1])) {
      merged.push(`${token} ${tokens[index + 1]}`);
      index++;
    } else {
      merged.push(token);
    }
  }
  return merged;
}

function splitLine(line: string, delimiter: Delimiter): string[] {
  if (delimiter === 'whitespace') return splitWhitespace(line);
  if (line.includes('"')) return splitQuoted(line, delimiter);
  return line.split(delimiter);
}

function isBlankText(text: string): boolean {
  for (let index = 0; index < text.length; index++) {
    const code = text.charCodeAt(index);
    if (code !== 32 && code !== 9 && code !== 0xa0 && code !== 0xfeff && code !== 11 && code !== 12) return false;
  }
  return true;
}

// Cell count without trailing empty cells: `0.2,0.65,,` has two cells.
function meaningfulLength(cells: readonly string[]): number {
  let count = cells.length;
  while (count > 0 && isBlankText(cells[count - 1])) count--;
  return count;
}

function classifyCell(raw: string, allowDecimalComma: boolean): CellClass {
  const cell = stripCellQuotes(raw);
  if (cell.length === 0) return 'empty';
  if (DOT_NUMBER.test(cell)) return 'number';
  if (allowDecimalComma && COMMA_NUMBER.test(cell)) return 'number';
  if (GROUPED_POINT_DECIMAL.test(cell)) return 'number';
  if (allowDecimalComma && GROUPED_COMMA_DECIMAL.test(cell)) return 'number';
  if (NOT_A_NUMBER_TOKEN.test(cell)) return 'nan';
  const first = cell.charCodeAt(0);
  if (first >= 48 && first <= 57) {
    if (parseTimestamp(cell) !== null) return 'timestamp';
    if (parseDuration(cell) !== null) return 'duration';
  }
  return 'text';
}

/**
 * One number cell → value; NaN when the cell is not a plain decimal number.
 * Number() alone would accept "0x1A", "0b11" and blank text; those are refused here.
 */
function parseNumberCell(cell: string, decimalComma: boolean): number {
  let text = cell;
  if (decimalComma) {
    if (text.indexOf('.') >= 0) {
      const grouped = parseGroupedCell(text, true);
      if (grouped === grouped) return grouped;
    }
    const comma = text.indexOf(',');
    if (comma >= 0) text = text.slice(0, comma) + '.' + text.slice(comma + 1);
  }
  const value = +text;
  if (value - value !== 0) {
    if (!decimalComma && text.indexOf(',') >= 0) {
      const grouped = parseGroupedCell(text, false);
      if (grouped === grouped) return grouped;
    }
    // a quoted number in a whitespace-separated file still reads
    if (text.includes('"')) {
      const unquoted = stripCellQuotes(text);
      if (unquoted !== text.trim()) return parseNumberCell(unquoted, false);
    }
    return Number.NaN;
  }
  if (value === 0 && isBlankText(text)) return Number.NaN;
  let start = 0;
  while (start < text.length && (text.charCodeAt(start) === 32 || text.charCodeAt(start) === 9)) start++;
  if (text.charCodeAt(start) === 48 && start + 1 < text.length) {
    const next = text.charCodeAt(start + 1) | 0x20;
    if (next === 0x78 || next === 0x62 || next === 0x6f) return Number.NaN;
  }
  return value;
}

/**
 * A number written with thousands separators → value; NaN when the cell is not one.
 * Decimal-comma files group with points ("1.000,0"), point-decimal files with commas ("1,000.0").
 */
function parseGroupedCell(cell: string, decimalComma: boolean): number {
  const text = stripCellQuotes(cell);
  if (decimalComma) {
    if (!GROUPED_COMMA_DECIMAL.test(text)) return Number.NaN;
    return +text.replace(/\./g, '').replace(',', '.');
  }
  if (!GROUPED_POINT_DECIMAL.test(text)) return Number.NaN;
  return +text.replace(/,/g, '');
}

function isGroupedCell(cell: string, decimalComma: boolean): boolean {
  const text = stripCellQuotes(cell);
  return decimalComma ? text.includes('.') && GROUPED_COMMA_DECIMAL.test(text) : text.includes(',') && GROUPED_POINT_DECIMAL.test(text);
}

// Cells that hold no value: blank, or a not-a-number word of a spreadsheet or station.
function isMissingCell(cell: string): boolean {
  const text = stripCellQuotes(cell);
  return text.length === 0 || NOT_A_NUMBER_TOKEN.test(text);
}

// Comment lines: "#", "//", "%" or "!" first (after blanks), or ";" in files not separated by ";".
function isCommentLine(text: string, delimiter: Delimiter | null): boolean {
  const head = text.charCodeAt(0);
  // fast path: a line starting with a digit, sign or point is data
  if ((head >= 48 && head <= 57) || head === 45 || head === 43 || head === 46) return false;
  let start = 0;
  while (start < text.length && (text.charCodeAt(start) === 32 || text.charCodeAt(start) === 9)) start++;
  const first = text.charCodeAt(start);
  if (first === 35 || first === 37 || first === 33) return true; // # % !
  if (first === 47 && text.charCodeAt(start + 1) === 47) return true; // //
  return first === 59 && delimiter !== null && delimiter !== ';'; // ;
}

// A rule line such as "-----", "=====", "*****" or "~~~" between blocks.
function isRuleLine(text: string): boolean {
  const trimmed = text.trim();
  return trimmed.length >= 3 && /^[-=*~_+#.\s]+$/.test(trimmed) && !/\d/.test(trimmed);
}

// A cell that reads as words ("End of test", "Peak power"), not as a mistyped number ("0.6x").
function isWordCell(cell: string): boolean {
  const text = stripCellQuotes(cell);
  if (text.length === 0) return false;
  return /^[^\d+\-.,]/.test(text) && /\p{L}{2}/u.test(text);
}

function shortCell(cell: string): string {
  const trimmed = cell.trim();
  return trimmed.length > MESSAGE_CELL_MAX ? `${trimmed.slice(0, MESSAGE_CELL_MAX)}…` : trimmed;
}

/**
 * Brings a column's summary up to date over rows [from, to): done after each piece the parser is
 * given, while those rows are still in the cache, so that no later pass over a million rows is
 * needed for them (detection, unit checks).
 */
function summarizeRows(values: Float64Array, from: number, to: number, summary: ColumnSummary): void {
  let min = summary.min;
  let max = summary.max;
  let blank = 0;
  for (let row = from; row < to; row++) {
    const value = values[row];
    if (value !== value) {
      blank++;
      continue;
    }
    if (value < min) min = value;
    if (value > max) max = value;
  }
  summary.min = min;
  summary.max = max;
  summary.maxAbs = min <= max ? Math.max(-min, max) : 0;
  summary.finite += to - from - blank;
}

class GrowableFloat64 {
  data = new Float64Array(1024);
  length = 0;
  /** room for `count` values in all, without growing on each push */
  reserve(count: number): void {
    if (count <= this.data.length) return;
    const bigger = new Float64Array(Math.max(count, this.data.length * 2));
    bigger.set(this.data.subarray(0, this.length));
    this.data = bigger;
  }
  push(value: number): void {
    if (this.length === this.data.length) {
      const bigger = new Float64Array(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.length++] = value;
  }
  toArray(): Float64Array {
    // A view when little capacity is unused (saves a copy of a big log's column at the
    // moment memory peaks); a trimmed copy otherwise.
    if (this.length >= this.data.length * 0.75) return this.data.subarray(0, this.length);
    return this.data.slice(0, this.length);
  }
}

class GrowableInt32 {
  data = new Int32Array(1024);
  length = 0;
  /** room for `count` values in all */
  reserve(count: number): void {
    if (count <= this.data.length) return;
    const bigger = new Int32Array(Math.max(count, this.data.length * 2));
    bigger.set(this.data.subarray(0, this.length));
    this.data = bigger;
  }
  push(value: number): void {
    if (this.length === this.data.length) {
      const bigger = new Int32Array(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.length++] = value;
  }
  toArray(): Int32Array {
    return this.data.slice(0, this.length);
  }
}

interface BufferedLine {
  text: string;
  line: number;
}

interface SplitRow {
  cells: string[];
  count: number;
  numbers: number;
  dataLike: number;
  texts: number;
}

interface Layout {
  delimiter: Delimiter;
  decimalComma: boolean;
  headerIndex: number;
  unitIndex: number | null;
  headerCells: string[];
  unitCells: string[] | null;
  exactRows: number;
  firstDataBalance: number;
  decimalMarkAmbiguous: boolean;
}

function readRow(cells: string[], allowDecimalComma: boolean): SplitRow {
  const count = meaningfulLength(cells);
  let numbers = 0;
  let dataLike = 0;
  let texts = 0;
  for (let index = 0; index < count; index++) {
    const kind = classifyCell(cells[index], allowDecimalComma);
    if (kind === 'number') {
      numbers++;
      dataLike++;
    } else if (kind === 'timestamp' || kind === 'duration') {
      dataLike++;
    } else if (kind === 'text') {
      texts++;
    }
  }
  return { cells, count, numbers, dataLike, texts };
}

function isDataRow(row: SplitRow): boolean {
  return row.dataLike >= 1 && row.dataLike >= row.texts;
}

function isHeaderRow(row: SplitRow): boolean {
  return row.count >= 2 && row.dataLike === 0 && row.texts >= 2;
}

// Units of columns we do not read (humidity, flows, pressures, power) still make a unit row.
const OTHER_UNIT = /^[([]?\s*(?:%|%\s*rh|rh|rpm|sccm|slpm|slm|nlpm|ml\/min|l\/min|nl\/min|kpa[ag]?|bar[ag]?|mbar|psi[ag]?|pa|atm|w|mw|w\/cm2|w\/cm²|mw\/cm2|mw\/cm²|a\.u\.|au|#|no\.?|1|-|–|—|n\/a|hz|khz|deg|°)\s*[)\]]?$/i;

// The row under a header is a unit row when every filled cell is a unit ("A/cm²", "[V]",
// "mΩ·cm²", or one of columns we do not read: "%", "sccm") and one of them is a unit we read.
function isUnitRow(cells: readonly string[], count: number, headerCount: number): boolean {
  if (count === 0 || count > headerCount) return false;
  let filled = 0;
  let units = 0;
  let ours = 0;
  for (let index = 0; index < count; index++) {
    const cell = stripCellQuotes(cells[index]);
    if (cell.length === 0) continue;
    filled++;
    if (DOT_NUMBER.test(cell) || COMMA_NUMBER.test(cell)) return false;
    if (lookUpUnit(cell) !== null) {
      units++;
      ours++;
    } else if (OTHER_UNIT.test(cell)) {
      units++;
    } else {
      return false;
    }
  }
  return ours >= 1 && units === filled;
}

// Alternative header splits for whitespace files, whose names may contain spaces:
// "j [A/cm2]   U [V]" is two columns, not four.
function whitespaceHeaderAlternatives(text: string): string[][] {
  const alternatives: string[][] = [];
  const byWideGaps = text.trim().split(/\s{2,}|\t+/);
  alternatives.push(byWideGaps);
  const tokens = splitWhitespace(text);
  const merged: string[] = [];
  for (const token of tokens) {
    const attaches = /^[([{/]/.test(token) || (merged.length > 0 && /\/$/.test(merged[merged.length - 1]));
    if (attaches && merged.length > 0) merged[merged.length - 1] = `${merged[merged.length - 1]} ${token}`;
    else merged.push(token);
  }
  alternatives.push(merged);
  return alternatives;
}

function compareLayouts(a: Layout, b: Layout): number {
  if (a.exactRows !== b.exactRows) return a.exactRows - b.exactRows;
  if (a.firstDataBalance !== b.firstDataBalance) return a.firstDataBalance - b.firstDataBalance;
  if (a.headerCells.length !== b.headerCells.length) return a.headerCells.length - b.headerCells.length;
  return 0;
}

// Looks at the first lines under every candidate delimiter and picks the header row that is
// followed by the most rows of numbers with the same cell count.
function findLayout(lines: readonly BufferedLine[]): Layout | null {
  let best: Layout | null = null;
  for (const delimiter of CANDIDATE_DELIMITERS) {
    const allowDecimalComma = delimiter !== ',';
    const rows = lines.map((entry) => readRow(splitLine(entry.text, delimiter), allowDecimalComma));
    for (let headerIndex = 0; headerIndex < rows.length - 1; headerIndex++) {
      const headerRow = rows[headerIndex];
      if (!isHeaderRow(headerRow)) continue;
      let unitIndex: number | null = null;
      let next = headerIndex + 1;
      if (isUnitRow(rows[next].cells, rows[next].count, headerRow.count) && next + 1 < rows.length) {
        unitIndex = next;
        next++;
      }
      const firstData = rows[next];
      if (!isDataRow(firstData)) continue;
      let headerCells = headerRow.cells.slice(0, headerRow.count);
      if (firstData.count !== headerCells.length && delimiter === 'whitespace') {
        for (const alternative of whitespaceHeaderAlternatives(lines[headerIndex].text)) {
          if (alternative.length === firstData.count) {
            headerCells = alternative;
            break;
          }
        }
      }
      const headerCount = headerCells.length;
      if (headerCount < 2 || firstData.count > headerCount) continue;
      let exactRows = 0;
      for (let index = next; index < rows.length && index < next + DETECTION_DATA_ROWS; index++) {
        if (lines[index].text === lines[headerIndex].text) continue;
        const row = rows[index];
        if (!isDataRow(row)) break;
        if (row.count === headerCount) exactRows++;
        else if (row.count > headerCount) break;
      }
      if (exactRows === 0) continue;
      const layout: Layout = {
        delimiter,
        decimalComma: false,
        headerIndex,
        unitIndex,
        headerCells,
        unitCells: unitIndex === null ? null : rows[unitIndex].cells,
        exactRows,
        firstDataBalance: firstData.numbers - firstData.texts,
        decimalMarkAmbiguous: false,
      };
      if (best === null || compareLayouts(layout, best) > 0) best = layout;
    }
  }
  if (best === null) return null;
  if (best.delimiter !== ',') {
    // Decimal comma when the data rows' numbers say so. Cells that cannot be a grouped number
    // ("0,652", "12,5", "1.000,5") decide; "1,500" could be 1.5 or 1500 and only breaks a tie.
    let commaCells = 0;
    let pointCells = 0;
    let eitherCommaCells = 0;
    const firstDataIndex = (best.unitIndex ?? best.headerIndex) + 1;
    for (let index = firstDataIndex; index < lines.length && index < firstDataIndex + DETECTION_DATA_ROWS; index++) {
      for (const raw of splitLine(lines[index].text, best.delimiter)) {
        const cell = stripCellQuotes(raw);
        const hasComma = cell.includes(',');
        const hasPoint = cell.includes('.');
        if (hasComma && hasPoint) {
          if (GROUPED_COMMA_DECIMAL.test(cell)) commaCells++;
          else if (GROUPED_POINT_DECIMAL.test(cell)) pointCells++;
        } else if (GROUP_OR_DECIMAL.test(cell)) {
          if (hasComma) eitherCommaCells++;
        } else if (hasComma && (COMMA_NUMBER.test(cell) || GROUPED_COMMA_DECIMAL.test(cell))) {
          commaCells++;
        } else if (hasComma && GROUPED_POINT_DECIMAL.test(cell)) {
          pointCells++;
        } else if (hasPoint && DOT_NUMBER.test(cell)) {
          pointCells++;
        }
      }
    }
    if (commaCells > 0 || pointCells > 0) {
      best.decimalComma = commaCells > 0 && commaCells >= pointCells;
    } else if (eitherCommaCells > 0) {
      // nothing decides: read "1,500" as 1.5 (as a decimal-comma file writes it), and say so
      best.decimalComma = true;
      best.decimalMarkAmbiguous = true;
    }
  }
  return best;
}

// Why no layout was found, as the most specific CurveFileError we can name.
function explainMissingLayout(lines: readonly BufferedLine[]): CurveFileError {
  let multiColumnDataLine: BufferedLine | null = null;
  let multiColumnIndex = -1;
  let multiColumnDelimiter: Delimiter = ',';
  let singleNumberLine: BufferedLine | null = null;
  for (const delimiter of CANDIDATE_DELIMITERS) {
    for (let index = 0; index < lines.length; index++) {
      const entry = lines[index];
      const row = readRow(splitLine(entry.text, delimiter), delimiter !== ',');
      if (row.count >= 2 && isDataRow(row) && row.numbers >= 1) {
        if (multiColumnDataLine === null || entry.line < multiColumnDataLine.line) {
          multiColumnDataLine = entry;
          multiColumnIndex = index;
          multiColumnDelimiter = delimiter;
        }
        break;
      }
      if (row.count === 1 && row.numbers === 1 && singleNumberLine === null) singleNumberLine = entry;
    }
  }
  if (multiColumnDataLine !== null && multiColumnIndex > 0) {
    // a header is there but its cell count differs from the data's
    const above = readRow(splitLine(lines[multiColumnIndex - 1].text, multiColumnDelimiter), multiColumnDelimiter !== ',');
    const data = readRow(splitLine(multiColumnDataLine.text, multiColumnDelimiter), multiColumnDelimiter !== ',');
    if (isHeaderRow(above) && above.count !== data.count) {
      const headerLineNumber = lines[multiColumnIndex - 1].line;
      return new CurveFileError(
        'ragged-row',
        `line ${multiColumnDataLine.line}: ${data.count} cells, but the header (line ${headerLineNumber}) has ${above.count}; cells are separated by ${delimiterLabel(multiColumnDelimiter)}`,
        { line: multiColumnDataLine.line },
      );
    }
  }
  if (multiColumnDataLine !== null) {
    const above = lines.filter((entry) => entry.line < multiColumnDataLine.line);
    const where = above.length === 0 ? 'the file starts with numbers' : `the line above line ${multiColumnDataLine.line} is not a header with one name per column`;
    return new CurveFileError(
      'no-header',
      `line ${multiColumnDataLine.line}: numbers without a header row (${where}); add a header naming each column, e.g. "Current density (A/cm2),Voltage (V)"`,
      { line: multiColumnDataLine.line },
    );
  }
  if (singleNumberLine !== null) {
    return new CurveFileError(
      'one-column',
      `line ${singleNumberLine.line}: only one column of numbers found; a curve needs at least current and voltage columns separated by comma, semicolon, tab or spaces`,
      { line: singleNumberLine.line },
    );
  }
  const last = lines[lines.length - 1];
  for (const delimiter of CANDIDATE_DELIMITERS) {
    const cells = splitLine(last.text, delimiter).map(stripCellQuotes).filter((cell) => cell.length > 0);
    const named = cells.filter((cell) => recogniseHeaderUnit(cell).quantity !== null).length;
    if ((cells.length >= 2 && named >= 1) || (cells.length === 1 && named === 1)) {
      return new CurveFileError('header-only', `line ${last.line}: a header but no data rows under it`, { line: last.line });
    }
  }
  return new CurveFileError('no-numbers', `no rows of numbers found in the first ${lines.length} non-empty lines; is this a curve file?`, {
    line: lines[0].line,
  });
}

// A column is numeric when most of its sampled cells are numbers — or, when its header names
// a quantity we read (voltage, current, …), as soon as any cell is a number, so that one stray
// word in a voltage column is reported with its line instead of the column being dropped.
function decideColumnKinds(rows: readonly string[][], header: readonly string[], decimalComma: boolean, delimiter: Delimiter): ColumnKind[] {
  const kinds: ColumnKind[] = [];
  const allowDecimalComma = decimalComma && delimiter !== ',';
  for (let column = 0; column < header.length; column++) {
    const namesQuantity = recogniseHeaderUnit(header[column]).quantity !== null;
    let numbers = 0;
    let nans = 0;
    let timestamps = 0;
    let durations = 0;
    let texts = 0;
    for (const cells of rows) {
      if (column >= cells.length) continue;
      const kind = classifyCell(cells[column], allowDecimalComma);
      if (kind === 'number') numbers++;
      else if (kind === 'nan') nans++;
      else if (kind === 'timestamp') timestamps++;
      else if (kind === 'duration') durations++;
      else if (kind === 'text') texts++;
    }
    const filled = numbers + nans + timestamps + durations + texts;
    if (filled === 0) kinds.push('empty');
    else if (timestamps >= 0.8 * filled) kinds.push('timestamp');
    else if (durations >= 0.8 * filled) kinds.push('duration');
    else if (numbers >= 1 && (numbers + nans >= 0.8 * filled || (namesQuantity && numbers >= timestamps + durations))) kinds.push('number');
    else kinds.push('text');
  }
  return kinds;
}

/**
 * A chunked parser for delimited text curve files.
 * Reads: UTF-8 BOM; CRLF, LF or CR line ends (also split across chunks); delimiter comma,
 * semicolon, tab, bar or runs of spaces, found from the first lines; decimal comma
 * (`0,652;0,2`, or tab-separated `0,652\t0,2`); RFC 4180 quotes; metadata lines above the
 * header (→ `conditions`); an optional unit row under the header; numeric rows. Date-time
 * columns (ISO 8601, `YYYY-MM-DD HH:MM:SS`) are kept as epoch seconds, `H:MM:SS` columns as
 * seconds, other text columns are ignored and listed. Blank lines, `#` comment lines and a
 * repeated header inside the data are skipped.
 * Steps, each a named function below: `feed` splits chunks into lines → `acceptLine` buffers the
 * first lines until `endDetection` (chooseLayout → readHeader → conditions → chooseColumnKinds →
 * prepareStoredColumns) → `acceptDataLine` reads each row (`acceptPlainRow` for plain numeric rows,
 * else `readDataRow` + `commitRow`, or `addToTail` for lines after the table) → `assembleTable`.
 * Reference: RFC 4180 (CSV); ISO 8601-1:2019 (date-times).
 * Cost: O(total characters) time; memory 8 bytes per number cell plus 4 per row.
 * @throws CurveFileError with code `empty`, `no-header`, `header-only`, `no-numbers`,
 *   `one-column`, `ragged-row`, `bad-number`, `too-many-rows`, `line-too-long` or
 *   `too-many-cells`, naming line and column.
 * @example const parser = createDelimitedParser(); parser.push('j (A/cm2),V (V)\n0.2,0.65\n'); parser.finish().rowCount // 1
 */
export function createDelimitedParser(options: DelimitedParserOptions = {}): DelimitedParser {
  const maxRows = options.maxRows ?? DEFAULT_MAX_ROWS;
  const previewRows = options.previewRows ?? 10;
  if (!(maxRows >= 1)) throw new RangeError(`createDelimitedParser: maxRows must be at least 1, got ${maxRows}`);
  if (!(previewRows >= 0)) throw new RangeError(`createDelimitedParser: previewRows must be ≥ 0, got ${previewRows}`);

  let failure: unknown = null;
  let finished = false;
  let startChecked = false;
  let pendingCarriageReturn = false;
  const carry: string[] = [];
  let carryChars = 0;
  let lineNumber = 0;

  // detection phase
  let detecting = true;
  const buffered: BufferedLine[] = [];
  let bufferedChars = 0;
  let bufferedNonEmpty = 0;

  // data phase
  let delimiter: Delimiter = ',';
  let decimalComma = false;
  let decimalMarkAmbiguous = false;
  let headerLine = 0;
  let unitLine: number | null = null;
  let headerText = '';
  let unitText: string | null = null;
  let header: string[] = [];
  let kinds: ColumnKind[] = [];
  let storedColumns: number[] = [];
  let storedKinds: ColumnKind[] = [];
  let growable: GrowableFloat64[] = [];
  let conditions: ParsedTable['conditions'] = { raw: {} };
  const dataLines = new GrowableInt32();
  const preview: string[][] = [];
  let rowCount = 0;

  // per stored column: cells without a value (stored as NaN), and cells with thousands separators
  let missing: ({ count: number; firstLine: number; firstText: string } | null)[] = [];
  let grouped: number[] = [];
  let scratch = new Float64Array(0);
  // the numeric fast path applies when every column is a stored number and cells are split by one character
  let plainDelimiter = -1;
  let plainMark = 46;
  // Lines after the table: once a line that is not data starts a tail, everything up to the end
  // is left out, unless data of the table's shape comes back (then the tail was text inside it).
  interface Tail {
    firstLine: number;
    lastLine: number;
    lineCount: number;
    samples: string[];
    texts: string[];
    lines: number[];
    /** a header-like line in the tail: the rows under it belong to another table */
    anotherTable: boolean;
  }
  let tail: Tail | null = null;
  const afterTableTexts: string[] = [];
  let afterTable: ParsedTable['afterTable'] = null;
  const skipped = { count: 0, lines: [] as number[], samples: [] as string[] };

  function cellError(line: number, column: number, what: string): CurveFileError {
    return new CurveFileError('bad-number', `line ${line}, column "${header[column]}": ${what}`, { line, column: header[column] });
  }

  // Reads one row into `scratch`; returns the error it would raise instead of throwing it, so
  // the caller can decide whether the row is bad data or the first line after the table.
  function readDataRow(cells: string[], line: number, count: number): CurveFileError | null {
    const headerCount = header.length;
    if (count > headerCount) {
      return new CurveFileError(
        'ragged-row',
        `line ${line}: ${count} cells, but the header (line ${headerLine}) has ${headerCount}; cells are separated by ${delimiterLabel(delimiter)}`,
        { line },
      );
    }
    if (cells.length < headerCount) {
      for (let index = 0; index < storedColumns.length; index++) {
        if (storedColumns[index] >= cells.length) {
          return new CurveFileError(
            'ragged-row',
            `line ${line}: ${cells.length} cells, but the header (line ${headerLine}) has ${headerCount}; column "${header[storedColumns[index]]}" is missing`,
            { line, column: header[storedColumns[index]] },
          );
        }
      }
    }
    for (let index = 0; index < storedColumns.length; index++) {
      const column = storedColumns[index];
      const cell = cells[column];
      const kind = storedKinds[index];
      let value: number;
      if (kind === 'number') {
        value = parseNumberCell(cell, decimalComma);
        if (value !== value) {
          if (!isMissingCell(cell)) {
            const shown = shortCell(cell);
            const hint = !decimalComma && /^[+-]?\d+,\d+$/.test(shown) ? ' (decimal comma in a file that uses a decimal point)' : '';
            return cellError(line, column, `not a number ("${shown}")${hint}`);
          }
        }
      } else if (kind === 'timestamp') {
        const seconds = parseTimestamp(stripCellQuotes(cell));
        if (seconds === null) {
          if (isBlankText(cell)) return cellError(line, column, 'empty cell');
          return cellError(line, column, `not a date-time ("${shortCell(cell)}"); expected e.g. 2024-05-01 10:00:00 or 2024-05-01T10:00:00Z`);
        }
        value = seconds;
      } else {
        const seconds = parseDuration(stripCellQuotes(cell));
        if (seconds === null) {
          if (isBlankText(cell)) return cellError(line, column, 'empty cell');
          return cellError(line, column, `not an elapsed time ("${shortCell(cell)}"); expected H:MM:SS`);
        }
        value = seconds;
      }
      scratch[index] = value;
    }
    return null;
  }

  function commitRow(cells: string[], line: number): void {
    if (rowCount >= maxRows) {
      throw new CurveFileError('too-many-rows', `line ${line}: more than ${maxRows} data rows; the limit is ${maxRows} rows per file`, { line });
    }
    for (let index = 0; index < storedColumns.length; index++) {
      const value = scratch[index];
      if (value !== value) {
        const cell = cells[storedColumns[index]];
        const entry = missing[index];
        if (entry === null) missing[index] = { count: 1, firstLine: line, firstText: shortCell(cell ?? '') };
        else entry.count++;
      } else if (storedKinds[index] === 'number') {
        const cell = cells[storedColumns[index]];
        // cheap test first: only cells holding both marks, or the other mark, can be grouped
        if ((decimalComma ? cell.indexOf('.') >= 0 : cell.indexOf(',') >= 0) && isGroupedCell(cell, decimalComma)) grouped[index]++;
      }
      growable[index].push(value);
    }
    dataLines.push(line);
    if (rowCount < previewRows) {
      const row: string[] = [];
      for (let column = 0; column < header.length; column++) row.push(column < cells.length ? stripCellQuotes(cells[column]) : '');
      preview.push(row);
    }
    rowCount++;
  }

  function addToTail(text: string, line: number, cells: string[]): void {
    if (tail === null) {
      tail = { firstLine: line, lastLine: line, lineCount: 0, samples: [], texts: [], lines: [], anotherTable: false };
    }
    tail.lastLine = line;
    tail.lineCount++;
    if (tail.samples.length < 3) tail.samples.push(shortCell(text));
    if (tail.texts.length < 200) {
      tail.texts.push(text);
      tail.lines.push(line);
    }
    if (isHeaderRow(readRow(cells, decimalComma && delimiter !== ','))) tail.anotherTable = true;
  }

  // Data of the table's shape after a tail: the tail lines were text inside the data.
  function tailWasInside(): void {
    const inside = tail as Tail;
    skipped.count += inside.lineCount;
    for (let index = 0; index < inside.lines.length && skipped.lines.length < 20; index++) skipped.lines.push(inside.lines[index]);
    for (let index = 0; index < inside.samples.length && skipped.samples.length < 3; index++) skipped.samples.push(inside.samples[index]);
    tail = null;
  }

  // A plain numeric row in the middle of the table, past the preview rows: read and stored at once.
  function acceptPlainRow(text: string, line: number): boolean {
    if (tail !== null || rowCount < previewRows || rowCount >= maxRows) return false;
    if (!readPlainNumbers(text, plainDelimiter, plainMark, storedColumns.length, scratch)) return false;
    for (let index = 0; index < scratch.length; index++) growable[index].push(scratch[index]);
    dataLines.push(line);
    rowCount++;
    return true;
  }

  function acceptDataLine(text: string, line: number): void {
    if (plainDelimiter >= 0 && acceptPlainRow(text, line)) return;
    if (text.length === 0 || isBlankText(text)) return;
    if (isCommentLine(text, delimiter)) return;
    if (text === headerText || text === unitText) {
      // a repeated header: the table goes on below it (exports that write one block per sweep)
      if (tail !== null) tailWasInside();
      return;
    }
    const cells = splitLine(text, delimiter);
    const count = meaningfulLength(cells);
    if (count === 0) return; // ",,," — an empty spreadsheet row
    if (tail !== null) {
      if (!tail.anotherTable && count === header.length && readDataRow(cells, line, count) === null) {
        tailWasInside();
        commitRow(cells, line);
        return;
      }
      addToTail(text, line, cells);
      return;
    }
    const problem = readDataRow(cells, line, count);
    if (problem === null) {
      commitRow(cells, line);
      return;
    }
    // a row that reads as words or a rule line, after some data: the table may have ended here
    const first = cells.find((cell) => !isBlankText(cell)) ?? '';
    if (rowCount > 0 && (isWordCell(first) || isRuleLine(text))) {
      addToTail(text, line, cells);
      return;
    }
    throw problem;
  }

  // ---- the end of detection, in its steps: layout → header (and unit row) → conditions above the
  // header → column kinds from a sample → stored columns → the buffered lines read as data

  /** The delimiter, decimal mark and header (and unit) rows of the buffered lines. */
  function chooseLayout(nonEmpty: BufferedLine[]) {
    const nonEmptyWithComments = buffered.filter((entry) => !isBlankText(entry.text));
    if (nonEmptyWithComments.length === 0) throw new CurveFileError('empty', 'the file is empty (no text, or only blank lines)');
    const layout = nonEmpty.length === 0 ? null : findLayout(nonEmpty);
    if (layout === null) throw explainMissingLayout(nonEmpty.length > 0 ? nonEmpty : nonEmptyWithComments);
    delimiter = layout.delimiter;
    decimalComma = layout.decimalComma;
    decimalMarkAmbiguous = layout.decimalMarkAmbiguous;
    return layout;
  }

  /** Column names from the header row, with the unit row's units appended in parentheses. */
  function readHeader(layout: NonNullable<ReturnType<typeof findLayout>>, nonEmpty: BufferedLine[]): void {
    const headerEntry = nonEmpty[layout.headerIndex];
    headerLine = headerEntry.line;
    headerText = headerEntry.text;
    header = layout.headerCells.map((cell, index) => {
      const name = stripCellQuotes(cell);
      return name.length > 0 ? name : `column ${index + 1}`;
    });
    if (layout.unitIndex !== null && layout.unitCells !== null) {
      const unitEntry = nonEmpty[layout.unitIndex];
      unitLine = unitEntry.line;
      unitText = unitEntry.text;
      const unitCells = layout.unitCells;
      header = header.map((name, index) => {
        const unit = index < unitCells.length ? stripCellQuotes(unitCells[index]) : '';
        return unit.length > 0 && unit !== '-' ? `${name} (${unit})` : name;
      });
    }
  }

  /** What each column holds, from up to KIND_SAMPLE_ROWS data rows (the sample ends where the table does). */
  function chooseColumnKinds(nonEmpty: BufferedLine[], firstDataLine: number): void {
    const sample: string[][] = [];
    for (const entry of nonEmpty) {
      if (entry.line <= firstDataLine || isCommentLine(entry.text, delimiter)) continue;
      if (sample.length >= KIND_SAMPLE_ROWS) break;
      const cells = splitLine(entry.text, delimiter);
      // summary lines below the table say nothing of its columns
      const first = cells.find((cell) => !isBlankText(cell)) ?? '';
      if (sample.length > 0 && !isDataRow(readRow(cells, decimalComma && delimiter !== ',')) && (isWordCell(first) || isRuleLine(entry.text))) break;
      sample.push(cells);
    }
    kinds = decideColumnKinds(sample, header, decimalComma, delimiter);
  }

  /** The columns kept as numbers, their buffers, and whether plain rows can take the fast path. */
  function prepareStoredColumns(): void {
    storedColumns = [];
    storedKinds = [];
    for (let column = 0; column < kinds.length; column++) {
      if (kinds[column] === 'number' || kinds[column] === 'timestamp' || kinds[column] === 'duration') {
        storedColumns.push(column);
        storedKinds.push(kinds[column]);
      }
    }
    growable = storedColumns.map(() => new GrowableFloat64());
    missing = storedColumns.map(() => null);
    grouped = storedColumns.map(() => 0);
    scratch = new Float64Array(storedColumns.length);
    const allNumbers = storedColumns.length === header.length && storedKinds.every((kind) => kind === 'number');
    plainDelimiter = allNumbers && delimiter !== 'whitespace' ? delimiter.charCodeAt(0) : -1;
    plainMark = decimalComma ? 44 : 46;
    // a decimal comma with comma-separated cells cannot be read without the general rules
    if (plainDelimiter === plainMark) plainDelimiter = -1;
  }

  function endDetection(): void {
    detecting = false;
    const nonEmpty = buffered.filter((entry) => !isBlankText(entry.text) && !isCommentLine(entry.text, null));
    const layout = chooseLayout(nonEmpty);
    readHeader(layout, nonEmpty);
    const metadata = buffered.filter((entry) => entry.line < headerLine).map((entry) => entry.text);
    conditions = readConditions(metadata, delimiter === 'whitespace' ? '' : delimiter);
    const firstDataLine = unitLine ?? headerLine;
    chooseColumnKinds(nonEmpty, firstDataLine);
    prepareStoredColumns();
    if (options.sizeHintBytes !== undefined && buffered.length > 0) {
      // the rows the input holds at the lines' mean length so far, and a little more
      const meanLine = (bufferedChars + buffered.length) / buffered.length;
      // never more rows than the bytes can hold as rows (two bytes a cell at least): at most 4 bytes
      // of columns per byte of file, whatever short lines came first
      const most = Math.ceil(options.sizeHintBytes / (2 * Math.max(1, storedColumns.length)));
      const rows = Math.min(maxRows, most, Math.ceil((options.sizeHintBytes / meanLine) * 1.02) + 16);
      for (const column of growable) column.reserve(rows);
      dataLines.reserve(rows);
    }
    for (const entry of buffered) {
      if (entry.line > firstDataLine) acceptDataLine(entry.text, entry.line);
    }
    buffered.length = 0;
  }

  function acceptLine(text: string): void {
    lineNumber++;
    checkLineBounds(text, lineNumber);
    if (!detecting) {
      acceptDataLine(text, lineNumber);
      return;
    }
    buffered.push({ text, line: lineNumber });
    bufferedChars += text.length;
    if (!isBlankText(text)) bufferedNonEmpty++;
    if (bufferedNonEmpty >= DETECTION_MAX_LINES || bufferedChars >= DETECTION_MAX_CHARS) endDetection();
  }

  function feed(chunk: string): void {
    let text = chunk;
    if (!startChecked) {
      if (text.length === 0) return;
      if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
      startChecked = true;
    }
    let start = 0;
    if (pendingCarriageReturn && text.length > 0) {
      pendingCarriageReturn = false;
      if (text.charCodeAt(0) === 10) start = 1;
    }
    let nextLineFeed = text.indexOf('\n', start);
    let nextCarriageReturn = text.indexOf('\r', start);
    while (nextLineFeed >= 0 || nextCarriageReturn >= 0) {
      let end: number;
      let breakLength = 1;
      if (nextCarriageReturn < 0 || (nextLineFeed >= 0 && nextLineFeed < nextCarriageReturn)) {
        end = nextLineFeed;
      } else {
        end = nextCarriageReturn;
        if (end + 1 < text.length) {
          if (text.charCodeAt(end + 1) === 10) breakLength = 2;
        } else {
          pendingCarriageReturn = true;
        }
      }
      let line = text.slice(start, end);
      if (carry.length > 0) {
        carry.push(line);
        line = carry.join('');
        carry.length = 0;
        carryChars = 0;
      }
      acceptLine(line);
      start = end + breakLength;
      if (nextLineFeed >= 0 && nextLineFeed < start) nextLineFeed = text.indexOf('\n', start);
      if (nextCarriageReturn >= 0 && nextCarriageReturn < start) nextCarriageReturn = text.indexOf('\r', start);
    }
    if (start < text.length) {
      carry.push(text.slice(start));
      carryChars += text.length - start;
      if (carryChars > MAX_LINE_CHARS) throw lineTooLong(lineNumber + 1);
    }
  }

  // ---- bytes: once the table's columns are known, its plain lines are read from the bytes; a line
  // left open by the text way is finished the text way first, and the first line that is not plain
  // (or the last, incomplete one) goes back to the text way, so every rule and message stays its own.
  function feedBytes(bytes: Uint8Array, decode: (bytes: Uint8Array) => string): void {
    let offset = 0;
    // while the layout is being found, feed the text in pieces of whole lines, so that the bytes
    // after it are read the fast way as soon as it is known
    while (detecting && offset < bytes.length) {
      const lineFeed = bytes.indexOf(10, Math.min(bytes.length, offset + DETECTION_PIECE_BYTES));
      const end = lineFeed < 0 ? bytes.length : lineFeed + 1;
      feed(decode(bytes.subarray(offset, end)));
      offset = end;
    }
    if (offset >= bytes.length) return;
    if (plainDelimiter >= 0 && (carry.length > 0 || pendingCarriageReturn)) {
      const lineFeed = bytes.indexOf(10, offset);
      if (lineFeed < 0) {
        feed(decode(bytes.subarray(offset)));
        return;
      }
      feed(decode(bytes.subarray(offset, lineFeed + 1)));
      offset = lineFeed + 1;
    }
    if (plainDelimiter >= 0 && tail === null && rowCount >= previewRows && carry.length === 0 && !pendingCarriageReturn) {
      offset = plainLines(bytes, offset);
    }
    if (offset < bytes.length) feed(decode(bytes.subarray(offset)));
  }

  /**
   * Reads the whole plain lines of bytes from `from` straight into the columns (a line ends at LF or
   * CR LF); returns where the first line it did not take starts: one that is not plain, is too long,
   * or has no line feed yet.
   */
  function plainLines(bytes: Uint8Array, from: number): number {
    const cells = storedColumns.length;
    // room for every line the bytes can hold (a plain row has at least two bytes per cell)
    const room = Math.min(maxRows, rowCount + Math.ceil((bytes.length - from) / (2 * cells)) + 1);
    for (const column of growable) column.reserve(room);
    dataLines.reserve(room);
    const columns = growable.map((column) => column.data);
    const lines = dataLines.data;
    // whole lines only: the last line feed ends the reading of every cell before it
    const lastLineFeed = bytes.lastIndexOf(10);
    const delimiterCode = plainDelimiter;
    const markCode = plainMark;
    const rowLimit = maxRows;
    let row = rowCount;
    let line = lineNumber;
    let start = from;
    rows: while (row < rowLimit && start <= lastLineFeed) {
      let index = start;
      for (let cell = 0; cell < cells; cell++) {
        // the value goes straight to its column's row: one past the rows counted until the line is whole
        if (!readPlainCell(bytes, index, markCode, columns[cell], row)) break rows;
        const next = bytes[cellEnd];
        if (cell < cells - 1) {
          if (next !== delimiterCode) break rows;
        } else if (next !== 10 && !(next === 13 && bytes[cellEnd + 1] === 10)) {
          break rows;
        }
        index = cellEnd + 1;
      }
      if (index - start > MAX_LINE_CHARS) break;
      if (bytes[index - 1] === 13) index++;
      lines[row] = ++line;
      row++;
      start = index;
    }
    lineNumber = line;
    for (const column of growable) column.length = row;
    dataLines.length = row;
    rowCount = row;
    return start;
  }

  /** The finished table: stored columns in header order, what was left out and why, the lines after the table. */
  function assembleTable(): ParsedTable {
    const columns: (Float64Array | null)[] = header.map(() => null);
    const missingCells: NonNullable<ParsedTable['missingCells']> = header.map(() => null);
    const groupedCells: number[] = header.map(() => 0);
    const columnSummaries: (ColumnSummary | null)[] = header.map(() => null);
    for (let index = 0; index < storedColumns.length; index++) {
      columns[storedColumns[index]] = growable[index].toArray();
      columnSummaries[storedColumns[index]] = summaries[index] ? { ...summaries[index] } : null;
      missingCells[storedColumns[index]] = missing[index];
      groupedCells[storedColumns[index]] = grouped[index];
    }
    const ignoredColumns: number[] = [];
    for (let column = 0; column < kinds.length; column++) if (columns[column] === null) ignoredColumns.push(column);
    const lines = dataLines.toArray();
    const finalTail = tail as Tail | null;
    if (finalTail !== null) {
      afterTable = { firstLine: finalTail.firstLine, lastLine: finalTail.lastLine, lineCount: finalTail.lineCount, samples: finalTail.samples };
      for (const text of finalTail.texts) afterTableTexts.push(text);
      mergeConditions(conditions, readConditions(afterTableTexts, delimiter === 'whitespace' ? '' : delimiter));
    }
    return {
      delimiter,
      decimalComma,
      headerLine,
      unitLine,
      header,
      conditions,
      columns,
      columnKinds: kinds,
      ignoredColumns,
      rowCount,
      firstDataLine: lines[0],
      dataLines: lines,
      preview,
      missingCells,
      afterTable,
      skippedLines: skipped.count > 0 ? skipped : null,
      groupedCells,
      decimalMarkAmbiguous,
      columnSummaries,
    };
  }

  function guarded<T>(action: () => T): T {
    if (failure !== null) throw failure;
    if (finished) throw new RangeError('createDelimitedParser: the parser has already finished');
    try {
      return action();
    } catch (error) {
      failure = error;
      throw error;
    }
  }

  // the stored columns' summaries, up to date over the first `summarized` rows
  let summaries: ColumnSummary[] = [];
  let summarized = 0;
  function summarize(): void {
    if (rowCount === summarized) return;
    if (summaries.length !== growable.length) summaries = growable.map(() => ({ min: Infinity, max: -Infinity, maxAbs: 0, finite: 0 }));
    for (let index = 0; index < growable.length; index++) summarizeRows(growable[index].data, summarized, rowCount, summaries[index]);
    summarized = rowCount;
  }

  return {
    push(chunk: string): void {
      guarded(() => feed(String(chunk)));
      summarize();
    },
    pushBytes(bytes: Uint8Array, decode: (bytes: Uint8Array) => string): void {
      guarded(() => feedBytes(bytes, decode));
      summarize();
    },
    finish(): ParsedTable {
      return guarded(() => {
        if (carry.length > 0) {
          const last = carry.join('');
          carry.length = 0;
          acceptLine(last);
        }
        if (detecting) endDetection();
        finished = true;
        if (rowCount === 0) {
          throw new CurveFileError('header-only', `line ${headerLine}: a header but no data rows under it`, { line: headerLine });
        }
        summarize();
        return assembleTable();
      });
    },
  };
}

/**
 * Whole text → ParsedTable, through the chunked parser in one push.
 * Reference, cost, throws: as createDelimitedParser.
 * @example parseDelimitedText('I (A);U (V)\n1,5;0,652\n').decimalComma // true
 */
export function parseDelimitedText(text: string, options: DelimitedParserOptions = {}): ParsedTable {
  const parser = createDelimitedParser(options);
  parser.push(text);
  return parser.finish();
}

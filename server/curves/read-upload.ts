// Turns an uploaded file on disk into a ParsedTable: sniff the content (never trust the
// extension), stream text through the chunked parser, or read a spreadsheet's chosen sheet.
import fs from 'node:fs';
import { createHash } from 'node:crypto';
import ExcelJS from 'exceljs';
import { createDelimitedParser, createChunkDecoder, mergeConditions, readConditions, sniffBytes } from '../../shared/curves';
import { CurveFileError } from '../../shared/curves/types';
import type { ParsedTable } from '../../shared/curves';

export interface ReadResult {
  table: ParsedTable;
  sha256: string;
  contentType: string;
  sheets?: string[];
  sheet?: string;
}

async function readHead(path: string, bytes: number): Promise<Uint8Array> {
  const handle = await fs.promises.open(path, 'r');
  try {
    const buffer = Buffer.alloc(bytes);
    const { bytesRead } = await handle.read(buffer, 0, bytes, 0);
    return buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

export async function hashFile(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of fs.createReadStream(path)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

export interface ReadOptions {
  sheet?: string;
  maxRows: number;
  /** called after each chunk with the bytes parsed so far (text files) */
  onBytes?: (bytesParsed: number) => void;
}

/** Give the event loop a turn so other requests (and progress polls) are served during a long parse. */
const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

export async function readUpload(path: string, options: ReadOptions): Promise<ReadResult> {
  const head = await readHead(path, 65536);
  const kind = sniffBytes(head);
  if (kind === 'xlsx') return readWorkbook(path, options);
  const reader = createTextReader(head, { maxRows: options.maxRows, sizeHintBytes: (await fs.promises.stat(path)).size });
  let bytesParsed = 0;
  for await (const chunk of fs.createReadStream(path, { highWaterMark: 1 << 20 })) {
    reader.push(chunk as Buffer);
    bytesParsed += (chunk as Buffer).length;
    options.onBytes?.(bytesParsed);
    await yieldToEventLoop();
  }
  return reader.finish();
}

/** The head of a file (its first 64 kB or all of it) that is no text table: why, or null for text. */
export function refuseHead(head: Uint8Array): CurveFileError | null {
  const kind = sniffBytes(head);
  if (kind === 'empty') return new CurveFileError('empty', 'The file is empty.');
  if (kind === 'binary') return new CurveFileError('binary', 'The file is binary, not a text table or an .xlsx workbook; export the data as CSV, TSV, TXT or XLSX.');
  if (kind === 'xls') return new CurveFileError('old-excel', 'This is an old .xls workbook; save it as .xlsx or CSV and upload again.');
  return null;
}

/** Reads a text table from its bytes in order, hashing them on the same pass (see readUpload). */
export interface TextReader {
  /** the next bytes of the file, from its first byte on */
  push(chunk: Uint8Array): void;
  /** the table, its SHA-256 and content type, once every byte was pushed */
  finish(): ReadResult;
}

/**
 * A text table read from its bytes as they come (from disk, or from the network while the upload
 * is received): `head` is the file's first 64 kB (or all of it) for the encoding; the same bytes
 * are pushed again from the first.
 * @throws CurveFileError for a head that is no text table, and as the delimited parser does
 */
export function createTextReader(head: Uint8Array, options: { maxRows: number; sizeHintBytes?: number; hash?: boolean }): TextReader {
  const refused = refuseHead(head);
  if (refused) throw refused;
  // `hash: false`: the caller hashes the bytes itself (a stream, on the thread that receives them); sha256 is then ''
  const hash = options.hash === false ? null : createHash('sha256');
  const decoder = createChunkDecoder(head);
  // the file's size lets the parser size its columns once
  const parser = createDelimitedParser({ maxRows: options.maxRows, sizeHintBytes: options.sizeHintBytes });
  // in an ASCII-compatible text the table's plain lines are read from the bytes, without decoding
  const fromBytes = decoder.encoding === 'utf-8' || decoder.encoding === 'windows-1252';
  const decode = (bytes: Uint8Array) => decoder.decode(bytes, { stream: true });
  return {
    push(chunk) {
      hash?.update(chunk);
      if (fromBytes) parser.pushBytes(chunk, decode);
      else parser.push(decode(chunk));
    },
    finish() {
      parser.push(decoder.decode());
      return { table: parser.finish(), sha256: hash ? hash.digest('hex') : '', contentType: 'text/plain' };
    },
  };
}

function cellText(value: ExcelJS.CellValue): string {
  if (value == null) return '';
  if (typeof value === 'number') return String(value);
  if (typeof value === 'string') return value;
  if (typeof value === 'boolean') return value ? 'TRUE' : 'FALSE';
  if (value instanceof Date) return value.toISOString();
  if (typeof value === 'object') {
    if ('result' in value) return cellText((value as { result: ExcelJS.CellValue }).result);
    if ('richText' in value) return (value as ExcelJS.CellRichTextValue).richText.map((r) => r.text).join('');
    if ('text' in value) return String((value as { text: unknown }).text);
    if ('error' in value) return '';
  }
  return String(value);
}

// A number kept as text in a cell ("0,652", "1.250,5"): only these can tell the sheet's decimal mark.
const TEXT_COMMA_DECIMAL = /^[+-]?(?:0|[1-9]\d{0,2}(?:\.\d{3})*|\d+),\d+$/;
const TEXT_POINT_DECIMAL = /^[+-]?(?:0|[1-9]\d{0,2}(?:,\d{3})*|\d+)\.\d+$/;

/**
 * A worksheet → tab-separated lines for the delimited parser. Real number cells are written
 * with the decimal mark the sheet's numbers-as-text use, so a sheet mixing both reads as one.
 */
function sheetLines(sheet: ExcelJS.Worksheet): string[] {
  const rows: ExcelJS.CellValue[][] = [];
  let textComma = 0;
  let textPoint = 0;
  sheet.eachRow({ includeEmpty: true }, (row) => {
    const values = (row.values as ExcelJS.CellValue[]).slice(1);
    rows.push(values);
    for (const value of values) {
      if (typeof value !== 'string') continue;
      const text = value.trim();
      if (TEXT_COMMA_DECIMAL.test(text)) textComma++;
      else if (TEXT_POINT_DECIMAL.test(text)) textPoint++;
    }
  });
  const commaSheet = textComma > 0 && textComma >= textPoint;
  return rows.map((values) => {
    const cells: string[] = [];
    for (let c = 0; c < values.length; c++) {
      const value = values[c];
      const numeric = typeof value === 'number' ? value : value && typeof value === 'object' && 'result' in value && typeof (value as { result: unknown }).result === 'number' ? ((value as { result: number }).result) : null;
      const text = numeric !== null && commaSheet ? String(numeric).replace('.', ',') : cellText(value ?? null);
      cells.push(text.replace(/[\t\r\n]+/g, ' '));
    }
    return cells.join('\t');
  });
}

// A sheet of key–value pairs (conditions, notes): most filled rows have 2–3 cells, the first a word.
function isKeyValueSheet(lines: readonly string[]): boolean {
  let filled = 0;
  let pairs = 0;
  for (const line of lines) {
    const cells = line.split('\t').map((cell) => cell.trim()).filter((cell) => cell.length > 0);
    if (cells.length === 0) continue;
    filled++;
    if (cells.length >= 2 && cells.length <= 3 && /^\p{L}/u.test(cells[0])) pairs++;
  }
  return filled > 0 && filled <= 200 && pairs * 2 >= filled;
}

async function readWorkbook(path: string, options: ReadOptions): Promise<ReadResult> {
  const workbook = new ExcelJS.Workbook();
  try {
    await workbook.xlsx.readFile(path);
  } catch {
    throw new CurveFileError('bad-xlsx', 'The file looks like an .xlsx workbook but could not be read; open and save it again, or export CSV.');
  }
  const sheets = workbook.worksheets.map((w) => w.name);
  const linesOf = new Map<ExcelJS.Worksheet, string[]>();
  const lines = (sheet: ExcelJS.Worksheet): string[] => {
    let found = linesOf.get(sheet);
    if (found === undefined) {
      found = sheetLines(sheet);
      linesOf.set(sheet, found);
    }
    return found;
  };
  const parseSheet = (sheet: ExcelJS.Worksheet) => {
    const parser = createDelimitedParser({ maxRows: options.maxRows });
    parser.push(lines(sheet).join('\n'));
    return parser.finish();
  };
  // Area, temperature, gases and back-pressure on another sheet of key–value pairs fill what
  // the data sheet does not state.
  const withOtherSheets = (table: ParsedTable, dataSheet: ExcelJS.Worksheet): ParsedTable => {
    for (const other of workbook.worksheets) {
      if (other === dataSheet || other.actualRowCount === 0 || other.actualRowCount > 200) continue;
      const pairs = lines(other);
      if (!isKeyValueSheet(pairs)) continue;
      const taken = mergeConditions(table.conditions, readConditions(pairs, '\t'));
      if (taken.length > 0) table.conditions.notes = [...(table.conditions.notes ?? []), `${taken.join(', ')} read from the sheet "${other.name}"`];
    }
    return table;
  };
  if (options.sheet) {
    const sheet = workbook.getWorksheet(options.sheet);
    if (!sheet) throw new CurveFileError('no-sheet', `The workbook has no sheet named "${options.sheet}"; it has: ${sheets.join(', ')}.`);
    return { table: withOtherSheets(parseSheet(sheet), sheet), sha256: await hashFile(path), contentType: XLSX_TYPE, sheets, sheet: sheet.name };
  }
  // No sheet named: the first sheet that holds a table of numbers (a notes sheet in front is common).
  let firstError: unknown = null;
  const withRows = workbook.worksheets.filter((sheet) => sheet.actualRowCount > 0);
  // a sheet of key–value pairs (conditions, notes) is read for its conditions, not as the table
  const tables = withRows.filter((sheet) => sheet.actualRowCount > 200 || !isKeyValueSheet(lines(sheet)));
  for (const sheet of tables.length > 0 ? tables : withRows) {
    try {
      return { table: withOtherSheets(parseSheet(sheet), sheet), sha256: await hashFile(path), contentType: XLSX_TYPE, sheets, sheet: sheet.name };
    } catch (error) {
      if (!(error instanceof CurveFileError) || error.code === 'too-many-rows') throw error;
      firstError ??= error;
    }
  }
  if (firstError instanceof CurveFileError) {
    throw new CurveFileError(firstError.code, `no sheet of the workbook (${sheets.join(', ')}) holds a table of numbers; the first said: ${firstError.message}`, { line: firstError.line, column: firstError.column });
  }
  throw new CurveFileError('empty', 'The workbook has no sheet with data.');
}

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

// Guard in front of the workbook reader: an .xlsx is a zip, and a zip can lie. Before ExcelJS
// sees a workbook, this reads the zip's central directory and inflates only the parts a curve
// needs (workbook, styles, shared strings, the sheets, their tables), counting bytes as they
// inflate — declared sizes are checked first and then not trusted. Media, drawings, charts,
// embedded objects and macros are never inflated. Each sheet is scanned for its cells, highest
// column and row. What passes is written to a small plain workbook the unchanged reader opens.
import fs from 'node:fs';
import yauzl from 'yauzl';
import { zipSync } from 'fflate';
import { AppError } from '../lib/errors';

export interface WorkbookLimits {
  /** expanded bytes of any one part (a sheet, the shared strings) */
  maxPartBytes: number;
  /** expanded bytes of all parts read together */
  maxTotalBytes: number;
  /** expanded ÷ compressed size of a part, checked once a part passes 1 MB */
  maxRatio: number;
  /** cells in the sheet that is read */
  maxCells: number;
  /** highest column of the sheet that is read (1 = A) */
  maxColumns: number;
  /** highest row of the sheet that is read */
  maxRows: number;
}

export interface GuardReport {
  /** parts copied, skipped (never inflated), and sheets replaced by empty ones */
  kept: string[];
  skipped: string[];
  emptied: string[];
  expandedBytes: number;
}

/** a sheet the caller did not ask for is still read when it is this small (notes, key–value sheets) */
const SMALL_SHEET_BYTES = 1 << 20;
const MAX_ENTRIES = 5000;
/** the ratio check starts after this many expanded bytes: small XML parts compress very well */
const RATIO_AFTER_BYTES = 1 << 20;

const ALWAYS = new Set(['[Content_Types].xml', '_rels/.rels', 'xl/workbook.xml', 'xl/_rels/workbook.xml.rels', 'xl/styles.xml', 'xl/sharedStrings.xml']);
const SHEET = /^xl\/worksheets\/sheet\d+\.xml$/;
const SHEET_RELS = /^xl\/worksheets\/_rels\/sheet\d+\.xml\.rels$/;
const KEEP_ALSO = /^(xl\/theme\/theme\d+\.xml|xl\/tables\/table\d+\.xml)$/;
const EMPTY_SHEET = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData/></worksheet>';

const mb = (bytes: number) => `${Number((bytes / 1048576).toFixed(1))} MB`;

function refuse(message: string, limit: string, details: Record<string, unknown> = {}): AppError {
  return new AppError(422, 'workbook-limit', `${message}; nothing was stored. Save the data sheet as CSV, or ask an administrator about ${limit}.`, { limit, ...details });
}

function unreadable(why: string): AppError {
  return new AppError(422, 'bad-xlsx', `The file looks like an .xlsx workbook but its zip structure cannot be read (${why}); open and save it again, or export CSV.`);
}

/** "XFD" → 16384 */
export function columnNumber(letters: string): number {
  let n = 0;
  for (let i = 0; i < letters.length; i++) n = n * 26 + (letters.charCodeAt(i) - 64);
  return n;
}

/** "16384" → "XFD" */
export function columnLetters(n: number): string {
  let out = '';
  for (let k = n; k > 0; k = Math.floor((k - 1) / 26)) out = String.fromCharCode(65 + ((k - 1) % 26)) + out;
  return out;
}

/**
 * Streaming count over sheet XML: cells (`<c …>`), the highest column and row named by cell
 * references, and the most cells in one row (for cells written without a reference).
 */
class SheetScan {
  cells = 0;
  maxColumn = 0;
  maxRow = 0;
  private inRow = 0;
  private maxInRow = 0;
  private tail = '';
  push(chunk: Buffer): void {
    const text = this.tail + chunk.toString('latin1');
    const cut = text.lastIndexOf('<');
    const scan = cut > 0 ? text.slice(0, cut) : text;
    // a tag cut between chunks is scanned with the next chunk; a run without "<" is not kept
    this.tail = cut > 0 && text.length - cut < 4096 ? text.slice(cut) : '';
    const tags = /<(c|row)\b([^>]*)>/g;
    for (let m = tags.exec(scan); m; m = tags.exec(scan)) {
      if (m[1] === 'row') {
        this.inRow = 0;
        const r = /\sr="(\d+)"/.exec(m[2]!);
        if (r) this.maxRow = Math.max(this.maxRow, Number(r[1]));
        else this.maxRow++;
        continue;
      }
      this.cells++;
      this.inRow++;
      if (this.inRow > this.maxInRow) this.maxInRow = this.inRow;
      const ref = /\sr="([A-Z]{1,3})(\d+)"/.exec(m[2]!);
      if (ref) {
        const column = columnNumber(ref[1]!);
        if (column > this.maxColumn) this.maxColumn = column;
        const row = Number(ref[2]);
        if (row > this.maxRow) this.maxRow = row;
      }
    }
  }
  get columns(): number {
    return Math.max(this.maxColumn, this.maxInRow);
  }
}

/** The first limit a scanned sheet passes, as the refusal to give, or null. */
function sheetProblem(title: string, scan: SheetScan, limits: WorkbookLimits, anySheet: boolean): AppError | null {
  const hint = anySheet ? ' (name the sheet to read if another one holds the curve)' : '';
  if (scan.columns > limits.maxColumns) {
    return refuse(`Sheet "${title}" has cells up to column ${columnLetters(scan.columns)} (${scan.columns.toLocaleString('en-US')}), beyond the ${limits.maxColumns.toLocaleString('en-US')} columns read (up to ${columnLetters(limits.maxColumns)})${hint}`, 'the column limit', { sheet: title, maxColumns: limits.maxColumns });
  }
  if (scan.cells > limits.maxCells) {
    return refuse(`Sheet "${title}" holds ${scan.cells.toLocaleString('en-US')} cells, above the ${limits.maxCells.toLocaleString('en-US')} read per sheet${hint}`, 'UPLOAD_XLSX_MAX_CELLS', { sheet: title, maxCells: limits.maxCells });
  }
  if (scan.maxRow > limits.maxRows) {
    return refuse(`Sheet "${title}" reaches row ${scan.maxRow.toLocaleString('en-US')}, beyond the ${limits.maxRows.toLocaleString('en-US')} rows read${hint}`, 'UPLOAD_MAX_ROWS', { sheet: title, maxRows: limits.maxRows });
  }
  return null;
}

function openZip(path: string): Promise<yauzl.ZipFile> {
  return new Promise((resolve, reject) => {
    yauzl.open(path, { lazyEntries: true, autoClose: false, validateEntrySizes: true, strictFileNames: false }, (error, zip) => (error ? reject(unreadable(error.message)) : resolve(zip!)));
  });
}

function listEntries(zip: yauzl.ZipFile): Promise<yauzl.Entry[]> {
  if (zip.entryCount > MAX_ENTRIES) return Promise.reject(refuse(`The workbook holds ${zip.entryCount.toLocaleString('en-US')} parts, more than the ${MAX_ENTRIES.toLocaleString('en-US')} a workbook of curves needs`, 'the workbook limits', { parts: zip.entryCount }));
  return new Promise((resolve, reject) => {
    const entries: yauzl.Entry[] = [];
    zip.on('entry', (entry: yauzl.Entry) => {
      entries.push(entry);
      zip.readEntry();
    });
    zip.on('end', () => resolve(entries));
    zip.on('error', (error: Error) => reject(unreadable(error.message)));
    zip.readEntry();
  });
}

/** Inflate one part, counting: refused the moment it passes the part, total or ratio limit. */
function inflate(zip: yauzl.ZipFile, entry: yauzl.Entry, limits: WorkbookLimits, totalSoFar: number, what: string, scan?: SheetScan): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    zip.openReadStream(entry, (error, stream) => {
      if (error || !stream) return reject(unreadable(error?.message ?? 'no data'));
      const chunks: Buffer[] = [];
      let bytes = 0;
      let failed = false;
      const fail = (problem: AppError) => {
        if (failed) return;
        failed = true;
        stream.destroy();
        reject(problem);
      };
      stream.on('data', (chunk: Buffer) => {
        bytes += chunk.length;
        if (bytes > limits.maxPartBytes) return fail(refuse(`${what} expands to more than ${mb(limits.maxPartBytes)}, the limit per part`, 'UPLOAD_XLSX_MAX_PART_BYTES', { part: entry.fileName, maxBytes: limits.maxPartBytes }));
        if (totalSoFar + bytes > limits.maxTotalBytes) return fail(refuse(`The parts of the workbook a curve needs expand to more than ${mb(limits.maxTotalBytes)} together`, 'UPLOAD_XLSX_MAX_PART_BYTES', { part: entry.fileName, maxBytes: limits.maxTotalBytes }));
        if (bytes > RATIO_AFTER_BYTES && bytes / Math.max(1, entry.compressedSize) > limits.maxRatio) {
          return fail(refuse(`${what} expands more than ${limits.maxRatio} times its compressed size (a zip bomb, or padding)`, 'UPLOAD_XLSX_MAX_RATIO', { part: entry.fileName, maxRatio: limits.maxRatio }));
        }
        scan?.push(chunk);
        chunks.push(chunk);
      });
      // yauzl checks the bytes against the declared size, so a lying header ends up here too
      stream.on('error', (streamError: Error) => fail(unreadable(streamError.message)));
      stream.on('end', () => {
        if (!failed) resolve(Buffer.concat(chunks));
      });
    });
  });
}

function attribute(tag: string, name: string): string | null {
  const m = new RegExp(`\\s${name}="([^"]*)"`).exec(tag);
  return m ? m[1]! : null;
}

function decodeXml(text: string): string {
  return text.replace(/&(amp|lt|gt|quot|apos|#\d+|#x[0-9a-f]+);/gi, (whole, code: string) => {
    const named: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };
    if (named[code.toLowerCase()]) return named[code.toLowerCase()]!;
    const n = code[1] === 'x' || code[1] === 'X' ? parseInt(code.slice(2), 16) : parseInt(code.slice(1), 10);
    return Number.isFinite(n) ? String.fromCodePoint(n) : whole;
  });
}

/** Sheet names → their part names, from workbook.xml and its relationships. */
function sheetParts(workbookXml: string, relsXml: string): { name: string; part: string }[] {
  const targets = new Map<string, string>();
  for (const m of relsXml.matchAll(/<Relationship\b[^>]*>/g)) {
    const id = attribute(m[0], 'Id');
    const target = attribute(m[0], 'Target');
    if (id && target) targets.set(id, target.startsWith('/') ? target.slice(1) : `xl/${target.replace(/^\.\//, '')}`);
  }
  const out: { name: string; part: string }[] = [];
  for (const m of workbookXml.matchAll(/<sheet\b[^>]*>/g)) {
    const name = attribute(m[0], 'name');
    const id = attribute(m[0], 'r:id') ?? attribute(m[0], 'id');
    const part = id ? targets.get(id) : undefined;
    if (name != null && part) out.push({ name: decodeXml(name), part });
  }
  return out;
}

/**
 * A sheet's relationships without what is skipped: hyperlinks and tables stay; a drawing keeps
 * its entry but points nowhere (the reader then skips it); comments, notes, images go.
 */
function trimSheetRels(xml: string): string {
  return xml.replace(/<Relationship\b[^>]*>/g, (tag) => {
    const type = attribute(tag, 'Type') ?? '';
    if (/\/(hyperlink|table)$/.test(type)) return tag;
    if (/\/drawing$/.test(type)) return tag.replace(/\sTarget="[^"]*"/, ' Target="skipped"');
    return '';
  });
}

/**
 * Check the workbook at `sourcePath` and write the parts a curve needs to `targetPath`.
 * `sheet`: the sheet the caller asked for (others larger than 1 MB become empty sheets);
 * without it every sheet is checked, since the reader looks for the first sheet with a table.
 * @throws AppError 422 `workbook-limit` naming the limit passed, or `bad-xlsx` for a broken zip.
 */
export async function guardWorkbook(sourcePath: string, targetPath: string, limits: WorkbookLimits, sheet?: string): Promise<GuardReport> {
  const zip = await openZip(sourcePath);
  try {
    const entries = await listEntries(zip);
    const byName = new Map(entries.map((e) => [e.fileName, e]));
    const report: GuardReport = { kept: [], skipped: [], emptied: [], expandedBytes: 0 };
    const out: Record<string, Uint8Array> = {};
    const read = async (entry: yauzl.Entry, what: string, scan?: SheetScan) => {
      if (entry.uncompressedSize > limits.maxPartBytes) {
        throw refuse(`${what} declares ${mb(entry.uncompressedSize)} expanded, above the ${mb(limits.maxPartBytes)} limit per part`, 'UPLOAD_XLSX_MAX_PART_BYTES', { part: entry.fileName, maxBytes: limits.maxPartBytes });
      }
      if (entry.uncompressedSize > RATIO_AFTER_BYTES && entry.uncompressedSize / Math.max(1, entry.compressedSize) > limits.maxRatio) {
        throw refuse(`${what} declares ${Math.round(entry.uncompressedSize / Math.max(1, entry.compressedSize))} times its compressed size, above the ratio limit of ${limits.maxRatio}`, 'UPLOAD_XLSX_MAX_RATIO', { part: entry.fileName, maxRatio: limits.maxRatio });
      }
      const bytes = await inflate(zip, entry, limits, report.expandedBytes, what, scan);
      report.expandedBytes += bytes.length;
      return bytes;
    };

    const workbookEntry = byName.get('xl/workbook.xml');
    const relsEntry = byName.get('xl/_rels/workbook.xml.rels');
    if (!workbookEntry || !relsEntry) throw unreadable('no xl/workbook.xml');
    const workbookXml = await read(workbookEntry, 'The workbook part');
    const relsXml = await read(relsEntry, 'The workbook relationships');
    out['xl/workbook.xml'] = workbookXml;
    out['xl/_rels/workbook.xml.rels'] = relsXml;
    const sheets = sheetParts(workbookXml.toString('utf8'), relsXml.toString('utf8'));
    const sheetName = new Map(sheets.map((s) => [s.part, s.name]));
    if (sheet !== undefined && !sheets.some((s) => s.name === sheet)) {
      // the reader names the sheets there are; let it say so
      sheet = undefined;
    }

    for (const entry of entries) {
      const name = entry.fileName;
      if (name in out) continue;
      if (name.endsWith('/')) continue;
      if ((entry.generalPurposeBitFlag & 1) !== 0) throw unreadable(`the part ${name} is encrypted`);
      if (SHEET.test(name)) {
        const title = sheetName.get(name) ?? name;
        const wanted = sheet === undefined || title === sheet;
        if (!wanted && entry.uncompressedSize > SMALL_SHEET_BYTES) {
          out[name] = Buffer.from(EMPTY_SHEET);
          report.emptied.push(name);
          continue;
        }
        const scan = new SheetScan();
        const bytes = await read(entry, `Sheet "${title}"`, scan);
        const problem = sheetProblem(title, scan, limits, sheet === undefined);
        if (problem && !wanted) {
          // a sheet nobody asked for is left out rather than refusing the workbook
          out[name] = Buffer.from(EMPTY_SHEET);
          report.emptied.push(name);
          continue;
        }
        if (problem) throw problem;
        out[name] = bytes;
      } else if (SHEET_RELS.test(name)) {
        out[name] = Buffer.from(trimSheetRels((await read(entry, `The relationships of ${name}`)).toString('utf8')));
      } else if (ALWAYS.has(name) || KEEP_ALSO.test(name)) {
        out[name] = await read(entry, `The part ${name}`);
      } else {
        report.skipped.push(name);
        continue;
      }
      report.kept.push(name);
    }
    await fs.promises.writeFile(targetPath, zipSync(out, { level: 0 }));
    return report;
  } finally {
    zip.close();
  }
}

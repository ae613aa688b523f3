// Workbooks built byte by byte for the upload tests: ordinary ones, and hostile ones (huge or
// lying parts, media bombs, cells in the last column) that a station would never write.
import { zipSync, type Zippable } from 'fflate';
import { columnLetters } from '../../server/uploads/workbook-guard';

export type Row = (string | number)[];

const escape = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** Sheet XML with inline strings; `rows[k]` is row k + 1, cells from column A. */
export function sheetXml(rows: Row[], extraCells: string = ''): string {
  const body = rows
    .map((row, r) => `<row r="${r + 1}">${row.map((value, c) => {
      const ref = `${columnLetters(c + 1)}${r + 1}`;
      return typeof value === 'number' ? `<c r="${ref}"><v>${value}</v></c>` : `<c r="${ref}" t="inlineStr"><is><t>${escape(value)}</t></is></c>`;
    }).join('')}</row>`)
    .join('');
  return `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${body}${extraCells}</sheetData></worksheet>`;
}

export interface SheetSpec {
  name: string;
  /** the sheet's XML; default: built from rows */
  xml?: string | Uint8Array;
  rows?: Row[];
}

/** A workbook zip: the sheets in order, plus any extra parts (e.g. xl/media/…), deflated. */
export function workbook(sheets: SheetSpec[], extra: Record<string, Uint8Array> = {}, level: 0 | 6 | 9 = 6): Buffer {
  const enc = (text: string) => new TextEncoder().encode(text);
  const files: Zippable = {
    '[Content_Types].xml': enc(`<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>${sheets.map((_, k) => `<Override PartName="/xl/worksheets/sheet${k + 1}.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>`).join('')}</Types>`),
    '_rels/.rels': enc('<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>'),
    'xl/workbook.xml': enc(`<?xml version="1.0" encoding="UTF-8"?><workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets>${sheets.map((s, k) => `<sheet name="${escape(s.name)}" sheetId="${k + 1}" r:id="rId${k + 1}"/>`).join('')}</sheets></workbook>`),
    'xl/_rels/workbook.xml.rels': enc(`<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${sheets.map((_, k) => `<Relationship Id="rId${k + 1}" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet${k + 1}.xml"/>`).join('')}</Relationships>`),
  };
  sheets.forEach((s, k) => {
    const xml = s.xml ?? sheetXml(s.rows ?? []);
    files[`xl/worksheets/sheet${k + 1}.xml`] = typeof xml === 'string' ? enc(xml) : xml;
  });
  for (const [name, data] of Object.entries(extra)) files[name] = [data, { level: 9 }];
  return Buffer.from(zipSync(files, { level }));
}

/**
 * Make the zip lie: rewrite the declared expanded size of one part, in its local header and in
 * the central directory (APPNOTE.TXT 4.3.7 and 4.3.12: offsets 22 and 24 of each header).
 */
export function declareSize(zip: Buffer, part: string, size: number): Buffer {
  const out = Buffer.from(zip);
  const name = Buffer.from(part);
  for (let at = 0; at < out.length - 4; at++) {
    const signature = out.readUInt32LE(at);
    if (signature === 0x04034b50 && out.subarray(at + 30, at + 30 + name.length).equals(name) && out.readUInt16LE(at + 26) === name.length) out.writeUInt32LE(size, at + 22);
    if (signature === 0x02014b50 && out.subarray(at + 46, at + 46 + name.length).equals(name) && out.readUInt16LE(at + 28) === name.length) out.writeUInt32LE(size, at + 24);
  }
  return out;
}

/** A polarization curve from the semi-empirical fixture model's shape: header + 8 points. */
export const POLARIZATION_ROWS: Row[] = [
  ['Current density (A/cm2)', 'Voltage (V)'],
  [0, 0.98], [0.05, 0.74], [0.1, 0.69], [0.2, 0.62], [0.3, 0.57], [0.4, 0.52], [0.6, 0.45], [0.8, 0.38],
];

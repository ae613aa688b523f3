// A design as comma-separated text for the lab: one line per run in run order, with the
// settings in coded or actual units, through the shared CSV writer (runs in the browser too).
import type { Design } from './types';
import { writeCsv, type CsvCell } from '../../csv/write-csv';

/**
 * CSV of a design: header `runOrder,standardOrder,block,pointType,<factor keys…>` (or, with
 * options.labels, `build,standard order,block,role in the design,<labels…>` and point kinds in
 * options.pointWords), then one
 * row per run in run order; numbers as JavaScript prints them (full precision), text quoted
 * when it holds a comma, quote or line break (RFC 4180), lines ending in CRLF.
 * Text starting with = + − @, tab or CR gets a leading apostrophe (and quotes) so spreadsheets
 * do not run it as a formula (see writeCsv).
 * Reference: RFC 4180 (common format for CSV files); OWASP "CSV injection" guidance for the apostrophe.
 * Cost: O(runs · factors).
 * @throws RangeError when design has no runs list or options.coded is not a boolean.
 * @example designToCsv(design, { coded: false }).split('\r\n')[0] // "runOrder,standardOrder,block,pointType,binderWt"
 */
export function designToCsv(design: Design, options: { coded: boolean; labels?: Record<string, string>; pointWords?: Partial<Record<string, string>> }): string {
  if (design === null || typeof design !== 'object' || !Array.isArray(design.runs) || !Array.isArray(design.factorKeys)) {
    throw new RangeError('designToCsv: design: must be a design returned by generateDesign');
  }
  if (options === null || typeof options !== 'object' || typeof options.coded !== 'boolean') {
    throw new RangeError('designToCsv: options.coded: must be true or false');
  }
  // with labels, a sheet for people: words and units in the header, point kinds in words
  const labels = options.labels;
  const header: CsvCell[] = labels
    ? ['build', 'standard order', 'block', 'role in the design', ...design.factorKeys.map((key) => labels[key] ?? key)]
    : ['runOrder', 'standardOrder', 'block', 'pointType', ...design.factorKeys];
  const rows: CsvCell[][] = [header];
  const ordered = design.runs.slice().sort((first, second) => first.runOrder - second.runOrder);
  for (const run of ordered) {
    const values = options.coded ? run.coded : run.actual;
    const cells: CsvCell[] = [run.runOrder, run.standardOrder, run.block, options.pointWords?.[run.pointType] ?? run.pointType];
    for (const key of design.factorKeys) cells.push(values[key]);
    rows.push(cells);
  }
  return writeCsv(rows, { lineEnd: '\r\n' });
}

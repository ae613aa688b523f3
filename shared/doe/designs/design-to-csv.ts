// A design as comma-separated text for the lab: one line per run in run order, with the
// settings in coded or actual units. Plain string building, so it runs in the browser too.
import type { Design } from './types';

// Cells a spreadsheet would treat as a formula; a leading apostrophe keeps them as text.
const FORMULA_START = /^[=+\-@\t\r]/;

function textCell(text: string): string {
  const safe = FORMULA_START.test(text) ? `'${text}` : text;
  return /[",\r\n]/.test(safe) || safe !== safe.trim() ? `"${safe.replace(/"/g, '""')}"` : safe;
}

function valueCell(value: number | string | undefined): string {
  if (value === undefined) return '';
  if (typeof value === 'number') return String(value);
  return textCell(value);
}

/**
 * CSV of a design: header `runOrder,standardOrder,block,pointType,<factor keys…>` (or, with
 * options.labels, `build,standard order,block,role in the design,<labels…>` and point kinds in
 * options.pointWords), then one
 * row per run in run order; numbers as JavaScript prints them (full precision), text quoted
 * when it holds a comma, quote or line break (RFC 4180), lines ending in CRLF.
 * Text starting with = + - @ gets a leading apostrophe so spreadsheets do not run it as a formula.
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
  const lines: string[] = [];
  // with labels, a sheet for people: words and units in the header, point kinds in words
  const labels = options.labels;
  const header = labels
    ? ['build', 'standard order', 'block', 'role in the design', ...design.factorKeys.map((key) => textCell(labels[key] ?? key))]
    : ['runOrder', 'standardOrder', 'block', 'pointType', ...design.factorKeys.map(textCell)];
  lines.push(header.join(','));
  const ordered = design.runs.slice().sort((first, second) => first.runOrder - second.runOrder);
  for (const run of ordered) {
    const values = options.coded ? run.coded : run.actual;
    const cells = [String(run.runOrder), String(run.standardOrder), String(run.block), textCell(options.pointWords?.[run.pointType] ?? run.pointType)];
    for (const key of design.factorKeys) cells.push(valueCell(values[key]));
    lines.push(cells.join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}

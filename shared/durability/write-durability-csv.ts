// CSV text of a durability log in Cellwright's own plain three-column shape (used by the demo seed
// and tests; the upload parser reads it like any lab file).
import type { CurveData } from '../curves/types';
import { writeCsv } from '../csv/write-csv';

export const DURABILITY_CSV_HEADER = 'Time (h),Current density (A/cm2),Voltage (V)';

/**
 * Writes time (h, 4 decimals), current density (A/cm², 5 decimals) and voltage (V, 6 decimals = 1 µV)
 * as comma-separated lines under DURABILITY_CSV_HEADER, "\n" line ends, trailing newline.
 * Reference: RFC 4180, through the shared writer (plain numeric fields need no quoting).
 * Cost: O(n) time and output size.
 * @throws RangeError when the curve has no time column or its arrays differ in length.
 * @example writeDurabilityCsv(generateSyntheticLog({ ... })).split('\n')[0] // 'Time (h),Current density (A/cm2),Voltage (V)'
 */
export function writeDurabilityCsv(curve: CurveData): string {
  const t = curve.tHours;
  if (!t) throw new RangeError('writeDurabilityCsv: curve must have a time column (tHours), got none');
  if (t.length !== curve.v.length || t.length !== curve.j.length) {
    throw new RangeError(
      `writeDurabilityCsv: time, current and voltage must have the same length, got ${t.length}, ${curve.j.length} and ${curve.v.length}`,
    );
  }
  const rows: string[][] = new Array(t.length + 1);
  rows[0] = DURABILITY_CSV_HEADER.split(',');
  for (let i = 0; i < t.length; i++) {
    rows[i + 1] = [t[i].toFixed(4), curve.j[i].toFixed(5), curve.v[i].toFixed(6)];
  }
  return writeCsv(rows);
}

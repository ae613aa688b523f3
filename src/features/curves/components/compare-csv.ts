// The compare view's CSV: exactly the points shown, one row per point, labelled by build.
import { writeCsv, type CsvCell } from '@shared/csv/write-csv';
import type { PlotSeries } from './polarization-plot';

export function comparedCurvesCsv(series: PlotSeries[]): string {
  const rows: CsvCell[][] = [['build', 'j (A/cm2)', 'V (V)', 'HFR (ohm cm2)']];
  for (const s of series) (s.points.j ?? []).forEach((j, k) => rows.push([s.name, j, s.points.v[k], s.points.hfr?.[k] ?? null]));
  return writeCsv(rows);
}

// The build page's CSV downloads: a curve's points exactly as stored (SI-style units named in the
// header) and its metrics with units, the method and inputs each was read by, and why one is
// missing. Pure: the numbers are written as they are, never rounded.
import { writeCsv } from '@shared/csv/write-csv';
import type { CurvePoints, CurveSummary, ProjectSettings } from '@shared/api-types';
import { CURVE_METRICS, type CurveMetricEntry } from '@shared/curves/metric-catalogue';

const CATALOGUE: Record<string, CurveMetricEntry> = CURVE_METRICS;

/** One row per point: j and V, with HFR and iR-free V where the file has them; logs by time. */
export function curvePointsCsv(points: CurvePoints): string {
  const n = points.v.length;
  const columns: [string, ArrayLike<number | null> | null | undefined][] = [
    ['time (h)', points.tHours],
    ['current density (A/cm²)', points.j],
    ['cell voltage (V)', points.v],
    ['HFR (Ω·cm²)', points.hfr],
    ['iR-free voltage from the file (V)', points.vIrFree],
    ['cell temperature (°C)', points.temperatureC],
    ['frequency (Hz)', points.frequencyHz],
    ['Z′ (Ω·cm²)', points.zReal],
    ['Z″ (Ω·cm²)', points.zImag],
  ];
  // a column is written when it holds at least one number (an impedance spectrum's j and V are blank)
  const kept = columns.filter(([, values]) => values && Array.from({ length: values.length }, (_, k) => values[k]).some((x) => typeof x === 'number' && Number.isFinite(x)));
  const rows = Array.from({ length: n }, (_, k) => kept.map(([, values]) => { const x = values![k]; return typeof x === 'number' && Number.isFinite(x) ? x : ''; }));
  return writeCsv([kept.map(([name]) => name), ...rows]);
}

/** One row per metric of the curve's kind: value in the stored unit, the method, its inputs, any note. */
export function curveMetricsCsv(curve: CurveSummary, build: { code: string }, settings: ProjectSettings): string {
  const header = ['build', 'curve', 'metric', 'value', 'unit', 'method', 'inputs', 'note', 'reference point'];
  const reference = `j_ref ${settings.refCurrentDensity} A/cm², V_ref ${settings.refVoltage} V${settings.irFree ? ', iR-free' : ''}, ${settings.loadingBasis} basis`;
  const rows = Object.entries(curve.metrics)
    .filter(([key, value]) => value != null || curve.metricNotes[key])
    .map(([key, value]) => {
      const entry = CATALOGUE[key];
      const method = curve.method[key];
      const inputs = method ? Object.entries(method.inputs).filter(([, v]) => v != null).map(([k, v]) => `${k}=${v}`).join('; ') : '';
      return [build.code, curve.label, entry?.label ?? key, typeof value === 'number' && Number.isFinite(value) ? value : '', entry?.unit ?? '', method?.method ?? '', inputs, curve.metricNotes[key] ?? '', reference];
    });
  return writeCsv([header, ...rows]);
}

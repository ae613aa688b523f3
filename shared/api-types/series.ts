// The answer of POST /api/projects/:id/series: the API's {kind, points, estimate, low, high, unit}
// plus the members, what was left out and why, what else differs, and the method.
import type { SeriesMismatch, SlopeInterval } from '../series';

export type { SeriesRequestBody } from '../schemas/series';

export interface SeriesMemberReading {
  buildId: number;
  code: string;
  /** °C (temperature) or kPa absolute (pressure) */
  value: number;
  valueUnit: string;
  /** A/cm² used in the fit, or null when the curve does not reach the voltage */
  currentDensity: number | null;
  irFreeCurrentDensity: number | null;
  basis: 'iR-free' | 'kinetic' | null;
  note: string | null;
  method: string;
}

export interface SeriesData {
  kind: 'arrhenius' | 'order';
  variable: 'temperature' | 'pressure';
  atVoltageIrFree: number;
  points: { buildId: number; x: number; y: number }[];
  estimate: number | null;
  low: number | null;
  high: number | null;
  unit: string;
  confidence: number;
  xLabel: string | null;
  yLabel: string | null;
  fit: SlopeInterval | null;
  method: string | null;
  noDependenceWithinNoise: boolean | null;
  basis: 'iR-free' | 'kinetic' | null;
  members: SeriesMemberReading[];
  mismatches: (SeriesMismatch & { code: string })[];
  leftOut: { buildId: number; code: string; reason: string }[];
  seriesKeys: string[];
  selection: 'auto' | 'as-given';
  notes: string[];
}

// Benchmark and reference-curve schemas shared by the client's forms, the server's validation and
// the OpenAPI document. A project's benchmark is one of its builds or one of its reference curves.
import { z } from 'zod';
import type { CurveMetrics } from '../curves/types';
import type { TestConditions } from './project';

const isoDate = z.string().trim().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD');

/** PUT /api/projects/:id/benchmark: exactly one of buildId and referenceCurveId. */
export const benchmarkSetSchema = z
  .object({
    buildId: z.number().int().positive().nullish(),
    referenceCurveId: z.number().int().positive().nullish(),
    note: z.string().trim().max(200).default(''),
  })
  .refine((b) => (b.buildId != null) !== (b.referenceCurveId != null), { message: 'give either buildId or referenceCurveId, not both', path: ['buildId'] });
export type BenchmarkSet = z.input<typeof benchmarkSetSchema>;

/** A multipart number field: empty text is "not given". */
const numberField = (min: number, max: number, unit: string) =>
  z.preprocess((v) => (v === '' || v == null ? undefined : v), z.coerce.number().finite('must be a number').min(min, `below ${min} ${unit}`).max(max, `above ${max} ${unit}`).optional());
const textField = (max: number) => z.preprocess((v) => (v === '' ? undefined : v), z.string().trim().max(max).optional());

/** The fields of POST /api/projects/:id/reference-curves beside the file (multipart). */
export const referenceCurveFieldsSchema = z.object({
  label: z.string().trim().min(1, 'required').max(120),
  source: z.string().trim().min(1, 'required: where the curve comes from').max(300),
  sourceDate: z.preprocess((v) => (v === '' ? undefined : v), isoDate.optional()),
  loadingMgCm2: numberField(0.001, 50, 'mg/cm²'),
  metalLoadingMgCm2: numberField(0.0001, 20, 'mg/cm²'),
  areaCm2: numberField(0.01, 1000, 'cm²'),
  temperatureC: numberField(-20, 300, '°C'),
  backPressureKPa: numberField(0, 1000, 'kPa'),
  anodeGas: textField(40),
  cathodeGas: textField(40),
  notes: z.preprocess((v) => (v == null ? '' : v), z.string().trim().max(2000)),
  /** set this reference curve as the project's benchmark (PIs) */
  makeBenchmark: z.preprocess((v) => v === 'true' || v === '1' || v === 'on' || v === true, z.boolean()).optional(),
});
export type ReferenceCurveFields = z.output<typeof referenceCurveFieldsSchema>;

/** A reference curve as the API answers it: provenance, conditions and metrics at the current reference point. */
export interface ReferenceCurveView {
  id: number;
  projectId: number;
  fileId: number | null;
  fileName: string | null;
  label: string;
  source: string;
  sourceDate: string | null;
  conditions: TestConditions;
  loadingMgCm2: number | null;
  metalLoadingMgCm2: number | null;
  areaCm2: number | null;
  notes: string;
  pointCount: number;
  metrics: CurveMetrics;
  metricNotes: Record<string, string>;
  createdAt: string;
  createdBy: string | null;
}

export interface BenchmarkPoints {
  j: number[];
  v: number[];
  vIrFree: number[] | null;
  hfr: number[] | null;
}

/** The project's benchmark, whichever it is, with what plots and differences need. */
export interface BenchmarkView {
  projectId: number;
  kind: 'build' | 'reference';
  /** how plots and tables name it: the build's code, or the reference curve's label */
  label: string;
  buildId: number | null;
  buildCode: string | null;
  referenceCurveId: number | null;
  /** the curve drawn: the build's polarization curve of record, or the reference curve */
  curveId: number | null;
  /** provenance of a reference curve (source, date) or the build's test date */
  source: string | null;
  sourceDate: string | null;
  conditions: TestConditions;
  note: string;
  setBy: string | null;
  setAt: string;
  /** the values differences are taken from: the build's values, or the reference curve's metrics */
  values: Record<string, number | null>;
  /** the polarization points (null when the benchmark build has no polarization curve) */
  points: BenchmarkPoints | null;
}

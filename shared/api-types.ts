// Shapes of the JSON the API returns, shared by the server (to type its answers) and the client.
import type { FactorDef, ProjectSettings, ResponseDef, TestConditions, ProjectRole } from './schemas/project';
import type { BuildStatus } from './schemas/build';
import type { ColumnMapping, CurveKind, CurveMetrics, FileConditions, MetricMethod } from './curves/types';
import type { RecordCurveIds } from './api-types/record';
import type { SupportCheck } from './doe/model/index';
import type { BoundedValue } from './doe/limits/index';

export type { FactorDef, ResponseDef, ProjectSettings, TestConditions, ProjectRole, BuildStatus };

// Feature answers (and their request bodies), one file per feature.
export type * from './api-types/responses';
export type * from './api-types/durability';
export type * from './api-types/doe';
export type * from './api-types/lineage';
export type * from './api-types/review';
export type * from './schemas/targets';
export type * from './schemas/lots';
export type * from './api-types/uploads';
export type * from './api-types/record';
export type * from './api-types/review-pack';

export interface Me {
  user: { id: number; email: string; name: string; isAdmin: boolean; labId: number | null; labKind: 'home' | 'partner' | null };
  roles: { projectId: number; role: ProjectRole; notify: boolean }[];
  csrfToken: string | null;
}

export interface Project {
  id: number;
  name: string;
  description: string;
  codePrefix: string;
  settings: ProjectSettings;
  metricsVersion: number;
  createdAt: string;
  updatedAt: string | null;
  myRole: ProjectRole | 'admin' | null;
  buildCount?: number;
}

/** A build as a picker shows it (GET /api/projects/:id/builds?view=brief): a few dozen bytes, not a few hundred. */
export type BuildBrief = Pick<Build, 'id' | 'code' | 'changeNote' | 'status' | 'labId' | 'parentId' | 'curveCount' | 'recordCurveIds'>;

export interface Build {
  id: number;
  projectId: number;
  code: string;
  parentId: number | null;
  parentCode: string | null;
  changeNote: string | null;
  factors: Record<string, number | string>;
  loadingMgCm2: number | null;
  metalLoadingMgCm2: number | null;
  areaCm2: number | null;
  catalystLot: string | null;
  /** the lot record the build was made from, if recorded */
  lotId?: number | null;
  /** metal content of that lot's catalyst, wt %, when the lot records it */
  lotMetalWtPct?: number | null;
  labId: number | null;
  labName: string | null;
  operatorId: number | null;
  operatorName: string | null;
  status: BuildStatus;
  builtOn: string | null;
  testedOn: string | null;
  replicateOf: number | null;
  testConditions: TestConditions;
  responses: Record<string, number>;
  /** curve metrics (current metrics version) merged with hand-entered responses */
  values: Record<string, number | null>;
  curveCount: number;
  /** the curve of record of each kind: the curve whose metrics are in `values` */
  recordCurveIds: RecordCurveIds;
  notes: string;
  /** the design the build was planned from (GET /api/projects/:id/designs), or null */
  designId: number | null;
  /** the day it was planned (YYYY-MM-DD), or null for builds recorded without a plan */
  plannedOn: string | null;
  /** why a flagged proposal was planned anyway, or null */
  planReason: string | null;
  createdAt: string;
  updatedAt: string | null;
}

export interface CurveSummary {
  id: number;
  buildId: number;
  fileId: number | null;
  kind: CurveKind;
  label: string;
  mapping: ColumnMapping | null;
  conditions: FileConditions | null;
  pointCount: number;
  metrics: CurveMetrics;
  metricNotes: Record<string, string>;
  method: Record<string, MetricMethod>;
  summary: Record<string, unknown>;
  metricsVersion: number;
  options: Record<string, unknown> | null;
  createdAt: string;
  /** the build's curve of record for this kind (its metrics are the build's values) */
  isRecord: boolean;
}

export interface LineageNode {
  id: number;
  code: string;
  changeNote: string | null;
  status: string;
}

export interface BuildDetail {
  build: Build;
  lineage: { ancestors: LineageNode[]; children: LineageNode[]; replicates: { id: number; code: string; status: string }[]; changeFromParent: string | null };
  curves: CurveSummary[];
  permissions: { edit: boolean; upload: boolean; review: boolean; comment: boolean };
}

export interface CurvePoints {
  j?: number[];
  v: number[];
  hfr?: number[] | null;
  /** the file's own iR-free voltage, V (null where missing) */
  vIrFree?: (number | null)[] | null;
  tHours?: number[] | null;
  temperatureC?: number[] | null;
  /** impedance spectra: frequency (Hz, falling), Z′ and Z″ (Ω·cm², Z″ = Im Z) */
  frequencyHz?: number[];
  zReal?: number[];
  zImag?: number[];
  downsampled: boolean;
  total: number;
}

export interface Lab {
  id: number;
  name: string;
  kind: 'home' | 'partner';
  city: string | null;
}

export interface UploadPreview {
  header: string[];
  rows: string[][];
  rowCount: number;
  headerLine: number;
  delimiter: string;
  decimalComma: boolean;
  conditions: FileConditions;
  detected: ColumnMapping | null;
  applied?: ColumnMapping | null;
  mappingSource?: string;
  /** why an import profile was not used on this file (then the columns were detected), or null */
  profileNote?: string | null;
  ambiguous?: boolean;
  reasons: string[];
  kind: CurveKind;
  sheets?: string[];
  sheet?: string;
  fileName?: string;
  /** the active area the build records, cm² (pre-filled where the file gives none) */
  buildAreaCm2?: number | null;
}

/** What planning a proposal answers: the planned build and why it was flagged, if it was. */
export interface PlanProposalResult {
  build: Build;
  flagged: boolean;
  flags: string[];
  support: SupportCheck;
  limit: BoundedValue;
}
export type * from './api-types/series';

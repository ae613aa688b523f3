// Curve uploads: the form fields sent with a file (POST /api/builds/:id/curves and …/preview)
// and the processing progress of a large upload (GET /api/uploads/:uploadId/progress).
import type { ColumnMapping, CurveKind } from '../curves/types';

export interface UploadFields {
  kind?: CurveKind;
  /** cell area, cm²; default the file's, else the build's */
  areaCm2?: number;
  profileId?: number;
  mapping?: ColumnMapping;
  sheet?: string;
  label?: string;
  saveProfileAs?: string;
  /** random id under which the server reports processing progress */
  uploadId?: string;
}

export type UploadPhase = 'receiving' | 'parsing' | 'measuring' | 'storing' | 'done' | 'error';

export interface UploadProgress {
  uploadId: string;
  phase: UploadPhase;
  /** fraction of the current phase done, 0–1 (parsing: bytes parsed / file size); null when unknown */
  fraction: number | null;
  bytesParsed: number;
  bytesTotal: number;
  /** the stored curve, once done */
  curveId: number | null;
  /** why it stopped, when phase = error */
  message: string | null;
  updatedAt: string;
}

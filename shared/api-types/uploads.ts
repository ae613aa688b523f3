// Curve uploads: the form fields sent with a file (POST /api/builds/:id/curves and …/preview;
// their schema is in shared/schemas/curves) and the processing progress of a large upload
// (GET /api/uploads/:uploadId/progress).

export type { UploadFields } from '../schemas/curves';

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

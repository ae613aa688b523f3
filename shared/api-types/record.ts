// The curve of record: the one curve of each kind that stands for its build. Bodies and answers
// of PUT /api/builds/:id/record and the upload answer's comparison with the record.
import type { CurveKind } from '../curves/types';
import type { BuildStatus } from '../schemas/build';

/** Curve ids of a build's curves of record, by kind; a kind without curves is absent. */
export type RecordCurveIds = Partial<Record<CurveKind, number>>;

export type { RecordChoice } from '../schemas/build';

export interface RecordChange {
  buildId: number;
  kind: CurveKind;
  /** the curve of record before and after; equal when nothing changed */
  fromCurveId: number | null;
  toCurveId: number | null;
  changed: boolean;
  /** set when the change sent a reviewed build back to review */
  status: { from: BuildStatus; to: BuildStatus } | null;
  /** one sentence for the person who acted */
  message: string;
}

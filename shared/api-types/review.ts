// Answers of the review loop: a build's review thread (comments and verdicts) and its audit trail.

export interface ReviewEntry {
  id: number;
  buildId: number;
  userId: number;
  userName: string | null;
  body: string;
  verdict: 'approved' | 'needs-work' | null;
  createdAt: string;
}

/** One line of a build's audit trail (GET /api/builds/:id/audit). */
export interface AuditTrailEntry {
  id: number;
  at: string;
  userId: number | null;
  userName: string | null;
  action: string;
  entity: string;
  entityId: number | null;
  /** field-by-field before → after (empty when the entry records no "before", e.g. a creation) */
  changes: { field: string; from: unknown; to: unknown }[];
  summary: string;
}

// The audit log: who changed what, when, before and after. Cached reads do not depend on it:
// they follow the database's own data version (server/db/data-version.ts).
import type { Db } from '../db';
import { auditLog } from '../db/schema';

export interface AuditEntry {
  userId: number | null;
  action: string;
  entity: string;
  entityId?: number | null;
  projectId?: number | null;
  before?: unknown;
  after?: unknown;
}

export function audit(db: Db, entry: AuditEntry): void {
  db.insert(auditLog)
    .values({
      userId: entry.userId,
      action: entry.action,
      entity: entry.entity,
      entityId: entry.entityId ?? null,
      projectId: entry.projectId ?? null,
      before: entry.before === undefined ? null : stripSecrets(entry.before),
      after: entry.after === undefined ? null : stripSecrets(entry.after),
    })
    .run();
}

function stripSecrets(value: unknown): unknown {
  if (!value || typeof value !== 'object') return value;
  const copy: Record<string, unknown> = { ...(value as Record<string, unknown>) };
  for (const key of ['passwordHash', 'tokenHash', 'csrfToken', 'points']) if (key in copy) delete copy[key];
  return copy;
}

// Site-wide administration: labs, people and their sessions, digests, backups, the outbox and
// the audit log.
import { and, desc, eq, lt, sql, type SQL } from 'drizzle-orm';
import type { z } from 'zod';
import path from 'node:path';
import type { AppContext, AuthUser } from '../context';
import { auditLog, labs, memberships, outbox, projects, sessions, users } from '../db/schema';
import type { AdminPageQuery, labCreateSchema, personUpdateSchema } from '../../shared/schemas/auth';
import { conflict, notFound } from '../lib/errors';
import { audit } from '../lib/audit';
import { sendDigests } from '../review/notify';
import { BACKUP_NAME, createBackup, listBackups } from '../backup/backup';

export function listLabs(ctx: AppContext) {
  return ctx.db.select().from(labs).orderBy(labs.name).all();
}

export function addLab(ctx: AppContext, admin: AuthUser, body: z.output<typeof labCreateSchema>) {
  const { db } = ctx;
  if (db.select({ id: labs.id }).from(labs).where(eq(labs.name, body.name)).get()) throw conflict(`A lab named "${body.name}" already exists.`, { fields: [{ path: 'name', message: 'already used' }] });
  const row = db.insert(labs).values({ name: body.name, kind: body.kind, city: body.city ?? null }).returning().get();
  audit(db, { userId: admin.id, action: 'create', entity: 'lab', entityId: row.id, after: row });
  return row;
}

export function listPeople(ctx: AppContext) {
  const { db } = ctx;
  const people = db
    .select({ id: users.id, email: users.email, name: users.name, isAdmin: users.isAdmin, labId: users.labId, labName: labs.name, disabledAt: users.disabledAt, createdAt: users.createdAt })
    .from(users)
    .leftJoin(labs, eq(labs.id, users.labId))
    .orderBy(users.name)
    .all();
  const roles = db
    .select({ userId: memberships.userId, projectId: memberships.projectId, projectName: projects.name, role: memberships.role })
    .from(memberships)
    .innerJoin(projects, eq(projects.id, memberships.projectId))
    .all();
  return people.map((p) => ({ ...p, roles: roles.filter((r) => r.userId === p.id) }));
}

/** Change a person; disabling ends their sessions. An admin cannot demote or disable themself. */
export function updatePerson(ctx: AppContext, admin: AuthUser, id: number, body: z.output<typeof personUpdateSchema>) {
  const { db } = ctx;
  const before = db.select().from(users).where(eq(users.id, id)).get();
  if (!before) throw notFound(`Person ${id}`);
  if (id === admin.id && (body.isAdmin === false || body.disabled === true)) throw conflict('You cannot remove your own admin rights or disable yourself.');
  if (body.labId != null && !db.select({ id: labs.id }).from(labs).where(eq(labs.id, body.labId)).get()) throw notFound(`Lab ${body.labId}`);
  const now = new Date().toISOString();
  const after = db.transaction((tx) => {
    const row = tx
      .update(users)
      .set({
        ...(body.name !== undefined && { name: body.name }),
        ...(body.isAdmin !== undefined && { isAdmin: body.isAdmin }),
        ...(body.labId !== undefined && { labId: body.labId }),
        ...(body.disabled !== undefined && { disabledAt: body.disabled ? now : null }),
      })
      .where(eq(users.id, id))
      .returning()
      .get();
    if (body.disabled) tx.update(sessions).set({ revokedAt: now }).where(and(eq(sessions.userId, id), sql`${sessions.revokedAt} is null`)).run();
    return row;
  });
  audit(db, { userId: admin.id, action: 'update', entity: 'person', entityId: id, before, after });
  return { id: after.id, email: after.email, name: after.name, isAdmin: after.isAdmin, labId: after.labId, disabledAt: after.disabledAt };
}

/** Sign a person out everywhere; returns how many sessions were ended. */
export function revokePersonSessions(ctx: AppContext, admin: AuthUser, id: number): number {
  const result = ctx.db.update(sessions).set({ revokedAt: new Date().toISOString() }).where(and(eq(sessions.userId, id), sql`${sessions.revokedAt} is null`)).run();
  audit(ctx.db, { userId: admin.id, action: 'revoke', entity: 'session', entityId: id, after: { revoked: result.changes } });
  return result.changes;
}

export async function sendDigestsNow(ctx: AppContext, admin: AuthUser): Promise<number> {
  const sent = await sendDigests(ctx);
  audit(ctx.db, { userId: admin.id, action: 'send', entity: 'digest', after: { sent } });
  return sent;
}

export function backupFolder(ctx: AppContext) {
  return { folder: ctx.env.backupDir, store: ctx.storage.describe(), backups: listBackups(ctx.env.backupDir) };
}

/** One backup at a time per app. */
const backupsRunning = new WeakSet<AppContext>();

/** Write a backup archive now (database copy + raw files + SHA-256 manifest) into BACKUP_DIR. */
export async function backupNow(ctx: AppContext, admin: AuthUser) {
  if (backupsRunning.has(ctx)) throw conflict('A backup is being written right now; wait for it to finish.');
  backupsRunning.add(ctx);
  try {
    const result = await createBackup(ctx, ctx.env.backupDir, { archive: true });
    audit(ctx.db, { userId: admin.id, action: 'create', entity: 'backup', after: { name: result.name, bytes: result.bytes, counts: result.manifest.counts, rawFiles: result.manifest.raw.length } });
    return { name: result.name, bytes: result.bytes, createdAt: result.manifest.createdAt, counts: result.manifest.counts, rawFiles: result.manifest.raw.length, databaseSha256: result.manifest.database.sha256 };
  } finally {
    backupsRunning.delete(ctx);
  }
}

/** The file of one backup archive in BACKUP_DIR, or 404. */
export function backupArchivePath(ctx: AppContext, name: string): string {
  const found = BACKUP_NAME.test(name) && name.endsWith('.tar') && listBackups(ctx.env.backupDir).find((b) => b.name === name && b.archive);
  if (!found) throw notFound(`Backup archive ${name.slice(0, 80)}`);
  return path.join(ctx.env.backupDir, name);
}

export function outboxPage(ctx: AppContext, q: AdminPageQuery) {
  return ctx.db.select().from(outbox).where(q.before ? lt(outbox.id, q.before) : undefined).orderBy(desc(outbox.id)).limit(q.limit).all();
}

export function auditPage(ctx: AppContext, q: AdminPageQuery) {
  const conds: SQL[] = [];
  if (q.before) conds.push(lt(auditLog.id, q.before));
  if (q.projectId) conds.push(eq(auditLog.projectId, q.projectId));
  if (q.entity) conds.push(eq(auditLog.entity, q.entity));
  if (q.entityId) conds.push(eq(auditLog.entityId, q.entityId));
  const rows = ctx.db
    .select({ a: auditLog, userName: users.name })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.userId))
    .where(conds.length ? and(...conds) : undefined)
    .orderBy(desc(auditLog.id))
    .limit(q.limit)
    .all();
  return rows.map((r) => ({ ...r.a, userName: r.userName }));
}

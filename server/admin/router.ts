// Site-wide administration: people, labs, the outbox and the audit log. Admins only,
// except the lab list (names), which every signed-in person needs for build forms.
import { Router } from 'express';
import { z } from 'zod';
import { and, desc, eq, lt, sql, type SQL } from 'drizzle-orm';
import type { AppContext } from '../context';
import { auditLog, labs, memberships, outbox, projects, sessions, users } from '../db/schema';
import { labCreateSchema, personUpdateSchema } from '../../shared/schemas/auth';
import { idParam, parseInput } from '../lib/validate';
import { conflict, forbidden, notFound } from '../lib/errors';
import { requireUser } from '../auth/access';
import { audit } from '../lib/audit';
import { sendDigests } from '../review/notify';
import type { Request } from 'express';
import path from 'node:path';
import { BACKUP_NAME, createBackup, listBackups } from '../backup/backup';

function requireAdmin(req: Request) {
  const user = requireUser(req.user);
  if (!user.isAdmin) throw forbidden('Only site administrators may do this.');
  return user;
}

const pageQuery = z.object({
  before: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
  projectId: z.coerce.number().int().positive().optional(),
  entity: z.string().max(40).optional(),
  entityId: z.coerce.number().int().positive().optional(),
});

export function adminRouter(ctx: AppContext): Router {
  const router = Router();
  const { db } = ctx;

  router.get('/labs', (req, res) => {
    requireUser(req.user);
    res.json({ labs: db.select().from(labs).orderBy(labs.name).all() });
  });

  router.post('/admin/labs', (req, res) => {
    const admin = requireAdmin(req);
    const body = parseInput(labCreateSchema, req.body);
    if (db.select({ id: labs.id }).from(labs).where(eq(labs.name, body.name)).get()) throw conflict(`A lab named "${body.name}" already exists.`, { fields: [{ path: 'name', message: 'already used' }] });
    const row = db.insert(labs).values({ name: body.name, kind: body.kind, city: body.city ?? null }).returning().get();
    audit(db, { userId: admin.id, action: 'create', entity: 'lab', entityId: row.id, after: row });
    res.status(201).json({ lab: row });
  });

  router.get('/admin/people', (req, res) => {
    requireAdmin(req);
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
    res.json({ people: people.map((p) => ({ ...p, roles: roles.filter((r) => r.userId === p.id) })) });
  });

  router.patch('/admin/people/:id', (req, res) => {
    const admin = requireAdmin(req);
    const id = idParam(req.params.id);
    const body = parseInput(personUpdateSchema, req.body);
    const before = db.select().from(users).where(eq(users.id, id)).get();
    if (!before) throw notFound(`Person ${id}`);
    if (id === admin.id && (body.isAdmin === false || body.disabled === true)) throw conflict('You cannot remove your own admin rights or disable yourself.');
    if (body.labId != null && !db.select({ id: labs.id }).from(labs).where(eq(labs.id, body.labId)).get()) throw notFound(`Lab ${body.labId}`);
    const now = new Date().toISOString();
    const after = db
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
    if (body.disabled) db.update(sessions).set({ revokedAt: now }).where(and(eq(sessions.userId, id), sql`${sessions.revokedAt} is null`)).run();
    audit(db, { userId: admin.id, action: 'update', entity: 'person', entityId: id, before, after });
    res.json({ person: { id: after.id, email: after.email, name: after.name, isAdmin: after.isAdmin, labId: after.labId, disabledAt: after.disabledAt } });
  });

  router.post('/admin/people/:id/revoke-sessions', (req, res) => {
    const admin = requireAdmin(req);
    const id = idParam(req.params.id);
    const result = db.update(sessions).set({ revokedAt: new Date().toISOString() }).where(and(eq(sessions.userId, id), sql`${sessions.revokedAt} is null`)).run();
    audit(db, { userId: admin.id, action: 'revoke', entity: 'session', entityId: id, after: { revoked: result.changes } });
    res.json({ revoked: result.changes });
  });

  router.post('/admin/digests/send', async (req, res) => {
    const admin = requireAdmin(req);
    const sent = await sendDigests(ctx);
    audit(db, { userId: admin.id, action: 'send', entity: 'digest', after: { sent } });
    res.json({ sent });
  });

  // Backups: the button on the admin page writes a .tar archive into BACKUP_DIR; it can be downloaded there.
  let backupRunning = false;
  router.get('/admin/backups', (req, res) => {
    requireAdmin(req);
    res.json({ folder: ctx.env.backupDir, store: ctx.storage.describe(), backups: listBackups(ctx.env.backupDir) });
  });

  router.post('/admin/backups', async (req, res) => {
    const admin = requireAdmin(req);
    if (backupRunning) throw conflict('A backup is being written right now; wait for it to finish.');
    backupRunning = true;
    try {
      const result = await createBackup(ctx, ctx.env.backupDir, { archive: true });
      audit(db, { userId: admin.id, action: 'create', entity: 'backup', after: { name: result.name, bytes: result.bytes, counts: result.manifest.counts, rawFiles: result.manifest.raw.length } });
      res.status(201).json({ backup: { name: result.name, bytes: result.bytes, createdAt: result.manifest.createdAt, counts: result.manifest.counts, rawFiles: result.manifest.raw.length, databaseSha256: result.manifest.database.sha256 } });
    } finally {
      backupRunning = false;
    }
  });

  router.get('/admin/backups/:name', (req, res) => {
    requireAdmin(req);
    const name = String(req.params.name);
    const found = BACKUP_NAME.test(name) && name.endsWith('.tar') && listBackups(ctx.env.backupDir).find((b) => b.name === name && b.archive);
    if (!found) throw notFound(`Backup archive ${name.slice(0, 80)}`);
    res.download(path.join(ctx.env.backupDir, name), name);
  });

  router.get('/admin/outbox', (req, res) => {
    requireAdmin(req);
    const q = parseInput(pageQuery, req.query, 'query');
    const rows = db.select().from(outbox).where(q.before ? lt(outbox.id, q.before) : undefined).orderBy(desc(outbox.id)).limit(q.limit).all();
    res.json({ messages: rows });
  });

  router.get('/admin/audit', (req, res) => {
    requireAdmin(req);
    const q = parseInput(pageQuery, req.query, 'query');
    const conds: SQL[] = [];
    if (q.before) conds.push(lt(auditLog.id, q.before));
    if (q.projectId) conds.push(eq(auditLog.projectId, q.projectId));
    if (q.entity) conds.push(eq(auditLog.entity, q.entity));
    if (q.entityId) conds.push(eq(auditLog.entityId, q.entityId));
    const rows = db
      .select({ a: auditLog, userName: users.name })
      .from(auditLog)
      .leftJoin(users, eq(users.id, auditLog.userId))
      .where(conds.length ? and(...conds) : undefined)
      .orderBy(desc(auditLog.id))
      .limit(q.limit)
      .all();
    res.json({ entries: rows.map((r) => ({ ...r.a, userName: r.userName })) });
  });

  return router;
}

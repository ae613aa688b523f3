// Projects, their factors and hand-entered responses, members and invitations.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { AppContext, AuthUser } from '../context';
import { builds, factors, invitations, labs, memberships, projects, responseDefs, users } from '../db/schema';
import type { FactorDef, NotifyBody, ResponseDef, ProjectRole, ProjectSettings } from '../../shared/schemas/project';
import { factorCreateSchema, projectCreateSchema, projectUpdateSchema, responseCreateSchema } from '../../shared/schemas/project';
import { inviteCreateSchema } from '../../shared/schemas/auth';
import type { z } from 'zod';
import { audit } from '../lib/audit';
import { escapeHtml } from '../lib/escape-html';
import type { AppLinks } from '../lib/base-url';
import { AppError, conflict, notFound } from '../lib/errors';
import type { ProjectAccess } from '../auth/access';
import { newToken, sha256 } from '../auth/tokens';
import { recomputeProjectMetrics } from '../curves/service';
import { isCurveMetric } from '../../shared/curves/metric-catalogue';

type ProjectRow = typeof projects.$inferSelect;

export function projectView(row: ProjectRow, role: ProjectRole | 'admin' | null) {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    codePrefix: row.codePrefix,
    settings: row.settings,
    metricsVersion: row.metricsVersion,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
    myRole: role,
  };
}

/** The projects a person may read, with their standing in each: site admins all, others their memberships. */
export function readableProjects(ctx: AppContext, user: AuthUser) {
  const { db } = ctx;
  return user.isAdmin
    ? db.select().from(projects).orderBy(asc(projects.id)).all().map((p) => ({ p, role: 'admin' as const }))
    : db
        .select({ p: projects, role: memberships.role })
        .from(memberships)
        .innerJoin(projects, eq(projects.id, memberships.projectId))
        .where(eq(memberships.userId, user.id))
        .orderBy(asc(projects.id))
        .all();
}

export function listProjects(ctx: AppContext, user: AuthUser) {
  const { db } = ctx;
  const rows = readableProjects(ctx, user);
  const counts = new Map(
    db
      .select({ projectId: builds.projectId, n: sql<number>`count(*)` })
      .from(builds)
      .groupBy(builds.projectId)
      .all()
      .map((r) => [r.projectId, r.n]),
  );
  return rows.map(({ p, role }) => ({ ...projectView(p, role), buildCount: counts.get(p.id) ?? 0 }));
}

/** A new project; its creator becomes its PI (who may create projects is the route's permission). */
export function createProject(ctx: AppContext, user: AuthUser, body: z.output<typeof projectCreateSchema>) {
  const { db } = ctx;
  return db.transaction((tx) => {
    const row = tx.insert(projects).values({ name: body.name, description: body.description, codePrefix: body.codePrefix, settings: body.settings, createdBy: user.id }).returning().get();
    tx.insert(memberships).values({ projectId: row.id, userId: user.id, role: 'pi' }).run();
    audit(tx as never, { userId: user.id, action: 'create', entity: 'project', entityId: row.id, projectId: row.id, after: row });
    return projectView(row, 'pi');
  });
}

export function getProject(ctx: AppContext, access: ProjectAccess) {
  const row = ctx.db.select().from(projects).where(eq(projects.id, access.projectId)).get();
  if (!row) throw notFound(`Project ${access.projectId}`);
  return projectView(row, access.role);
}

export function updateProject(ctx: AppContext, access: ProjectAccess, body: z.output<typeof projectUpdateSchema>) {
  const { db } = ctx;
  const before = db.select().from(projects).where(eq(projects.id, access.projectId)).get()!;
  // settings merge: a form that edits the reference point keeps the rules and prices it does not show
  const settings = body.settings === undefined ? undefined : { ...before.settings, ...body.settings };
  const settingsChanged = settings !== undefined && JSON.stringify(settings) !== JSON.stringify(before.settings);
  const rulesChanged = settings !== undefined && (JSON.stringify(settings.onsetRule ?? null) !== JSON.stringify(before.settings.onsetRule ?? null) || JSON.stringify(settings.holdRule ?? null) !== JSON.stringify(before.settings.holdRule ?? null));
  const after = db
    .update(projects)
    .set({
      ...(body.name !== undefined && { name: body.name }),
      ...(body.description !== undefined && { description: body.description }),
      ...(body.codePrefix !== undefined && { codePrefix: body.codePrefix }),
      ...(settings !== undefined && { settings }),
      ...(settingsChanged && { metricsVersion: before.metricsVersion + 1 }),
      updatedAt: new Date().toISOString(),
    })
    .where(eq(projects.id, access.projectId))
    .returning()
    .get();
  audit(db, { userId: access.user.id, action: 'update', entity: 'project', entityId: after.id, projectId: after.id, before, after });
  let recomputed = 0;
  if (settingsChanged) recomputed = recomputeProjectMetrics(ctx, access.projectId, rulesChanged ? ['polarization', 'durability', 'hold'] : ['polarization']);
  return { ...projectView(after, access.role), recomputedCurves: recomputed };
}

/** Replace the project's metal prices (entered by hand, never fetched); audited, metrics untouched. */
export function setMetalPrices(ctx: AppContext, access: ProjectAccess, prices: NonNullable<ProjectSettings['metalPrices']>) {
  const { db } = ctx;
  const seen = new Set<string>();
  const fields = prices.flatMap((price, index) => {
    const key = price.metal.trim().toLowerCase();
    const repeated = seen.has(key);
    seen.add(key);
    return repeated ? [{ path: `prices.${index}.metal`, message: `${price.metal} is priced twice` }] : [];
  });
  const currencies = new Set(prices.map((price) => price.currency.trim().toUpperCase()));
  if (currencies.size > 1) fields.push({ path: 'prices', message: `one currency for all prices (got ${[...currencies].join(', ')}); no conversion is made` });
  if (fields.length) throw new AppError(400, 'validation', `Invalid request: ${fields.map((f) => `${f.path}: ${f.message}`).join('; ')}`, { fields });
  const before = db.select().from(projects).where(eq(projects.id, access.projectId)).get()!;
  const settings = { ...before.settings, metalPrices: prices };
  const after = db.update(projects).set({ settings, updatedAt: new Date().toISOString() }).where(eq(projects.id, access.projectId)).returning().get();
  audit(db, { userId: access.user.id, action: 'update', entity: 'metal-prices', entityId: after.id, projectId: after.id, before: { metalPrices: before.settings.metalPrices ?? [] }, after: { metalPrices: prices } });
  return { metalPrices: prices };
}

export function factorView(row: typeof factors.$inferSelect): FactorDef {
  return { id: row.id, key: row.key, label: row.label, unit: row.unit, kind: row.kind, low: row.low, high: row.high, levels: row.levels ?? null, testVariable: row.testVariable };
}

export function listFactors(ctx: AppContext, projectId: number): FactorDef[] {
  return ctx.db.select().from(factors).where(eq(factors.projectId, projectId)).orderBy(asc(factors.position), asc(factors.id)).all().map(factorView);
}

export function addFactor(ctx: AppContext, access: ProjectAccess, body: z.output<typeof factorCreateSchema>) {
  const { db } = ctx;
  const exists = db.select({ id: factors.id }).from(factors).where(and(eq(factors.projectId, access.projectId), eq(factors.key, body.key))).get();
  if (exists) throw conflict(`A factor with key "${body.key}" already exists in this project.`, { fields: [{ path: 'key', message: 'already used' }] });
  const position = db.select({ n: sql<number>`count(*)` }).from(factors).where(eq(factors.projectId, access.projectId)).get()!.n;
  const row = db
    .insert(factors)
    .values({
      projectId: access.projectId,
      key: body.key,
      label: body.label,
      unit: body.unit,
      kind: body.kind,
      low: body.kind === 'continuous' ? (body.low ?? null) : null,
      high: body.kind === 'continuous' ? (body.high ?? null) : null,
      levels: body.kind === 'categorical' ? (body.levels ?? []) : null,
      testVariable: body.testVariable,
      position,
    })
    .returning()
    .get();
  audit(db, { userId: access.user.id, action: 'create', entity: 'factor', entityId: row.id, projectId: access.projectId, after: row });
  return factorView(row);
}

export function updateFactor(ctx: AppContext, access: ProjectAccess, factorId: number, body: z.output<typeof factorCreateSchema>) {
  const { db } = ctx;
  const before = db.select().from(factors).where(and(eq(factors.id, factorId), eq(factors.projectId, access.projectId))).get();
  if (!before) throw notFound(`Factor ${factorId}`);
  if (body.key !== before.key) throw new AppError(400, 'validation', 'A factor key cannot change once builds may use it; add a new factor instead.', { fields: [{ path: 'key', message: 'cannot change' }] });
  const after = db
    .update(factors)
    .set({
      label: body.label,
      unit: body.unit,
      kind: body.kind,
      low: body.kind === 'continuous' ? (body.low ?? null) : null,
      high: body.kind === 'continuous' ? (body.high ?? null) : null,
      levels: body.kind === 'categorical' ? (body.levels ?? []) : null,
    })
    .where(eq(factors.id, factorId))
    .returning()
    .get();
  audit(db, { userId: access.user.id, action: 'update', entity: 'factor', entityId: factorId, projectId: access.projectId, before, after });
  return factorView(after);
}

export function responseView(row: typeof responseDefs.$inferSelect): ResponseDef {
  return { id: row.id, key: row.key, label: row.label, unit: row.unit, goal: row.goal, target: row.target };
}

export function listResponses(ctx: AppContext, projectId: number): ResponseDef[] {
  return ctx.db.select().from(responseDefs).where(eq(responseDefs.projectId, projectId)).orderBy(asc(responseDefs.id)).all().map(responseView);
}


export function addResponse(ctx: AppContext, access: ProjectAccess, body: z.output<typeof responseCreateSchema>) {
  const { db } = ctx;
  // Every catalogue key is reserved, computed yet or not, so a hand-entered response never shadows a metric.
  if (isCurveMetric(body.key)) throw conflict(`"${body.key}" is a curve metric; choose another key for a hand-entered response.`, { fields: [{ path: 'key', message: 'reserved for a curve metric' }] });
  const exists = db.select({ id: responseDefs.id }).from(responseDefs).where(and(eq(responseDefs.projectId, access.projectId), eq(responseDefs.key, body.key))).get();
  if (exists) throw conflict(`A response with key "${body.key}" already exists in this project.`, { fields: [{ path: 'key', message: 'already used' }] });
  const row = db.insert(responseDefs).values({ projectId: access.projectId, key: body.key, label: body.label, unit: body.unit, goal: body.goal, target: body.target ?? null }).returning().get();
  audit(db, { userId: access.user.id, action: 'create', entity: 'response', entityId: row.id, projectId: access.projectId, after: row });
  return responseView(row);
}

export function listMembers(ctx: AppContext, projectId: number) {
  const members = ctx.db
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, labId: users.labId, labName: labs.name, notify: memberships.notify, digest: memberships.digest })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .leftJoin(labs, eq(labs.id, users.labId))
    .where(eq(memberships.projectId, projectId))
    .orderBy(asc(users.name))
    .all();
  const pending = ctx.db
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, createdAt: invitations.createdAt })
    .from(invitations)
    .where(and(eq(invitations.projectId, projectId), sql`${invitations.acceptedAt} is null`))
    .all();
  return { members, pendingInvitations: pending };
}

export function setMemberRole(ctx: AppContext, access: ProjectAccess, userId: number, role: ProjectRole) {
  const { db } = ctx;
  const before = db.select().from(memberships).where(and(eq(memberships.projectId, access.projectId), eq(memberships.userId, userId))).get();
  const user = db.select({ id: users.id }).from(users).where(eq(users.id, userId)).get();
  if (!user) throw notFound(`Person ${userId}`);
  if (before?.role === 'pi' && role !== 'pi') {
    const pis = db.select({ n: sql<number>`count(*)` }).from(memberships).where(and(eq(memberships.projectId, access.projectId), eq(memberships.role, 'pi'))).get()!.n;
    if (pis <= 1) throw conflict('A project needs at least one PI; give someone else the PI role before changing this one.');
  }
  if (before) db.update(memberships).set({ role }).where(eq(memberships.id, before.id)).run();
  else db.insert(memberships).values({ projectId: access.projectId, userId, role }).run();
  audit(db, { userId: access.user.id, action: before ? 'update' : 'create', entity: 'membership', entityId: userId, projectId: access.projectId, before, after: { userId, role } });
  return { userId, role };
}

export function removeMember(ctx: AppContext, access: ProjectAccess, userId: number) {
  const { db } = ctx;
  const before = db.select().from(memberships).where(and(eq(memberships.projectId, access.projectId), eq(memberships.userId, userId))).get();
  if (!before) throw notFound(`Member ${userId}`);
  if (before.role === 'pi') {
    const pis = db.select({ n: sql<number>`count(*)` }).from(memberships).where(and(eq(memberships.projectId, access.projectId), eq(memberships.role, 'pi'))).get()!.n;
    if (pis <= 1) throw conflict('A project needs at least one PI; give someone else the PI role first.');
  }
  db.delete(memberships).where(eq(memberships.id, before.id)).run();
  audit(db, { userId: access.user.id, action: 'delete', entity: 'membership', entityId: userId, projectId: access.projectId, before });
  return { ok: true };
}

/** My own e-mail notices for one project: each event, a daily digest, or none. */
export function setNotify(ctx: AppContext, access: ProjectAccess, body: NotifyBody) {
  const { user } = access;
  const row = ctx.db.select().from(memberships).where(and(eq(memberships.projectId, access.projectId), eq(memberships.userId, user.id))).get();
  if (!row) throw notFound('Your membership');
  const next = { notify: body.notify, digest: body.digest ?? row.digest };
  ctx.db.update(memberships).set(next).where(eq(memberships.id, row.id)).run();
  audit(ctx.db, { userId: user.id, action: 'update', entity: 'membership', entityId: user.id, projectId: access.projectId, before: { notify: row.notify, digest: row.digest }, after: next });
  return next;
}

/**
 * Invite someone by e-mail (the links come from emailLinks: the address people use to reach the app). A person who already has an account is added to the project at once
 * (with a notice e-mail) instead of getting an invitation they could never accept.
 */
export async function invite(ctx: AppContext, access: ProjectAccess, body: z.output<typeof inviteCreateSchema>, links: AppLinks) {
  const { db } = ctx;
  const project = db.select().from(projects).where(eq(projects.id, access.projectId)).get()!;
  const account = db.select().from(users).where(eq(users.email, body.email)).get();
  if (account?.passwordHash) return { invitation: null, member: await addExistingAccount(ctx, access, project, account, body, links) };
  if (body.role === 'partner' && body.labId == null) {
    const existing = db.select({ labId: users.labId }).from(users).where(eq(users.email, body.email)).get();
    if (!existing?.labId) throw new AppError(400, 'validation', 'A partner invitation needs the partner lab (labId) the person belongs to.', { fields: [{ path: 'labId', message: 'required for partners' }] });
  }
  if (body.labId != null && !db.select({ id: labs.id }).from(labs).where(eq(labs.id, body.labId)).get()) throw notFound(`Lab ${body.labId}`);
  const token = newToken();
  const expiresAt = new Date(Date.now() + 7 * 86400_000).toISOString();
  const row = db.insert(invitations).values({ tokenHash: sha256(token), email: body.email, projectId: access.projectId, role: body.role, labId: body.labId ?? null, invitedBy: access.user.id, expiresAt }).returning().get();
  const link = links.invitation(token);
  await ctx.mailer.send({
    to: body.email,
    subject: `You are invited to “${project.name}” on Cellwright`,
    text: `${access.user.name} invited you to the project “${project.name}” as ${body.role}.\n\nSet your name and password here (the link works once and expires in 7 days):\n${link}\n`,
    html: `<p>${escapeHtml(access.user.name)} invited you to the project “${escapeHtml(project.name)}” as <b>${body.role}</b>.</p><p><a href="${link}">Accept the invitation</a> — the link works once and expires in 7 days.</p>`,
  });
  audit(db, { userId: access.user.id, action: 'create', entity: 'invitation', entityId: row.id, projectId: access.projectId, after: { email: body.email, role: body.role, labId: body.labId } });
  return { invitation: { id: row.id, email: row.email, role: row.role, expiresAt }, member: null };
}

async function addExistingAccount(ctx: AppContext, access: ProjectAccess, project: ProjectRow, account: typeof users.$inferSelect, body: z.output<typeof inviteCreateSchema>, links: AppLinks) {
  const { db } = ctx;
  const current = db.select().from(memberships).where(and(eq(memberships.projectId, project.id), eq(memberships.userId, account.id))).get();
  if (current) throw new AppError(409, 'already-member', `${account.name} (${account.email}) is already a member of this project as ${current.role}; change the role in the members list instead.`, { userId: account.id, role: current.role });
  if (body.role === 'partner' && body.labId == null && account.labId == null) throw new AppError(400, 'validation', 'A partner needs the partner lab (labId) the person belongs to.', { fields: [{ path: 'labId', message: 'required for partners' }] });
  db.insert(memberships).values({ projectId: project.id, userId: account.id, role: body.role }).run();
  audit(db, { userId: access.user.id, action: 'create', entity: 'membership', entityId: account.id, projectId: project.id, after: { userId: account.id, role: body.role, via: 'invitation of an existing account' } });
  const link = links.project(project.id);
  try {
    await ctx.mailer.send({
      to: account.email,
      subject: `You were added to “${project.name}” on Cellwright`,
      text: `${access.user.name} added you to the project “${project.name}” as ${body.role}.\n\nSign in as usual and open it here:\n${link}\n`,
      html: `<p>${escapeHtml(access.user.name)} added you to the project “${escapeHtml(project.name)}” as <b>${body.role}</b>.</p><p><a href="${link}">Open the project</a> — sign in as usual.</p>`,
    });
  } catch (error) {
    ctx.logger.warn({ err: error, to: account.email }, 'membership notice could not be sent');
  }
  return { userId: account.id, name: account.name, email: account.email, role: body.role, added: true };
}




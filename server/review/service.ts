// The review loop: comments on a build by anyone who may comment, a PI's verdict (which moves
// the build to "reviewed"), the build's audit trail, and the home page's review lists.
import { and, asc, desc, eq, inArray, or, sql } from 'drizzle-orm';
import type { AppContext, AuthUser } from '../context';
import { can, type ProjectAccess } from '../auth/access';
import { auditLog, builds, memberships, projects, reviews, users } from '../db/schema';
import { audit } from '../lib/audit';
import { AppError, conflict } from '../lib/errors';
import { nextStatus } from '../../shared/builds/status';
import type { VerdictBody } from '../../shared/schemas/review';
import { notifyVerdict } from './notify';
import { getBuildItem } from '../builds/service';
import type { AuditTrailEntry, ReviewEntry } from '../../shared/api-types';

type BuildRow = typeof builds.$inferSelect;

export function listThread(ctx: AppContext, buildId: number): ReviewEntry[] {
  return ctx.db
    .select({ id: reviews.id, buildId: reviews.buildId, userId: reviews.userId, userName: users.name, body: reviews.body, verdict: reviews.verdict, createdAt: reviews.createdAt })
    .from(reviews)
    .leftJoin(users, eq(users.id, reviews.userId))
    .where(eq(reviews.buildId, buildId))
    .orderBy(asc(reviews.id))
    .all();
}

function entry(ctx: AppContext, id: number): ReviewEntry {
  return listThread(ctx, ctx.db.select({ b: reviews.buildId }).from(reviews).where(eq(reviews.id, id)).get()!.b).find((r) => r.id === id)!;
}

/** A build's thread with what the caller may add to it. */
export function reviewThread(ctx: AppContext, access: ProjectAccess, build: BuildRow) {
  return { reviews: listThread(ctx, build.id), status: build.status, permissions: { comment: can(access, 'comment'), review: can(access, 'review') } };
}

/** A comment on a build (who may comment is the route's permission). */
export function addComment(ctx: AppContext, access: ProjectAccess, build: BuildRow, body: string): ReviewEntry {
  const row = ctx.db.insert(reviews).values({ buildId: build.id, userId: access.user.id, body, verdict: null }).returning().get();
  audit(ctx.db, { userId: access.user.id, action: 'comment', entity: 'review', entityId: row.id, projectId: build.projectId, after: { buildId: build.id, body } });
  return entry(ctx, row.id);
}

/** A PI's verdict (who may give one is the route's permission): the build becomes reviewed and its author is told. */
/** The verdict that stands on a reviewed build: the latest one, with who gave it and when. */
function standingVerdict(ctx: AppContext, buildId: number) {
  return ctx.db
    .select({ verdict: reviews.verdict, at: reviews.createdAt, by: users.name })
    .from(reviews)
    .innerJoin(users, eq(users.id, reviews.userId))
    .where(and(eq(reviews.buildId, buildId), sql`${reviews.verdict} is not null`))
    .orderBy(desc(reviews.id))
    .limit(1)
    .get();
}

export async function giveVerdict(ctx: AppContext, access: ProjectAccess, build: BuildRow, input: VerdictBody) {
  const step = nextStatus(build.status, { kind: 'verdict' });
  if (!step.ok) {
    throw conflict(`${build.code} is ${build.status}: a verdict needs a build that was made and tested.`, { fields: [{ path: 'verdict', message: `not possible on a ${build.status} build` }] });
  }
  // the same verdict twice on a build nobody has changed since (a new curve of record sends it
  // back to tested): a double click, not a decision; a changed verdict is a deliberate revision
  const standing = build.status === 'reviewed' ? standingVerdict(ctx, build.id) : undefined;
  if (standing && standing.verdict === input.verdict && !input.repeat) {
    const said = input.verdict === 'approved' ? 'approved' : 'marked as needing work';
    throw new AppError(409, 'verdict-already-given', `${build.code} was already ${said} by ${standing.by} on ${standing.at.slice(0, 10)}; nothing was recorded. Send repeat: true to give the same verdict again.`, { fields: [{ path: 'verdict', message: `already ${said}` }] });
  }
  const { row, after } = ctx.db.transaction((tx) => {
    const row = tx.insert(reviews).values({ buildId: build.id, userId: access.user.id, body: input.body, verdict: input.verdict }).returning().get();
    const after = tx.update(builds).set({ status: step.status, updatedAt: new Date().toISOString() }).where(eq(builds.id, build.id)).returning().get();
    return { row, after };
  });
  audit(ctx.db, { userId: access.user.id, action: 'verdict', entity: 'review', entityId: row.id, projectId: build.projectId, after: { buildId: build.id, verdict: input.verdict, body: input.body } });
  if (step.changed) {
    audit(ctx.db, { userId: access.user.id, action: 'update', entity: 'build', entityId: build.id, projectId: build.projectId, before: { status: build.status }, after: { status: after.status } });
  }
  await notifyVerdict(ctx, access.user, build, input.verdict, input.body);
  // the next build waiting for this reviewer, so the queue can be cleared one after another
  const next = awaitingReview(ctx, access.user, 1).find((b) => b.buildId !== build.id) ?? null;
  return { review: entry(ctx, row.id), status: after.status, nextWaiting: next && { buildId: next.buildId, code: next.code, projectId: next.projectId } };
}

/** Who changed what on one build, newest first: the build itself, its curves and its reviews. */
export function buildAuditTrail(ctx: AppContext, build: BuildRow, limit = 200): AuditTrailEntry[] {
  const reviewIds = ctx.db.select({ id: reviews.id }).from(reviews).where(eq(reviews.buildId, build.id)).all().map((r) => r.id);
  const rows = ctx.db
    .select({ a: auditLog, userName: users.name })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.userId))
    .where(
      or(
        and(eq(auditLog.entity, 'build'), eq(auditLog.entityId, build.id)),
        and(
          eq(auditLog.entity, 'curve'),
          or(
            sql`json_extract(${auditLog.after}, '$.buildId') = ${build.id}`,
            sql`json_extract(${auditLog.before}, '$.buildId') = ${build.id}`,
            sql`${auditLog.entityId} in (select id from curves where build_id = ${build.id})`,
          ),
        ),
        reviewIds.length ? and(eq(auditLog.entity, 'review'), inArray(auditLog.entityId, reviewIds)) : sql`0`,
      ),
    )
    .orderBy(desc(auditLog.id))
    .limit(limit)
    .all();
  return rows.map(({ a, userName }) => ({
    id: a.id,
    at: a.at,
    userId: a.userId,
    userName,
    action: a.action,
    entity: a.entity,
    entityId: a.entityId,
    changes: changedFields(a.before, a.after),
    summary: summarize(a.entity, a.action, a.after),
  }));
}

const SKIP = new Set(['updatedAt', 'createdAt', 'id', 'projectId']);

/** Field-by-field before → after for updates; the new values for creations. */
function changedFields(before: unknown, after: unknown): { field: string; from: unknown; to: unknown }[] {
  const b = (before && typeof before === 'object' ? before : {}) as Record<string, unknown>;
  const a = (after && typeof after === 'object' ? after : {}) as Record<string, unknown>;
  if (!before) return [];
  const out: { field: string; from: unknown; to: unknown }[] = [];
  for (const key of new Set([...Object.keys(b), ...Object.keys(a)])) {
    if (SKIP.has(key) || !(key in a)) continue;
    if (JSON.stringify(b[key]) !== JSON.stringify(a[key])) out.push({ field: key, from: b[key] ?? null, to: a[key] ?? null });
  }
  return out;
}

function summarize(entity: string, action: string, after: unknown): string {
  const a = (after && typeof after === 'object' ? after : {}) as Record<string, unknown>;
  if (entity === 'curve' && action === 'upload') return `uploaded ${String(a.kind ?? 'curve')} file “${String(a.file ?? '')}” (${String(a.points ?? '?')} points)${a.isRecord === false ? ', beside the curve of record' : ''}`;
  if (entity === 'curve' && action === 'delete') return 'removed a curve';
  if (entity === 'curve' && action === 'record') {
    const label = a.label ? `“${String(a.label)}”` : 'no curve';
    return a.cause === 'deleted' ? `the ${String(a.kind)} curve of record was removed; now ${label}` : `made ${label} the ${String(a.kind)} curve of record`;
  }
  if (entity === 'curve') return 'changed curve options';
  if (entity === 'review' && action === 'verdict') return `verdict: ${String(a.verdict)} — “${String(a.body ?? '')}”`;
  if (entity === 'review') return `commented: “${String(a.body ?? '')}”`;
  if (entity === 'build' && action === 'create') return 'created the build';
  return `${action} ${entity}`;
}

/** Whole days since a build was tested (YYYY-MM-DD), as of `now`; null without a test date. */
export function daysWaiting(testedOn: string | null, now: Date): number | null {
  const since = testedOn ? Date.parse(`${testedOn}T00:00:00Z`) : NaN;
  return Number.isFinite(since) ? Math.max(0, Math.floor((now.getTime() - since) / 86_400_000)) : null;
}

/**
 * Home: tested builds waiting for a verdict in the projects where I am PI, the longest-waiting
 * last-changed first as before, each with how long it has waited (whole days since it was tested),
 * its V at j_ref and the change from its parent's (both of record, V).
 */
export function awaitingReview(ctx: AppContext, user: AuthUser, limit = 200, now = new Date()) {
  const piProjects = ctx.db.select({ projectId: memberships.projectId }).from(memberships).where(and(eq(memberships.userId, user.id), eq(memberships.role, 'pi'))).all().map((m) => m.projectId);
  if (piProjects.length === 0) return [];
  const rows = ctx.db
    .select({ buildId: builds.id, code: builds.code, projectId: builds.projectId, projectName: projects.name, changeNote: builds.changeNote, status: builds.status, testedOn: builds.testedOn, parentId: builds.parentId })
    .from(builds)
    .innerJoin(projects, eq(projects.id, builds.projectId))
    .where(and(inArray(builds.projectId, piProjects), eq(builds.status, 'tested')))
    .orderBy(desc(sql`coalesce(${builds.updatedAt}, ${builds.testedOn}, ${builds.createdAt})`), desc(builds.id))
    .limit(limit)
    .all();
  const valueOf = (buildId: number | null) => {
    if (buildId == null) return { code: null, value: null };
    const item = getBuildItem(ctx, buildId);
    const value = item.values.vAtRef;
    return { code: item.code, value: typeof value === 'number' ? value : null };
  };
  return rows.map(({ parentId, ...row }) => {
    const own = valueOf(row.buildId);
    const parent = valueOf(parentId);
    return {
      ...row,
      waitingDays: daysWaiting(row.testedOn, now),
      vAtRef: own.value,
      parentCode: parent.code,
      changeFromParent: own.value != null && parent.value != null ? own.value - parent.value : null,
    };
  });
}

/** Home: my builds whose latest verdict is "needs work" (and still stand as reviewed). */
export function needsWork(ctx: AppContext, user: AuthUser, projectIds: number[], limit = 20) {
  if (projectIds.length === 0) return [];
  const mine = ctx.db
    .select({ buildId: builds.id, code: builds.code, projectId: builds.projectId, projectName: projects.name })
    .from(builds)
    .innerJoin(projects, eq(projects.id, builds.projectId))
    .where(and(inArray(builds.projectId, projectIds), eq(builds.status, 'reviewed'), or(eq(builds.createdBy, user.id), eq(builds.operatorId, user.id))))
    .all();
  if (mine.length === 0) return [];
  const verdicts = ctx.db
    .select({ buildId: reviews.buildId, verdict: reviews.verdict, body: reviews.body, id: reviews.id })
    .from(reviews)
    .where(and(inArray(reviews.buildId, mine.map((b) => b.buildId)), sql`${reviews.verdict} is not null`))
    .orderBy(asc(reviews.id))
    .all();
  const latest = new Map<number, { verdict: string | null; body: string; id: number }>();
  for (const v of verdicts) latest.set(v.buildId, v);
  return mine
    .filter((b) => latest.get(b.buildId)?.verdict === 'needs-work')
    .map((b) => ({ ...b, comment: latest.get(b.buildId)!.body, reviewId: latest.get(b.buildId)!.id }))
    .sort((x, y) => y.reviewId - x.reviewId)
    .slice(0, limit)
    .map(({ reviewId: _omit, ...rest }) => rest);
}

// The home page's data: my projects with each one's best build, recent uploads, and the review
// lists (awaiting my verdict, my builds that need work).
import { and, asc, desc, eq, inArray, isNotNull, ne, sql } from 'drizzle-orm';
import type { AppContext, AuthUser } from '../context';
import { builds, curves, files, lots, projects, referenceCurves, responseDefs, users } from '../db/schema';
import { getBuildItem } from '../builds/service';
import { listProjects } from '../projects/service';
import { awaitingReview, needsWork } from '../review/service';
import { targetsForHome } from '../targets/service';

type BestBuild = { buildId: number; code: string; vAtRef: number; changeNote: string | null };

const vAtRef = sql<number>`json_extract(${curves.metrics}, '$.vAtRef')`;

/** Per project: the highest V at j_ref among its polarization curves of record at the project's current reference point, discarded builds left out. */
function bestBuild(ctx: AppContext, projectId: number): BestBuild | null {
  return (
    ctx.db
      .select({ buildId: builds.id, code: builds.code, changeNote: builds.changeNote, vAtRef })
      .from(curves)
      .innerJoin(builds, eq(builds.id, curves.buildId))
      .innerJoin(projects, eq(projects.id, builds.projectId))
      .where(and(eq(builds.projectId, projectId), eq(curves.kind, 'polarization'), eq(curves.isRecord, true), eq(curves.metricsVersion, projects.metricsVersion), ne(builds.status, 'discarded'), isNotNull(vAtRef)))
      .orderBy(desc(vAtRef))
      .limit(1)
      .get() ?? null
  );
}

/**
 * A partner's home: the planned or built builds of its own lab in its projects, each with what it
 * still needs (a polarization curve of record, the project's hand-entered responses).
 */
function waitingForData(ctx: AppContext, user: AuthUser, projectIds: number[]) {
  if (user.labKind !== 'partner' || user.labId == null || projectIds.length === 0) return [];
  const rows = ctx.db
    .select({ id: builds.id, projectName: projects.name })
    .from(builds)
    .innerJoin(projects, eq(projects.id, builds.projectId))
    .where(and(inArray(builds.projectId, projectIds), eq(builds.labId, user.labId), inArray(builds.status, ['planned', 'built'])))
    .orderBy(asc(builds.id))
    .all();
  const defsOf = new Map<number, { key: string; label: string; unit: string }[]>();
  return rows.map((row) => {
    const b = getBuildItem(ctx, row.id);
    if (!defsOf.has(b.projectId)) defsOf.set(b.projectId, ctx.db.select({ key: responseDefs.key, label: responseDefs.label, unit: responseDefs.unit }).from(responseDefs).where(eq(responseDefs.projectId, b.projectId)).all());
    const needs: string[] = [];
    if (!b.recordCurveIds?.polarization) needs.push('a polarization curve');
    for (const def of defsOf.get(b.projectId)!) if (b.responses?.[def.key] == null) needs.push(def.unit ? `${def.label} (${def.unit})` : def.label);
    return { buildId: b.id, code: b.code, projectId: b.projectId, projectName: row.projectName, status: b.status, plannedOn: b.plannedOn, changeNote: b.changeNote, needs };
  });
}

export function homePage(ctx: AppContext, user: AuthUser) {
  const { db } = ctx;
  const myProjects = listProjects(ctx, user);
  const ids = myProjects.map((p) => p.id);
  const recentUploads = ids.length
    ? db
        // what each file belongs to: a build's curve, a catalyst lot's record (a certificate), or a reference curve
        .select({ fileId: files.id, name: files.originalName, uploadedAt: files.uploadedAt, projectId: files.projectId, buildId: files.buildId, buildCode: builds.code, buildStatus: builds.status, uploadedBy: users.name, lotId: files.lotId, lotName: lots.name, referenceCurveId: referenceCurves.id })
        .from(files)
        .leftJoin(builds, eq(builds.id, files.buildId))
        .leftJoin(lots, eq(lots.id, files.lotId))
        .leftJoin(referenceCurves, eq(referenceCurves.fileId, files.id))
        .leftJoin(users, eq(users.id, files.uploadedBy))
        // a partner sees its own uploads (with their review status); others see the projects' latest
        .where(user.labKind === 'partner' ? and(inArray(files.projectId, ids), eq(files.uploadedBy, user.id)) : inArray(files.projectId, ids))
        .orderBy(desc(files.id))
        .limit(8)
        .all()
    : [];
  return {
    projects: myProjects.map((p) => ({ ...p, best: bestBuild(ctx, p.id), targets: targetsForHome(ctx, user, p.id, p.myRole ?? 'viewer') })),
    recentUploads,
    awaitingReview: awaitingReview(ctx, user),
    needsWork: needsWork(ctx, user, ids),
    waitingForData: waitingForData(ctx, user, ids),
  };
}

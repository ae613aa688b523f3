// The home page's data: my projects with each one's best build, recent uploads, and the review
// lists (awaiting my verdict, my builds that need work).
import { and, desc, eq, inArray, isNotNull, ne, sql } from 'drizzle-orm';
import type { AppContext, AuthUser } from '../context';
import { builds, curves, files, projects, users } from '../db/schema';
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

export function homePage(ctx: AppContext, user: AuthUser) {
  const { db } = ctx;
  const myProjects = listProjects(ctx, user);
  const ids = myProjects.map((p) => p.id);
  const recentUploads = ids.length
    ? db
        .select({ fileId: files.id, name: files.originalName, uploadedAt: files.uploadedAt, projectId: files.projectId, buildId: files.buildId, buildCode: builds.code, uploadedBy: users.name })
        .from(files)
        .leftJoin(builds, eq(builds.id, files.buildId))
        .leftJoin(users, eq(users.id, files.uploadedBy))
        .where(inArray(files.projectId, ids))
        .orderBy(desc(files.id))
        .limit(8)
        .all()
    : [];
  return {
    projects: myProjects.map((p) => ({ ...p, best: bestBuild(ctx, p.id), targets: targetsForHome(ctx, user, p.id, p.myRole ?? 'viewer') })),
    recentUploads,
    awaitingReview: awaitingReview(ctx, user),
    needsWork: needsWork(ctx, user, ids),
  };
}

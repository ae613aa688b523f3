// The home page's data: my projects, recent uploads, each project's best build.
import { Router } from 'express';
import { desc, eq, inArray } from 'drizzle-orm';
import type { AppContext } from '../context';
import { builds, curves, files, projects, users } from '../db/schema';
import { requireUser } from '../auth/access';
import { listProjects } from '../projects/service';
import { awaitingReview, needsWork } from '../review/service';

export function homeRouter(ctx: AppContext): Router {
  const router = Router();
  const { db } = ctx;

  router.get('/home', (req, res) => {
    const user = requireUser(req.user);
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
    const best: Record<number, { buildId: number; code: string; vAtRef: number; changeNote: string | null } | null> = {};
    for (const p of myProjects) {
      const version = db.select({ v: projects.metricsVersion }).from(projects).where(eq(projects.id, p.id)).get()!.v;
      const rows = db
        .select({ buildId: builds.id, code: builds.code, changeNote: builds.changeNote, status: builds.status, metrics: curves.metrics, metricsVersion: curves.metricsVersion })
        .from(curves)
        .innerJoin(builds, eq(builds.id, curves.buildId))
        .where(eq(builds.projectId, p.id))
        .all();
      let top: (typeof best)[number] = null;
      for (const r of rows) {
        const v = r.metrics.vAtRef;
        if (r.metricsVersion !== version || r.status === 'discarded' || v == null) continue;
        if (!top || v > top.vAtRef) top = { buildId: r.buildId, code: r.code, vAtRef: v, changeNote: r.changeNote };
      }
      best[p.id] = top;
    }
    res.json({ projects: myProjects.map((p) => ({ ...p, best: best[p.id] })), recentUploads, awaitingReview: awaitingReview(ctx, user), needsWork: needsWork(ctx, user, ids) });
  });

  return router;
}

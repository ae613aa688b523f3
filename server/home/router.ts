// The home page's data: my projects, recent uploads, each project's best build.
import { Router } from 'express';
import { desc, eq, inArray } from 'drizzle-orm';
import type { AppContext } from '../context';
import { builds, files, users } from '../db/schema';
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
    // best build per project: highest V at j_ref among the polarization curves of record at the current version
    const bestOf = db.$client.prepare(
      `select b.id as buildId, b.code, b.change_note as changeNote, json_extract(c.metrics, '$.vAtRef') as vAtRef
       from curves c join builds b on b.id = c.build_id join projects p on p.id = b.project_id
       where b.project_id = ? and c.kind = 'polarization' and c.is_record = 1 and c.metrics_version = p.metrics_version
         and b.status <> 'discarded' and json_extract(c.metrics, '$.vAtRef') is not null
       order by vAtRef desc limit 1`,
    );
    const best: Record<number, { buildId: number; code: string; vAtRef: number; changeNote: string | null } | null> = {};
    for (const p of myProjects) best[p.id] = (bestOf.get(p.id) as (typeof best)[number] | undefined) ?? null;
    res.json({ projects: myProjects.map((p) => ({ ...p, best: best[p.id] })), recentUploads, awaitingReview: awaitingReview(ctx, user), needsWork: needsWork(ctx, user, ids) });
  });

  return router;
}

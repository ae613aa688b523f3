// HTTP for builds: list and create per project, read and update one.
import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { buildCreateSchema, buildUpdateSchema, BUILD_STATUSES } from '../../shared/schemas/build';
import { idParam, parseInput } from '../lib/validate';
import { requireProject } from '../auth/access';
import * as service from './service';
import { curvesForBuild } from '../curves/service';
import { can, requireBuildWrite } from '../auth/access';
import { chooseRecord } from '../curves/record';
import { answerCache, dataVersion } from '../lib/data-version';

const listQuery = z.object({
  status: z.enum(BUILD_STATUSES).optional(),
  limit: z.coerce.number().int().min(1).max(100000).optional(),
  offset: z.coerce.number().int().min(0).optional(),
});

export const recordChoiceSchema = z.object({
  kind: z.enum(['polarization', 'durability', 'hold']).optional(),
  curveId: z.number().int().positive(),
});

export function buildsRouter(ctx: AppContext): Router {
  const router = Router();
  const { db } = ctx;

  // Every member of a project sees the same list, so the serialised answer is shared until the
  // project's next write (server/lib/data-version.ts).
  const listCache = answerCache(64);
  router.get('/projects/:id/builds', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'read');
    const query = parseInput(listQuery, req.query, 'query');
    const key = `${access.projectId}|${dataVersion(access.projectId)}|${query.status ?? ''}|${query.limit ?? ''}|${query.offset ?? ''}`;
    let body = listCache.get(key);
    if (!body) {
      body = JSON.stringify({ builds: service.listBuilds(ctx, access, query) });
      listCache.set(key, body);
    }
    res.type('application/json').send(body);
  });

  router.post('/projects/:id/builds', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'createBuild');
    const body = parseInput(buildCreateSchema, req.body);
    res.status(201).json({ build: service.createBuild(ctx, access, body) });
  });

  router.get('/builds/:id', (req, res) => {
    const { row, access } = service.accessBuild(ctx, req.user, idParam(req.params.id));
    const build = service.getBuildItem(ctx, row.id);
    const partnerOwn = access.role !== 'partner' || (access.user.labId != null && row.labId === access.user.labId);
    res.json({
      build,
      lineage: service.lineage(ctx, row),
      curves: curvesForBuild(ctx, row.id),
      permissions: {
        edit: can(access, 'createBuild') && partnerOwn,
        upload: can(access, 'createBuild') && partnerOwn,
        review: can(access, 'review'),
        comment: can(access, 'comment'),
      },
    });
  });

  // Choose the build's curve of record of one kind (partners: their own lab's builds only).
  router.put('/builds/:id/record', async (req, res) => {
    const { row, access } = service.accessBuild(ctx, req.user, idParam(req.params.id), 'createBuild');
    requireBuildWrite(access, row);
    const body = parseInput(recordChoiceSchema, req.body);
    const record = await chooseRecord(ctx, access, row, body);
    res.json({ record, build: service.getBuildItem(ctx, row.id), curves: curvesForBuild(ctx, row.id) });
  });

  router.patch('/builds/:id', (req, res) => {
    const { row, access } = service.accessBuild(ctx, req.user, idParam(req.params.id), 'createBuild');
    const body = parseInput(buildUpdateSchema, req.body);
    res.json({ build: service.updateBuild(ctx, access, row, body) });
  });

  return router;
}

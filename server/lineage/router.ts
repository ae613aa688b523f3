// HTTP for the lineage view: GET /api/projects/:id/lineage?response=vAtRef
import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { idParam, parseInput } from '../lib/validate';
import { requireProject, requireUser } from '../auth/access';
import { lineageView, projectResponses } from './service';
import type { LineageData } from '../../shared/api-types';

export const lineageQuery = z.object({ response: z.string().trim().min(1).max(64).default('vAtRef') });

export function lineageRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/projects/:id/lineage', (req, res) => {
    requireUser(req.user);
    const access = requireProject(ctx.db, req.user, idParam(req.params.id), 'read');
    const query = parseInput(lineageQuery, req.query, 'query');
    const answer: LineageData = { ...lineageView(ctx, access, query.response), responses: projectResponses(ctx, access.projectId) };
    res.json(answer);
  });
  return router;
}

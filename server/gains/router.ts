// HTTP for gains: GET /api/projects/:id/gains?response=vAtRef&builds=ID,ID,…
import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { idParam, parseInput } from '../lib/validate';
import { requireProject, requireUser } from '../auth/access';
import { gainsFor, MAX_CHAIN } from './service';

export const gainsQuery = z.object({
  response: z.string().trim().min(1).max(64).default('vAtRef'),
  builds: z
    .string()
    .trim()
    .regex(/^\d+(,\d+)*$/, 'must be build ids separated by commas, e.g. 1,4,6')
    .transform((text) => text.split(',').map(Number))
    .refine((ids) => ids.every((id) => id > 0), 'build ids must be positive')
    .refine((ids) => ids.length <= MAX_CHAIN, `at most ${MAX_CHAIN} builds`)
    .optional()
    .describe('build ids in chain order, baseline first; default: the best path of the lineage'),
});

export function gainsRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/projects/:id/gains', (req, res) => {
    requireUser(req.user);
    const access = requireProject(ctx.db, req.user, idParam(req.params.id), 'read');
    const query = parseInput(gainsQuery, req.query, 'query');
    res.json(gainsFor(ctx, access, { response: query.response, builds: query.builds }));
  });
  return router;
}

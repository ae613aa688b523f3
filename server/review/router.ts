// HTTP for the review loop: a build's thread, comments, verdicts and audit trail.
import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { idParam, parseInput } from '../lib/validate';
import { can, requireUser } from '../auth/access';
import { accessBuild } from '../builds/service';
import { addComment, buildAuditTrail, giveVerdict, listThread } from './service';

export const commentSchema = z.object({ body: z.string().trim().min(1, 'write a comment').max(4000, 'at most 4000 characters') });
export const verdictSchema = z.object({
  verdict: z.enum(['approved', 'needs-work']),
  body: z.string().trim().min(1, 'say why, in a sentence or two').max(4000, 'at most 4000 characters'),
});

export function reviewRouter(ctx: AppContext): Router {
  const router = Router();

  router.get('/builds/:id/reviews', (req, res) => {
    requireUser(req.user);
    const { row, access } = accessBuild(ctx, req.user, idParam(req.params.id));
    res.json({ reviews: listThread(ctx, row.id), status: row.status, permissions: { comment: can(access, 'comment'), review: can(access, 'review') } });
  });

  router.post('/builds/:id/reviews', (req, res) => {
    requireUser(req.user);
    const { row, access } = accessBuild(ctx, req.user, idParam(req.params.id), 'comment');
    const body = parseInput(commentSchema, req.body);
    res.status(201).json({ review: addComment(ctx, access, row, body.body) });
  });

  router.post('/builds/:id/verdict', async (req, res) => {
    requireUser(req.user);
    const { row, access } = accessBuild(ctx, req.user, idParam(req.params.id), 'review');
    const body = parseInput(verdictSchema, req.body);
    res.status(201).json(await giveVerdict(ctx, access, row, body));
  });

  router.get('/builds/:id/audit', (req, res) => {
    requireUser(req.user);
    const { row } = accessBuild(ctx, req.user, idParam(req.params.id));
    res.json({ entries: buildAuditTrail(ctx, row) });
  });

  return router;
}

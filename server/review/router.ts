// HTTP for the review loop: a build's thread, comments, verdicts and audit trail, and the
// project's review pack (JSON for the page, PDF for handing out).
import { commentSchema, verdictSchema } from '../../shared/schemas/review';
import { reviewPackQuery } from '../../shared/schemas/review-pack';
import { reviewPack } from './pack';
import { reviewPackPdf } from './pack-pdf';
import { defineFeature, route } from '../lib/route';
import * as review from './service';

export const reviewFeature = defineFeature('review', [
  route({
    method: 'get', path: '/api/builds/{id}/reviews', tag: 'review', permission: { action: 'read', on: 'build' },
    summary: 'A build’s review thread: comments and verdicts',
    handle: ({ ctx, access, build }) => review.reviewThread(ctx, access, build),
  }),
  route({
    method: 'post', path: '/api/builds/{id}/reviews', tag: 'review', permission: { action: 'comment', on: 'build' }, body: commentSchema, status: 201,
    summary: 'Comment on a build (PIs, researchers, partners)',
    handle: ({ ctx, access, build, body }) => ({ review: review.addComment(ctx, access, build, body.body) }),
  }),
  route({
    method: 'post', path: '/api/builds/{id}/verdict', tag: 'review', permission: { action: 'review', on: 'build' }, body: verdictSchema, status: 201,
    summary: 'A PI’s verdict (approved or needs-work) with a comment; the build becomes reviewed and its author is told',
    handle: ({ ctx, access, build, body }) => review.giveVerdict(ctx, access, build, body),
  }),
  route({
    method: 'get', path: '/api/builds/{id}/audit', tag: 'review', permission: { action: 'read', on: 'build' },
    summary: 'Audit trail of one build: who changed what, when (build, curves, reviews)',
    handle: ({ ctx, build }) => ({ entries: review.buildAuditTrail(ctx, build) }),
  }),
  route({
    method: 'get', path: '/api/projects/{id}/review-pack', tag: 'review', permission: { action: 'read', on: 'project' }, query: reviewPackQuery,
    summary: 'The review pack of a project for an optional date range (from, to: YYYY-MM-DD) → {project, period, response, gains (best path), gainsNote, topBuilds, durability, openThreads}',
    handle: ({ ctx, access, query }) => reviewPack(ctx, access, query),
  }),
  route({
    method: 'get', path: '/api/projects/{id}/review-pack.pdf', tag: 'review', permission: { action: 'read', on: 'project' }, query: reviewPackQuery,
    summary: 'The review pack as a PDF (A4, text kept as text), for the same date range',
    handle: async ({ ctx, access, query, res }) => {
      const pack = reviewPack(ctx, access, query);
      const pdf = await reviewPackPdf(pack);
      const name = `review-pack-${pack.project.codePrefix}-${pack.generatedAt.slice(0, 10)}.pdf`;
      res.setHeader('Content-Type', 'application/pdf');
      res.setHeader('Content-Disposition', `attachment; filename="${name}"`);
      res.send(pdf);
    },
  }),
]);

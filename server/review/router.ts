// HTTP for the review loop: a build's thread, comments, verdicts and audit trail.
import { commentSchema, verdictSchema } from '../../shared/schemas/review';
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
]);

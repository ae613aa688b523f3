// HTTP for designed experiments: generate a design, plan its runs as builds, fit a surface,
// propose next builds. Validation here, rules and statistics in the service.
import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { idParam, parseInput } from '../lib/validate';
import { requireProject } from '../auth/access';
import * as service from './service';

const KINDS = ['full-factorial-2', 'fractional-factorial', 'full-factorial-3', 'central-composite', 'box-behnken', 'latin-hypercube'] as const;

const designFactorSchema = z.union([
  z.string().min(1),
  z.object({ key: z.string().min(1), low: z.number().finite().optional(), high: z.number().finite().optional(), levels: z.array(z.string().min(1)).optional() }),
]);

export const designRequestSchema = z.object({
  kind: z.enum(KINDS),
  factors: z.array(designFactorSchema).min(1, 'choose at least one factor'),
  centerPoints: z.number().int().min(0).max(50).optional(),
  replicates: z.number().int().min(1).max(20).optional(),
  blocks: z.number().int().min(1).max(64).optional(),
  blockBy: z.enum(['replicate', 'interaction']).optional(),
  seed: z.number().int().min(0).max(2 ** 31 - 1).optional(),
  randomize: z.boolean().optional(),
  generators: z.array(z.string().min(1)).optional(),
  variant: z.enum(['circumscribed', 'inscribed', 'face-centred']).optional(),
  alpha: z.union([z.enum(['rotatable', 'orthogonal']), z.number().positive().finite()]).optional(),
  runs: z.number().int().min(1).max(4096).optional(),
  maximin: z.boolean().optional(),
  iterations: z.number().int().min(1).max(2000).optional(),
});

const factorValue = z.union([z.number().finite(), z.string().min(1)]);

export const planRunsSchema = z.object({
  runs: z
    .array(
      z.object({
        runOrder: z.number().int().positive(),
        standardOrder: z.number().int().positive().optional(),
        block: z.number().int().positive().optional(),
        pointType: z.string().max(20).optional(),
        actual: z.record(z.string(), factorValue),
      }),
    )
    .min(1, 'at least one run')
    .max(500, 'at most 500 runs at once'),
  parentId: z.number().int().positive().nullish(),
  labId: z.number().int().positive().nullish(),
  labsByBlock: z.record(z.string(), z.number().int().positive()).optional(),
  loadingMgCm2: z.number().positive().max(50).nullish(),
  areaCm2: z.number().positive().max(1000).nullish(),
  note: z.string().trim().max(300).optional(),
  designKind: z.string().max(40).optional(),
  seed: z.number().int().optional(),
  held: z.record(z.string(), factorValue).optional(),
  designSettings: z.record(z.string(), z.unknown()).optional(),
});

const modelSchema = z.union([
  z.enum(['auto', 'linear', 'interactions', 'quadratic']),
  z.object({ terms: z.array(z.string().min(1)).min(1, 'at least one term') }),
]);

export const surfaceRequestSchema = z.object({
  response: z.string().min(1),
  model: modelSchema.default('linear'),
  factors: z.array(z.string().min(1)).min(1, 'choose at least one factor').optional(),
  exclude: z.array(z.number().int().positive()).optional(),
});

export const proposalsRequestSchema = surfaceRequestSchema.extend({
  goal: z.union([z.enum(['maximize', 'minimize']), z.object({ target: z.number().finite() })]).optional(),
  count: z.number().int().min(1).max(50).default(3),
  strategy: z.enum(['exploit', 'explore', 'balance']).optional(),
  constraints: z
    .object({
      fixed: z.record(z.string(), factorValue).optional(),
      bounds: z.record(z.string(), z.object({ min: z.number().finite().optional(), max: z.number().finite().optional() })).optional(),
    })
    .optional(),
  seed: z.number().int().min(0).max(2 ** 31 - 1).optional(),
  exploratory: z.number().int().min(0).max(5).optional(),
});

export const planProposalSchema = surfaceRequestSchema.extend({
  recipe: z.record(z.string(), factorValue),
  reason: z.string().trim().max(1000).optional(),
  parentId: z.number().int().positive().nullish(),
  changeNote: z.string().trim().max(500).optional(),
});

export function doeRouter(ctx: AppContext): Router {
  const router = Router();
  const { db } = ctx;

  router.post('/projects/:id/designs', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'plan');
    const body = parseInput(designRequestSchema, req.body);
    res.json(service.generateProjectDesign(ctx, access, body));
  });

  router.post('/projects/:id/designs/plan', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'plan');
    const body = parseInput(planRunsSchema, req.body);
    res.status(201).json(service.planDesignRuns(ctx, access, body));
  });

  router.get('/projects/:id/designs', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'read');
    res.json({ designs: service.listProjectDesigns(ctx, access) });
  });

  router.post('/projects/:id/proposals/plan', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'plan');
    const body = parseInput(planProposalSchema, req.body);
    res.status(201).json(service.planProposal(ctx, access, body));
  });

  router.post('/projects/:id/surface', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'fit');
    const body = parseInput(surfaceRequestSchema, req.body);
    res.json(service.fitProjectSurface(ctx, access, body));
  });

  router.post('/projects/:id/proposals', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'fit');
    const body = parseInput(proposalsRequestSchema, req.body);
    res.json(service.proposeProjectBuilds(ctx, access, body));
  });

  return router;
}

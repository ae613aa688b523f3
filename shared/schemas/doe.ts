// Designed-experiment request schemas: generate a design, plan its runs as builds, fit a
// response surface, propose the next builds, plan one proposal.
import { z } from 'zod';
import { responseFieldDescription } from '../curves/metric-catalogue';
import type { DesignKind } from '../doe/designs/types';

export const DESIGN_KINDS = ['full-factorial-2', 'fractional-factorial', 'full-factorial-3', 'central-composite', 'box-behnken', 'latin-hypercube'] as const satisfies readonly DesignKind[];

const designFactorSchema = z.union([
  z.string().min(1),
  z.object({ key: z.string().min(1), low: z.number().finite().optional(), high: z.number().finite().optional(), levels: z.array(z.string().min(1)).optional() }),
]);

/** POST /api/projects/:id/designs: a design over project factors, named by key or with a range / level choice. */
export const designRequestSchema = z.object({
  kind: z.enum(DESIGN_KINDS),
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
export type DesignBody = z.infer<typeof designRequestSchema>;
/** One factor of a design request with a narrower range or a subset of levels. */
export type DesignFactorChoice = Exclude<DesignBody['factors'][number], string>;

const factorValue = z.union([z.number().finite(), z.string().min(1)]);

const planRunSchema = z.object({
  runOrder: z.number().int().positive(),
  standardOrder: z.number().int().positive().optional(),
  block: z.number().int().positive().optional(),
  pointType: z.string().max(20).optional(),
  actual: z.record(z.string(), factorValue),
});
export type PlanRun = z.infer<typeof planRunSchema>;

/** POST /api/projects/:id/designs/plan: design runs to planned builds, all or none. */
export const planRunsSchema = z.object({
  runs: z.array(planRunSchema).min(1, 'at least one run').max(500, 'at most 500 runs at once'),
  parentId: z.number().int().positive().nullish(),
  /** lab of every run, unless its block has its own entry in labsByBlock */
  labId: z.number().int().positive().nullish(),
  /** block number → lab id */
  labsByBlock: z.record(z.string(), z.number().int().positive()).optional(),
  loadingMgCm2: z.number().positive().max(50).nullish(),
  areaCm2: z.number().positive().max(1000).nullish(),
  /** what the design is for, written into each build's change note */
  note: z.string().trim().max(300).optional(),
  /** design kind and seed, recorded in each build's notes so the plan can be traced */
  designKind: z.string().max(40).optional(),
  seed: z.number().int().optional(),
  /** values for the project factors the design does not vary, so every build carries every factor */
  held: z.record(z.string(), factorValue).optional(),
  /** how the design was made (variant, α, centre points, blocks…), kept with the stored design */
  designSettings: z.record(z.string(), z.unknown()).optional(),
});
export type PlanRunsBody = z.infer<typeof planRunsSchema>;

const modelSchema = z.union([
  z.enum(['auto', 'linear', 'interactions', 'quadratic']),
  z.object({ terms: z.array(z.string().min(1)).min(1, 'at least one term') }),
]);

/** POST /api/projects/:id/surface */
export const surfaceRequestSchema = z.object({
  response: z.string().min(1).describe(responseFieldDescription()),
  /** a model, or "auto": the simplest adequate model the builds support, chosen by leave-one-out error */
  model: modelSchema.default('linear'),
  /** factor keys to fit over; default every factor of the project that can be estimated */
  factors: z.array(z.string().min(1)).min(1, 'choose at least one factor').optional(),
  /** builds to leave out of the fit (e.g. a known bad electrode) */
  exclude: z.array(z.number().int().positive()).optional(),
});
export type SurfaceRequest = z.infer<typeof surfaceRequestSchema>;

/** POST /api/projects/:id/proposals */
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
  /** extra exploratory proposals, outside the trust region and labelled so (default 0) */
  exploratory: z.number().int().min(0).max(5).optional(),
});
export type ProposalsRequest = z.infer<typeof proposalsRequestSchema>;

/** POST /api/projects/:id/proposals/plan: the fit a proposal came from, the recipe, and a reason when it is flagged. */
export const planProposalSchema = surfaceRequestSchema.extend({
  recipe: z.record(z.string(), factorValue),
  /** required (a sentence) when the recipe is outside the builds' support or at a physical limit */
  reason: z.string().trim().max(1000).optional(),
  parentId: z.number().int().positive().nullish(),
  changeNote: z.string().trim().max(500).optional(),
});
export type PlanProposalBody = z.infer<typeof planProposalSchema>;

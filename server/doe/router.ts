// HTTP for designed experiments: generate a design, plan its runs as builds, list planned
// designs, fit a surface, propose next builds and plan one of them.
import { designRequestSchema, planProposalSchema, planRunsSchema, proposalsRequestSchema, surfaceRequestSchema } from '../../shared/schemas/doe';
import { defineFeature, route } from '../lib/route';
import * as doe from './service';

export const doeFeature = defineFeature('doe', [
  route({
    method: 'post', path: '/api/projects/{id}/designs', tag: 'plan', permission: { action: 'plan', on: 'project' }, body: designRequestSchema,
    summary: 'Generate a design over the project’s factors (2^k, 2^(k−p), 3^k, central composite, Box–Behnken, Latin hypercube) → runs in coded and actual units with alias structure; not stored',
    handle: ({ ctx, access, body }) => doe.generateProjectDesign(ctx, access, body),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/designs/plan', tag: 'plan', permission: { action: 'plan', on: 'project' }, body: planRunsSchema, status: 201,
    summary: 'Turn design runs into planned builds (codes assigned, optional parent, lab per block; factors not in the design at the held values or the parent’s); all or none. The design is stored and each build links to it (designId) with its planned date → {builds, designId}',
    handle: ({ ctx, access, body }) => doe.planDesignRuns(ctx, access, body),
  }),
  route({
    method: 'get', path: '/api/projects/{id}/designs', tag: 'plan', permission: { action: 'read', on: 'project' },
    summary: 'Designs whose runs were planned as builds, newest first → {designs: [{id, kind, seed, runCount, note, settings, createdAt, createdByName, builds}]}',
    handle: ({ ctx, access }) => ({ designs: doe.listProjectDesigns(ctx, access) }),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/surface', tag: 'surface', permission: { action: 'fit', on: 'project' }, body: surfaceRequestSchema,
    summary: 'Fit a response surface on tested and reviewed builds (model "auto": the simplest adequate model by leave-one-out error) → coefficients (coded and actual) with SE, t, p, ANOVA, R², adjusted R², predicted R², RMSE, VIF, warnings; plus model (choice and candidates), support, quality (leave-one-out error vs replicate spread), effects over each factor’s range, limits, trustRegion. A model the builds cannot support is refused with 422 (too-few-runs, aliased-terms) before fitting',
    handle: ({ ctx, access, body }) => doe.fitProjectSurface(ctx, access, body),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/proposals', tag: 'surface', permission: { action: 'fit', on: 'project' }, body: proposalsRequestSchema,
    summary: 'Next builds from the fitted surface → {proposals: [{factors, predicted (held inside physical limits), modelPredicted, low, high, kind (supported | exploratory), reason, extrapolation, support, limit, flags, flagged, nearest, cautions}]}',
    handle: ({ ctx, access, body }) => doe.proposeProjectBuilds(ctx, access, body),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/proposals/plan', tag: 'surface', permission: { action: 'plan', on: 'project' }, body: planProposalSchema, status: 201,
    summary: 'Plan one proposal as a build: the server refits the request and checks the recipe; a flagged recipe (outside the builds’ support, at a physical limit) needs a reason, stored on the build (planReason) → 201 {build, flagged, flags, support, limit}; 422 reason-required',
    handle: ({ ctx, access, body }) => doe.planProposal(ctx, access, body),
  }),
]);

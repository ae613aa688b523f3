// Routes of curves, gains, review, designs, surface and proposals, documented beside the core ones.
import { z } from 'zod';
import type { RouteDoc } from './openapi';
import { conditionChoiceSchema, uploadFieldsSchema } from './curves/router';
import { designRequestSchema, planProposalSchema, planRunsSchema, proposalsRequestSchema, surfaceRequestSchema } from './doe/router';
import { gainsQuery } from './gains/router';
import { lineageQuery } from './lineage/router';
import { commentSchema, verdictSchema } from './review/router';
import { recordChoiceSchema } from './builds/router';

const fileField = z.string().describe('the file (CSV, TSV, TXT or XLSX)');

export const extraRoutes: RouteDoc[] = [
  { method: 'post', path: '/api/builds/{id}/curves', summary: 'Upload a curve file: 201 {curve, recordCurve} or 422 naming file, line and column, with nothing stored. The first curve of a kind becomes the build’s curve of record (curve.isRecord); a later one is stored beside it and changes no value until chosen (PUT /api/builds/{id}/record); recordCurve is the record of that kind. curve.summary.importNotes says what was done on the way in; curve.summary.conditionMismatches lists file vs build conditions', multipart: { file: fileField, ...uploadFieldsSchema.shape }, tag: 'curves' },
  { method: 'post', path: '/api/builds/{id}/curves/preview', summary: 'Detect columns and units of a file without storing it', multipart: { file: fileField, ...uploadFieldsSchema.shape }, tag: 'curves' },
  { method: 'get', path: '/api/curves/{id}', summary: 'Curve points and metrics (long logs downsampled: maxPoints, fromHours, toHours)', tag: 'curves' },
  { method: 'patch', path: '/api/curves/{id}', summary: 'Relabel a curve or set durability options (break-in, windows, loss fraction)', body: z.object({ label: z.string().optional(), breakInHours: z.number().optional(), windows: z.array(z.object({ fromHours: z.number(), toHours: z.number() })).optional(), lossFraction: z.number().optional() }), tag: 'curves' },
  { method: 'post', path: '/api/curves/{id}/conditions', summary: 'Settle a condition on which the file and the build differ (summary.conditionMismatches): chosen "file" makes the build record the file\'s value, "build" keeps it; an area that changes the conversion of total current re-measures the curve. Audited. Answers {curve, build}', body: conditionChoiceSchema, tag: 'curves' },
  { method: 'delete', path: '/api/curves/{id}', summary: 'Remove a curve (the raw file stays) → {ok, record}: when it was the curve of record, the oldest remaining curve of its kind takes over (record says which; a reviewed build goes back to review)', tag: 'curves' },
  { method: 'put', path: '/api/builds/{id}/record', summary: 'Choose the build’s curve of record of one kind → {record: {kind, fromCurveId, toCurveId, changed, status, message}, build, curves}. A reviewed build goes back to review (status tested) and its PIs are told; audited. Partners: their own lab’s builds only', body: recordChoiceSchema, tag: 'builds' },
  { method: 'get', path: '/api/files/{id}/raw', summary: 'The uploaded bytes, unchanged', tag: 'curves' },
  { method: 'get', path: '/api/projects/{id}/import-profiles', summary: 'Saved column/unit mappings', tag: 'curves' },
  { method: 'post', path: '/api/projects/{id}/import-profiles', summary: 'Save a column/unit mapping for a lab’s file shape', body: z.object({ name: z.string(), labId: z.number().nullish(), kind: z.enum(['polarization', 'durability', 'hold']).optional(), mapping: z.record(z.string(), z.object({ header: z.string(), unit: z.string() })) }), tag: 'curves' },
  { method: 'delete', path: '/api/import-profiles/{id}', summary: 'Remove an import profile', tag: 'curves' },
  { method: 'get', path: '/api/uploads/{uploadId}/progress', summary: 'Processing progress of an upload sent with an uploadId field: phase (receiving, parsing, measuring, storing, done, error) and fraction; JSON for polling, or server-sent events with Accept: text/event-stream', tag: 'curves' },
  { method: 'get', path: '/api/projects/{id}/durability', summary: 'Durability comparison: every durability / hold curve of the project (isRecord marks each build’s curves of record) with rate ± 95 % interval (µV/h), hours run, break-in and held conditions', tag: 'curves' },
  { method: 'post', path: '/api/projects/{id}/designs', summary: 'Generate a design over the project’s factors (2^k, 2^(k−p), 3^k, central composite, Box–Behnken, Latin hypercube) → runs in coded and actual units with alias structure; not stored', body: designRequestSchema, tag: 'plan' },
  { method: 'post', path: '/api/projects/{id}/designs/plan', summary: 'Turn design runs into planned builds (codes assigned, optional parent, lab per block; factors not in the design at the held values or the parent’s); all or none. The design is stored and each build links to it (designId) with its planned date → {builds, designId}', body: planRunsSchema, tag: 'plan' },
  { method: 'get', path: '/api/projects/{id}/designs', summary: 'Designs whose runs were planned as builds, newest first → {designs: [{id, kind, seed, runCount, note, settings, createdAt, createdByName, builds}]}', tag: 'plan' },
  { method: 'post', path: '/api/projects/{id}/surface', summary: 'Fit a response surface on tested and reviewed builds (model "auto": the simplest adequate model by leave-one-out error) → coefficients (coded and actual) with SE, t, p, ANOVA, R², adjusted R², predicted R², RMSE, VIF, warnings; plus model (choice and candidates), support, quality (leave-one-out error vs replicate spread), effects over each factor’s range, limits, trustRegion. A model the builds cannot support is refused with 422 (too-few-runs, aliased-terms) before fitting', body: surfaceRequestSchema, tag: 'surface' },
  { method: 'post', path: '/api/projects/{id}/proposals', summary: 'Next builds from the fitted surface → {proposals: [{factors, predicted (held inside physical limits), modelPredicted, low, high, kind (supported | exploratory), reason, extrapolation, support, limit, flags, flagged, nearest, cautions}]}', body: proposalsRequestSchema, tag: 'surface' },
  { method: 'post', path: '/api/projects/{id}/proposals/plan', summary: 'Plan one proposal as a build: the server refits the request and checks the recipe; a flagged recipe (outside the builds’ support, at a physical limit) needs a reason, stored on the build (planReason) → 201 {build, flagged, flags, support, limit}; 422 reason-required', body: planProposalSchema, tag: 'surface' },
  { method: 'get', path: '/api/projects/{id}/gains', summary: 'Gains waterfall along a chain of builds (default: the lineage’s best path) → {response, unit, steps: [{buildId, code, value, gain, low, high, withinNoise, n, sd, method, note, changeNote, changeText}], total}; values in the response’s internal unit', query: gainsQuery, tag: 'gains' },
  { method: 'get', path: '/api/projects/{id}/lineage', summary: 'Lineage tree of replicate groups with the chosen response (mean, SD, n), recipe changes from each parent, best path', query: lineageQuery, tag: 'gains' },
  { method: 'get', path: '/api/builds/{id}/reviews', summary: 'A build’s review thread: comments and verdicts', tag: 'review' },
  { method: 'post', path: '/api/builds/{id}/reviews', summary: 'Comment on a build (PIs, researchers, partners)', body: commentSchema, tag: 'review' },
  { method: 'post', path: '/api/builds/{id}/verdict', summary: 'A PI’s verdict (approved or needs-work) with a comment; the build becomes reviewed and its author is told', body: verdictSchema, tag: 'review' },
  { method: 'get', path: '/api/builds/{id}/audit', summary: 'Audit trail of one build: who changed what, when (build, curves, reviews)', tag: 'review' },
];

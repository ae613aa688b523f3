// HTTP for curves: multipart upload (streamed to disk by multer) and preview, points, options,
// conditions, removal, raw bytes, import profiles, and the project's durability comparison.
import type { Request } from 'express';
import { pipeline } from 'node:stream/promises';
import type { AppContext } from '../context';
import { conditionChoiceSchema, curvePatchSchema, importProfileCreateSchema, pointsQuery, uploadFieldsSchema } from '../../shared/schemas/curves';
import type { UploadFields } from '../../shared/schemas/curves';
import type { ProjectAccess } from '../auth/access';
import { defineFeature, route } from '../lib/route';
import { receiveFile, receivedFile, removeReceivedFile, tableReadWhileReceived } from '../lib/receive-file';
import { silentProgress, trackUpload } from '../uploads/progress';
import * as curves from './service';
import { durabilityAnswer } from './durability';

async function upload(ctx: AppContext, req: Request, access: ProjectAccess, build: Parameters<typeof curves.ingestUpload>[2], fields: UploadFields, previewOnly: boolean) {
  const file = receivedFile(req);
  const { uploadId, ...options } = fields;
  const progress = uploadId && !previewOnly ? trackUpload(access.user.id, uploadId, file.size) : silentProgress;
  try {
    const result = await curves.ingestUpload(ctx, access, build, { tmpPath: file.tmpPath, originalName: file.originalName, size: file.size, tableRead: tableReadWhileReceived(req) }, { ...options, previewOnly, progress });
    progress.done('curve' in result && result.curve ? result.curve.id : null);
    return result;
  } catch (error) {
    progress.fail(error instanceof Error ? error.message : String(error));
    throw error;
  }
}

export const curvesFeature = defineFeature('curves', [
  route({
    method: 'post', path: '/api/builds/{id}/curves', tag: 'curves', permission: { action: 'uploadCurves', on: 'build' }, multipart: uploadFieldsSchema, status: 201,
    summary: 'Upload a curve file: 201 {curve, recordCurve} or 422 naming file, line and column, with nothing stored. The first curve of a kind becomes the build’s curve of record (curve.isRecord); a later one is stored beside it and changes no value until chosen (PUT /api/builds/{id}/record); recordCurve is the record of that kind. curve.summary.importNotes says what was done on the way in; curve.summary.conditionMismatches lists file vs build conditions',
    before: (ctx) => [receiveFile(ctx, { parseText: true })],
    cleanup: removeReceivedFile,
    handle: ({ ctx, req, access, build, fields }) => upload(ctx, req, access, build, fields, false),
  }),
  route({
    method: 'post', path: '/api/builds/{id}/curves/preview', tag: 'curves', permission: { action: 'uploadCurves', on: 'build' }, multipart: uploadFieldsSchema,
    summary: 'Detect columns and units of a file without storing it',
    before: (ctx) => [receiveFile(ctx, { parseText: true })],
    cleanup: removeReceivedFile,
    handle: ({ ctx, req, access, build, fields }) => upload(ctx, req, access, build, fields, true),
  }),
  route({
    method: 'get', path: '/api/curves/{id}', tag: 'curves', permission: { action: 'read', on: 'curve' }, query: pointsQuery,
    summary: 'Curve points and metrics (long logs downsampled: maxPoints, fromHours, toHours)',
    handle: ({ ctx, curve, query }) => ({ curve: curves.curveView(curve), points: curves.curvePoints(ctx, curve, query) }),
  }),
  route({
    method: 'patch', path: '/api/curves/{id}', tag: 'curves', permission: { action: 'editBuild', on: 'curve' }, body: curvePatchSchema,
    summary: 'Relabel a curve or set durability options (break-in, windows, loss fraction)',
    handle: ({ ctx, access, curve, body }) => ({ curve: curves.patchCurve(ctx, access, curve, body) }),
  }),
  route({
    method: 'post', path: '/api/curves/{id}/conditions', tag: 'curves', permission: { action: 'editBuild', on: 'curve' }, body: conditionChoiceSchema,
    summary: 'Settle a condition on which the file and the build differ (summary.conditionMismatches): chosen "file" makes the build record the file\'s value, "build" keeps it; an area that changes the conversion of total current re-measures the curve. Audited. Answers {curve, build}',
    handle: ({ ctx, access, curve, build, body }) => curves.chooseCondition(ctx, access, curve, build, body.field, body.chosen),
  }),
  route({
    method: 'delete', path: '/api/curves/{id}', tag: 'curves', permission: { action: 'deleteCurves', on: 'curve' },
    summary: 'Remove a curve (the raw file stays) → {ok, record}: when it was the curve of record, the oldest remaining curve of its kind takes over (record says which; a reviewed build goes back to review)',
    handle: async ({ ctx, access, curve }) => ({ ok: true, record: await curves.deleteCurve(ctx, access, curve) }),
  }),
  route({
    method: 'get', path: '/api/files/{id}/raw', tag: 'curves', permission: { action: 'read', on: 'file' },
    summary: 'The uploaded bytes, unchanged',
    handle: async ({ ctx, res, file }) => {
      const stream = await curves.openRawFile(ctx, file);
      res.setHeader('Content-Type', 'application/octet-stream');
      res.setHeader('Content-Disposition', `attachment; filename="${file.originalName.replace(/[^\w.\- ]+/g, '_')}"`);
      res.setHeader('X-Content-SHA256', file.sha256);
      res.setHeader('Content-Length', String(file.sizeBytes));
      await pipeline(stream, res).catch((error: unknown) => {
        // the client went away, or the store broke off mid-file: the answer is already under way
        ctx.logger.warn({ err: error, fileId: file.id }, 'raw file stream ended early');
      });
    },
  }),
  route({
    method: 'get', path: '/api/projects/{id}/import-profiles', tag: 'curves', permission: { action: 'read', on: 'project' },
    summary: 'Saved column/unit mappings',
    handle: ({ ctx, access }) => ({ profiles: curves.listProfiles(ctx, access.projectId) }),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/import-profiles', tag: 'curves', permission: { action: 'manageProfiles', on: 'project' }, body: importProfileCreateSchema, status: 201,
    summary: 'Save a column/unit mapping for a lab’s file shape (for one’s own lab; PIs for any lab of the project)',
    handle: ({ ctx, access, body }) => ({ profile: curves.saveProfile(ctx, access, body) }),
  }),
  route({
    method: 'delete', path: '/api/import-profiles/{id}', tag: 'curves', permission: { action: 'manageProfiles', on: 'import-profile' },
    summary: 'Remove an import profile (one’s own lab’s; PIs any of the project)',
    handle: ({ ctx, access, profile }) => {
      curves.deleteProfile(ctx, access, profile);
      return { ok: true };
    },
  }),
  route({
    method: 'get', path: '/api/projects/{id}/durability', tag: 'curves', permission: { action: 'read', on: 'project' },
    summary: 'Durability comparison: every durability / hold curve of the project (isRecord marks each build’s curves of record) with rate ± 95 % interval (µV/h), hours run, break-in and held conditions',
    handle: ({ ctx, access }) => durabilityAnswer(ctx, access),
  }),
]);

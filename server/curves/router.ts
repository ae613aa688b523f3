// HTTP for curves: multipart upload (streamed to disk by multer), preview, points, raw bytes,
// and import profiles.
import { Router, type Request, type Response, type NextFunction } from 'express';
import multer from 'multer';
import fs from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { z } from 'zod';
import { and, eq } from 'drizzle-orm';
import type { AppContext } from '../context';
import { curves, files, importProfiles } from '../db/schema';
import { idParam, parseInput } from '../lib/validate';
import { AppError, forbidden, notFound } from '../lib/errors';
import { requireBuildWrite, requireProfileLab, requireProject, requireUser } from '../auth/access';
import { accessBuild } from '../builds/service';
import { chooseCondition, curvePoints, deleteCurve, ingestUpload, loadCurve, updateCurveOptions, curveView, requireCompleteProfile } from './service';
import { audit } from '../lib/audit';
import { silentProgress, trackUpload, UPLOAD_ID_PATTERN } from '../uploads/progress';
import { checkedFileName, multipartProblem } from '../lib/multipart-errors';

/** 52428800 → "50 MB", 1500 → "1.5 kB": the limit in the words of the message. */
function formatBytes(bytes: number): string {
  if (bytes >= 1048576) return `${Number((bytes / 1048576).toFixed(1))} MB`;
  if (bytes >= 1024) return `${Number((bytes / 1024).toFixed(1))} kB`;
  return `${bytes} bytes`;
}

const unitSpec = z.object({ column: z.number().int().min(0), unit: z.string() });
const mappingSchema = z
  .object({
    current: unitSpec.extend({ unit: z.enum(['A/cm2', 'mA/cm2', 'A', 'mA']), negated: z.boolean().optional() }).optional(),
    voltage: unitSpec.extend({ unit: z.enum(['V', 'mV']) }).optional(),
    voltageIrFree: unitSpec.extend({ unit: z.enum(['V', 'mV']) }).optional(),
    hfr: unitSpec.extend({ unit: z.enum(['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm']) }).optional(),
    time: unitSpec.extend({ unit: z.enum(['s', 'min', 'h', 'timestamp']) }).optional(),
    temperature: unitSpec.extend({ unit: z.enum(['C', 'K']) }).optional(),
  })
  .refine((mapping) => mapping.voltage !== undefined || mapping.voltageIrFree !== undefined, { message: 'a voltage column is required (voltage or voltageIrFree)', path: ['voltage'] });

export const conditionChoiceSchema = z.object({
  field: z.enum(['temperatureC', 'areaCm2', 'anodeGas', 'cathodeGas', 'backPressureKPa']),
  chosen: z.enum(['file', 'build']),
});

const jsonText = <T extends z.ZodType>(schema: T) =>
  z.string().transform((text, ctx) => {
    try {
      return JSON.parse(text) as unknown;
    } catch {
      ctx.addIssue({ code: 'custom', message: 'must be JSON' });
      return z.NEVER;
    }
  }).pipe(schema);

export const uploadFieldsSchema = z.object({
  kind: z.enum(['polarization', 'durability', 'hold']).optional(),
  areaCm2: z.coerce.number().positive('must be above 0 cm²').max(1000).optional(),
  profileId: z.coerce.number().int().positive().optional(),
  mapping: jsonText(mappingSchema).optional(),
  sheet: z.string().max(100).optional(),
  label: z.string().max(120).optional(),
  saveProfileAs: z.string().trim().min(1).max(80).optional(),
  uploadId: z.string().regex(UPLOAD_ID_PATTERN, 'must be 8–64 letters, digits, "-" or "_"').optional(),
});

const pointsQuery = z
  .object({
    maxPoints: z.coerce.number().int().min(10).max(100000).optional(),
    fromHours: z.coerce.number().finite().optional(),
    toHours: z.coerce.number().finite().optional(),
  })
  .refine((q) => q.fromHours == null || q.toHours == null || q.toHours >= q.fromHours, { message: 'toHours must not be before fromHours', path: ['toHours'] });

const curvePatchSchema = z.object({
  label: z.string().trim().max(120).optional(),
  breakInHours: z.number().min(0).nullable().optional(),
  windows: z.array(z.object({ fromHours: z.number().min(0), toHours: z.number().min(0) })).max(20).optional(),
  lossFraction: z.number().gt(0).lt(1).optional(),
});

const profileSchema = z.object({
  name: z.string().trim().min(1).max(80),
  labId: z.number().int().positive().nullish(),
  kind: z.enum(['polarization', 'durability', 'hold']).default('polarization'),
  mapping: z.partialRecord(z.enum(['current', 'voltage', 'voltageIrFree', 'hfr', 'time', 'temperature']), z.object({ header: z.string().min(1), unit: z.string().min(1), negated: z.boolean().optional() })),
});

export function curvesRouter(ctx: AppContext): Router {
  const router = Router();
  const { db, env } = ctx;
  const tmpDir = path.join(env.uploadsDir, 'tmp');
  fs.mkdirSync(tmpDir, { recursive: true });
  const upload = multer({ dest: tmpDir, limits: { fileSize: env.UPLOAD_MAX_BYTES, files: 1, fields: 20 } });

  const receiveFile = (req: Request, res: Response, next: NextFunction) => {
    upload.single('file')(req, res, (error: unknown) => {
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') {
          return next(new AppError(413, 'too-large', `The file is larger than the upload limit of ${formatBytes(env.UPLOAD_MAX_BYTES)} (UPLOAD_MAX_BYTES = ${env.UPLOAD_MAX_BYTES} bytes); nothing was stored. Split the log or ask an administrator to raise the limit.`, { limit: 'UPLOAD_MAX_BYTES', maxBytes: env.UPLOAD_MAX_BYTES }));
        }
        return next(new AppError(400, 'bad-upload', `Upload refused: ${error.message} (field "${error.field ?? 'file'}"). Send one file in the multipart field "file".`));
      }
      if (error) {
        // a refused body leaves no temporary file behind, however far multer got
        if (typeof req.file?.path === 'string') fs.rmSync(req.file.path, { force: true });
        return next(multipartProblem(error) ?? error);
      }
      next();
    });
  };

  async function handleUpload(req: Request, res: Response, previewOnly: boolean) {
    const file = req.file;
    try {
      const { row, access } = accessBuild(ctx, req.user, idParam(req.params.id), 'createBuild');
      requireBuildWrite(access, row);
      if (!file) throw new AppError(400, 'validation', 'Send the file in the multipart field "file".', { fields: [{ path: 'file', message: 'required' }] });
      const originalName = checkedFileName(file.originalname);
      const { uploadId, ...fields } = parseInput(uploadFieldsSchema, req.body ?? {}, 'upload fields');
      const progress = uploadId && !previewOnly ? trackUpload(access.user.id, uploadId, file.size) : silentProgress;
      try {
        const result = await ingestUpload(ctx, access, row, { tmpPath: file.path, originalName, size: file.size }, { ...fields, previewOnly, progress });
        progress.done('curve' in result && result.curve ? result.curve.id : null);
        res.status(previewOnly ? 200 : 201).json(result);
      } catch (error) {
        progress.fail(error instanceof Error ? error.message : String(error));
        throw error;
      }
    } finally {
      if (file) fs.rmSync(file.path, { force: true });
    }
  }

  router.post('/builds/:id/curves', receiveFile, (req, res) => handleUpload(req, res, false));
  router.post('/builds/:id/curves/preview', receiveFile, (req, res) => handleUpload(req, res, true));

  router.get('/curves/:id', (req, res) => {
    requireUser(req.user);
    const row = loadCurve(ctx, idParam(req.params.id));
    accessBuild(ctx, req.user, row.buildId);
    const query = parseInput(pointsQuery, req.query, 'query');
    res.json({ curve: curveView(row), points: curvePoints(row, query) });
  });

  router.patch('/curves/:id', (req, res) => {
    requireUser(req.user);
    const row = loadCurve(ctx, idParam(req.params.id));
    const { row: build, access } = accessBuild(ctx, req.user, row.buildId, 'createBuild');
    requireBuildWrite(access, build);
    const body = parseInput(curvePatchSchema, req.body);
    const { label, ...options } = body;
    let curve = curveView(row);
    if (Object.keys(options).length) curve = updateCurveOptions(ctx, access, row, options);
    if (label !== undefined) {
      ctx.db.update(curves).set({ label }).where(eq(curves.id, row.id)).run();
      audit(ctx.db, { userId: access.user.id, action: 'update', entity: 'curve', entityId: row.id, projectId: access.projectId, before: { label: row.label }, after: { label } });
      curve = { ...curve, label };
    }
    res.json({ curve });
  });

  // The uploader settles a condition on which the file and the build's record differ.
  router.post('/curves/:id/conditions', (req, res) => {
    requireUser(req.user);
    const row = loadCurve(ctx, idParam(req.params.id));
    const { row: build, access } = accessBuild(ctx, req.user, row.buildId, 'createBuild');
    requireBuildWrite(access, build);
    const body = parseInput(conditionChoiceSchema, req.body);
    res.json(chooseCondition(ctx, access, row, build, body.field, body.chosen));
  });

  router.delete('/curves/:id', async (req, res) => {
    requireUser(req.user);
    const row = loadCurve(ctx, idParam(req.params.id));
    const { access } = accessBuild(ctx, req.user, row.buildId, 'deleteBuild');
    // record: null, or which curve took over as the curve of record (and whether review restarted)
    const record = await deleteCurve(ctx, access, row);
    res.json({ ok: true, record });
  });

  router.get('/files/:id/raw', async (req, res) => {
    requireUser(req.user);
    const id = idParam(req.params.id);
    const file = db.select().from(files).where(eq(files.id, id)).get();
    if (!file || file.projectId == null) throw notFound(`File ${id}`);
    requireProject(db, req.user, file.projectId, 'read');
    const stream = await ctx.storage.get(file.sha256);
    if (!stream) throw notFound(`Stored bytes of file ${id}`);
    res.setHeader('Content-Type', 'application/octet-stream');
    res.setHeader('Content-Disposition', `attachment; filename="${file.originalName.replace(/[^\w.\- ]+/g, '_')}"`);
    res.setHeader('X-Content-SHA256', file.sha256);
    res.setHeader('Content-Length', String(file.sizeBytes));
    await pipeline(stream, res).catch((error: unknown) => {
      // the client went away, or the store broke off mid-file: the answer is already under way
      ctx.logger.warn({ err: error, fileId: id }, 'raw file stream ended early');
    });
  });

  router.get('/projects/:id/import-profiles', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'read');
    const rows = db.select().from(importProfiles).where(eq(importProfiles.projectId, access.projectId)).all();
    res.json({ profiles: rows });
  });

  router.post('/projects/:id/import-profiles', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'manageProfiles');
    const body = parseInput(profileSchema, req.body);
    // not given: the caller's own lab (partners always get theirs)
    let labId = body.labId === undefined ? access.user.labId : body.labId;
    if (access.role === 'partner') {
      if (labId != null && labId !== access.user.labId) throw forbidden('Partners may only save profiles for their own lab.');
      labId = access.user.labId;
    }
    requireProfileLab(access, labId);
    requireCompleteProfile(body.kind, body.mapping);
    const row = db.insert(importProfiles).values({ name: body.name, labId, projectId: access.projectId, kind: body.kind, mapping: body.mapping, createdBy: access.user.id }).returning().get();
    audit(db, { userId: access.user.id, action: 'create', entity: 'import-profile', entityId: row.id, projectId: access.projectId, after: row });
    res.status(201).json({ profile: row });
  });

  router.delete('/import-profiles/:id', (req, res) => {
    requireUser(req.user);
    const id = idParam(req.params.id);
    const row = db.select().from(importProfiles).where(eq(importProfiles.id, id)).get();
    if (!row || row.projectId == null) throw notFound(`Import profile ${id}`);
    const access = requireProject(db, req.user, row.projectId, 'manageProfiles');
    requireProfileLab(access, row.labId);
    db.delete(importProfiles).where(and(eq(importProfiles.id, id))).run();
    audit(db, { userId: access.user.id, action: 'delete', entity: 'import-profile', entityId: id, projectId: access.projectId, before: row });
    res.json({ ok: true });
  });

  return router;
}

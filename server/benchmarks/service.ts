// A project's benchmark (one of its builds, or an imported reference curve with its provenance)
// and its reference curves: import from a file, list, read with points, remove.
import fs from 'node:fs';
import { and, asc, eq } from 'drizzle-orm';
import type { AppContext } from '../context';
import type { ProjectAccess } from '../auth/access';
import { benchmarks, builds, curves, files, projects, referenceCurves, users } from '../db/schema';
import { audit } from '../lib/audit';
import { AppError, notFound } from '../lib/errors';
import { parseUpload } from '../uploads/parse-runner';
import { CurveFileError } from '../../shared/curves/types';
import type { CurveData, MetricsResult } from '../../shared/curves/types';
import { applyMapping, checkEnoughData, detectMapping, importNotes, polarizationMetrics } from '../../shared/curves';
import { encodePoints, decodePoints } from '../curves/points-codec';
import { readPoints } from '../curves/point-store';
import { metricsOfKind, nullMetrics } from '../../shared/curves/metric-catalogue';
import { asUnprocessable, mappingNeeded, placeWholeFileError, referencePoint, refuseEmptyMetrics } from '../curves/service';
import { getBuildItem } from '../builds/service';
import type { BenchmarkPoints, BenchmarkSet, BenchmarkView, ReferenceCurveFields, ReferenceCurveView } from '../../shared/schemas/benchmarks';
import type { TestConditions } from '../../shared/schemas/project';

type ReferenceRow = typeof referenceCurves.$inferSelect;
type ProjectRow = typeof projects.$inferSelect;

function projectRow(ctx: AppContext, projectId: number): ProjectRow {
  return ctx.db.select().from(projects).where(eq(projects.id, projectId)).get()!;
}

function personName(ctx: AppContext, userId: number | null): string | null {
  if (userId == null) return null;
  return ctx.db.select({ name: users.name }).from(users).where(eq(users.id, userId)).get()?.name ?? null;
}

/** A reference curve's metrics at the project's reference point now, with its own loadings. */
function measureReference(row: Pick<ReferenceRow, 'loadingMgCm2' | 'metalLoadingMgCm2' | 'conditions'>, data: CurveData, project: ProjectRow): MetricsResult {
  return polarizationMetrics(data, referencePoint(project), { loadingMgCm2: row.loadingMgCm2, metalLoadingMgCm2: row.metalLoadingMgCm2 }, { h2CrossoverAcm2: (row.conditions.h2CrossoverMAcm2 ?? 0) / 1000 });
}

function pointsOf(data: CurveData): BenchmarkPoints {
  return { j: Array.from(data.j), v: Array.from(data.v), vIrFree: data.vIrFree ? Array.from(data.vIrFree) : null, hfr: data.hfr ? Array.from(data.hfr) : null };
}

function referenceView(ctx: AppContext, row: ReferenceRow, project: ProjectRow, data = decodePoints(row.points, 'polarization')): ReferenceCurveView {
  let metrics: ReferenceCurveView['metrics'] = nullMetrics(metricsOfKind('polarization'));
  let metricNotes: Record<string, string> = {};
  try {
    const result = measureReference(row, data, project);
    metrics = result.metrics;
    metricNotes = result.metricNotes as Record<string, string>;
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
    metricNotes = { vAtRef: error.message.replace(/^\w+: /, '') };
  }
  const file = row.fileId == null ? undefined : ctx.db.select({ name: files.originalName }).from(files).where(eq(files.id, row.fileId)).get();
  return {
    id: row.id,
    projectId: row.projectId,
    fileId: row.fileId,
    fileName: file?.name ?? null,
    label: row.label,
    source: row.source,
    sourceDate: row.sourceDate,
    conditions: row.conditions,
    loadingMgCm2: row.loadingMgCm2,
    metalLoadingMgCm2: row.metalLoadingMgCm2,
    areaCm2: row.areaCm2,
    notes: row.notes,
    pointCount: row.pointCount,
    metrics,
    metricNotes,
    createdAt: row.createdAt,
    createdBy: personName(ctx, row.createdBy),
  };
}

function loadReference(ctx: AppContext, projectId: number, id: number): ReferenceRow {
  const row = ctx.db.select().from(referenceCurves).where(eq(referenceCurves.id, id)).get();
  if (!row || row.projectId !== projectId) throw notFound(`Reference curve ${id}`);
  return row;
}

export function listReferenceCurves(ctx: AppContext, access: ProjectAccess): ReferenceCurveView[] {
  const project = projectRow(ctx, access.projectId);
  const rows = ctx.db.select().from(referenceCurves).where(eq(referenceCurves.projectId, access.projectId)).orderBy(asc(referenceCurves.id)).all();
  return rows.map((row) => referenceView(ctx, row, project));
}

export function readReferenceCurve(ctx: AppContext, row: ReferenceRow) {
  const project = projectRow(ctx, row.projectId);
  const data = decodePoints(row.points, 'polarization');
  return { referenceCurve: referenceView(ctx, row, project, data), points: pointsOf(data) };
}

/**
 * Import a reference curve from a polarization file: the same reading, unit detection and checks
 * as a build's upload (line and column named in every refusal), stored with its provenance.
 */
export async function importReferenceCurve(ctx: AppContext, access: ProjectAccess, upload: { tmpPath: string; originalName: string; size: number }, fields: ReferenceCurveFields) {
  const { db, env } = ctx;
  try {
    let read;
    try {
      read = await parseUpload(env, upload.tmpPath, { maxRows: env.UPLOAD_MAX_ROWS }, upload.originalName);
    } catch (error) {
      throw asUnprocessable(error, upload.originalName);
    }
    const { table } = read;
    const areaCm2 = fields.areaCm2 ?? table.conditions.areaCm2 ?? null;
    const detection = detectMapping(table, 'polarization', { areaCm2 });
    if (!detection.mapping || detection.ambiguous) throw mappingNeeded(table, detection, { fileName: upload.originalName, buildAreaCm2: areaCm2 });
    const mapping = detection.mapping;
    let data: ReturnType<typeof applyMapping>;
    try {
      data = applyMapping(table, mapping, { kind: 'polarization', areaCm2 });
      checkEnoughData(data);
    } catch (error) {
      throw asUnprocessable(placeWholeFileError(error, table, mapping), upload.originalName);
    }
    const conditions: TestConditions = {
      temperatureC: fields.temperatureC ?? table.conditions.temperatureC ?? null,
      backPressureKPa: fields.backPressureKPa ?? null,
      anodeGas: fields.anodeGas ?? null,
      cathodeGas: fields.cathodeGas ?? null,
    };
    const project = projectRow(ctx, access.projectId);
    const draft = { loadingMgCm2: fields.loadingMgCm2 ?? null, metalLoadingMgCm2: fields.metalLoadingMgCm2 ?? null, conditions };
    let result: MetricsResult;
    try {
      result = measureReference(draft, data, project);
    } catch (error) {
      if (error instanceof RangeError) throw new AppError(422, 'cannot-measure', `${upload.originalName}: ${error.message.replace(/^\w+: /, '')}; nothing was stored.`, { file: upload.originalName });
      throw asUnprocessable(placeWholeFileError(error, table, mapping), upload.originalName);
    }
    refuseEmptyMetrics(result, data, upload.originalName, table, mapping);
    const notes = importNotes(table, data.notes);
    const points = encodePoints(data);
    const { existed } = await ctx.storage.put(read.sha256, upload.tmpPath);
    try {
      const row = db.transaction((tx) => {
        const file = tx.insert(files).values({ sha256: read.sha256, sizeBytes: upload.size, originalName: upload.originalName.slice(0, 255), contentType: read.contentType, projectId: access.projectId, uploadedBy: access.user.id }).returning().get();
        const inserted = tx
          .insert(referenceCurves)
          .values({ projectId: access.projectId, fileId: file.id, label: fields.label, source: fields.source, sourceDate: fields.sourceDate ?? null, conditions, loadingMgCm2: draft.loadingMgCm2, metalLoadingMgCm2: draft.metalLoadingMgCm2, areaCm2: data.areaCm2 ?? areaCm2, notes: [fields.notes, ...notes.map((n) => `On import: ${n}.`)].filter(Boolean).join('\n').slice(0, 4000), mapping, pointCount: data.v.length, points, createdBy: access.user.id })
          .returning()
          .get();
        audit(tx as never, { userId: access.user.id, action: 'create', entity: 'reference-curve', entityId: inserted.id, projectId: access.projectId, after: { label: inserted.label, source: inserted.source, sourceDate: inserted.sourceDate, file: upload.originalName, sha256: read.sha256, points: inserted.pointCount } });
        if (fields.makeBenchmark) putBenchmark(tx as never, access, { referenceCurveId: inserted.id, note: '' });
        return inserted;
      });
      return { referenceCurve: referenceView(ctx, row, project, data) };
    } catch (error) {
      if (!existed && !db.select({ id: files.id }).from(files).where(eq(files.sha256, read.sha256)).get()) await ctx.storage.remove(read.sha256);
      throw error;
    }
  } catch (error) {
    if (error instanceof CurveFileError) throw asUnprocessable(error, upload.originalName);
    throw error;
  } finally {
    fs.rmSync(upload.tmpPath, { force: true });
  }
}

export function deleteReferenceCurve(ctx: AppContext, access: ProjectAccess, row: ReferenceRow) {
  ctx.db.transaction((tx) => {
    // the benchmark row goes with it (cascade); say so in the audit
    const wasBenchmark = tx.select({ id: benchmarks.id }).from(benchmarks).where(and(eq(benchmarks.projectId, row.projectId), eq(benchmarks.referenceCurveId, row.id))).get();
    tx.delete(benchmarks).where(eq(benchmarks.referenceCurveId, row.id)).run();
    tx.delete(referenceCurves).where(eq(referenceCurves.id, row.id)).run();
    audit(tx as never, { userId: access.user.id, action: 'delete', entity: 'reference-curve', entityId: row.id, projectId: row.projectId, before: { label: row.label, source: row.source, wasBenchmark: Boolean(wasBenchmark) } });
  });
}

type Tx = Parameters<Parameters<AppContext['db']['transaction']>[0]>[0];

function putBenchmark(tx: Tx, access: ProjectAccess, body: { buildId?: number | null; referenceCurveId?: number | null; note: string }) {
  const before = tx.select().from(benchmarks).where(eq(benchmarks.projectId, access.projectId)).get();
  const values = { buildId: body.buildId ?? null, referenceCurveId: body.referenceCurveId ?? null, note: body.note, setBy: access.user.id, setAt: new Date().toISOString() };
  if (before) tx.update(benchmarks).set(values).where(eq(benchmarks.id, before.id)).run();
  else tx.insert(benchmarks).values({ projectId: access.projectId, ...values }).run();
  audit(tx as never, { userId: access.user.id, action: before ? 'update' : 'create', entity: 'benchmark', entityId: access.projectId, projectId: access.projectId, before: before ? { buildId: before.buildId, referenceCurveId: before.referenceCurveId, note: before.note } : undefined, after: { buildId: values.buildId, referenceCurveId: values.referenceCurveId, note: values.note } });
}

/** Set the project's benchmark: one of its builds (not discarded) or one of its reference curves. */
export function setBenchmark(ctx: AppContext, access: ProjectAccess, body: BenchmarkSet): BenchmarkView {
  if (body.buildId != null) {
    const build = ctx.db.select({ id: builds.id, projectId: builds.projectId, status: builds.status, code: builds.code }).from(builds).where(eq(builds.id, body.buildId)).get();
    if (!build || build.projectId !== access.projectId) throw new AppError(422, 'validation', `buildId: build ${body.buildId} is not a build of this project.`, { fields: [{ path: 'buildId', message: 'not a build of this project' }] });
    if (build.status === 'discarded') throw new AppError(422, 'validation', `buildId: ${build.code} is discarded and cannot be the benchmark.`, { fields: [{ path: 'buildId', message: 'discarded' }] });
  } else if (body.referenceCurveId != null) {
    const ref = ctx.db.select({ projectId: referenceCurves.projectId }).from(referenceCurves).where(eq(referenceCurves.id, body.referenceCurveId)).get();
    if (!ref || ref.projectId !== access.projectId) throw new AppError(422, 'validation', `referenceCurveId: reference curve ${body.referenceCurveId} is not one of this project.`, { fields: [{ path: 'referenceCurveId', message: 'not a reference curve of this project' }] });
  }
  ctx.db.transaction((tx) => putBenchmark(tx, access, { buildId: body.buildId, referenceCurveId: body.referenceCurveId, note: body.note ?? '' }));
  return getBenchmark(ctx, access)!;
}

export function clearBenchmark(ctx: AppContext, access: ProjectAccess): void {
  ctx.db.transaction((tx) => {
    const before = tx.select().from(benchmarks).where(eq(benchmarks.projectId, access.projectId)).get();
    if (!before) return;
    tx.delete(benchmarks).where(eq(benchmarks.id, before.id)).run();
    audit(tx as never, { userId: access.user.id, action: 'delete', entity: 'benchmark', entityId: access.projectId, projectId: access.projectId, before: { buildId: before.buildId, referenceCurveId: before.referenceCurveId, note: before.note } });
  });
}

/** The project's benchmark with its curve's points and the values differences are taken from, or null. */
export function getBenchmark(ctx: AppContext, access: Pick<ProjectAccess, 'projectId'>): BenchmarkView | null {
  const row = ctx.db.select().from(benchmarks).where(eq(benchmarks.projectId, access.projectId)).get();
  if (!row) return null;
  const common = { projectId: row.projectId, note: row.note, setBy: personName(ctx, row.setBy), setAt: row.setAt };
  if (row.buildId != null) {
    const build = getBuildItem(ctx, row.buildId);
    const curveId = build.recordCurveIds.polarization ?? null;
    const curve = curveId == null ? undefined : ctx.db.select({ id: curves.id, points: curves.points }).from(curves).where(eq(curves.id, curveId)).get();
    return {
      ...common,
      kind: 'build',
      label: build.code,
      buildId: build.id,
      buildCode: build.code,
      referenceCurveId: null,
      curveId,
      source: null,
      sourceDate: build.testedOn ?? build.builtOn ?? null,
      conditions: build.testConditions,
      values: build.values,
      points: curve ? pointsOf(readPoints(ctx.db, curve, 'polarization')) : null,
    };
  }
  const ref = loadReference(ctx, row.projectId, row.referenceCurveId!);
  const { referenceCurve, points } = readReferenceCurve(ctx, ref);
  const values: Record<string, number | null> = {};
  for (const [key, value] of Object.entries(referenceCurve.metrics)) values[key] = typeof value === 'number' && Number.isFinite(value) ? value : null;
  return {
    ...common,
    kind: 'reference',
    label: referenceCurve.label,
    buildId: null,
    buildCode: null,
    referenceCurveId: ref.id,
    curveId: null,
    source: referenceCurve.source,
    sourceDate: referenceCurve.sourceDate,
    conditions: referenceCurve.conditions,
    values,
    points,
  };
}

// Builds: create, read, update, list with their current metric values and lineage.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { z } from 'zod';
import type { AppContext } from '../context';
import { builds, curves, labs, projects, users } from '../db/schema';
import { buildCreateSchema, buildUpdateSchema, checkFactorValues } from '../../shared/schemas/build';
import type { Build, RecordCurveIds } from '../../shared/api-types';
import type { CurveKind } from '../../shared/curves/types';
import { audit } from '../lib/audit';
import { AppError, conflict, notFound } from '../lib/errors';
import { requireBuildWrite, requireProject, requireUser, type ProjectAccess } from '../auth/access';
import type { AuthUser } from '../context';
import { listFactors, listResponses } from '../projects/service';
import { notifyBuildTested } from '../review/notify';
import { recomputeBuildMetrics } from '../curves/service';
import { describeChanges, diffRecipe } from '../../shared/lineage';

type BuildRow = typeof builds.$inferSelect;
const parent = alias(builds, 'parent');

/** A build as the API lists it: one definition, shared/api-types `Build`. */
export type BuildListItem = Build;

const METRIC_FROM_KIND: Record<string, string[]> = {
  polarization: ['vAtRef', 'vAtRefIrFree', 'jAtRef', 'jAtRefIrFree', 'massActivity', 'peakPower', 'ocv', 'tafelSlope', 'hfr'],
  durability: ['degradationRate', 'breakInHours'],
  hold: ['degradationRate'],
};

function selectBuilds(ctx: AppContext) {
  return ctx.db
    .select({ b: builds, parentCode: parent.code, labName: labs.name, operatorName: users.name })
    .from(builds)
    .leftJoin(parent, eq(parent.id, builds.parentId))
    .leftJoin(labs, eq(labs.id, builds.labId))
    .leftJoin(users, eq(users.id, builds.operatorId));
}

function metricValues(ctx: AppContext, buildIds: number[], metricsVersion: number) {
  if (buildIds.length === 0) return new Map<number, BuildMetricSummary>();
  const rows: CurveMetricRow[] = [];
  for (let i = 0; i < buildIds.length; i += 900) {
    const chunk = buildIds.slice(i, i + 900);
    rows.push(
      ...(ctx.db
        .select({ id: curves.id, buildId: curves.buildId, kind: curves.kind, isRecord: curves.isRecord, metrics: curves.metrics, metricsVersion: curves.metricsVersion })
        .from(curves)
        .where(inArray(curves.buildId, chunk))
        .orderBy(asc(curves.id))
        .all() as unknown as CurveMetricRow[]),
    );
  }
  return summarizeMetrics(rows, metricsVersion);
}

interface CurveMetricRow {
  id: number;
  buildId: number;
  kind: string;
  isRecord: boolean;
  /** only read for curves of record */
  metrics: Record<string, number | null> | null;
  metricsVersion: number;
}

interface BuildMetricSummary {
  values: Record<string, number | null>;
  count: number;
  records: RecordCurveIds;
}

/**
 * A build's metric values are those of its curves of record, one per kind (polarization only
 * when measured at the project's current reference point). Other curves are counted, never read:
 * a later upload changes nothing until someone chooses it as the record.
 */
function summarizeMetrics(rows: CurveMetricRow[], metricsVersion: number) {
  const byBuild = new Map<number, BuildMetricSummary>();
  for (const row of rows) {
    let entry = byBuild.get(row.buildId);
    if (!entry) {
      entry = { values: {}, count: 0, records: {} };
      byBuild.set(row.buildId, entry);
    }
    entry.count += 1;
    if (!row.isRecord) continue;
    entry.records[row.kind as CurveKind] = row.id;
    if (row.metrics && (row.metricsVersion === metricsVersion || row.kind !== 'polarization')) {
      for (const key of METRIC_FROM_KIND[row.kind] ?? []) {
        const v = row.metrics[key];
        if (v !== undefined) entry.values[key] = v;
      }
    }
  }
  return byBuild;
}

function toItem(row: { b: BuildRow; parentCode: string | null; labName: string | null; operatorName: string | null }, metrics?: BuildMetricSummary): BuildListItem {
  const b = row.b;
  return {
    id: b.id,
    projectId: b.projectId,
    code: b.code,
    parentId: b.parentId,
    parentCode: row.parentCode,
    changeNote: b.changeNote,
    factors: b.factorValues,
    loadingMgCm2: b.loadingMgCm2,
    metalLoadingMgCm2: b.metalLoadingMgCm2,
    areaCm2: b.areaCm2,
    catalystLot: b.catalystLot,
    labId: b.labId,
    labName: row.labName,
    operatorId: b.operatorId,
    operatorName: row.operatorName,
    status: b.status,
    builtOn: b.builtOn,
    testedOn: b.testedOn,
    replicateOf: b.replicateOf,
    testConditions: b.testConditions,
    responses: b.responseValues,
    values: { ...(metrics?.values ?? {}), ...b.responseValues },
    curveCount: metrics?.count ?? 0,
    recordCurveIds: metrics?.records ?? {},
    notes: b.notes,
    designId: b.designId ?? null,
    plannedOn: b.plannedOn ?? null,
    planReason: b.planReason ?? null,
    createdAt: b.createdAt,
    updatedAt: b.updatedAt,
  };
}

function projectVersion(ctx: AppContext, projectId: number): number {
  return ctx.db.select({ v: projects.metricsVersion }).from(projects).where(eq(projects.id, projectId)).get()?.v ?? 1;
}

/**
 * The builds list is the hottest read (tables, gains, surface, scripts): its two queries are
 * prepared once per database and take the project, status and page as parameters.
 */
const listStatements = new WeakMap<object, ReturnType<typeof prepareList>>();

// Raw prepared SQL (not the query builder) because this list is read on every table view and by
// partner scripts: building and mapping the query per request cost more than running it.
const LIST_SQL = `select b.id, b.project_id as projectId, b.code, b.parent_id as parentId, b.change_note as changeNote,
  b.factor_values as factorValues, b.loading_mg_cm2 as loadingMgCm2, b.metal_loading_mg_cm2 as metalLoadingMgCm2,
  b.area_cm2 as areaCm2, b.catalyst_lot as catalystLot, b.lab_id as labId, b.operator_id as operatorId,
  b.test_conditions as testConditions, b.status, b.built_on as builtOn, b.tested_on as testedOn,
  b.replicate_of as replicateOf, b.response_values as responseValues, b.notes, b.design_id as designId,
  b.planned_on as plannedOn, b.plan_reason as planReason, b.created_by as createdBy,
  b.created_at as createdAt, b.updated_at as updatedAt,
  p.code as parentCode, l.name as labName, u.name as operatorName
  from builds b left join builds p on p.id = b.parent_id left join labs l on l.id = b.lab_id left join users u on u.id = b.operator_id
  where b.project_id = @projectId and (@status is null or b.status = @status)
  order by b.id limit @limit offset @offset`;

type RawBuildRow = Omit<BuildRow, 'factorValues' | 'testConditions' | 'responseValues'> & { factorValues: string; testConditions: string; responseValues: string; parentCode: string | null; labName: string | null; operatorName: string | null };

function prepareList(ctx: AppContext) {
  const sqlite = ctx.db.$client;
  return {
    builds: sqlite.prepare(LIST_SQL),
    // the curves of exactly that page of builds, in upload order; metrics of the records only
    curvesOfPage: sqlite.prepare(
      `select id, build_id as buildId, kind, is_record as isRecord, case when is_record = 1 then metrics end as metrics, metrics_version as metricsVersion from curves
       where build_id in (select id from builds where project_id = @projectId and (@status is null or status = @status) order by id limit @limit offset @offset)
       order by id`,
    ),
    version: sqlite.prepare('select metrics_version as v from projects where id = ?'),
  };
}

export function listBuilds(ctx: AppContext, access: ProjectAccess, options: { status?: string; limit?: number; offset?: number } = {}): BuildListItem[] {
  let statements = listStatements.get(ctx.db.$client);
  if (!statements) {
    statements = prepareList(ctx);
    listStatements.set(ctx.db.$client, statements);
  }
  const params = { projectId: access.projectId, status: options.status ?? null, limit: options.limit ?? -1, offset: options.offset ?? 0 };
  const rows = statements.builds.all(params) as RawBuildRow[];
  const curveRows = statements.curvesOfPage.all(params) as { id: number; buildId: number; kind: string; isRecord: number; metrics: string | null; metricsVersion: number }[];
  const version = (statements.version.get(access.projectId) as { v: number } | undefined)?.v ?? 1;
  const metrics = summarizeMetrics(curveRows.map((r) => ({ ...r, isRecord: r.isRecord === 1, metrics: r.metrics == null ? null : (JSON.parse(r.metrics) as Record<string, number | null>) })), version);
  return rows.map((r) => {
    const { parentCode, labName, operatorName, ...rest } = r;
    const b = { ...rest, factorValues: JSON.parse(r.factorValues), testConditions: JSON.parse(r.testConditions), responseValues: JSON.parse(r.responseValues) } as BuildRow;
    return toItem({ b, parentCode, labName, operatorName }, metrics.get(r.id));
  });
}

export function loadBuildRow(ctx: AppContext, buildId: number): BuildRow {
  const row = ctx.db.select().from(builds).where(eq(builds.id, buildId)).get();
  if (!row) throw notFound(`Build ${buildId}`);
  return row;
}

/** Build and the caller's access to its project (404 when the project is not visible). */
export function accessBuild(ctx: AppContext, user: AuthUser | undefined, buildId: number, action: Parameters<typeof requireProject>[3] = 'read') {
  requireUser(user);
  const row = loadBuildRow(ctx, buildId);
  const access = requireProject(ctx.db, user, row.projectId, action);
  return { row, access };
}

export function getBuildItem(ctx: AppContext, buildId: number): BuildListItem {
  const row = selectBuilds(ctx).where(eq(builds.id, buildId)).get();
  if (!row) throw notFound(`Build ${buildId}`);
  const metrics = metricValues(ctx, [buildId], projectVersion(ctx, row.b.projectId));
  return toItem(row, metrics.get(buildId));
}

export function lineage(ctx: AppContext, build: BuildRow) {
  const ancestors: { id: number; code: string; changeNote: string | null; status: string }[] = [];
  const seen = new Set<number>([build.id]);
  let cursor = build.parentId;
  while (cursor != null && !seen.has(cursor) && ancestors.length < 200) {
    seen.add(cursor);
    const p = ctx.db.select({ id: builds.id, code: builds.code, changeNote: builds.changeNote, status: builds.status, parentId: builds.parentId }).from(builds).where(eq(builds.id, cursor)).get();
    if (!p) break;
    ancestors.unshift({ id: p.id, code: p.code, changeNote: p.changeNote, status: p.status });
    cursor = p.parentId;
  }
  const children = ctx.db
    .select({ id: builds.id, code: builds.code, changeNote: builds.changeNote, status: builds.status })
    .from(builds)
    .where(eq(builds.parentId, build.id))
    .orderBy(asc(builds.id))
    .all();
  const replicates = ctx.db
    .select({ id: builds.id, code: builds.code, status: builds.status })
    .from(builds)
    .where(and(eq(builds.projectId, build.projectId), sql`(${builds.replicateOf} = ${build.replicateOf ?? build.id} or ${builds.id} = ${build.replicateOf ?? -1}) and ${builds.id} <> ${build.id}`))
    .all();
  return { ancestors, children, replicates, changeFromParent: changeFromParent(ctx, build) };
}

/** "binder 20 → 30 wt %, activation 2 → 4 h": what changed from the parent, diffed from the records. */
function changeFromParent(ctx: AppContext, build: BuildRow): string | null {
  if (build.parentId == null) return null;
  const parentRow = ctx.db.select().from(builds).where(eq(builds.id, build.parentId)).get();
  if (!parentRow) return null;
  const labName = (id: number | null) => (id == null ? null : (ctx.db.select({ name: labs.name }).from(labs).where(eq(labs.id, id)).get()?.name ?? null));
  const snapshot = (b: BuildRow) => ({ factors: b.factorValues, loadingMgCm2: b.loadingMgCm2, metalLoadingMgCm2: b.metalLoadingMgCm2, catalystLot: b.catalystLot, labName: labName(b.labId), testConditions: b.testConditions });
  const text = describeChanges(diffRecipe(snapshot(parentRow), snapshot(build), listFactors(ctx, build.projectId)));
  return text || 'no recorded difference';
}

function nextCode(ctx: AppContext, projectId: number): string {
  const project = ctx.db.select({ prefix: projects.codePrefix }).from(projects).where(eq(projects.id, projectId)).get()!;
  const prefix = `${project.prefix}-`;
  const rows = ctx.db.select({ code: builds.code }).from(builds).where(and(eq(builds.projectId, projectId), sql`${builds.code} like ${prefix + '%'}`)).all();
  let max = 0;
  for (const r of rows) {
    const n = Number(r.code.slice(prefix.length));
    if (Number.isInteger(n) && n > max) max = n;
  }
  return `${prefix}${String(max + 1).padStart(3, '0')}`;
}

function validateRelations(ctx: AppContext, projectId: number, body: { parentId?: number | null; replicateOf?: number | null; labId?: number | null; responses?: Record<string, number> }, selfId?: number) {
  const fields: { path: string; message: string }[] = [];
  for (const key of ['parentId', 'replicateOf'] as const) {
    const id = body[key];
    if (id == null) continue;
    if (id === selfId) fields.push({ path: key, message: 'a build cannot refer to itself' });
    const other = ctx.db.select({ projectId: builds.projectId }).from(builds).where(eq(builds.id, id)).get();
    if (!other || other.projectId !== projectId) fields.push({ path: key, message: `build ${id} is not in this project` });
  }
  if (body.parentId != null && selfId != null) {
    // refuse cycles: walking up from the new parent must not reach this build
    let cursor: number | null = body.parentId;
    const seen = new Set<number>();
    while (cursor != null && !seen.has(cursor)) {
      if (cursor === selfId) { fields.push({ path: 'parentId', message: 'that parent would make a loop in the lineage' }); break; }
      seen.add(cursor);
      cursor = ctx.db.select({ p: builds.parentId }).from(builds).where(eq(builds.id, cursor)).get()?.p ?? null;
    }
  }
  if (body.labId != null && !ctx.db.select({ id: labs.id }).from(labs).where(eq(labs.id, body.labId)).get()) fields.push({ path: 'labId', message: `lab ${body.labId} does not exist` });
  if (body.responses) {
    const known = new Set(listResponses(ctx, projectId).map((r) => r.key));
    for (const key of Object.keys(body.responses)) if (!known.has(key)) fields.push({ path: `responses.${key}`, message: `no hand-entered response "${key}" is defined in this project` });
  }
  if (fields.length) throw new AppError(400, 'validation', `Invalid body: ${fields.map((f) => `${f.path}: ${f.message}`).join('; ')}`, { fields });
}

function checkFactors(ctx: AppContext, projectId: number, values: Record<string, number | string>, status: string) {
  const issues = checkFactorValues(values, listFactors(ctx, projectId), { requireAll: status !== 'planned' });
  if (issues.length) {
    const fields = issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    throw new AppError(400, 'validation', `Invalid body: ${fields.map((f) => `${f.path}: ${f.message}`).join('; ')}`, { fields });
  }
}

export function createBuild(ctx: AppContext, access: ProjectAccess, body: z.output<typeof buildCreateSchema>, origin: { designId?: number | null } = {}): BuildListItem {
  const { db } = ctx;
  let labId = body.labId ?? access.user.labId ?? null;
  if (access.role === 'partner') {
    if (body.labId != null && body.labId !== access.user.labId) throw new AppError(403, 'forbidden', 'Partners may only create builds for their own lab.');
    labId = access.user.labId;
  }
  requireBuildWrite(access, { labId });
  const status = body.status ?? 'built';
  checkFactors(ctx, access.projectId, body.factors, status);
  validateRelations(ctx, access.projectId, body);
  const code = body.code ?? nextCode(ctx, access.projectId);
  if (db.select({ id: builds.id }).from(builds).where(and(eq(builds.projectId, access.projectId), eq(builds.code, code))).get()) {
    throw conflict(`Build code ${code} is already used in this project.`, { fields: [{ path: 'code', message: 'already used' }] });
  }
  const row = db
    .insert(builds)
    .values({
      projectId: access.projectId,
      code,
      parentId: body.parentId ?? null,
      changeNote: body.changeNote ?? null,
      factorValues: body.factors,
      loadingMgCm2: body.loadingMgCm2 ?? null,
      metalLoadingMgCm2: body.metalLoadingMgCm2 ?? null,
      areaCm2: body.areaCm2 ?? null,
      catalystLot: body.catalystLot ?? null,
      labId,
      operatorId: access.user.id,
      testConditions: body.testConditions ?? {},
      status,
      builtOn: body.builtOn ?? null,
      testedOn: body.testedOn ?? null,
      replicateOf: body.replicateOf ?? null,
      responseValues: body.responses ?? {},
      notes: body.notes ?? '',
      designId: origin.designId ?? null,
      // a planned build records the day it was planned
      plannedOn: body.plannedOn ?? (status === 'planned' ? new Date().toISOString().slice(0, 10) : null),
      planReason: body.planReason ?? null,
      createdBy: access.user.id,
    })
    .returning()
    .get();
  audit(db, { userId: access.user.id, action: 'create', entity: 'build', entityId: row.id, projectId: access.projectId, after: row });
  return getBuildItem(ctx, row.id);
}

export function updateBuild(ctx: AppContext, access: ProjectAccess, before: BuildRow, body: z.output<typeof buildUpdateSchema>): BuildListItem {
  const { db } = ctx;
  requireBuildWrite(access, before);
  if (access.role === 'partner' && body.labId != null && body.labId !== access.user.labId) throw new AppError(403, 'forbidden', 'Partners cannot move a build to another lab.');
  if (body.status === 'reviewed' && access.role !== 'pi' && access.role !== 'admin') throw new AppError(403, 'forbidden', 'Only a PI marks a build reviewed (by giving a review verdict).');
  const status = body.status ?? before.status;
  const factorValues = body.factors ?? before.factorValues;
  if (body.factors !== undefined || body.status !== undefined) checkFactors(ctx, before.projectId, factorValues, status);
  validateRelations(ctx, before.projectId, body, before.id);
  if (body.code && body.code !== before.code && db.select({ id: builds.id }).from(builds).where(and(eq(builds.projectId, before.projectId), eq(builds.code, body.code))).get()) {
    throw conflict(`Build code ${body.code} is already used in this project.`, { fields: [{ path: 'code', message: 'already used' }] });
  }
  const set: Partial<typeof builds.$inferInsert> = { updatedAt: new Date().toISOString() };
  if (body.code !== undefined) set.code = body.code;
  if (body.parentId !== undefined) set.parentId = body.parentId;
  if (body.changeNote !== undefined) set.changeNote = body.changeNote;
  if (body.factors !== undefined) set.factorValues = body.factors;
  if (body.loadingMgCm2 !== undefined) set.loadingMgCm2 = body.loadingMgCm2;
  if (body.metalLoadingMgCm2 !== undefined) set.metalLoadingMgCm2 = body.metalLoadingMgCm2;
  if (body.areaCm2 !== undefined) set.areaCm2 = body.areaCm2;
  if (body.catalystLot !== undefined) set.catalystLot = body.catalystLot;
  if (body.labId !== undefined) set.labId = body.labId;
  if (body.status !== undefined) set.status = body.status;
  if (body.builtOn !== undefined) set.builtOn = body.builtOn;
  if (body.testedOn !== undefined) set.testedOn = body.testedOn;
  if (body.replicateOf !== undefined) set.replicateOf = body.replicateOf;
  if (body.testConditions !== undefined) set.testConditions = body.testConditions;
  if (body.responses !== undefined) set.responseValues = { ...before.responseValues, ...body.responses };
  if (body.notes !== undefined) set.notes = body.notes;
  if (body.plannedOn !== undefined) set.plannedOn = body.plannedOn;
  if (body.planReason !== undefined) set.planReason = body.planReason;
  const after = db.update(builds).set(set).where(eq(builds.id, before.id)).returning().get();
  audit(db, { userId: access.user.id, action: 'update', entity: 'build', entityId: before.id, projectId: before.projectId, before, after });
  // loading and H₂ crossover enter the curve metrics: measure the build's curves again
  if (after.loadingMgCm2 !== before.loadingMgCm2 || after.metalLoadingMgCm2 !== before.metalLoadingMgCm2 || (after.testConditions?.h2CrossoverMAcm2 ?? 0) !== (before.testConditions?.h2CrossoverMAcm2 ?? 0)) {
    recomputeBuildMetrics(ctx, before.id);
  }
  if (after.status === 'tested' && before.status !== 'tested') void notifyBuildTested(ctx, access.user, before, after);
  return getBuildItem(ctx, before.id);
}


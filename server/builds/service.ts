// Builds: create, read, update, list with their current metric values and lineage; the build
// page's answer; choosing a curve of record.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { z } from 'zod';
import type { AppContext } from '../context';
import type { Db } from '../db';
import { builds, curves, labs, lots, projects, users } from '../db/schema';
import { dataVersion } from '../db/data-version';
import { checkFactorValues, type buildCreateSchema, type buildUpdateSchema, type BuildListQuery, type RecordChoice } from '../../shared/schemas/build';
import type { Build, BuildBrief, RecordCurveIds } from '../../shared/api-types';
import type { CurveKind, CurveMetrics } from '../../shared/curves/types';
import { metricsOfKind } from '../../shared/curves/metric-catalogue';
import { buildPermissions, labForNewBuild } from '../../shared/auth/permissions';
import { becameTested, nextStatus } from '../../shared/builds/status';
import { audit } from '../lib/audit';
import { answerCache } from '../lib/answer-cache';
import { AppError, conflict, forbidden, notFound } from '../lib/errors';
import { actorOf, can, requireOwnLab, type ProjectAccess } from '../auth/access';
import { listFactors, listResponses } from '../projects/service';
import { notifyBuildTested } from '../review/notify';
import { curvesForBuild, recomputeBuildMetrics } from '../curves/service';
import { chooseRecord } from '../curves/record';
import { describeChanges, diffRecipe } from '../../shared/lineage';

type BuildRow = typeof builds.$inferSelect;
const parent = alias(builds, 'parent');

/** A build as the API lists it: one definition, shared/api-types `Build`. */
export type BuildListItem = Build;


interface CurveMetricRow {
  id: number;
  buildId: number;
  kind: string;
  isRecord: boolean;
  /** only read for curves of record (null on the others) */
  metrics: CurveMetrics | null;
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
      for (const key of metricsOfKind(row.kind as CurveKind)) {
        // a spectrum's HFR stays on its curve: the build's `hfr` is its polarization curve's
        if (row.kind === 'impedance' && key === 'hfr') continue;
        const v = (row.metrics as unknown as Record<string, number | null | undefined>)[key];
        if (v !== undefined) entry.values[key] = v;
      }
    }
  }
  return byBuild;
}

type ItemRow = { b: BuildRow; parentCode: string | null; labName: string | null; operatorName: string | null; lotMetalWtPct?: number | null };

/** The one mapping from the stored build (with its parent code, lab and operator names) to the API's build. */
function toItem(row: ItemRow, metrics?: BuildMetricSummary): BuildListItem {
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
    lotId: b.lotId ?? null,
    lotMetalWtPct: row.lotMetalWtPct ?? null,
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

/**
 * The queries behind a build list item, through Drizzle and prepared once per database: the
 * builds list is the hottest read (tables, gains, surface, partner scripts), so building and
 * compiling the SQL per request would cost more than running it. A page of a project and a
 * single build share the selected columns, the curve summary and `toItem`.
 */
function prepareItemQueries(db: Db) {
  const itemColumns = { b: builds, parentCode: parent.code, labName: labs.name, operatorName: users.name, lotMetalWtPct: lots.metalWtPct };
  const items = () => db.select(itemColumns).from(builds).leftJoin(parent, eq(parent.id, builds.parentId)).leftJoin(labs, eq(labs.id, builds.labId)).leftJoin(users, eq(users.id, builds.operatorId)).leftJoin(lots, eq(lots.id, builds.lotId));
  const ofPage = and(eq(builds.projectId, sql.placeholder('projectId')), sql`(${sql.placeholder('status')} is null or ${builds.status} = ${sql.placeholder('status')})`);
  const curveColumns = {
    id: curves.id,
    buildId: curves.buildId,
    kind: curves.kind,
    isRecord: curves.isRecord,
    // only the records' metrics are parsed: a build's other curves are counted, not read
    metrics: sql`case when ${curves.isRecord} = 1 then ${curves.metrics} end`.mapWith(curves.metrics),
    metricsVersion: curves.metricsVersion,
  };
  const pageIds = db.select({ id: builds.id }).from(builds).where(ofPage).orderBy(asc(builds.id)).limit(sql.placeholder('limit')).offset(sql.placeholder('offset'));
  return {
    page: items().where(ofPage).orderBy(asc(builds.id)).limit(sql.placeholder('limit')).offset(sql.placeholder('offset')).prepare(),
    one: items().where(eq(builds.id, sql.placeholder('buildId'))).prepare(),
    curvesOfPage: db.select(curveColumns).from(curves).where(inArray(curves.buildId, pageIds)).orderBy(asc(curves.id)).prepare(),
    curvesOfBuild: db.select(curveColumns).from(curves).where(eq(curves.buildId, sql.placeholder('buildId'))).orderBy(asc(curves.id)).prepare(),
    metricsVersion: db.select({ v: projects.metricsVersion }).from(projects).where(eq(projects.id, sql.placeholder('projectId'))).prepare(),
  };
}

const itemQueries = new WeakMap<object, ReturnType<typeof prepareItemQueries>>();
function queries(ctx: AppContext) {
  let found = itemQueries.get(ctx.db.$client);
  if (!found) {
    found = prepareItemQueries(ctx.db);
    itemQueries.set(ctx.db.$client, found);
  }
  return found;
}

export function listBuilds(ctx: AppContext, access: ProjectAccess, options: { status?: string; limit?: number; offset?: number } = {}): BuildListItem[] {
  const q = queries(ctx);
  const params = { projectId: access.projectId, status: options.status ?? null, limit: options.limit ?? -1, offset: options.offset ?? 0 };
  const rows = q.page.all(params);
  const version = q.metricsVersion.get({ projectId: access.projectId })?.v ?? 1;
  const metrics = summarizeMetrics(q.curvesOfPage.all(params), version);
  return rows.map((row) => toItem(row, metrics.get(row.b.id)));
}

export function getBuildItem(ctx: AppContext, buildId: number): BuildListItem {
  const q = queries(ctx);
  const row = q.one.get({ buildId });
  if (!row) throw notFound(`Build ${buildId}`);
  const version = q.metricsVersion.get({ projectId: row.b.projectId })?.v ?? 1;
  return toItem(row, summarizeMetrics(q.curvesOfBuild.all({ buildId }), version).get(buildId));
}

/**
 * The builds list as JSON text. Every member of a project sees the same list, so the text is
 * kept until the database next changes (`dataVersion`: any write, by any code path).
 */
const listCaches = new WeakMap<object, ReturnType<typeof answerCache>>();
/** What a picker needs of a build (the list's `view=brief`). */
function briefOf(build: Build): BuildBrief {
  return { id: build.id, code: build.code, changeNote: build.changeNote, status: build.status, labId: build.labId, parentId: build.parentId, curveCount: build.curveCount, recordCurveIds: build.recordCurveIds };
}

export function buildListJson(ctx: AppContext, access: ProjectAccess, query: BuildListQuery): string {
  let cache = listCaches.get(ctx.db.$client);
  if (!cache) {
    cache = answerCache(64);
    listCaches.set(ctx.db.$client, cache);
  }
  const key = `${access.projectId}|${dataVersion(ctx.db)}|${query.status ?? ''}|${query.limit ?? ''}|${query.offset ?? ''}|${query.view ?? 'full'}`;
  let body = cache.get(key);
  if (!body) {
    const list = listBuilds(ctx, access, query);
    // how many builds the whole list holds, so a client reading one page knows how many pages there are
    const total = query.limit === undefined && !query.offset ? list.length : ctx.db.select({ n: sql<number>`count(*)` }).from(builds).where(and(eq(builds.projectId, access.projectId), query.status ? eq(builds.status, query.status) : undefined)).get()!.n;
    body = JSON.stringify({ builds: query.view === 'brief' ? list.map(briefOf) : list, total });
    cache.set(key, body);
  }
  return body;
}

/** The build page: the build, its lineage, its curves, and what the caller may do on it. */
export function buildDetail(ctx: AppContext, access: ProjectAccess, row: BuildRow) {
  return {
    build: getBuildItem(ctx, row.id),
    lineage: lineage(ctx, row),
    curves: curvesForBuild(ctx, row.id),
    permissions: buildPermissions(actorOf(access), row.labId),
  };
}

/** Choose the build's curve of record of one kind; answers the change with the build and its curves as they are now. */
export async function chooseBuildRecord(ctx: AppContext, access: ProjectAccess, row: BuildRow, choice: RecordChoice) {
  const record = await chooseRecord(ctx, access, row, choice);
  return { record, build: getBuildItem(ctx, row.id), curves: curvesForBuild(ctx, row.id) };
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

/**
 * The lot a build points at: the record named by lotId (its name fills the free-text lot unless
 * one is given), else the project's lot whose name the free text matches, else none.
 */
function resolveLot(ctx: AppContext, projectId: number, body: { lotId?: number | null; catalystLot?: string | null }): { lotId: number | null; catalystLot: string | null } | null {
  if (body.lotId != null) {
    const lot = ctx.db.select({ id: lots.id, name: lots.name }).from(lots).where(eq(lots.id, body.lotId)).get()!;
    return { lotId: lot.id, catalystLot: body.catalystLot ?? lot.name };
  }
  if (body.lotId === null) return { lotId: null, catalystLot: body.catalystLot ?? null };
  if (body.catalystLot === undefined) return null;
  const named = body.catalystLot ? ctx.db.select({ id: lots.id }).from(lots).where(and(eq(lots.projectId, projectId), eq(lots.name, body.catalystLot))).get() : undefined;
  return { lotId: named?.id ?? null, catalystLot: body.catalystLot ?? null };
}

function validateRelations(ctx: AppContext, projectId: number, body: { parentId?: number | null; replicateOf?: number | null; labId?: number | null; lotId?: number | null; responses?: Record<string, number> }, selfId?: number) {
  const fields: { path: string; message: string }[] = [];
  if (body.lotId != null) {
    const lot = ctx.db.select({ projectId: lots.projectId }).from(lots).where(eq(lots.id, body.lotId)).get();
    if (!lot || lot.projectId !== projectId) fields.push({ path: 'lotId', message: `lot ${body.lotId} is not a lot of this project` });
  }
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
  const lab = labForNewBuild(actorOf(access), body.labId);
  if (lab.problem) throw forbidden(lab.problem);
  const labId = lab.labId;
  requireOwnLab(access, 'createBuild', labId);
  const step = nextStatus(null, { kind: 'create', requested: body.status });
  if (!step.ok) throw conflict(step.reason);
  const status = step.status;
  checkFactors(ctx, access.projectId, body.factors, status);
  validateRelations(ctx, access.projectId, body);
  const code = body.code ?? nextCode(ctx, access.projectId);
  const lot = resolveLot(ctx, access.projectId, body);
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
      catalystLot: lot?.catalystLot ?? null,
      lotId: lot?.lotId ?? null,
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
  // a partner's build stays in its own lab
  if (body.labId != null) requireOwnLab(access, 'editBuild', body.labId);
  const step = body.status === undefined ? null : nextStatus(before.status, { kind: 'set', to: body.status });
  if (step && !step.ok) throw conflict(step.reason);
  if (step?.needsReviewer && !can(access, 'review')) throw forbidden('Only a PI marks a build reviewed (by giving a review verdict).');
  const status = step ? step.status : before.status;
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
  const lot = resolveLot(ctx, before.projectId, body);
  if (lot) {
    set.catalystLot = lot.catalystLot;
    set.lotId = lot.lotId;
  }
  if (body.labId !== undefined) set.labId = body.labId;
  if (step) set.status = step.status;
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
  if (becameTested(before.status, after.status)) void notifyBuildTested(ctx, access.user, before, after);
  return getBuildItem(ctx, before.id);
}


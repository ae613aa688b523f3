// A project's targets: stored goals on a metric or response, each answered with its status
// against the project's builds (met by which build and when, or the best so far and the gap).
import { asc, eq } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppContext, AuthUser } from '../context';
import type { ProjectAccess } from '../auth/access';
import { projects, targets } from '../db/schema';
import { audit } from '../lib/audit';
import { AppError } from '../lib/errors';
import { listBuilds } from '../builds/service';
import { projectResponses } from '../lineage/service';
import { conversionFactor, targetStatus, type TargetObservation } from '../../shared/targets';
import type { targetCreateSchema, targetUpdateSchema, TargetView } from '../../shared/schemas/targets';
import type { Build, ResponseInfo } from '../../shared/api-types';
import type { ProjectRole } from '../../shared/schemas/project';

type TargetRow = typeof targets.$inferSelect;

/** The date a build's value stands at: tested, else built, else the day it was recorded. */
function buildDate(b: Build): string {
  return (b.testedOn ?? b.builtOn ?? b.createdAt).slice(0, 10);
}

/** Metrics that are per mass of catalyst or metal, following the project's loading basis. */
const PER_MASS = new Set(['massActivity']);

interface ProjectValues {
  responses: ResponseInfo[];
  builds: Build[];
  basis: 'catalyst' | 'metal';
}

function projectValues(ctx: AppContext, access: ProjectAccess): ProjectValues {
  const project = ctx.db.select({ settings: projects.settings }).from(projects).where(eq(projects.id, access.projectId)).get();
  return { responses: projectResponses(ctx, access.projectId), builds: listBuilds(ctx, access), basis: project?.settings.loadingBasis ?? 'catalyst' };
}

function toView(row: TargetRow, data: ProjectValues): TargetView {
  const response = data.responses.find((r) => r.key === row.metric);
  const unit = response?.unit ?? row.unit;
  const observations: TargetObservation[] = [];
  for (const b of data.builds) {
    if (b.status === 'discarded') continue;
    const value = b.values[row.metric];
    if (typeof value !== 'number' || !Number.isFinite(value)) continue;
    observations.push({ buildId: b.id, code: b.code, date: buildDate(b), value, unit, basis: PER_MASS.has(row.metric) ? data.basis : null });
  }
  const status = targetStatus({ comparator: row.comparator, value: row.value, unit: row.unit, basis: row.basis }, observations);
  return {
    id: row.id,
    projectId: row.projectId,
    metric: row.metric,
    metricLabel: response?.label ?? row.metric,
    comparator: row.comparator,
    value: row.value,
    unit: row.unit,
    basis: row.basis ?? null,
    conditions: row.conditions,
    dueDate: row.dueDate ?? null,
    name: row.name,
    status,
  };
}

export function listTargets(ctx: AppContext, access: ProjectAccess): TargetView[] {
  const rows = ctx.db.select().from(targets).where(eq(targets.projectId, access.projectId)).orderBy(asc(targets.id)).all();
  if (!rows.length) return [];
  const data = projectValues(ctx, access);
  return rows.map((row) => toView(row, data));
}

/** Targets of a project for someone who may read it (the home page's cards). */
export function targetsForHome(ctx: AppContext, user: AuthUser, projectId: number, role: ProjectRole | 'admin'): TargetView[] {
  return listTargets(ctx, { projectId, role, user });
}

/** The metric must be one the project knows, the unit one its values convert to, a basis only for per-mass metrics. */
function checkTarget(ctx: AppContext, projectId: number, t: { metric: string; unit: string; basis?: 'catalyst' | 'metal' | null }) {
  const responses = projectResponses(ctx, projectId);
  const response = responses.find((r) => r.key === t.metric);
  const fields: { path: string; message: string }[] = [];
  if (!response) fields.push({ path: 'metric', message: `"${t.metric}" is neither a curve metric nor a hand-entered response of this project (known: ${responses.map((r) => r.key).join(', ')})` });
  else if (conversionFactor(response.unit, t.unit) === null) fields.push({ path: 'unit', message: `${response.label} is measured in ${response.unit}; "${t.unit}" does not convert to it` });
  if (t.basis && !PER_MASS.has(t.metric)) fields.push({ path: 'basis', message: 'a basis (catalyst or metal) applies only to activities per mass' });
  if (fields.length) throw new AppError(400, 'validation', `Invalid body: ${fields.map((f) => `${f.path}: ${f.message}`).join('; ')}`, { fields });
}

export function createTarget(ctx: AppContext, access: ProjectAccess, body: z.output<typeof targetCreateSchema>): TargetView {
  checkTarget(ctx, access.projectId, body);
  const row = ctx.db.transaction((tx) => {
    const inserted = tx.insert(targets).values({
      projectId: access.projectId, metric: body.metric, comparator: body.comparator, value: body.value, unit: body.unit,
      basis: body.basis ?? null, conditions: body.conditions, dueDate: body.dueDate ?? null, name: body.name, createdBy: access.user.id,
    }).returning().get();
    audit(tx as never, { userId: access.user.id, action: 'create', entity: 'target', entityId: inserted.id, projectId: access.projectId, after: inserted });
    return inserted;
  });
  return toView(row, projectValues(ctx, access));
}

export function updateTarget(ctx: AppContext, access: ProjectAccess, before: TargetRow, body: z.output<typeof targetUpdateSchema>): TargetView {
  const merged = { metric: body.metric ?? before.metric, unit: body.unit ?? before.unit, basis: body.basis === undefined ? before.basis : body.basis };
  checkTarget(ctx, access.projectId, merged);
  const row = ctx.db.transaction((tx) => {
    const after = tx.update(targets).set({
      ...merged,
      ...(body.comparator !== undefined && { comparator: body.comparator }),
      ...(body.value !== undefined && { value: body.value }),
      ...(body.conditions !== undefined && { conditions: body.conditions }),
      ...(body.dueDate !== undefined && { dueDate: body.dueDate }),
      ...(body.name !== undefined && { name: body.name }),
      updatedAt: new Date().toISOString(),
    }).where(eq(targets.id, before.id)).returning().get();
    audit(tx as never, { userId: access.user.id, action: 'update', entity: 'target', entityId: before.id, projectId: access.projectId, before, after });
    return after;
  });
  return toView(row, projectValues(ctx, access));
}

export function deleteTarget(ctx: AppContext, access: ProjectAccess, before: TargetRow): void {
  ctx.db.transaction((tx) => {
    tx.delete(targets).where(eq(targets.id, before.id)).run();
    audit(tx as never, { userId: access.user.id, action: 'delete', entity: 'target', entityId: before.id, projectId: access.projectId, before });
  });
}

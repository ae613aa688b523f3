// Catalyst lots of a project: records (maker, batch size, date, metal content), the builds made
// from each, and the lot-to-lot comparison of a response at matched recipes.
import { and, asc, eq, sql } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppContext } from '../context';
import type { ProjectAccess } from '../auth/access';
import { builds, lots } from '../db/schema';
import { audit } from '../lib/audit';
import { conflict, AppError } from '../lib/errors';
import { listBuilds } from '../builds/service';
import { resolveResponse } from '../lineage/service';
import { compareLots } from '../../shared/lots';
import type { lotCreateSchema, lotUpdateSchema, LotView } from '../../shared/schemas/lots';

type LotRow = typeof lots.$inferSelect;

function buildCounts(ctx: AppContext, projectId: number): Map<number, number> {
  return new Map(
    ctx.db.select({ lotId: builds.lotId, n: sql<number>`count(*)` }).from(builds).where(eq(builds.projectId, projectId)).groupBy(builds.lotId).all()
      .filter((r) => r.lotId != null).map((r) => [r.lotId!, r.n]),
  );
}

function toView(row: LotRow, count: number): LotView {
  return { id: row.id, projectId: row.projectId, name: row.name, maker: row.maker, batchSizeG: row.batchSizeG ?? null, madeOn: row.madeOn ?? null, metalWtPct: row.metalWtPct ?? null, notes: row.notes, buildCount: count };
}

export function listLots(ctx: AppContext, access: ProjectAccess): LotView[] {
  const counts = buildCounts(ctx, access.projectId);
  return ctx.db.select().from(lots).where(eq(lots.projectId, access.projectId)).orderBy(asc(lots.id)).all().map((r) => toView(r, counts.get(r.id) ?? 0));
}

function nameTaken(ctx: AppContext, projectId: number, name: string, exceptId?: number) {
  const found = ctx.db.select({ id: lots.id }).from(lots).where(and(eq(lots.projectId, projectId), eq(lots.name, name))).get();
  if (found && found.id !== exceptId) throw conflict(`A lot named "${name}" is already recorded in this project.`, { fields: [{ path: 'name', message: 'already used' }] });
}

export function createLot(ctx: AppContext, access: ProjectAccess, body: z.output<typeof lotCreateSchema>): LotView {
  nameTaken(ctx, access.projectId, body.name);
  const row = ctx.db.transaction((tx) => {
    const inserted = tx.insert(lots).values({ projectId: access.projectId, name: body.name, maker: body.maker, batchSizeG: body.batchSizeG ?? null, madeOn: body.madeOn ?? null, metalWtPct: body.metalWtPct ?? null, notes: body.notes, createdBy: access.user.id }).returning().get();
    audit(tx as never, { userId: access.user.id, action: 'create', entity: 'lot', entityId: inserted.id, projectId: access.projectId, after: inserted });
    return inserted;
  });
  return toView(row, 0);
}

export function updateLot(ctx: AppContext, access: ProjectAccess, before: LotRow, body: z.output<typeof lotUpdateSchema>): LotView {
  if (body.name !== undefined) nameTaken(ctx, access.projectId, body.name, before.id);
  const row = ctx.db.transaction((tx) => {
    const after = tx.update(lots).set({
      ...(body.name !== undefined && { name: body.name }),
      ...(body.maker !== undefined && { maker: body.maker }),
      ...(body.batchSizeG !== undefined && { batchSizeG: body.batchSizeG }),
      ...(body.madeOn !== undefined && { madeOn: body.madeOn }),
      ...(body.metalWtPct !== undefined && { metalWtPct: body.metalWtPct }),
      ...(body.notes !== undefined && { notes: body.notes }),
      updatedAt: new Date().toISOString(),
    }).where(eq(lots.id, before.id)).returning().get();
    audit(tx as never, { userId: access.user.id, action: 'update', entity: 'lot', entityId: before.id, projectId: access.projectId, before, after });
    return after;
  });
  return toView(row, buildCounts(ctx, access.projectId).get(row.id) ?? 0);
}

/** A build's recipe without its lot: factor values and catalyst loading (what "matched" means). */
function recipeKey(b: { factors: Record<string, number | string>; loadingMgCm2: number | null }): string {
  const keys = Object.keys(b.factors).sort();
  return JSON.stringify([keys.map((k) => [k, b.factors[k]]), b.loadingMgCm2]);
}

/** The lot with its builds (each with metal loading: measured, or catalyst loading × the lot's metal content). */
export function lotDetail(ctx: AppContext, access: ProjectAccess, lot: LotRow) {
  const made = listBuilds(ctx, access).filter((b) => b.lotId === lot.id);
  return {
    lot: toView(lot, made.length),
    builds: made.map((b) => {
      const derived = b.loadingMgCm2 != null && lot.metalWtPct != null ? (b.loadingMgCm2 * lot.metalWtPct) / 100 : null;
      return {
        id: b.id, code: b.code, status: b.status, changeNote: b.changeNote, testedOn: b.testedOn, loadingMgCm2: b.loadingMgCm2,
        metalLoadingMgCm2: b.metalLoadingMgCm2 ?? derived,
        metalLoadingSource: b.metalLoadingMgCm2 != null ? 'measured' as const : derived != null ? 'from lot metal content' as const : null,
        values: b.values,
      };
    }),
  };
}

export function lotComparison(ctx: AppContext, access: ProjectAccess, lot: LotRow, query: { against: number; response: string }) {
  const other = ctx.db.select().from(lots).where(eq(lots.id, query.against)).get();
  if (!other || other.projectId !== lot.projectId) throw new AppError(400, 'validation', `Invalid query: against: lot ${query.against} is not a lot of this project`, { fields: [{ path: 'against', message: 'not a lot of this project' }] });
  if (other.id === lot.id) throw new AppError(400, 'validation', 'Invalid query: against: choose another lot than this one', { fields: [{ path: 'against', message: 'same lot' }] });
  const response = resolveResponse(ctx, access.projectId, query.response);
  const values = [];
  for (const b of listBuilds(ctx, access)) {
    const lotId = b.lotId;
    const value = b.values[response.key];
    if (b.status === 'discarded' || (lotId !== lot.id && lotId !== other.id) || typeof value !== 'number' || !Number.isFinite(value)) continue;
    values.push({ lotId: lotId!, recipe: recipeKey(b), value });
  }
  // a: the lot judged against (e.g. the small batch), b: this lot (e.g. the scale-up)
  const result = compareLots(other.id, lot.id, values);
  return { response, unit: response.unit, confidence: 0.95, lot: { id: lot.id, name: lot.name }, against: { id: other.id, name: other.name }, ...result };
}

// Catalyst lots of a project: records (maker, batch size, date, metal content), the builds made
// from each, and the lot-to-lot comparison of a response at matched recipes.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { and, asc, desc, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppContext, AuthUser } from '../context';
import type { ProjectAccess } from '../auth/access';
import { builds, files, lots, users } from '../db/schema';
import { readableProjects } from '../projects/service';
import { audit } from '../lib/audit';
import { conflict, AppError } from '../lib/errors';
import { listBuilds } from '../builds/service';
import { resolveResponse } from '../lineage/service';
import { compareLots } from '../../shared/lots';
import type { lotCreateSchema, lotUpdateSchema, LotFileView, LotView } from '../../shared/schemas/lots';

type LotRow = typeof lots.$inferSelect;

function buildCounts(ctx: AppContext, projectId: number): Map<number, number> {
  return new Map(
    ctx.db.select({ lotId: builds.lotId, n: sql<number>`count(*)` }).from(builds).where(eq(builds.projectId, projectId)).groupBy(builds.lotId).all()
      .filter((r) => r.lotId != null).map((r) => [r.lotId!, r.n]),
  );
}

/** The files kept with each of these lots, newest first. */
function lotFiles(ctx: AppContext, lotIds: number[]): Map<number, LotFileView[]> {
  const byLot = new Map<number, LotFileView[]>();
  if (!lotIds.length) return byLot;
  const rows = ctx.db
    .select({ id: files.id, lotId: files.lotId, name: files.originalName, sizeBytes: files.sizeBytes, contentType: files.contentType, uploadedAt: files.uploadedAt, uploadedBy: users.name })
    .from(files)
    .leftJoin(users, eq(users.id, files.uploadedBy))
    .where(and(isNotNull(files.lotId), inArray(files.lotId, lotIds)))
    .orderBy(desc(files.id))
    .all();
  for (const r of rows) {
    const list = byLot.get(r.lotId!) ?? [];
    list.push({ id: r.id, name: r.name, sizeBytes: r.sizeBytes, contentType: r.contentType, uploadedAt: r.uploadedAt, uploadedBy: r.uploadedBy ?? null });
    byLot.set(r.lotId!, list);
  }
  return byLot;
}

function toView(row: LotRow, count: number, kept: LotFileView[] = []): LotView {
  return { id: row.id, projectId: row.projectId, name: row.name, maker: row.maker, batchSizeG: row.batchSizeG ?? null, madeOn: row.madeOn ?? null, metalWtPct: row.metalWtPct ?? null, notes: row.notes, buildCount: count, files: kept };
}

export function listLots(ctx: AppContext, access: ProjectAccess): LotView[] {
  const counts = buildCounts(ctx, access.projectId);
  const rows = ctx.db.select().from(lots).where(eq(lots.projectId, access.projectId)).orderBy(asc(lots.id)).all();
  const kept = lotFiles(ctx, rows.map((r) => r.id));
  return rows.map((r) => toView(r, counts.get(r.id) ?? 0, kept.get(r.id)));
}

/** Every lot of every project the person may read (site admins: all), by project then name. */
export function listAllLots(ctx: AppContext, user: AuthUser, query: { projectId?: number; q?: string }): LotView[] {
  const names = new Map(readableProjects(ctx, user).map(({ p }) => [p.id, p.name]));
  const ids = [...names.keys()].filter((id) => query.projectId === undefined || id === query.projectId);
  if (!ids.length) return [];
  const needle = query.q?.toLowerCase();
  const rows = ctx.db.select().from(lots).where(inArray(lots.projectId, ids)).orderBy(asc(lots.projectId), asc(lots.name)).all()
    .filter((r) => !needle || r.name.toLowerCase().includes(needle) || r.maker.toLowerCase().includes(needle));
  const counts = new Map<number, number>(
    ctx.db.select({ lotId: builds.lotId, n: sql<number>`count(*)` }).from(builds).where(and(isNotNull(builds.lotId), inArray(builds.projectId, ids))).groupBy(builds.lotId).all().map((r) => [r.lotId!, r.n]),
  );
  const kept = lotFiles(ctx, rows.map((r) => r.id));
  return rows.map((r) => ({ ...toView(r, counts.get(r.id) ?? 0, kept.get(r.id)), projectName: names.get(r.projectId)! }));
}

/** What a certificate may be: documents, images and tables, not programs. */
const KEPT_EXTENSIONS = new Set(['.pdf', '.png', '.jpg', '.jpeg', '.tif', '.tiff', '.csv', '.txt', '.tsv', '.xlsx', '.xls', '.docx', '.odt', '.ods']);

/** Keep a file (a certificate of analysis, a supplier data sheet) with the lot: stored by its hash, audited. */
export async function addLotFile(ctx: AppContext, access: ProjectAccess, lot: LotRow, upload: { tmpPath: string; originalName: string; size: number; contentType: string }): Promise<LotView> {
  try {
    const ext = path.extname(upload.originalName).toLowerCase();
    if (!KEPT_EXTENSIONS.has(ext)) {
      throw new AppError(415, 'unsupported-type', `${upload.originalName}: a lot keeps documents, images and tables (${[...KEPT_EXTENSIONS].join(', ')}), not "${ext || 'no extension'}" files. Nothing was stored.`, { fields: [{ path: 'file', message: 'unsupported file type' }] });
    }
    if (upload.size === 0) throw new AppError(422, 'empty-file', `${upload.originalName}: the file is empty. Nothing was stored.`, { fields: [{ path: 'file', message: 'empty' }] });
    const hash = crypto.createHash('sha256');
    await pipeline(fs.createReadStream(upload.tmpPath), hash);
    const sha256 = hash.digest('hex');
    const { existed } = await ctx.storage.put(sha256, upload.tmpPath);
    try {
      ctx.db.transaction((tx) => {
        const file = tx.insert(files).values({ sha256, sizeBytes: upload.size, originalName: upload.originalName.slice(0, 255), contentType: upload.contentType.slice(0, 100) || 'application/octet-stream', projectId: lot.projectId, lotId: lot.id, uploadedBy: access.user.id }).returning().get();
        audit(tx as never, { userId: access.user.id, action: 'attach', entity: 'lot', entityId: lot.id, projectId: lot.projectId, after: { fileId: file.id, file: file.originalName, sha256, sizeBytes: upload.size } });
      });
    } catch (error) {
      if (!existed && !ctx.db.select({ id: files.id }).from(files).where(eq(files.sha256, sha256)).get()) await ctx.storage.remove(sha256);
      throw error;
    }
  } finally {
    fs.rmSync(upload.tmpPath, { force: true });
  }
  return lotView(ctx, lot);
}

/** The file leaves the lot's list (its bytes stay stored, as every raw file does). */
export function removeLotFile(ctx: AppContext, access: ProjectAccess, lot: LotRow, fileId: number): LotView {
  const file = ctx.db.select().from(files).where(eq(files.id, fileId)).get();
  if (!file || file.lotId !== lot.id) throw new AppError(404, 'not-found', `File ${fileId} is not kept with lot ${lot.name}.`);
  ctx.db.transaction((tx) => {
    tx.update(files).set({ lotId: null }).where(eq(files.id, fileId)).run();
    audit(tx as never, { userId: access.user.id, action: 'detach', entity: 'lot', entityId: lot.id, projectId: lot.projectId, before: { fileId, file: file.originalName } });
  });
  return lotView(ctx, lot);
}

function lotView(ctx: AppContext, lot: LotRow): LotView {
  const fresh = ctx.db.select().from(lots).where(eq(lots.id, lot.id)).get()!;
  return toView(fresh, buildCounts(ctx, lot.projectId).get(lot.id) ?? 0, lotFiles(ctx, [lot.id]).get(lot.id));
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
  return toView(row, buildCounts(ctx, access.projectId).get(row.id) ?? 0, lotFiles(ctx, [row.id]).get(row.id));
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
    lot: toView(lot, made.length, lotFiles(ctx, [lot.id]).get(lot.id)),
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

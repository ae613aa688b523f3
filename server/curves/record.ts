// The curve of record: exactly one curve per build and kind stands for the build in every table,
// chart and fit. The first upload of a kind becomes it; afterwards it changes only when someone
// chooses another curve (or deletes the record, when the oldest remaining curve takes over).
// Changing the record of a reviewed build sends the build back to review and tells the PIs.
import { and, asc, eq } from 'drizzle-orm';
import type { AppContext } from '../context';
import type { ProjectAccess } from '../auth/access';
import { builds, curves } from '../db/schema';
import { audit } from '../lib/audit';
import { AppError } from '../lib/errors';
import { notifyRecordChanged } from '../review/notify';
import type { CurveKind } from '../../shared/curves/types';
import type { BuildStatus, RecordChange, RecordChoice } from '../../shared/api-types';
import { nextStatus } from '../../shared/builds/status';

type BuildRow = typeof builds.$inferSelect;
type Tx = Parameters<Parameters<AppContext['db']['transaction']>[0]>[0];
type Reader = AppContext['db'] | Tx;

const KIND_WORD: Record<CurveKind, string> = { polarization: 'polarization curve', durability: 'durability log', hold: 'open-circuit hold', impedance: 'impedance spectrum' };

/** The build's curve of record of one kind (id and label), or null when it has no curve of that kind. */
export function recordOf(db: Reader, buildId: number, kind: CurveKind): { id: number; label: string } | null {
  return db
    .select({ id: curves.id, label: curves.label })
    .from(curves)
    .where(and(eq(curves.buildId, buildId), eq(curves.kind, kind), eq(curves.isRecord, true)))
    .get() ?? null;
}

const quoted = (label: string | null | undefined, id: number | null) => (label ? `“${label}”` : `curve ${id}`);

/** A reviewed build whose record changed goes back to "tested", waiting for a new verdict. */
function backToReview(tx: Tx, build: BuildRow): { from: BuildStatus; to: BuildStatus } | null {
  const step = nextStatus(build.status, { kind: 'record-change' });
  if (!step.ok || !step.changed) return null;
  tx.update(builds).set({ status: step.status, updatedAt: new Date().toISOString() }).where(eq(builds.id, build.id)).run();
  return { from: build.status, to: step.status };
}

function afterChange(ctx: AppContext, access: ProjectAccess, build: BuildRow, change: Omit<RecordChange, 'message'> & { fromLabel: string | null; toLabel: string | null }, cause: 'chosen' | 'deleted') {
  audit(ctx.db, {
    userId: access.user.id,
    action: 'record',
    entity: 'curve',
    entityId: change.toCurveId ?? change.fromCurveId,
    projectId: build.projectId,
    before: { buildId: build.id, kind: change.kind, curveId: change.fromCurveId, label: change.fromLabel },
    after: { buildId: build.id, kind: change.kind, curveId: change.toCurveId, label: change.toLabel, cause },
  });
  if (change.status) {
    audit(ctx.db, { userId: access.user.id, action: 'update', entity: 'build', entityId: build.id, projectId: build.projectId, before: { status: change.status.from }, after: { status: change.status.to } });
  }
}

function describeChange(build: BuildRow, change: Omit<RecordChange, 'message'> & { fromLabel: string | null; toLabel: string | null }, cause: 'chosen' | 'deleted'): string {
  const word = KIND_WORD[change.kind];
  const what = change.toCurveId == null
    ? `${build.code} has no ${word} left, so no ${word} of record: its ${change.kind} values are empty now.`
    : cause === 'deleted'
      ? `The ${word} of record of ${build.code} was removed; the oldest remaining one, ${quoted(change.toLabel, change.toCurveId)}, is the record now.`
      : `${quoted(change.toLabel, change.toCurveId)} is now the ${word} of record of ${build.code} (was ${quoted(change.fromLabel, change.fromCurveId)}).`;
  return change.status ? `${what} The build was reviewed, so it went back to review (status: tested) and the PIs were told.` : what;
}

/**
 * Make one curve the build's curve of record of its kind.
 * @throws AppError 400 when the curve is not one of this build's curves or its kind differs from `kind`
 */
export async function chooseRecord(ctx: AppContext, access: ProjectAccess, build: BuildRow, choice: RecordChoice): Promise<RecordChange> {
  const curve = ctx.db.select({ id: curves.id, buildId: curves.buildId, kind: curves.kind, label: curves.label }).from(curves).where(eq(curves.id, choice.curveId)).get();
  if (!curve || curve.buildId !== build.id) {
    throw new AppError(400, 'validation', `curveId: curve ${choice.curveId} is not a curve of build ${build.code}.`, { fields: [{ path: 'curveId', message: `not a curve of ${build.code}` }] });
  }
  if (choice.kind && choice.kind !== curve.kind) {
    throw new AppError(400, 'validation', `kind: curve ${curve.id} is a ${curve.kind} curve, not ${choice.kind}.`, { fields: [{ path: 'kind', message: `curve ${curve.id} is ${curve.kind}` }] });
  }
  const current = recordOf(ctx.db, build.id, curve.kind);
  if (current?.id === curve.id) {
    return { buildId: build.id, kind: curve.kind, fromCurveId: curve.id, toCurveId: curve.id, changed: false, status: null, message: `${quoted(curve.label, curve.id)} is already the ${KIND_WORD[curve.kind]} of record of ${build.code}; nothing changed.` };
  }
  const status = ctx.db.transaction((tx) => {
    if (current) tx.update(curves).set({ isRecord: false }).where(eq(curves.id, current.id)).run();
    tx.update(curves).set({ isRecord: true }).where(eq(curves.id, curve.id)).run();
    return backToReview(tx, build);
  });
  const change = { buildId: build.id, kind: curve.kind, fromCurveId: current?.id ?? null, toCurveId: curve.id, changed: true, status, fromLabel: current?.label ?? null, toLabel: curve.label };
  afterChange(ctx, access, build, change, 'chosen');
  if (status) await notifyRecordChanged(ctx, access.user, build, change);
  const { fromLabel: _f, toLabel: _t, ...answer } = change;
  return { ...answer, message: describeChange(build, change, 'chosen') };
}

/**
 * Delete a curve; when it was the record, the oldest remaining curve of its kind takes over
 * (audited, and a reviewed build goes back to review). Returns the record change, if any.
 */
export async function deleteCurveKeepingRecord(ctx: AppContext, access: ProjectAccess, row: { id: number; buildId: number; kind: CurveKind; label: string; isRecord: boolean }, deletedView: unknown): Promise<RecordChange | null> {
  const build = ctx.db.select().from(builds).where(eq(builds.id, row.buildId)).get()!;
  const result = ctx.db.transaction((tx) => {
    tx.delete(curves).where(eq(curves.id, row.id)).run();
    if (!row.isRecord) return null;
    const next = tx.select({ id: curves.id, label: curves.label }).from(curves).where(and(eq(curves.buildId, row.buildId), eq(curves.kind, row.kind))).orderBy(asc(curves.id)).limit(1).get();
    if (next) tx.update(curves).set({ isRecord: true }).where(eq(curves.id, next.id)).run();
    return { next: next ?? null, status: backToReview(tx, build) };
  });
  audit(ctx.db, { userId: access.user.id, action: 'delete', entity: 'curve', entityId: row.id, projectId: access.projectId, before: deletedView });
  if (!result) return null;
  const change = { buildId: build.id, kind: row.kind, fromCurveId: row.id, toCurveId: result.next?.id ?? null, changed: true, status: result.status, fromLabel: row.label, toLabel: result.next?.label ?? null };
  afterChange(ctx, access, build, change, 'deleted');
  if (result.status) await notifyRecordChanged(ctx, access.user, build, change);
  const { fromLabel: _f, toLabel: _t, ...answer } = change;
  return { ...answer, message: describeChange(build, change, 'deleted') };
}

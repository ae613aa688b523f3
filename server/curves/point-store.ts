// A curve's points in the database: small curves in `curves.points` as one blob, long ones as a
// head there and their pieces in `curve_point_chunks` (see points-codec.ts). Every reader and
// writer of stored curve points goes through here.
import type Database from 'better-sqlite3';
import type { CurveData, CurveKind } from '../../shared/curves/types';
import { decodePoints, isPiecesHead, packPoints } from './points-codec';

interface Client {
  $client: Database.Database;
}

const statements = new WeakMap<Database.Database, { insert: Database.Statement; select: Database.Statement; remove: Database.Statement }>();

function prepared(db: Client) {
  let found = statements.get(db.$client);
  if (!found) {
    found = {
      insert: db.$client.prepare('insert into curve_point_chunks (curve_id, seq, bytes) values (?, ?, ?)'),
      select: db.$client.prepare('select bytes from curve_point_chunks where curve_id = ? order by seq').pluck(),
      remove: db.$client.prepare('delete from curve_point_chunks where curve_id = ?'),
    };
    statements.set(db.$client, found);
  }
  return found;
}

/**
 * Writes a curve's pieces (from packPoints) once its row exists; inside the caller's transaction.
 * SQLite copies one piece at a time, never the whole log.
 */
export function writePointPieces(db: Client, curveId: number, pieces: readonly Uint8Array[]): void {
  const { insert } = prepared(db);
  pieces.forEach((piece, seq) => insert.run(curveId, seq, piece));
}

/** Replaces a stored curve's points: returns the new blob for `curves.points`, the pieces written already. */
export function replacePoints(db: Client, curveId: number, data: CurveData): Buffer {
  const { remove } = prepared(db);
  remove.run(curveId);
  const { points, pieces } = packPoints(data);
  writePointPieces(db, curveId, pieces);
  return points;
}

/** A stored curve's columns, from its `curves.points` blob (and its pieces, when that is a head). */
export function readPoints(db: Client, row: { id: number; points: Buffer | Uint8Array }, kind: CurveKind): CurveData {
  if (!isPiecesHead(row.points)) return decodePoints(row.points, kind);
  const { select } = prepared(db);
  return decodePoints(row.points, kind, () => select.iterate(row.id) as Iterable<Buffer>);
}

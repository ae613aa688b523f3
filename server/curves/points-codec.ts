// Curve points stored compactly: little-endian Float64 columns, not a row per point, exactly as read.
// Layout "CWP1": "CWP1" | uint32 pointCount | uint32 columnMask | column arrays in mask order, in one blob.
// Layout "CWPC" (a long curve): "CWPC" | uint32 pointCount | uint32 columnMask | uint32 pieceBytes in
// the blob, and the same column arrays, in mask order, in pieces of at most pieceBytes (no piece
// spans two columns) stored apart, in order (curve_point_chunks).
import type { CurveData, CurveKind } from '../../shared/curves/types';

// vIrFree and the impedance columns came later: each takes the next bit, so older blobs still read.
const COLUMNS = ['j', 'v', 'hfr', 'tHours', 'temperatureC', 'vIrFree', 'frequencyHz', 'zReal', 'zImag'] as const;
type ColumnName = (typeof COLUMNS)[number];
const HEADER = 12;

function presentColumns(curve: CurveData): { mask: number; present: Float64Array[] } {
  let mask = 0;
  const present: Float64Array[] = [];
  COLUMNS.forEach((name, bit) => {
    const column = curve[name as ColumnName];
    if (column) {
      mask |= 1 << bit;
      present.push(column);
    }
  });
  return { mask, present };
}

/** Curves whose columns take more than this are stored in pieces (about 130,000 rows of four columns). */
export const PIECES_ABOVE_BYTES = 4 << 20;
/** The size of one stored piece. */
export const PIECE_BYTES = 1 << 20;

/**
 * The stored form of a curve: one "CWP1" blob, or for a long curve a "CWPC" head and its pieces —
 * views of the curve's own columns (nothing is copied; store them before the columns change).
 */
export function packPoints(curve: CurveData, options: { piecesAboveBytes?: number; pieceBytes?: number } = {}): { points: Buffer; pieces: Uint8Array[] } {
  const n = curve.v.length;
  const { mask, present } = presentColumns(curve);
  const pieceBytes = options.pieceBytes ?? PIECE_BYTES;
  if (present.length * n * 8 <= (options.piecesAboveBytes ?? PIECES_ABOVE_BYTES)) return { points: encodePoints(curve), pieces: [] };
  if (pieceBytes % 8 !== 0 || pieceBytes <= 0) throw new RangeError(`packPoints: pieceBytes must be a positive multiple of 8, got ${pieceBytes}`);
  const head = Buffer.alloc(16);
  head.write('CWPC', 0, 'latin1');
  head.writeUInt32LE(n, 4);
  head.writeUInt32LE(mask, 8);
  head.writeUInt32LE(pieceBytes, 12);
  const pieces: Uint8Array[] = [];
  for (const column of present) {
    const bytes = new Uint8Array(column.buffer, column.byteOffset, n * 8);
    for (let at = 0; at < bytes.length; at += pieceBytes) pieces.push(bytes.subarray(at, Math.min(bytes.length, at + pieceBytes)));
  }
  return { points: head, pieces };
}

/** Whether a stored blob is the head of a curve kept in pieces. */
export function isPiecesHead(blob: Uint8Array): boolean {
  return blob.length === 16 && blob[0] === 0x43 && blob[1] === 0x57 && blob[2] === 0x50 && blob[3] === 0x43;
}

export function encodePoints(curve: CurveData): Buffer {
  const n = curve.v.length;
  const { mask, present } = presentColumns(curve);
  const buffer = Buffer.allocUnsafe(HEADER + present.length * n * 8);
  buffer.write('CWP1', 0, 'latin1');
  buffer.writeUInt32LE(n, 4);
  buffer.writeUInt32LE(mask, 8);
  let offset = HEADER;
  for (const column of present) {
    const bytes = new Uint8Array(column.buffer, column.byteOffset, n * 8);
    buffer.set(bytes, offset);
    offset += n * 8;
  }
  return buffer;
}

/**
 * A stored curve's columns: from its "CWP1" blob, or from a "CWPC" head and its pieces in order
 * (`pieces` is only called for a head). Each piece is copied once into the curve's own columns.
 * @throws Error when the layout is unknown or the pieces do not add up to the head's columns
 */
export function decodePoints(blob: Buffer | Uint8Array, kind: CurveKind, pieces?: () => Iterable<Uint8Array>): CurveData {
  const buffer = Buffer.isBuffer(blob) ? blob : Buffer.from(blob);
  const layout = buffer.toString('latin1', 0, 4);
  if (layout !== 'CWP1' && !(layout === 'CWPC' && isPiecesHead(buffer))) throw new Error('stored curve points have an unknown layout');
  const n = buffer.readUInt32LE(4);
  const mask = buffer.readUInt32LE(8);
  let aligned: ArrayBuffer;
  if (layout === 'CWPC') {
    if (!pieces) throw new Error('stored curve points are kept in pieces, and none were given');
    let count = 0;
    for (let bits = mask; bits; bits &= bits - 1) count++;
    aligned = new ArrayBuffer(count * n * 8);
    const into = new Uint8Array(aligned);
    let at = 0;
    for (const piece of pieces()) {
      if (at + piece.length > into.length) throw new Error('stored curve points: the pieces hold more bytes than the head says');
      into.set(piece, at);
      at += piece.length;
    }
    if (at !== into.length) throw new Error(`stored curve points: the pieces hold ${at} of ${into.length} bytes`);
  } else {
    // copy into an aligned ArrayBuffer so Float64Array views are legal
    aligned = new ArrayBuffer(buffer.length - HEADER);
    new Uint8Array(aligned).set(buffer.subarray(HEADER));
  }
  const out: Partial<Record<ColumnName, Float64Array>> = {};
  let offset = 0;
  COLUMNS.forEach((name, bit) => {
    if (mask & (1 << bit)) {
      out[name] = new Float64Array(aligned, offset, n);
      offset += n * 8;
    }
  });
  const data: CurveData = { kind, j: out.j ?? new Float64Array(n), v: out.v ?? new Float64Array(n), hfr: out.hfr, tHours: out.tHours, temperatureC: out.temperatureC };
  if (out.vIrFree) data.vIrFree = out.vIrFree;
  if (out.frequencyHz) Object.assign(data, { frequencyHz: out.frequencyHz, zReal: out.zReal, zImag: out.zImag });
  return data;
}

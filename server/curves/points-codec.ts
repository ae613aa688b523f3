// Curve points stored compactly: one blob of little-endian Float64 columns, not a row per point.
// Layout: "CWP1" | uint32 pointCount | uint32 columnMask | column arrays in mask order.
import type { CurveData, CurveKind } from '../../shared/curves/types';

// vIrFree and the impedance columns came later: each takes the next bit, so older blobs still read.
const COLUMNS = ['j', 'v', 'hfr', 'tHours', 'temperatureC', 'vIrFree', 'frequencyHz', 'zReal', 'zImag'] as const;
type ColumnName = (typeof COLUMNS)[number];
const HEADER = 12;

export function encodePoints(curve: CurveData): Buffer {
  const n = curve.v.length;
  let mask = 0;
  const present: Float64Array[] = [];
  COLUMNS.forEach((name, bit) => {
    const column = curve[name as ColumnName];
    if (column) {
      mask |= 1 << bit;
      present.push(column);
    }
  });
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

export function decodePoints(blob: Buffer | Uint8Array, kind: CurveKind): CurveData {
  const buffer = Buffer.isBuffer(blob) ? blob : Buffer.from(blob);
  if (buffer.toString('latin1', 0, 4) !== 'CWP1') throw new Error('stored curve points have an unknown layout');
  const n = buffer.readUInt32LE(4);
  const mask = buffer.readUInt32LE(8);
  // copy into an aligned ArrayBuffer so Float64Array views are legal
  const aligned = new ArrayBuffer(buffer.length - HEADER);
  new Uint8Array(aligned).set(buffer.subarray(HEADER));
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

// The stored form of curve points: one blob for a short curve, a head and pieces for a long one;
// both read back bit for bit (points are stored exactly, Float64).
import { describe, expect, it } from 'vitest';
import { decodePoints, encodePoints, isPiecesHead, packPoints } from '../../../server/curves/points-codec';
import type { CurveData } from '../../../shared/curves/types';

// invented values; -0, a subnormal and the largest double check that nothing is rounded on the way
const curve = (n: number): CurveData => {
  const j = new Float64Array(n), v = new Float64Array(n), tHours = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    j[i] = 0.2 + i * 1e-7;
    v[i] = 0.6 - i / 3e7;
    tHours[i] = i / 60;
  }
  v[1] = -0;
  v[2] = 5e-324;
  j[3] = Number.MAX_VALUE;
  return { kind: 'durability', j, v, tHours };
};
const sameBits = (a: Float64Array, b: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength).equals(Buffer.from(b.buffer, b.byteOffset, b.byteLength));

describe('curve points storage', () => {
  it('keeps a short curve in one blob', () => {
    const data = curve(1000);
    const { points, pieces } = packPoints(data);
    expect(pieces).toEqual([]);
    expect(points.equals(encodePoints(data))).toBe(true);
    expect(points.length).toBe(12 + 3 * 1000 * 8); // derived by hand: 12-byte head + 3 columns × 1,000 × 8 bytes
    const back = decodePoints(points, 'durability');
    expect(sameBits(back.v, data.v) && sameBits(back.j, data.j) && sameBits(back.tHours!, data.tHours!)).toBe(true);
  });

  it('keeps a long curve as a head and pieces that never span two columns, and reads it back bit for bit', () => {
    const data = curve(1001);
    const { points, pieces } = packPoints(data, { piecesAboveBytes: 0, pieceBytes: 800 });
    expect(isPiecesHead(points)).toBe(true);
    // derived by hand: each column is 8,008 bytes → 10 pieces of 800 and one of 8; 3 columns
    expect(pieces.map((p) => p.length)).toEqual([...Array(3)].flatMap(() => [...Array(10).fill(800), 8]));
    // the pieces are views of the curve's columns, not copies
    expect(pieces[0]!.buffer).toBe(data.j.buffer);
    const back = decodePoints(points, 'durability', () => pieces);
    expect(sameBits(back.v, data.v) && sameBits(back.j, data.j) && sameBits(back.tHours!, data.tHours!)).toBe(true);
    expect(Object.is(back.v[1], -0)).toBe(true);
    expect(back.v[2]).toBe(5e-324);
  });

  it('refuses pieces that do not add up to the head, and a head without its pieces', () => {
    const data = curve(100);
    const { points, pieces } = packPoints(data, { piecesAboveBytes: 0, pieceBytes: 256 });
    expect(() => decodePoints(points, 'durability', () => pieces.slice(1))).toThrow(/pieces hold 2144 of 2400 bytes/); // 2,400 − 256
    expect(() => decodePoints(points, 'durability', () => [...pieces, new Uint8Array(8)])).toThrow(/more bytes than the head says/);
    expect(() => decodePoints(points, 'durability')).toThrow(/kept in pieces/);
    expect(() => packPoints(data, { piecesAboveBytes: 0, pieceBytes: 12 })).toThrow(RangeError);
  });
});

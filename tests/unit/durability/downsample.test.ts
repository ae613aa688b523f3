import { describe, it, expect } from 'vitest';
import { downsampleForPlot } from '../../../shared/durability';

function series(count: number): { t: Float64Array; v: Float64Array } {
  const t = new Float64Array(count);
  const v = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    t[i] = i / 60; // a row a minute, h
    v[i] = 0.65 - 8e-6 * t[i] + 5e-4 * Math.sin(i / 50);
  }
  return { t, v };
}

describe('downsampleForPlot', () => {
  const { t, v } = series(200_000);

  it('keeps at most maxPoints, with the first and last points', () => {
    const out = downsampleForPlot(t, v, 2000);
    expect(out.t.length).toBeLessThanOrEqual(2000);
    expect(out.t.length).toBeGreaterThan(1900); // derived by hand: 999 buckets × 2 + 2 = 2000
    expect(out.t[0]).toBe(t[0]);
    expect(out.v[0]).toBe(v[0]);
    expect(out.t[out.t.length - 1]).toBe(t[t.length - 1]);
    expect(out.v[out.v.length - 1]).toBe(v[v.length - 1]);
  });

  it('keeps time order and a one-row spike', () => {
    const spiked = v.slice();
    spiked[123_457] = 0.3; // an invented dip, e.g. a brief gas starvation
    const out = downsampleForPlot(t, spiked, 500);
    for (let i = 1; i < out.t.length; i++) expect(out.t[i]).toBeGreaterThanOrEqual(out.t[i - 1]);
    expect(Math.min(...out.v)).toBe(0.3); // input: the spike value survives min/max bucketing
  });

  it('returns a copy of a short series unchanged', () => {
    const out = downsampleForPlot(t.subarray(0, 100), v.subarray(0, 100), 2000);
    expect(Array.from(out.t)).toEqual(Array.from(t.subarray(0, 100)));
  });

  it('limits itself to a time range', () => {
    const out = downsampleForPlot(t, v, 300, { fromHours: 1000, toHours: 2000 });
    expect(out.t[0]).toBeCloseTo(1000, 9); // the range start, on the minute grid
    expect(out.t[out.t.length - 1]).toBeCloseTo(2000, 9); // the range end, on the minute grid
    expect(out.t.length).toBeLessThanOrEqual(300);
  });

  it('can use largest-triangle-three-buckets from the downsample package', () => {
    const out = downsampleForPlot(t, v, 1000, undefined, { method: 'lttb' });
    expect(out.t.length).toBe(1000); // LTTB returns exactly the requested count
    expect(out.t[0]).toBe(t[0]);
    expect(out.t[999]).toBe(t[t.length - 1]);
  });

  it('throws on mismatched lengths, a bad maxPoints and a bad range', () => {
    expect(() => downsampleForPlot(t, v.subarray(1), 100)).toThrow(/same length/);
    expect(() => downsampleForPlot(t, v, 3)).toThrow(/maxPoints/);
    expect(() => downsampleForPlot(t, v, 10.5)).toThrow(/maxPoints/);
    expect(() => downsampleForPlot(t, v, 100, { fromHours: NaN, toHours: 1 })).toThrow(/range/);
  });
});

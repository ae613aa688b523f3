// Thins a long voltage-time series to what a plot can show, keeping its look: spikes, steps at
// restarts and the first and last points survive.
import { createLTTB } from 'downsample';
import { lowerBound, upperBound } from './sorted-search';

export interface DownsampleOptions {
  /** 'minmax' (default): the lowest and highest point of each bucket, in time order — fast, keeps every
   *  spike; 'lttb': largest-triangle-three-buckets from the `downsample` package — smoother look, slower */
  method?: 'minmax' | 'lttb';
}

/**
 * Downsamples (t, v) to at most maxPoints points for plotting, optionally within a time range.
 * minmax: split the interior rows into (maxPoints − 2) / 2 equal-count buckets and keep each bucket's
 * minimum and maximum of v (in time order), plus the first and last rows.
 * lttb: Steinarsson's largest-triangle-three-buckets via the `downsample` npm package.
 * Reference: S. Steinarsson (2013), "Downsampling time series for visual representation", MSc thesis,
 * University of Iceland (LTTB; min/max bucketing is the baseline it is compared with).
 * Cost: minmax O(n) time, no allocation per point; lttb O(n) time with one small array per point.
 * t must be non-decreasing (rows in time order) for the range to be found by binary search.
 * @throws RangeError when t and v differ in length, maxPoints is not an integer ≥ 4, or the range is not finite.
 * @example downsampleForPlot(curve.tHours, curve.v, 2000).t.length // ≤ 2000
 */
export function downsampleForPlot(
  t: Float64Array,
  v: Float64Array,
  maxPoints: number,
  range?: { fromHours: number; toHours: number },
  options: DownsampleOptions = {},
): { t: Float64Array; v: Float64Array } {
  if (t.length !== v.length) throw new RangeError(`downsampleForPlot: t and v must have the same length, got ${t.length} and ${v.length}`);
  if (!Number.isInteger(maxPoints) || maxPoints < 4) {
    throw new RangeError(`downsampleForPlot: maxPoints must be an integer ≥ 4, got ${maxPoints}`);
  }
  let from = 0;
  let to = t.length;
  if (range) {
    if (!Number.isFinite(range.fromHours) || !Number.isFinite(range.toHours)) {
      throw new RangeError(`downsampleForPlot: range must be finite, got ${range.fromHours} to ${range.toHours}`);
    }
    from = lowerBound(t, range.fromHours);
    to = upperBound(t, range.toHours);
    if (to < from) to = from;
  }
  const count = to - from;
  if (count <= maxPoints) return { t: t.slice(from, to), v: v.slice(from, to) };

  if (options.method === 'lttb') {
    const indices = new Uint32Array(count);
    for (let i = 0; i < count; i++) indices[i] = from + i;
    const lttb = createLTTB<number>({ x: (index: number) => t[index], y: (index: number) => v[index] });
    const chosen = lttb(indices, maxPoints) as Uint32Array;
    const outT = new Float64Array(chosen.length);
    const outV = new Float64Array(chosen.length);
    for (let i = 0; i < chosen.length; i++) {
      outT[i] = t[chosen[i]];
      outV[i] = v[chosen[i]];
    }
    return { t: outT, v: outV };
  }

  const buckets = Math.floor((maxPoints - 2) / 2);
  const outT = new Float64Array(2 + 2 * buckets);
  const outV = new Float64Array(2 + 2 * buckets);
  let written = 0;
  outT[written] = t[from];
  outV[written] = v[from];
  written++;
  const interiorFrom = from + 1;
  const interiorCount = count - 2;
  for (let b = 0; b < buckets; b++) {
    const bucketFrom = interiorFrom + Math.floor((b * interiorCount) / buckets);
    const bucketTo = interiorFrom + Math.floor(((b + 1) * interiorCount) / buckets);
    if (bucketTo <= bucketFrom) continue;
    let minIndex = bucketFrom;
    let maxIndex = bucketFrom;
    for (let i = bucketFrom + 1; i < bucketTo; i++) {
      const value = v[i];
      if (value < v[minIndex]) minIndex = i;
      if (value > v[maxIndex]) maxIndex = i;
    }
    const firstIndex = minIndex < maxIndex ? minIndex : maxIndex;
    const secondIndex = minIndex < maxIndex ? maxIndex : minIndex;
    outT[written] = t[firstIndex];
    outV[written] = v[firstIndex];
    written++;
    if (secondIndex !== firstIndex) {
      outT[written] = t[secondIndex];
      outV[written] = v[secondIndex];
      written++;
    }
  }
  outT[written] = t[to - 1];
  outV[written] = v[to - 1];
  written++;
  return { t: outT.slice(0, written), v: outV.slice(0, written) };
}

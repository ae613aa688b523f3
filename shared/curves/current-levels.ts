// Distinct current levels of a column: how many set points a curve steps through, and how much
// of the time it spends at the most common one (a durability log sits at one level).

export interface CurrentLevel {
  /** mean of the readings in the level, in the column's unit */
  center: number;
  /** readings (of the sample) in the level */
  count: number;
}

export interface CurrentLevelsOptions {
  /** readings within this fraction of their neighbour belong to one level; default 0.03 */
  relativeTolerance?: number;
  /** …or within this absolute difference, in the column's unit; default 0 */
  absoluteTolerance?: number;
  /** at most this many evenly spaced readings are looked at; default 20,000 */
  maxSample?: number;
}

export interface CurrentLevelsResult {
  levels: CurrentLevel[];
  /** share of the sampled readings in the largest level, 0–1 */
  modalShare: number;
  sampled: number;
}

/**
 * Groups readings into levels: sorted, a reading starts a new level when it is further from the
 * previous reading than max(relativeTolerance × |previous|, absoluteTolerance). Readings of one
 * galvanostatic step differ by far less than neighbouring set points (common practice in the
 * trade: steps 10–100 % apart, readings within ~1 %). NaN readings are skipped.
 * Cost: O(m log m) for a sample of m ≤ maxSample readings.
 * @example countCurrentLevels(Float64Array.of(0, 0.1, 0.1, 0.2)).levels.length // 3
 */
export function countCurrentLevels(values: ArrayLike<number>, options: CurrentLevelsOptions = {}): CurrentLevelsResult {
  const relative = options.relativeTolerance ?? 0.03;
  const absolute = options.absoluteTolerance ?? 0;
  const maxSample = options.maxSample ?? 20_000;
  if (!(relative >= 0) || !(absolute >= 0)) throw new RangeError('countCurrentLevels: tolerances must be ≥ 0');
  const stride = Math.max(1, Math.ceil(values.length / maxSample));
  const sample: number[] = [];
  for (let index = 0; index < values.length; index += stride) {
    const value = values[index];
    if (value === value) sample.push(value);
  }
  sample.sort((a, b) => a - b);
  const levels: CurrentLevel[] = [];
  let sum = 0;
  let count = 0;
  for (let index = 0; index < sample.length; index++) {
    const value = sample[index];
    if (count > 0) {
      const previous = sample[index - 1];
      if (value - previous > Math.max(relative * Math.abs(previous), absolute)) {
        levels.push({ center: sum / count, count });
        sum = 0;
        count = 0;
      }
    }
    sum += value;
    count++;
  }
  if (count > 0) levels.push({ center: sum / count, count });
  let largest = 0;
  for (const level of levels) if (level.count > largest) largest = level.count;
  return { levels, modalShare: sample.length === 0 ? 0 : largest / sample.length, sampled: sample.length };
}

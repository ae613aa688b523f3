// The slope of a straight line with its Student-t interval, the core of every series analysis
// (ln j against 1/T, ln j against ln p).
import { fitLine } from '../stats/linear-fit';
import { tQuantile } from '../stats/distributions';
import type { SlopeInterval } from './types';

/**
 * Least-squares slope of y against x with its two-sided interval at `confidence`.
 * Definition: slope b and SE(b) from ordinary least squares (fitLine); interval b ± t·SE(b) with
 * t the Student quantile at (1 + confidence)/2 and n − 2 degrees of freedom. With exactly two
 * points the line passes through both: the slope is returned with no SE and no interval.
 * Reference: Draper & Smith, "Applied Regression Analysis", 3rd ed., ch. 1 (confidence interval of
 * the slope); the fit itself is checked against NIST StRD Norris (tests/unit/stats/linear-fit.test.ts).
 * Cost: O(n).
 * @throws RangeError when the arrays differ in length, hold fewer than 2 points, a value is not
 *   finite, all x are equal, or confidence is not in (0, 1).
 * @example slopeWithInterval([1, 2, 3, 4], [2.1, 3.9, 6.2, 7.8]).slope // 1.93
 */
export function slopeWithInterval(x: readonly number[], y: readonly number[], confidence = 0.95): SlopeInterval {
  if (x.length !== y.length) throw new RangeError(`slopeWithInterval: x and y must have the same length, got ${x.length} and ${y.length}`);
  if (x.length < 2) throw new RangeError(`slopeWithInterval: at least 2 points are needed, got ${x.length}`);
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`slopeWithInterval: confidence must be in (0, 1), got ${confidence}`);
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) throw new RangeError(`slopeWithInterval: values must be finite numbers, got x[${i}] = ${x[i]}, y[${i}] = ${y[i]}`);
  }
  const distinctX = new Set(x).size;
  if (distinctX < 2) throw new RangeError(`slopeWithInterval: x must take at least 2 different values, got all x = ${x[0]}`);
  if (x.length === 2) {
    const slope = (y[1] - y[0]) / (x[1] - x[0]);
    return { slope, slopeSE: null, intercept: y[0] - slope * x[0], low: null, high: null, confidence, n: 2, distinctX, df: 0, tCritical: null, r2: null, residualSD: null };
  }
  const line = fitLine(x, y);
  const df = line.n - 2;
  const tCritical = tQuantile((1 + confidence) / 2, df);
  return {
    slope: line.slope,
    slopeSE: line.slopeSE,
    intercept: line.intercept,
    low: line.slope - tCritical * line.slopeSE,
    high: line.slope + tCritical * line.slopeSE,
    confidence,
    n: line.n,
    distinctX,
    df,
    tCritical,
    r2: line.r2,
    residualSD: line.residualSD,
  };
}

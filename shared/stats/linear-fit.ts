// Straight-line least-squares fit y = intercept + slope·x with standard errors, written to
// stay accurate on long, offset data (durability logs: 10⁵–10⁶ points of ~0.6 V at hours 0–5000).
import { CompensatedSum } from './compensated-sum';

/** Result of a straight-line fit. */
export interface LineFit {
  /** dy/dx */
  slope: number;
  /** y at x = 0 */
  intercept: number;
  /** standard error of the slope (ordinary least squares, independent errors) */
  slopeSE: number;
  /** standard error of the intercept */
  interceptSE: number;
  /** residual standard deviation, sqrt(RSS / (n − 2)) */
  residualSD: number;
  /** coefficient of determination, 1 − RSS / Syy (1 when y is constant and fitted exactly) */
  r2: number;
  /** number of points used */
  n: number;
  /** mean of x over the points used (the fit's centre; handy for prediction intervals) */
  meanX: number;
  /** mean of y over the points used */
  meanY: number;
  /** Σ(x − x̄)² over the points used */
  sxx: number;
  /** residual sum of squares */
  rss: number;
}

/** Index range [from, to) into the arrays. */
export interface IndexRange {
  from: number;
  to: number;
}

/**
 * Ordinary least-squares straight line through (x[i], y[i]) for i in [range.from, range.to).
 *
 * Definition: slope = Sxy / Sxx, intercept = ȳ − slope·x̄, with Sxx = Σ(x − x̄)², Sxy = Σ(x − x̄)(y − ȳ);
 * residual SD s = sqrt(Σr² / (n − 2)); SE(slope) = s / sqrt(Sxx); SE(intercept) = s·sqrt(1/n + x̄²/Sxx).
 * Numerics: three passes — compensated (Neumaier) sums for the means, centred sums of squares and
 * cross-products with the first-pass rounding error removed (the "corrected two-pass" form), and the
 * residual sum of squares summed from residuals directly, never as Syy − slope·Sxy, which cancels
 * catastrophically when R² is close to 1.
 * Reference: Chan, Golub & LeVeque (1983), "Algorithms for computing the sample variance", Am. Stat.
 * 37, 242–247; Draper & Smith, "Applied Regression Analysis", ch. 1; checked against NIST StRD Norris.
 * Cost: O(n) time, three passes, no allocation per point.
 * @throws RangeError when the arrays differ in length, the range is not inside them, fewer than
 *   3 points are used, a value is not finite, or all x are equal.
 * @example fitLine([0, 1, 2, 3], [1, 3, 5, 7]).slope // 2
 */
export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>, range?: IndexRange): LineFit {
  if (x.length !== y.length) {
    throw new RangeError(`fitLine: x and y must have the same length, got ${x.length} and ${y.length}`);
  }
  const from = range ? range.from : 0;
  const to = range ? range.to : x.length;
  if (!Number.isInteger(from) || !Number.isInteger(to) || from < 0 || to > x.length || from > to) {
    throw new RangeError(`fitLine: range must satisfy 0 ≤ from ≤ to ≤ ${x.length} (integers), got from ${from}, to ${to}`);
  }
  const n = to - from;
  if (n < 3) throw new RangeError(`fitLine: at least 3 points are needed, got ${n}`);

  // Pass 1: means with Neumaier compensation (also catches non-finite values).
  const sumX = new CompensatedSum();
  const sumY = new CompensatedSum();
  for (let i = from; i < to; i++) {
    const xi = x[i];
    const yi = y[i];
    if (!Number.isFinite(xi) || !Number.isFinite(yi)) {
      throw new RangeError(`fitLine: values must be finite numbers, got x[${i}] = ${xi}, y[${i}] = ${yi}`);
    }
    sumX.add(xi);
    sumY.add(yi);
  }
  const meanX0 = sumX.value() / n;
  const meanY0 = sumY.value() / n;

  // Pass 2: centred sums. Σdx and Σdy are not exactly zero in floating point; their remainders
  // correct both the means and the sums of squares (Chan, Golub & LeVeque's corrected two-pass).
  let sdx = 0;
  let sdy = 0;
  const sxx = new CompensatedSum();
  const sxy = new CompensatedSum();
  const syy = new CompensatedSum();
  for (let i = from; i < to; i++) {
    const dx = x[i] - meanX0;
    const dy = y[i] - meanY0;
    sdx += dx;
    sdy += dy;
    sxx.add(dx * dx);
    sxy.add(dx * dy);
    syy.add(dy * dy);
  }
  const meanX = meanX0 + sdx / n;
  const meanY = meanY0 + sdy / n;
  const Sxx = sxx.value() - (sdx * sdx) / n;
  const Sxy = sxy.value() - (sdx * sdy) / n;
  const Syy = syy.value() - (sdy * sdy) / n;
  if (!(Sxx > 0)) throw new RangeError(`fitLine: x must not be constant, got all x = ${x[from]}`);

  const slope = Sxy / Sxx;
  const intercept = meanY - slope * meanX;

  // Pass 3: residuals summed directly (about the centred line, so no large offsets enter).
  const residualSquares = new CompensatedSum();
  for (let i = from; i < to; i++) {
    const r = y[i] - meanY - slope * (x[i] - meanX);
    residualSquares.add(r * r);
  }
  const rss = residualSquares.value();

  const residualSD = Math.sqrt(rss / (n - 2));
  const slopeSE = residualSD / Math.sqrt(Sxx);
  const interceptSE = residualSD * Math.sqrt(1 / n + (meanX * meanX) / Sxx);
  const r2 = Syy > 0 ? 1 - rss / Syy : 1;
  return { slope, intercept, slopeSE, interceptSE, residualSD, r2, n, meanX, meanY, sxx: Sxx, rss };
}

/**
 * The least-squares slope alone, for callers that need no standard errors: fitLine's slope for
 * three or more points, the two-point slope for two, null when x is constant, fewer than two
 * points are given, or a value is not finite.
 * Cost: O(n).
 * @throws never.
 * @example lineSlope([0, 1, 2], [1, 3, 5]) // 2
 */
export function lineSlope(x: ArrayLike<number>, y: ArrayLike<number>): number | null {
  if (x.length !== y.length || x.length < 2) return null;
  if (x.length === 2) {
    const slope = (y[1] - y[0]) / (x[1] - x[0]);
    return Number.isFinite(slope) ? slope : null;
  }
  try {
    return fitLine(x, y).slope;
  } catch (error) {
    if (error instanceof RangeError) return null;
    throw error;
  }
}

// Shapes shared by the series analyses (apparent activation energy, apparent reaction order).

/** One point of a series plot: x and y as plotted, with the build it came from. */
export interface SeriesPoint {
  buildId: number;
  x: number;
  y: number;
}

/** A slope read off a straight line with its interval (see slopeWithInterval). */
export interface SlopeInterval {
  slope: number;
  /** standard error of the slope; null with two points (no degrees of freedom left) */
  slopeSE: number | null;
  intercept: number;
  /** slope interval at `confidence`; null with two points */
  low: number | null;
  high: number | null;
  confidence: number;
  /** points used */
  n: number;
  /** distinct x values among them */
  distinctX: number;
  /** n − 2 */
  df: number;
  /** Student t quantile used for the interval; null with two points */
  tCritical: number | null;
  /** coefficient of determination; null with two points (trivially 1) */
  r2: number | null;
  /** residual standard deviation; null with two points */
  residualSD: number | null;
}

/**
 * Result of a series analysis. The first six fields are the API's series answer
 * `{kind, points, estimate, low, high, unit}`; the rest say how it was obtained.
 */
export interface SeriesResult {
  kind: 'arrhenius' | 'order';
  points: SeriesPoint[];
  /** Eₐ in kJ/mol (arrhenius) or the dimensionless order (order) */
  estimate: number;
  /** interval at `confidence`; null when only two points were given */
  low: number | null;
  high: number | null;
  unit: string;
  confidence: number;
  /** what x and y are, with units, for axis titles */
  xLabel: string;
  yLabel: string;
  /** the straight line behind the estimate, in the plotted x and y */
  fit: SlopeInterval;
  /** one sentence: what was fitted and how the interval was formed */
  method: string;
  /** caveats (two points only, too narrow a span, interval holding zero, …) */
  notes: string[];
  /**
   * order only: true when the interval holds 0 ("no dependence within noise"), false when it does
   * not, null with two points (no interval)
   */
  noDependenceWithinNoise?: boolean | null;
}

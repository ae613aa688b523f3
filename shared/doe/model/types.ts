// Shapes shared by the response-surface code: factors, observed runs, model choice and the
// fitted surface. Everything here is plain data (JSON-safe), so a fit computed on the server
// can be sent to the browser and used there for prediction and proposals.

/** A recipe or test variable. Continuous factors are coded −1…+1 over low/high. */
export interface Factor {
  key: string;
  label?: string;
  unit?: string;
  kind: 'continuous' | 'categorical';
  /** continuous only: the bottom of the working range, in the factor's unit */
  low?: number;
  /** continuous only: the top of the working range, in the factor's unit */
  high?: number;
  /** categorical only: the levels; the first one is the baseline of the treatment coding */
  levels?: string[];
}

/** One observed run (a tested build): its factor values and the response value. */
export interface Observation {
  factors: Record<string, number | string>;
  y: number;
  buildId?: number;
  /** how a person names the run (a build code like "C-017"); used in messages instead of row numbers */
  label?: string;
  block?: number | string;
}

/** Which terms to fit. Term strings: "binder", "binder*temp", "binder^2". */
export type ModelSpec = 'linear' | 'interactions' | 'quadratic' | { terms: string[] };

/** A factor as the fit used it: continuous factors always carry the low/high used for coding. */
export interface ResolvedFactor {
  key: string;
  label?: string;
  unit?: string;
  kind: 'continuous' | 'categorical';
  low?: number;
  high?: number;
  levels?: string[];
  /** continuous only: smallest and largest value seen in the data */
  dataMin?: number;
  dataMax?: number;
  /** categorical only: the levels at least one run was made at */
  levelsRun?: string[];
}

/**
 * One model term: a product of factor powers. `powers[i]` belongs to `factors[i]` of the
 * resolved factor list (0 = absent). Categorical factors only ever have power 0 or 1.
 */
export interface ModelTerm {
  name: string;
  powers: number[];
  degree: number;
}

/**
 * One column of the model matrix. A term with a categorical factor gives one column per
 * non-baseline level (treatment coding), named like `temp*gdl[carbon paper]`.
 */
export interface ModelColumn {
  name: string;
  /** name of the term this column belongs to ("intercept" for the constant) */
  term: string;
  /** powers of the continuous factors, aligned with the resolved factor list */
  powers: number[];
  /** categorical indicators in this column: factor index → level that makes the indicator 1 */
  indicators: { factor: number; level: string }[];
}

export interface Coefficient {
  /** column name, e.g. "intercept", "temp", "temp*binder", "temp^2", "gdl[cloth]" */
  term: string;
  /** the column in words, e.g. "Cell temperature × PTFE binder", "GDL: cloth" */
  label: string;
  /** estimate in coded units (0 for an aliased column, which was not estimated) */
  coded: number;
  codedSE: number | null;
  t: number | null;
  p: number | null;
  /** coefficient of the same monomial when the model is written in actual units */
  actual: number;
  actualSE: number | null;
  /** variance inflation factor (null for the intercept and for aliased columns) */
  vif: number | null;
  /** true when the column was a linear combination of earlier ones and was dropped */
  aliased: boolean;
}

export interface AnovaRow {
  ss: number;
  df: number;
  ms: number;
}

export interface AnovaTestRow extends AnovaRow {
  f: number | null;
  p: number | null;
}

export interface AnovaTermRow extends AnovaTestRow {
  term: string;
  /** the term in words */
  label: string;
}

export interface Anova {
  model: AnovaTestRow;
  residual: AnovaRow;
  lackOfFit?: AnovaTestRow;
  pureError?: AnovaRow;
  total: { ss: number; df: number };
  /** partial (adjusted) sum of squares of each term given all the others */
  terms: AnovaTermRow[];
}

/**
 * What prediction, extrapolation checks, canonical analysis and proposals need from a fit.
 * rInverse is R⁻¹ of the thin QR of the coded model matrix (estimated columns only), so
 * (XᵀX)⁻¹ = R⁻¹R⁻ᵀ without ever forming XᵀX.
 */
export interface FitBasis {
  factors: ResolvedFactor[];
  columns: ModelColumn[];
  /** indices into columns of the estimated (non-aliased) columns, in the order of rInverse */
  estimated: number[];
  rInverse: number[][];
  /** coded coefficients of the estimated columns */
  beta: number[];
  mse: number;
  dfResidual: number;
  maxLeverage: number;
}

export interface SurfaceFit {
  response?: string;
  /** model term names, intercept first */
  terms: string[];
  coefficients: Coefficient[];
  anova: Anova;
  r2: number;
  adjR2: number;
  /** 1 − PRESS/SS_total; null when a run has leverage 1 (PRESS undefined) */
  predR2: number | null;
  press: number | null;
  rmse: number;
  n: number;
  distinctRuns: number;
  /** recipes (distinct settings) built more than once */
  replicateGroups?: number;
  leverage: number[];
  residuals: number[];
  predicted: number[];
  warnings: string[];
  basis: FitBasis;
}

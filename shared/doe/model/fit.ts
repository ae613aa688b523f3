// Fits a response-surface model to observed runs: least squares in coded units, ANOVA with
// lack of fit and pure error, PRESS, leverage, VIF, and the coefficients in actual units.
import { fUpperP, tTwoSidedP } from '../../stats/distributions';
import { DoeInputError } from './errors';
import { encodePoint } from './encode';
import { checkRows, resolveFactors, rowPlace, settingsKey } from './factors';
import { qrLeastSquares } from './numeric';
import { compensatedDot, compensatedSum } from '../../stats/compensated-sum';
import { buildModelTerms, modelRow } from './terms';
import { columnLabel, factorName, termLabel } from './labels';
import type {
  Anova,
  AnovaTermRow,
  Coefficient,
  Factor,
  ModelColumn,
  ModelSpec,
  Observation,
  ResolvedFactor,
  SurfaceFit,
} from './types';

export interface FitSurfaceInput {
  factors: Factor[];
  rows: Observation[];
  model: ModelSpec;
  /** name of the response (e.g. "vAtRef"), carried into the result and messages */
  responseKey?: string;
}

const VIF_LIMIT = 10;

/** A number with at most 6 significant digits, for messages. */
function short(value: number): string {
  return String(Number(value.toPrecision(6)));
}

function finiteOrNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

function binomial(n: number, k: number): number {
  let result = 1;
  for (let i = 1; i <= k; i++) result = (result * (n - k + i)) / i;
  return result;
}

function columnSignature(powers: number[], indicators: { factor: number; level: string }[]): string {
  const levels = indicators.map((entry) => `${entry.factor}=${entry.level}`).sort();
  return `${powers.join(',')}|${levels.join(';')}`;
}

/**
 * Coefficient map from coded to actual units. Each coded column Π((x_f − c_f)/h_f)^p_f is
 * expanded by the binomial theorem into actual monomials Π x_f^q_f (q ≤ p), which are columns
 * of the same model because the model is hierarchical. Returns T with actual = T·coded.
 */
function codedToActualMap(factors: ResolvedFactor[], columns: ModelColumn[]): number[][] {
  const p = columns.length;
  const index = new Map<string, number>();
  for (let j = 0; j < p; j++) index.set(columnSignature(columns[j].powers, columns[j].indicators), j);
  const map: number[][] = [];
  for (let k = 0; k < p; k++) map.push(new Array<number>(p).fill(0));
  for (let j = 0; j < p; j++) {
    const powers = columns[j].powers;
    const target = new Array<number>(powers.length).fill(0);
    const walk = (f: number, factorProduct: number): void => {
      if (f === powers.length) {
        const k = index.get(columnSignature(target, columns[j].indicators));
        if (k === undefined) throw new Error(`fitSurface: model is not hierarchical at column ${columns[j].name} (internal)`);
        map[k][j] += factorProduct;
        return;
      }
      if (powers[f] === 0) {
        target[f] = 0;
        walk(f + 1, factorProduct);
        return;
      }
      const low = factors[f].low as number;
      const high = factors[f].high as number;
      const centre = (low + high) / 2;
      const half = (high - low) / 2;
      for (let q = 0; q <= powers[f]; q++) {
        target[f] = q;
        const weight = (binomial(powers[f], q) * (-centre) ** (powers[f] - q)) / half ** powers[f];
        walk(f + 1, factorProduct * weight);
      }
      target[f] = 0;
    };
    walk(0, 1);
  }
  return map;
}

function describeRows(indices: number[], rows: Observation[]): string {
  const shown = indices.slice(0, 6).map((i) => rowPlace(i, rows[i]));
  return indices.length > 6 ? `${shown.join('; ')} and ${indices.length - 6} more` : shown.join('; ');
}

/** The runs as the fit sees them: resolved factors, model columns, coded rows and replicate groups. */
interface Design {
  input: FitSurfaceInput;
  rows: Observation[];
  responseKey: string | undefined;
  factors: ResolvedFactor[];
  built: ReturnType<typeof buildModelTerms>;
  columns: ModelColumn[];
  warnings: string[];
  n: number;
  p: number;
  encodedRows: ReturnType<typeof encodePoint>[];
  x: number[][];
  y: number[];
  /** run indices by identical factor settings */
  groups: Map<string, number[]>;
  distinctRuns: number;
}

/** The least-squares solution and what follows from it directly. */
interface Solved {
  estimated: number[];
  aliased: number[];
  beta: number[];
  rInverse: number[][];
  rank: number;
  predicted: number[];
  residuals: number[];
  ssTotal: number;
  ssResidual: number;
  dfResidual: number;
  mse: number;
  dfModel: number;
  ssModel: number;
  /** (XᵀX)⁻¹ of the estimated columns */
  cov: number[][];
  leverage: number[];
  press: number | null;
  /** model column → its position among the estimated columns */
  positionOf: Map<number, number>;
}

/** Step 1: check the input, build the model columns, code the runs and group replicates. */
function prepareDesign(input: FitSurfaceInput): Design {
  if (!input || typeof input !== 'object') {
    throw new DoeInputError('invalid-row', 'fitSurface: input must be an object { factors, rows, model } (input)');
  }
  const { rows, model, responseKey } = input;
  if (!Array.isArray(rows)) throw new DoeInputError('invalid-row', 'fitSurface: rows must be an array (rows)');
  const factors = resolveFactors('fitSurface', input.factors, rows);
  checkRows('fitSurface', factors, rows);
  const built = buildModelTerms(factors, model);
  const columns = built.columns;
  const warnings = [...built.warnings];
  const n = rows.length;
  const p = columns.length;
  const responseName = responseKey ? `response "${responseKey}"` : 'the response';
  if (n <= p) {
    throw new DoeInputError(
      'too-few-runs',
      `fitSurface: need more runs than model terms to estimate the error (${n} runs, ${p} model columns; ${responseName})`,
      { runs: n, columns: p },
    );
  }

  const encodedRows = rows.map((row) => encodePoint('fitSurface', factors, row.factors));
  const x = encodedRows.map((encoded) => modelRow(columns, encoded));
  const y = rows.map((row) => row.y);

  const groups = new Map<string, number[]>();
  for (let i = 0; i < n; i++) {
    const key = settingsKey(factors, rows[i]);
    const members = groups.get(key);
    if (members) members.push(i);
    else groups.set(key, [i]);
  }
  const distinctRuns = groups.size;
  if (distinctRuns < p) {
    warnings.push(`Only ${distinctRuns} distinct factor settings for ${p} model columns: the model cannot be fully estimated; use a smaller model or add runs.`);
  }
  return { input, rows, responseKey, factors, built, columns, warnings, n, p, encodedRows, x, y, groups, distinctRuns };
}

/** Step 2: Householder QR with rank checks; residuals, sums of squares, (XᵀX)⁻¹, leverages and PRESS. */
function solve(design: Design): Solved {
  const { factors, columns, warnings, n, x, y } = design;
  const ls = qrLeastSquares(x, y);
  const { estimated, aliased, beta, rInverse } = ls;
  const rank = estimated.length;
  if (aliased.length > 0) {
    const names = aliased.map((j) => columnLabel(factors, columns[j])).join(', ');
    warnings.push(`Aliased terms (linear combinations of earlier terms in these runs) were not estimated: ${names}.`);
  }

  // fitted values and residuals
  const predicted = new Array<number>(n);
  const residuals = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    const rowValues = estimated.map((j) => x[i][j]);
    predicted[i] = compensatedDot(rowValues, beta);
    residuals[i] = y[i] - predicted[i];
  }
  const meanY = compensatedSum(y) / n;
  const ssTotal = compensatedSum(y.map((value) => (value - meanY) * (value - meanY)));
  const ssResidual = compensatedSum(residuals.map((e) => e * e));
  const dfResidual = n - rank;
  const mse = ssResidual / dfResidual;
  const dfModel = rank - 1;
  const ssModel = Math.max(0, ssTotal - ssResidual);

  // (XᵀX)⁻¹ = R⁻¹R⁻ᵀ, its diagonal, and leverages hᵢ = ‖xᵢᵀR⁻¹‖²
  const cov = new Array<number[]>(rank);
  for (let a = 0; a < rank; a++) {
    cov[a] = new Array<number>(rank);
    for (let b = 0; b < rank; b++) {
      let sum = 0;
      for (let m = Math.max(a, b); m < rank; m++) sum += rInverse[a][m] * rInverse[b][m];
      cov[a][b] = sum;
    }
  }
  const leverage = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    let sumSquares = 0;
    for (let m = 0; m < rank; m++) {
      let z = 0;
      for (let a = 0; a <= m; a++) z += x[i][estimated[a]] * rInverse[a][m];
      sumSquares += z * z;
    }
    leverage[i] = sumSquares;
  }

  let press: number | null = 0;
  const pressTerms: number[] = [];
  for (let i = 0; i < n; i++) {
    const oneMinusH = 1 - leverage[i];
    if (!(oneMinusH > 1e-10)) {
      press = null;
      break;
    }
    const deleted = residuals[i] / oneMinusH;
    pressTerms.push(deleted * deleted);
  }
  if (press !== null) press = compensatedSum(pressTerms);
  const positionOf = new Map<number, number>();
  estimated.forEach((j, position) => positionOf.set(j, position));
  return { estimated, aliased, beta, rInverse, rank, predicted, residuals, ssTotal, ssResidual, dfResidual, mse, dfModel, ssModel, cov, leverage, press, positionOf };
}

/** Step 3: coded and actual-unit coefficients with SEs, t, p and VIF; aliased columns reported with coded 0. */
function coefficientTable(design: Design, solved: Solved): Coefficient[] {
  const { factors, columns, warnings, n, p, x } = design;
  const { estimated, beta, rInverse, rank, dfResidual, mse, cov, positionOf } = solved;
  const codedAll = new Array<number>(p).fill(0);
  estimated.forEach((j, position) => {
    codedAll[j] = beta[position];
  });
  const map = codedToActualMap(factors, columns);
  const coefficients: Coefficient[] = [];
  const highVif: string[] = [];
  for (let k = 0; k < p; k++) {
    const position = positionOf.get(k);
    const actualTerms: number[] = [];
    for (let j = 0; j < p; j++) if (map[k][j] !== 0) actualTerms.push(map[k][j] * codedAll[j]);
    const actual = compensatedSum(actualTerms);
    // actual-unit variance: row k of T·R⁻¹ (estimated columns), squared and summed
    let actualVariance = 0;
    for (let m = 0; m < rank; m++) {
      const parts: number[] = [];
      for (let a = 0; a <= m; a++) {
        const weight = map[k][estimated[a]];
        if (weight !== 0) parts.push(weight * rInverse[a][m]);
      }
      const v = compensatedSum(parts);
      actualVariance += v * v;
    }
    const actualSE = Math.sqrt(mse * actualVariance);
    if (position === undefined) {
      coefficients.push({ term: columns[k].name, label: columnLabel(factors, columns[k]), coded: 0, codedSE: null, t: null, p: null, actual, actualSE: finiteOrNull(actualSE), vif: null, aliased: true });
      continue;
    }
    const codedSE = Math.sqrt(mse * cov[position][position]);
    const t = beta[position] / codedSE;
    let vif: number | null = null;
    if (k !== 0) {
      const column = x.map((row) => row[k]);
      const mean = compensatedSum(column) / n;
      const centredSS = compensatedSum(column.map((value) => (value - mean) * (value - mean)));
      // the non-intercept block of (XᵀX)⁻¹ is the inverse of the centred cross-products,
      // so VIF_j = [(XᵀX)⁻¹]_jj · Σ(x_ij − x̄_j)² = 1/(1 − R_j²)
      vif = cov[position][position] * centredSS;
      if (vif > VIF_LIMIT) highVif.push(`${columnLabel(factors, columns[k])} (${short(vif)})`);
    }
    coefficients.push({
      term: columns[k].name,
      label: columnLabel(factors, columns[k]),
      coded: beta[position],
      codedSE: finiteOrNull(codedSE),
      t: finiteOrNull(t),
      p: Number.isFinite(t) ? tTwoSidedP(t, dfResidual) : null,
      actual,
      actualSE: finiteOrNull(actualSE),
      vif,
      aliased: false,
    });
  }
  if (highVif.length > 0) {
    warnings.push(`Variance inflation above ${VIF_LIMIT} (correlated terms, unstable coefficients): ${highVif.join(', ')}.`);
  }
  return coefficients;
}

/** Step 4: partial (adjusted) SS of each term given all others. */
function termRowsOf(design: Design, solved: Solved): AnovaTermRow[] {
  const { factors, built, columns, n, p, x, y } = design;
  const { estimated, beta, ssResidual, dfResidual, mse, cov, positionOf } = solved;
  // partial (adjusted) SS of each term given all others: b_Tᵀ (C_TT)⁻¹ b_T
  const termRows: AnovaTermRow[] = [];
  for (const term of built.terms) {
    if (term.name === 'intercept') continue;
    const positions: number[] = [];
    for (let j = 0; j < p; j++) {
      const position = positionOf.get(j);
      if (columns[j].term === term.name && position !== undefined) positions.push(position);
    }
    if (positions.length === 0) continue;
    let ss: number;
    if (positions.length === 1) ss = (beta[positions[0]] * beta[positions[0]]) / cov[positions[0]][positions[0]];
    else {
      // several columns (a categorical term): refit without them rather than invert their
      // covariance block, which can be near singular in a poor design
      const kept = estimated.filter((_, position) => !positions.includes(position));
      const reduced = qrLeastSquares(x.map((row) => kept.map((j) => row[j])), y);
      const reducedResiduals = new Array<number>(n);
      for (let i = 0; i < n; i++) {
        const rowValues = reduced.estimated.map((j) => x[i][kept[j]]);
        const e = y[i] - compensatedDot(rowValues, reduced.beta);
        reducedResiduals[i] = e * e;
      }
      ss = Math.max(0, compensatedSum(reducedResiduals) - ssResidual);
    }
    const df = positions.length;
    const ms = ss / df;
    const f = ms / mse;
    termRows.push({ term: term.name, label: termLabel(factors, term), ss, df, ms, f: finiteOrNull(f), p: Number.isFinite(f) ? fUpperP(f, df, dfResidual) : null });
  }
  return termRows;
}

/** Step 5: the ANOVA table: model, residual, total, terms, and pure error / lack of fit from replicates. */
function anovaOf(design: Design, solved: Solved, termRows: AnovaTermRow[]): Anova {
  const { warnings, n, y, groups } = design;
  const { ssTotal, ssResidual, dfResidual, mse, dfModel, ssModel } = solved;
  const fModel = dfModel > 0 ? ssModel / dfModel / mse : NaN;
  const anova: Anova = {
    model: {
      ss: ssModel,
      df: dfModel,
      ms: dfModel > 0 ? ssModel / dfModel : 0,
      f: finiteOrNull(fModel),
      p: Number.isFinite(fModel) ? fUpperP(fModel, dfModel, dfResidual) : null,
    },
    residual: { ss: ssResidual, df: dfResidual, ms: mse },
    total: { ss: ssTotal, df: n - 1 },
    terms: termRows,
  };

  // pure error from replicate groups; lack of fit is what is left of the residual
  const pureErrorParts: number[] = [];
  let dfPureError = 0;
  for (const members of groups.values()) {
    if (members.length < 2) continue;
    const groupMean = compensatedSum(members.map((i) => y[i])) / members.length;
    for (const i of members) pureErrorParts.push((y[i] - groupMean) * (y[i] - groupMean));
    dfPureError += members.length - 1;
  }
  if (dfPureError > 0) {
    const ssPureError = compensatedSum(pureErrorParts);
    const msPureError = ssPureError / dfPureError;
    anova.pureError = { ss: ssPureError, df: dfPureError, ms: msPureError };
    const dfLackOfFit = dfResidual - dfPureError;
    if (dfLackOfFit > 0) {
      const ssLackOfFit = Math.max(0, ssResidual - ssPureError);
      const msLackOfFit = ssLackOfFit / dfLackOfFit;
      const fLackOfFit = msLackOfFit / msPureError;
      anova.lackOfFit = {
        ss: ssLackOfFit,
        df: dfLackOfFit,
        ms: msLackOfFit,
        f: finiteOrNull(fLackOfFit),
        p: Number.isFinite(fLackOfFit) ? fUpperP(fLackOfFit, dfLackOfFit, dfPureError) : null,
      };
    } else {
      warnings.push('Lack of fit cannot be tested: the model has as many terms as there are distinct settings.');
    }
  } else {
    warnings.push('No replicated settings: pure error and lack of fit cannot be separated (replicate a centre point to test lack of fit).');
  }
  return anova;
}

/** Step 6: leverage, coverage of the ranges, units, blocks and degenerate-response warnings. */
function addDataWarnings(design: Design, solved: Solved): void {
  const { rows, factors, warnings, n, encodedRows } = design;
  const { rank, ssTotal, ssResidual, leverage, press } = solved;
  const leverageLimit = (2 * rank) / n;
  if (leverageLimit < 1) {
    const high: number[] = [];
    for (let i = 0; i < n; i++) if (leverage[i] > leverageLimit) high.push(i);
    if (high.length > 0) {
      warnings.push(`High-leverage runs (leverage above 2p/n = ${short(leverageLimit)}), which steer the fit strongly: ${describeRows(high, rows)}.`);
    }
  }
  if (press === null) {
    warnings.push('A build has leverage 1 (the model passes through it exactly): its left-out error, PRESS and the R² for left-out builds cannot be worked out.');
  }
  for (let f = 0; f < factors.length; f++) {
    const factor = factors[f];
    if (factor.kind !== 'continuous') continue;
    const low = factor.low as number;
    const high = factor.high as number;
    const range = high - low;
    const dataMin = factor.dataMin as number;
    const dataMax = factor.dataMax as number;
    if (dataMin > low + 0.1 * range || dataMax < high - 0.1 * range) {
      warnings.push(`${factorName(factor)}: the runs cover only ${short(dataMin)}–${short(dataMax)} of the range ${short(low)}–${short(high)}${factor.unit ? ` ${factor.unit}` : ''}; predictions near the range ends are extrapolation.`);
    }
    let largestCoded = 0;
    for (const encoded of encodedRows) largestCoded = Math.max(largestCoded, Math.abs(encoded[f] as number));
    if (largestCoded > 2) {
      warnings.push(`${factorName(factor)}: some runs lie far outside the range ${short(low)}–${short(high)}${factor.unit ? ` ${factor.unit}` : ''} (up to ${short(largestCoded)} half-ranges from the centre); check the units.`);
    }
  }
  const blocks = new Set<string>();
  for (const row of rows) if (row.block !== undefined && row.block !== null) blocks.add(String(row.block));
  if (blocks.size > 1) warnings.push(`The runs carry ${blocks.size} blocks; block effects are not part of this model.`);
  if (ssTotal === 0) warnings.push('The response does not vary across the builds: nothing to model.');
  if (ssResidual === 0 && ssTotal > 0) warnings.push('The residual error is zero: the model reproduces every run exactly, so standard errors and tests are not meaningful.');
}

/**
 * Fits a response-surface model by least squares.
 * Definition: continuous factors are coded −1…+1 over low/high (data min/max when not
 * given), categorical factors are treatment coded; coefficients come from a Householder QR
 * of the coded model matrix (never the normal equations), (XᵀX)⁻¹ = R⁻¹R⁻ᵀ. Actual-unit
 * coefficients and their standard errors follow exactly from the linear map that expands the
 * coded polynomial. ANOVA: model/residual about the mean; lack of fit = residual − pure error,
 * pure error from the spread within groups of runs with identical settings; partial SS per
 * term. PRESS = Σ(eᵢ/(1 − hᵢᵢ))², predicted R² = 1 − PRESS/SS_total.
 * Reference: Montgomery, Design and Analysis of Experiments, ch. 10–11; Myers, Montgomery &
 * Anderson-Cook, Response Surface Methodology, ch. 2–3; NIST/SEMATECH e-Handbook §4.4.
 * Cost: O(n·p²) for n runs and p model columns.
 * @throws DoeInputError: 'invalid-factor', 'invalid-row', 'invalid-model', or 'too-few-runs'
 *   when there are no more runs than model columns (n ≤ p).
 * @example fitSurface({ factors, rows, model: 'quadratic' }).coefficients[1].coded
 */
export function fitSurface(input: FitSurfaceInput): SurfaceFit {
  const design = prepareDesign(input);
  const solved = solve(design);
  const coefficients = coefficientTable(design, solved);
  const anova = anovaOf(design, solved, termRowsOf(design, solved));
  addDataWarnings(design, solved);
  const { responseKey, factors, built, columns, warnings, n, groups, distinctRuns } = design;
  const { estimated, rInverse, beta, residuals, predicted, ssTotal, ssResidual, dfResidual, mse, leverage, press } = solved;
  const r2 = ssTotal > 0 ? 1 - ssResidual / ssTotal : 0;
  const adjR2 = ssTotal > 0 ? 1 - (ssResidual / dfResidual) / (ssTotal / (n - 1)) : 0;
  const predR2 = press !== null && ssTotal > 0 ? 1 - press / ssTotal : null;
  let maxLeverage = 0;
  for (const h of leverage) maxLeverage = Math.max(maxLeverage, h);

  return {
    response: responseKey,
    terms: built.terms.map((term) => term.name),
    coefficients,
    anova,
    r2,
    adjR2,
    predR2,
    press,
    rmse: Math.sqrt(mse),
    n,
    distinctRuns,
    replicateGroups: [...groups.values()].filter((members) => members.length > 1).length,
    leverage,
    residuals,
    predicted,
    warnings,
    basis: { factors, columns, estimated, rInverse, beta, mse, dfResidual, maxLeverage },
  };
}

// Whether the runs can support a model at all, decided before anything is fitted: enough
// distinct recipes for the model's columns, and no column that the runs cannot tell apart from
// the others (aliased). The answer names the terms in words, so a person can act on it.
import { DoeInputError } from './errors';
import { encodePoint } from './encode';
import { checkRows, resolveFactors, settingsKey } from './factors';
import { columnLabel } from './labels';
import { qrLeastSquares } from './numeric';
import { buildModelTerms, modelRow } from './terms';
import type { Factor, ModelColumn, ModelSpec, Observation, ResolvedFactor } from './types';

export interface AliasedColumn {
  /** the column in words */
  label: string;
  /** the estimated columns it is a combination of, in words (empty for a column of zeros) */
  with: string[];
}

export interface ModelSupport {
  supported: boolean;
  /** 'too-few-runs' or 'aliased-terms' when not supported */
  code: 'too-few-runs' | 'aliased-terms' | null;
  /** one sentence saying why not (empty when supported) */
  reason: string;
  /** model-matrix columns, the constant included */
  columns: number;
  runs: number;
  distinctRuns: number;
  /** distinct recipes this model needs: one more than its columns */
  distinctNeeded: number;
  aliased: AliasedColumn[];
}

function capital(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Which estimated columns an aliased column is made of: least squares of it on them. */
function partners(x: number[][], estimated: number[], j: number, columns: ModelColumn[], factors: ResolvedFactor[]): string[] {
  const target = x.map((row) => row[j]);
  if (target.every((value) => value === 0)) return [];
  const fit = qrLeastSquares(x.map((row) => estimated.map((e) => row[e])), target);
  let largest = 0;
  for (const b of fit.beta) largest = Math.max(largest, Math.abs(b));
  const out: string[] = [];
  fit.estimated.forEach((position, a) => {
    if (Math.abs(fit.beta[a]) > 1e-6 * largest) out.push(columnLabel(factors, columns[estimated[position]]));
  });
  return out;
}

/**
 * Checks that the runs can support a model, before fitting it.
 * Definition: supported when the number of distinct recipes (factor settings; replicates count
 * once) exceeds the number of model columns — so at least one recipe is left over to test the
 * model's shape — and no column is a linear combination of the others over those recipes
 * (Householder QR with the rank test of qrLeastSquares). Aliased columns are reported with the
 * columns they cannot be told apart from.
 * Reference: estimability in linear models, Montgomery, Design and Analysis of Experiments,
 * §8.2 (aliasing) and ch. 10; Golub & Van Loan, Matrix Computations, §5.4 (rank detection).
 * Cost: O(d·p²) for d distinct recipes and p columns.
 * @throws DoeInputError ('invalid-factor', 'invalid-row', 'invalid-model') for bad input.
 * @example checkModelSupport(factors, rows, 'quadratic').reason // 'The full quadratic model has 21 columns …'
 */
export function checkModelSupport(factorList: Factor[], rows: Observation[], model: ModelSpec, modelName = 'this model'): ModelSupport {
  if (!Array.isArray(rows)) throw new DoeInputError('invalid-row', 'checkModelSupport: rows must be an array (rows)');
  const factors = resolveFactors('checkModelSupport', factorList, rows);
  checkRows('checkModelSupport', factors, rows);
  const { columns } = buildModelTerms(factors, model);
  const p = columns.length;
  const distinct = new Map<string, Observation>();
  for (const row of rows) {
    const key = settingsKey(factors, row);
    if (!distinct.has(key)) distinct.set(key, row);
  }
  const d = distinct.size;
  const base = { columns: p, runs: rows.length, distinctRuns: d, distinctNeeded: p + 1, aliased: [] as AliasedColumn[] };
  if (d < p + 1) {
    return {
      ...base,
      supported: false,
      code: 'too-few-runs',
      reason: `${capital(modelName)} has ${p} terms (the constant included) but the builds give only ${d} distinct recipe${d === 1 ? '' : 's'}; it needs at least ${p + 1}. Fit fewer terms, or make builds at new recipes.`,
    };
  }
  const x = [...distinct.values()].map((row) => modelRow(columns, encodePoint('checkModelSupport', factors, row.factors)));
  const ls = qrLeastSquares(x, new Array<number>(x.length).fill(0));
  if (ls.aliased.length > 0) {
    const aliased = ls.aliased.map((j) => ({ label: columnLabel(factors, columns[j]), with: partners(x, ls.estimated, j, columns, factors) }));
    const words = aliased
      .map((a) => (a.with.length === 0 ? `${a.label} (never varied in these builds)` : `${a.label} (moves together with ${a.with.join(' and ')})`))
      .join('; ');
    return {
      ...base,
      aliased,
      supported: false,
      code: 'aliased-terms',
      reason: `In these builds some terms of ${modelName} cannot be told apart from others: ${words}. Leave those terms out, or make builds that vary them separately.`,
    };
  }
  return { ...base, supported: true, code: null, reason: '' };
}

// Automatic model choice: the simplest model the builds support that predicts a left-out build
// about as well as the best one, from the standard ladder (quadratic, interactions, linear) and
// a term-by-term search between them. The choice is returned with its reasons.
import { DoeInputError } from './errors';
import { encodePoint } from './encode';
import { checkRows, resolveFactors, settingsKey } from './factors';
import { termLabel } from './labels';
import { qrLeastSquares } from './numeric';
import { compensatedSum } from '../../stats/compensated-sum';
import { buildModelTerms, modelRow, termName } from './terms';
import type { Factor, ModelColumn, ModelTerm, Observation } from './types';

export type CandidateName = 'linear' | 'interactions' | 'quadratic' | 'selected';

export interface ModelCandidate {
  name: CandidateName;
  /** term names without the constant, e.g. ["binder", "cellTemp", "binder*cellTemp"] */
  terms: string[];
  /** the same terms in words */
  termLabels: string[];
  /** model-matrix columns, the constant included */
  columns: number;
  supported: boolean;
  /** why the builds cannot support it (empty when supported) */
  reason: string;
  /** √(PRESS/n), internal units; null when not supported */
  looRmse: number | null;
  /** distinct recipes needed to fit it with two to spare */
  distinctNeeded: number;
}

export interface ModelChoice {
  chosen: ModelCandidate;
  /** the standard ladder and the searched model, chosen one included */
  candidates: ModelCandidate[];
  runs: number;
  distinctRuns: number;
  /** the rule, in words */
  rule: string;
  /** tolerance used: a simpler model wins while its error is within (1 + tolerance) of the best */
  tolerance: number;
}

export interface ChooseModelInput {
  factors: Factor[];
  rows: Observation[];
  /** relative slack in leave-one-out error for preferring a simpler model (default 0.05) */
  tolerance?: number;
}

interface Evaluation {
  supported: boolean;
  reason: string;
  looRmse: number | null;
  columns: number;
}

const SPARE_RECIPES = 2;
const STEP_GAIN = 0.01;
const MAX_STEPS = 40;

export const MODEL_CHOICE_RULE =
  'Every model the builds can support (at least two distinct recipes more than its terms, no terms that move together) is scored by its leave-one-out error — each build predicted from a fit without it. The simplest model within 5 % of the lowest error is chosen.';

/**
 * Chooses the response-surface model the runs support.
 * Definition: candidates are the linear, two-factor-interaction and full quadratic models and
 * a model found by stepwise search from the linear one, adding a second-order term whose
 * parents are present or removing a term no other term needs, one move at a time, taking the
 * move that lowers the leave-one-out RMS error √(PRESS/n) most while it lowers it by at least
 * 1 %. A model is supported when the distinct recipes number at least its columns + 2, no
 * column is aliased, and no build has leverage 1. The chosen model is the one with the fewest
 * columns whose error is within (1 + tolerance) of the lowest.
 * Reference: PRESS as a selection criterion, Allen (1974), Technometrics 16, 125–127; Myers,
 * Montgomery & Anderson-Cook, Response Surface Methodology, §2.8 (hierarchy, selection). The
 * spare-recipe and 5 % rules are our own.
 * Cost: O(s·m·n·p²) for s steps and m candidate moves; s, m ≲ 40 in practice.
 * @throws DoeInputError ('invalid-factor', 'invalid-row') for bad input; ('too-few-runs') when not
 *   even one main effect can be supported.
 * @example chooseModel({ factors, rows }).chosen.terms // ['binder', 'cellTemp', 'binder*cellTemp']
 */
export function chooseModel(input: ChooseModelInput): ModelChoice {
  const tolerance = input.tolerance ?? 0.05;
  const factors = resolveFactors('chooseModel', input.factors, input.rows);
  checkRows('chooseModel', factors, input.rows);
  const rows = input.rows;
  const n = rows.length;
  const full = buildModelTerms(factors, 'quadratic');
  const encoded = rows.map((row) => encodePoint('chooseModel', factors, row.factors));
  const xFull = encoded.map((e) => modelRow(full.columns, e));
  const y = rows.map((row) => row.y);
  const distinctRows = new Map<string, number>();
  rows.forEach((row, i) => {
    const key = settingsKey(factors, row);
    if (!distinctRows.has(key)) distinctRows.set(key, i);
  });
  const distinct = distinctRows.size;
  const distinctIndex = [...distinctRows.values()];
  const termByName = new Map<string, ModelTerm>();
  for (const term of full.terms) termByName.set(term.name, term);
  const columnsOf = new Map<string, number[]>();
  full.columns.forEach((column: ModelColumn, j: number) => {
    const list = columnsOf.get(column.term) ?? [];
    list.push(j);
    columnsOf.set(column.term, list);
  });

  const cache = new Map<string, Evaluation>();
  const evaluate = (terms: string[]): Evaluation => {
    const key = [...terms].sort().join('|');
    const seen = cache.get(key);
    if (seen) return seen;
    const picked = [0];
    for (const name of terms) for (const j of columnsOf.get(name) ?? []) picked.push(j);
    const p = picked.length;
    let result: Evaluation;
    if (distinct < p + SPARE_RECIPES) {
      result = { supported: false, reason: `needs ${p + SPARE_RECIPES} distinct recipes, the builds give ${distinct}`, looRmse: null, columns: p };
    } else {
      const x = xFull.map((row) => picked.map((j) => row[j]));
      const onDistinct = qrLeastSquares(distinctIndex.map((i) => x[i]), new Array<number>(distinct).fill(0));
      if (onDistinct.aliased.length > 0) {
        result = { supported: false, reason: 'some of its terms move together in these builds', looRmse: null, columns: p };
      } else {
        const ls = qrLeastSquares(x, y);
        const press = pressOf(x, y, ls);
        result = press === null
          ? { supported: false, reason: 'a build is the only one fixing some term (leverage 1), so its error cannot be judged', looRmse: null, columns: p }
          : { supported: true, reason: '', looRmse: Math.sqrt(press / n), columns: p };
      }
    }
    cache.set(key, result);
    return result;
  };

  const mainTerms = full.terms.filter((t) => t.degree === 1).map((t) => t.name);
  const secondOrder = full.terms.filter((t) => t.degree === 2).map((t) => t.name);
  const interactions = secondOrder.filter((name) => !(termByName.get(name) as ModelTerm).powers.some((power) => power === 2));
  const divides = (small: number[], big: number[]): boolean => small.every((power, f) => power <= big[f]);
  // hierarchy: every term that divides this one (its parents) is in the model
  const parentsPresent = (name: string, set: Set<string>): boolean => {
    const powers = (termByName.get(name) as ModelTerm).powers;
    for (const other of termByName.values()) {
      if (other.degree === 0 || other.degree >= (termByName.get(name) as ModelTerm).degree) continue;
      if (divides(other.powers, powers) && !set.has(other.name)) return false;
    }
    return true;
  };
  // a term another term of the model needs cannot be removed
  const hasChildren = (name: string, set: Set<string>): boolean => {
    const term = termByName.get(name) as ModelTerm;
    for (const other of set) {
      if (other === name) continue;
      const child = termByName.get(other) as ModelTerm;
      if (child.degree > term.degree && divides(term.powers, child.powers)) return true;
    }
    return false;
  };
  const better = (a: Evaluation, b: Evaluation | null): boolean => {
    if (!a.supported) return false;
    if (!b || !b.supported) return true;
    return (a.looRmse as number) < (b.looRmse as number) * (1 - STEP_GAIN);
  };

  // stepwise search from the linear model
  let current = new Set(mainTerms);
  let currentEval = evaluate([...current]);
  // the linear model may itself be too big: drop main effects until one is supported
  while (!currentEval.supported && current.size > 1) {
    let best: { set: Set<string>; ev: Evaluation } | null = null;
    for (const name of current) {
      const next = new Set(current);
      next.delete(name);
      const ev = evaluate([...next]);
      if (!best || (ev.supported && (!best.ev.supported || (ev.looRmse as number) < (best.ev.looRmse as number)))) best = { set: next, ev };
    }
    if (!best) break;
    current = best.set;
    currentEval = best.ev;
  }
  if (!currentEval.supported) {
    throw new DoeInputError('too-few-runs', `chooseModel: ${distinct} distinct recipe${distinct === 1 ? '' : 's'} cannot support even one factor (a model with one factor needs ${2 + SPARE_RECIPES})`, { runs: n, distinctRuns: distinct });
  }
  for (let step = 0; step < MAX_STEPS; step++) {
    let best: { set: Set<string>; ev: Evaluation } | null = null;
    for (const name of secondOrder) {
      if (current.has(name) || !parentsPresent(name, current)) continue;
      const next = new Set(current);
      next.add(name);
      const ev = evaluate([...next]);
      if (ev.supported && (!best || (ev.looRmse as number) < (best.ev.looRmse as number))) best = { set: next, ev };
    }
    for (const name of current) {
      if (current.size === 1 || hasChildren(name, current)) continue;
      const next = new Set(current);
      next.delete(name);
      const ev = evaluate([...next]);
      if (ev.supported && (!best || (ev.looRmse as number) < (best.ev.looRmse as number))) best = { set: next, ev };
    }
    if (!best || !better(best.ev, currentEval)) break;
    current = best.set;
    currentEval = best.ev;
  }

  const ordered = (set: Iterable<string>): string[] => full.terms.map((t) => t.name).filter((name) => name !== 'intercept' && [...set].includes(name));
  const candidate = (name: CandidateName, terms: string[]): ModelCandidate => {
    const ev = evaluate(terms);
    return {
      name,
      terms,
      termLabels: terms.map((t) => termLabel(factors, termByName.get(t) as ModelTerm)),
      columns: ev.columns,
      supported: ev.supported,
      reason: ev.reason,
      looRmse: ev.looRmse,
      distinctNeeded: ev.columns + SPARE_RECIPES,
    };
  };
  const candidates: ModelCandidate[] = [
    candidate('linear', mainTerms),
    candidate('interactions', ordered([...mainTerms, ...interactions])),
    candidate('quadratic', ordered([...mainTerms, ...secondOrder])),
  ];
  const searched = ordered(current);
  const sameAs = candidates.find((c) => c.terms.length === searched.length && c.terms.every((t) => current.has(t)));
  if (!sameAs) candidates.push(candidate('selected', searched));
  const supported = candidates.filter((c) => c.supported);
  let lowest = Infinity;
  for (const c of supported) lowest = Math.min(lowest, c.looRmse as number);
  const adequate = supported.filter((c) => (c.looRmse as number) <= lowest * (1 + tolerance));
  adequate.sort((a, b) => a.columns - b.columns || (a.looRmse as number) - (b.looRmse as number));
  return { chosen: adequate[0], candidates, runs: n, distinctRuns: distinct, rule: MODEL_CHOICE_RULE, tolerance };
}

/** PRESS = Σ(eᵢ/(1 − hᵢᵢ))² from a QR solve; null when some hᵢᵢ = 1. */
function pressOf(x: number[][], y: number[], ls: ReturnType<typeof qrLeastSquares>): number | null {
  const { estimated, beta, rInverse } = ls;
  const rank = estimated.length;
  const terms: number[] = [];
  for (let i = 0; i < x.length; i++) {
    let fitted = 0;
    let h = 0;
    for (let m = 0; m < rank; m++) {
      fitted += x[i][estimated[m]] * beta[m];
      let z = 0;
      for (let a = 0; a <= m; a++) z += x[i][estimated[a]] * rInverse[a][m];
      h += z * z;
    }
    const oneMinusH = 1 - h;
    if (!(oneMinusH > 1e-10)) return null;
    const deleted = (y[i] - fitted) / oneMinusH;
    terms.push(deleted * deleted);
  }
  return compensatedSum(terms);
}


// Next-build proposals from a fitted surface: the best predicted recipe (exploit), the recipe
// the model knows least about (explore, D-optimal augmentation), or a mix of the two
// (balance, upper confidence bound). Every proposal respects the bounds and fixed values.
import { tQuantile } from '../../stats/distributions';
import { DoeInputError } from '../model/errors';
import { encodePoint } from '../model/encode';
import { checkExtrapolation, rowLeverage, rowValue } from '../model/predict';
import { modelRow } from '../model/terms';
import type { Factor, ResolvedFactor, SurfaceFit } from '../model/types';
import { candidateSet, type Candidate } from './candidates';
import { seededUniform } from './prng';

export type ProposalGoal = 'maximize' | 'minimize' | { target: number };
export type ProposalStrategy = 'exploit' | 'explore' | 'balance';
export type ProposalReasonKind = 'best predicted' | 'most informative' | 'balance (upper confidence bound)';

export interface ProposalConstraints {
  /** factor key → value the proposals must use (a number, or a level for categorical factors) */
  fixed?: Record<string, number | string>;
  /** factor key → narrower range, actual units */
  bounds?: Record<string, { min?: number; max?: number }>;
}

export interface ProposeInput {
  fit: SurfaceFit;
  /** the project's factors (bounds and levels); defaults to the factors the fit used */
  factors?: Factor[];
  goal: ProposalGoal;
  count: number;
  strategy: ProposalStrategy;
  constraints?: ProposalConstraints;
  seed?: number;
  /** smallest coded distance between two proposals (default 0.3) */
  minDistance?: number;
  /** multiplier of the standard error in the upper confidence bound (default 1.96) */
  kappa?: number;
}

export interface Proposal {
  /** factor values in actual units (every factor, including ones outside the model) */
  factors: Record<string, number | string>;
  /** the model factors in coded units (levels for categorical factors) */
  coded: Record<string, number | string>;
  predicted: number;
  /** 95 % prediction interval for one build made at this recipe */
  low: number;
  high: number;
  reasonKind: ProposalReasonKind;
  /** the kind, then one sentence on why */
  reason: string;
  extrapolation: boolean;
}

interface SearchFactor {
  key: string;
  kind: 'continuous' | 'categorical';
  /** index in the fit's factor list, or −1 when the model does not use this factor */
  modelIndex: number;
  min: number;
  max: number;
  levels: string[];
  fixed: number | string | undefined;
  note?: string;
}

const MAX_COUNT = 50;

function isGoal(goal: unknown): goal is ProposalGoal {
  if (goal === 'maximize' || goal === 'minimize') return true;
  return !!goal && typeof goal === 'object' && typeof (goal as { target?: unknown }).target === 'number' && Number.isFinite((goal as { target: number }).target);
}

/** Works out, per factor, the allowed range or levels after bounds and fixed values. */
function searchSpace(fit: SurfaceFit, factors: Factor[] | undefined, constraints: ProposalConstraints): SearchFactor[] {
  const fn = 'proposeBuilds';
  const modelFactors = fit.basis.factors;
  const listed: (Factor | ResolvedFactor)[] = [];
  const seen = new Set<string>();
  for (const factor of factors ?? modelFactors) {
    if (!factor || typeof factor.key !== 'string') throw new DoeInputError('invalid-factor', `${fn}: each factor needs a key (factors)`);
    if (seen.has(factor.key)) throw new DoeInputError('invalid-factor', `${fn}: duplicate factor key "${factor.key}" (factors)`);
    seen.add(factor.key);
    listed.push(factor);
  }
  for (const factor of modelFactors) if (!seen.has(factor.key)) listed.push(factor);
  const fixed = constraints.fixed ?? {};
  const bounds = constraints.bounds ?? {};
  for (const key of [...Object.keys(fixed), ...Object.keys(bounds)]) {
    if (!listed.some((factor) => factor.key === key)) {
      throw new DoeInputError('invalid-constraint', `${fn}: unknown factor "${key}" (constraints)`);
    }
  }
  const space: SearchFactor[] = [];
  for (const factor of listed) {
    const modelIndex = modelFactors.findIndex((entry) => entry.key === factor.key);
    const modelFactor = modelIndex >= 0 ? modelFactors[modelIndex] : undefined;
    if (modelFactor && modelFactor.kind !== factor.kind) {
      throw new DoeInputError('invalid-factor', `${fn}: factor "${factor.key}" is ${factor.kind} here but ${modelFactor.kind} in the fit (factors)`);
    }
    const fixedValue = fixed[factor.key];
    const bound = bounds[factor.key];
    if (factor.kind === 'categorical') {
      if (bound !== undefined) throw new DoeInputError('invalid-constraint', `${fn}: bounds do not apply to categorical factor "${factor.key}" (constraints.bounds)`);
      let levels = [...(factor.levels ?? [])];
      if (modelFactor) levels = levels.filter((level) => (modelFactor.levels as string[]).includes(level));
      if (levels.length === 0) throw new DoeInputError('invalid-factor', `${fn}: factor "${factor.key}" has no level the model knows (factors)`);
      if (fixedValue !== undefined) {
        const level = String(fixedValue);
        if (!levels.includes(level)) throw new DoeInputError('invalid-constraint', `${fn}: "${level}" is not an allowed level of factor "${factor.key}" (constraints.fixed)`);
        levels = [level];
      }
      space.push({ key: factor.key, kind: 'categorical', modelIndex, min: NaN, max: NaN, levels, fixed: fixedValue === undefined ? undefined : String(fixedValue) });
      continue;
    }
    let min = factor.low ?? modelFactor?.low;
    let max = factor.high ?? modelFactor?.high;
    if (bound !== undefined) {
      if (typeof bound !== 'object' || bound === null) throw new DoeInputError('invalid-constraint', `${fn}: bounds must be { min?, max } (constraints.bounds.${factor.key})`);
      if (bound.min !== undefined) {
        if (!Number.isFinite(bound.min)) throw new DoeInputError('invalid-constraint', `${fn}: min must be a finite number (constraints.bounds.${factor.key})`);
        min = min === undefined ? bound.min : Math.max(min, bound.min);
      }
      if (bound.max !== undefined) {
        if (!Number.isFinite(bound.max)) throw new DoeInputError('invalid-constraint', `${fn}: max must be a finite number (constraints.bounds.${factor.key})`);
        max = max === undefined ? bound.max : Math.min(max, bound.max);
      }
    }
    if (fixedValue !== undefined) {
      if (typeof fixedValue !== 'number' || !Number.isFinite(fixedValue)) {
        throw new DoeInputError('invalid-constraint', `${fn}: fixed value of factor "${factor.key}" must be a finite number (constraints.fixed)`);
      }
      if ((min !== undefined && fixedValue < min) || (max !== undefined && fixedValue > max)) {
        throw new DoeInputError('invalid-constraint', `${fn}: fixed value ${fixedValue} of factor "${factor.key}" is outside its bounds ${min}–${max} (constraints.fixed)`);
      }
      space.push({ key: factor.key, kind: 'continuous', modelIndex, min: fixedValue, max: fixedValue, levels: [], fixed: fixedValue });
      continue;
    }
    if (min === undefined || max === undefined) {
      throw new DoeInputError('invalid-factor', `${fn}: factor "${factor.key}" needs low and high, or a fixed value (factors)`);
    }
    if (!(min <= max)) {
      throw new DoeInputError('invalid-constraint', `${fn}: the bounds of factor "${factor.key}" leave nothing to choose from (${min}–${max}; constraints.bounds)`);
    }
    space.push({ key: factor.key, kind: 'continuous', modelIndex, min, max, levels: [], fixed: undefined });
  }
  // factors the model does not use are held at a fixed value, the centre, or the first level
  for (const entry of space) {
    if (entry.modelIndex >= 0 || entry.fixed !== undefined) continue;
    if (entry.kind === 'continuous') {
      entry.fixed = (entry.min + entry.max) / 2;
      entry.min = entry.max = entry.fixed;
    } else {
      entry.fixed = entry.levels[0];
      entry.levels = [entry.levels[0]];
    }
    entry.note = `${entry.key} is not in the model and was held at ${String(entry.fixed)}`;
  }
  return space;
}

interface Evaluated {
  actual: Record<string, number | string>;
  encoded: (number | string)[];
  row: number[];
  estimatedRow: number[];
}

function format(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  return Number(value.toPrecision(4)).toString();
}

/**
 * Proposes the next builds to make from a fitted surface.
 * Definition: a seeded candidate set (box vertices, grid, random points × categorical levels)
 * inside the bounds and fixed values is scored, the best candidate at least `minDistance`
 * (coded units; a different categorical level counts as 1) from earlier proposals is taken
 * and polished by coordinate search. exploit scores the predicted response (or −|ŷ − target|);
 * explore scores the prediction variance x₀ᵀM⁻¹x₀ and updates M = XᵀX with each pick
 * (greedy D-optimal augmentation, Sherman–Morrison update); balance scores the upper
 * confidence bound ŷ + κ·se (κ = 1.96 by default), with the same update so a batch spreads.
 * Reference: Atkinson, Donev & Tobias, Optimum Experimental Designs, with SAS (2007), ch. 11–12
 * (D-optimum augmentation, sequential construction); Srinivas et al. (2010), ICML, "Gaussian
 * process optimization in the bandit setting" (upper confidence bound).
 * Cost: O(count·(C + polish)·p²) for C candidates and p model columns.
 * @throws DoeInputError: 'invalid-goal', 'invalid-constraint', 'invalid-factor' for bad input.
 * @example proposeBuilds({ fit, goal: 'maximize', count: 3, strategy: 'balance', seed: 7 })
 */
export function proposeBuilds(input: ProposeInput): Proposal[] {
  const fn = 'proposeBuilds';
  if (!input || typeof input !== 'object' || !input.fit || !input.fit.basis) {
    throw new DoeInputError('invalid-goal', `${fn}: input needs a fitted surface (fit)`);
  }
  const { fit, goal, count, strategy } = input;
  if (!isGoal(goal)) throw new DoeInputError('invalid-goal', `${fn}: goal must be "maximize", "minimize" or { target: number } (goal)`);
  if (!(Number.isInteger(count) && count >= 1 && count <= MAX_COUNT)) {
    throw new DoeInputError('invalid-goal', `${fn}: count must be a whole number from 1 to ${MAX_COUNT} (count = ${String(count)})`);
  }
  if (strategy !== 'exploit' && strategy !== 'explore' && strategy !== 'balance') {
    throw new DoeInputError('invalid-goal', `${fn}: strategy must be "exploit", "explore" or "balance" (strategy = ${JSON.stringify(strategy)})`);
  }
  const minDistance = input.minDistance ?? 0.3;
  if (!(Number.isFinite(minDistance) && minDistance >= 0)) throw new DoeInputError('invalid-goal', `${fn}: minDistance must be a number ≥ 0 (minDistance)`);
  const kappa = input.kappa ?? 1.96;
  if (!(Number.isFinite(kappa) && kappa >= 0)) throw new DoeInputError('invalid-goal', `${fn}: kappa must be a number ≥ 0 (kappa)`);
  const constraints = input.constraints ?? {};
  if (typeof constraints !== 'object' || constraints === null) throw new DoeInputError('invalid-constraint', `${fn}: constraints must be an object (constraints)`);

  const basis = fit.basis;
  const modelFactors = basis.factors;
  const space = searchSpace(fit, input.factors, constraints);
  const freeContinuous = space.filter((entry) => entry.kind === 'continuous' && entry.fixed === undefined && entry.max > entry.min);
  const freeCategorical = space.filter((entry) => entry.kind === 'categorical' && entry.levels.length > 1);
  const random = seededUniform(input.seed ?? 1);
  const candidates = candidateSet({ dimensions: freeContinuous.length, levelChoices: freeCategorical.map((entry) => entry.levels) }, random);

  const response = fit.response ? fit.response : 'response';
  const rank = basis.estimated.length;
  const mse = basis.mse;
  const tPrediction = tQuantile(0.975, basis.dfResidual);
  // M⁻¹ = (XᵀX)⁻¹ = R⁻¹R⁻ᵀ over the estimated columns; updated after each pick where needed
  const mInverse: number[][] = [];
  for (let a = 0; a < rank; a++) {
    mInverse.push(new Array<number>(rank).fill(0));
    for (let b = 0; b < rank; b++) {
      let sum = 0;
      for (let m = Math.max(a, b); m < rank; m++) sum += basis.rInverse[a][m] * basis.rInverse[b][m];
      mInverse[a][b] = sum;
    }
  }
  const quadratic = (v: number[]): number => {
    let total = 0;
    for (let a = 0; a < rank; a++) {
      let inner = 0;
      for (let b = 0; b < rank; b++) inner += mInverse[a][b] * v[b];
      total += v[a] * inner;
    }
    return Math.max(0, total);
  };

  const evaluate = (candidate: Candidate): Evaluated => {
    const actual: Record<string, number | string> = {};
    let c = 0;
    let l = 0;
    for (const entry of space) {
      if (entry.kind === 'continuous') {
        if (entry.fixed !== undefined) actual[entry.key] = entry.fixed;
        else if (entry.max === entry.min) actual[entry.key] = entry.min;
        else {
          const u = candidate.unit[c++];
          const value = u >= 1 ? entry.max : u <= 0 ? entry.min : entry.min + u * (entry.max - entry.min);
          actual[entry.key] = Math.min(entry.max, Math.max(entry.min, value));
        }
      } else if (entry.levels.length > 1) actual[entry.key] = candidate.levels[l++];
      else actual[entry.key] = entry.levels[0];
    }
    const modelPoint: Record<string, number | string> = {};
    for (const factor of modelFactors) modelPoint[factor.key] = actual[factor.key];
    const encoded = encodePoint(fn, modelFactors, modelPoint);
    const row = modelRow(basis.columns, encoded);
    return { actual, encoded, row, estimatedRow: basis.estimated.map((j) => row[j]) };
  };

  const goalScore = (predicted: number): number => {
    if (goal === 'maximize') return predicted;
    if (goal === 'minimize') return -predicted;
    return -Math.abs(predicted - goal.target);
  };
  const score = (point: Evaluated): number => {
    if (strategy === 'explore') return quadratic(point.estimatedRow);
    const predicted = rowValue(basis, point.row);
    if (strategy === 'exploit') return goalScore(predicted);
    return goalScore(predicted) + kappa * Math.sqrt(mse * quadratic(point.estimatedRow));
  };

  const picked: Evaluated[] = [];
  const distance = (a: Evaluated, b: Evaluated): number => {
    let sumSquares = 0;
    for (let f = 0; f < modelFactors.length; f++) {
      if (modelFactors[f].kind === 'continuous') {
        const delta = (a.encoded[f] as number) - (b.encoded[f] as number);
        sumSquares += delta * delta;
      } else if (a.encoded[f] !== b.encoded[f]) sumSquares += 1;
    }
    return Math.sqrt(sumSquares);
  };
  const farEnough = (point: Evaluated, limit: number): boolean => picked.every((other) => distance(point, other) >= limit);

  const evaluatedCandidates = candidates.map((candidate) => ({ candidate, point: evaluate(candidate) }));
  const proposals: Proposal[] = [];
  let limit = minDistance;
  let relaxations = 0;
  while (proposals.length < count) {
    let best: { candidate: Candidate; point: Evaluated; value: number } | undefined;
    for (const entry of evaluatedCandidates) {
      if (!farEnough(entry.point, limit)) continue;
      const value = score(entry.point);
      if (!best || value > best.value) best = { candidate: entry.candidate, point: entry.point, value };
    }
    if (!best) {
      // the allowed region is too small for this spacing: halve it a few times, then stop
      if (relaxations >= 4 || limit === 0) break;
      limit /= 2;
      relaxations++;
      continue;
    }
    const polished = polish(best.candidate, best.value, evaluate, score, (point) => farEnough(point, limit));
    const chosen = polished.point;
    picked.push(chosen);

    const predicted = rowValue(basis, chosen.row);
    const leverage = rowLeverage(basis, chosen.row);
    const halfWidth = tPrediction * Math.sqrt(mse * (1 + leverage));
    const se = Math.sqrt(mse * leverage);
    const modelPoint: Record<string, number | string> = {};
    const coded: Record<string, number | string> = {};
    modelFactors.forEach((factor, f) => {
      modelPoint[factor.key] = chosen.actual[factor.key];
      coded[factor.key] = chosen.encoded[f];
    });
    const extrapolation = checkExtrapolation(fit, modelPoint).extrapolation;
    const reasonKind: ProposalReasonKind = strategy === 'exploit' ? 'best predicted' : strategy === 'explore' ? 'most informative' : 'balance (upper confidence bound)';
    const interval = `95 % prediction interval ${format(predicted - halfWidth)} to ${format(predicted + halfWidth)}`;
    let sentence: string;
    if (strategy === 'exploit') {
      const aim = goal === 'maximize' ? `highest predicted ${response}` : goal === 'minimize' ? `lowest predicted ${response}` : `predicted ${response} closest to the target ${format(goal.target)}`;
      sentence = `${aim} in the allowed region${proposals.length > 0 ? ' away from the earlier proposals' : ''}: ${format(predicted)} (${interval}).`;
    } else if (strategy === 'explore') {
      sentence = `the surface is least certain here (standard error of the mean ${format(se)} against an RMSE of ${format(Math.sqrt(mse))}); a build here sharpens the model most, given the runs so far and the earlier proposals. Predicted ${format(predicted)} (${interval}).`;
    } else {
      sentence = `predicted ${format(predicted)} plus ${format(kappa)} standard errors (${format(se)}) gives the most promising optimistic value, trading the prediction against its uncertainty (${interval}).`;
    }
    const notes = space.filter((entry) => entry.note).map((entry) => entry.note as string);
    if (notes.length > 0) sentence += ` ${notes.join('; ')}.`;
    if (extrapolation) sentence += ' This recipe is outside the region the runs cover: the prediction is an extrapolation.';
    proposals.push({
      factors: { ...chosen.actual },
      coded,
      predicted,
      low: predicted - halfWidth,
      high: predicted + halfWidth,
      reasonKind,
      reason: `${reasonKind}: ${sentence}`,
      extrapolation,
    });

    if (strategy !== 'exploit') {
      // Sherman–Morrison: (M + xxᵀ)⁻¹ = M⁻¹ − M⁻¹x xᵀM⁻¹ / (1 + xᵀM⁻¹x)
      const x = chosen.estimatedRow;
      const mx = new Array<number>(rank).fill(0);
      for (let a = 0; a < rank; a++) for (let b = 0; b < rank; b++) mx[a] += mInverse[a][b] * x[b];
      const denominator = 1 + quadratic(x);
      for (let a = 0; a < rank; a++) for (let b = 0; b < rank; b++) mInverse[a][b] -= (mx[a] * mx[b]) / denominator;
    }
  }
  return proposals;
}

/**
 * Coordinate search in the unit box: try ± step along each free continuous axis, keep any
 * improvement that stays inside the box and far enough from earlier picks, halve the step
 * when nothing improves. Cheap and derivative-free; the model is a low-order polynomial.
 */
function polish(
  start: Candidate,
  startValue: number,
  evaluate: (candidate: Candidate) => Evaluated,
  score: (point: Evaluated) => number,
  allowed: (point: Evaluated) => boolean,
): { point: Evaluated; value: number } {
  let current = { unit: [...start.unit], levels: start.levels };
  let currentPoint = evaluate(current);
  let currentValue = startValue;
  let step = 0.1;
  let evaluations = 0;
  while (step >= 1e-3 && evaluations < 400 && current.unit.length > 0) {
    let improved = false;
    for (let d = 0; d < current.unit.length; d++) {
      for (const direction of [1, -1]) {
        const unit = [...current.unit];
        unit[d] = Math.min(1, Math.max(0, unit[d] + direction * step));
        if (unit[d] === current.unit[d]) continue;
        const trial = { unit, levels: current.levels };
        const point = evaluate(trial);
        evaluations++;
        if (!allowed(point)) continue;
        const value = score(point);
        if (value > currentValue + 1e-12 * Math.max(1, Math.abs(currentValue))) {
          current = trial;
          currentPoint = point;
          currentValue = value;
          improved = true;
          break;
        }
      }
    }
    if (!improved) step /= 2;
  }
  return { point: currentPoint, value: currentValue };
}

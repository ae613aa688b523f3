// Next-build proposals from a fitted surface. Two kinds, never mixed up: proposals inside the
// trust region (recipes the builds already made give the model support for: within the ranges
// run, at levels run, no more remote than the most remote build) and exploratory proposals, a
// stated step outside it, labelled as such with their wider uncertainty. Within each kind the
// choice is the best predicted recipe (exploit), the one the model knows least about (explore,
// D-optimal augmentation), or a mix (balance, upper confidence bound). Predictions are held
// inside physical limits (a cell voltage below the reversible voltage, currents ≥ 0), and the
// search never chases a value past them. Every proposal respects the bounds and fixed values.
import { tQuantile } from '../../stats/distributions';
import { DoeInputError } from '../model/errors';
import { encodePoint } from '../model/encode';
import { factorName, roundForText } from '../model/labels';
import { rowLeverage, rowValue } from '../model/predict';
import { modelRow } from '../model/terms';
import { checkSupport, type SupportCheck } from '../model/trust-region';
import type { Factor, ResolvedFactor, SurfaceFit } from '../model/types';
import { boundPrediction, limitsAt, type BoundedValue, type LimitContext } from '../limits/response-limits';
import { candidateSet, type Candidate } from './candidates';
import { mulberry32 } from '../../stats/random';

export type ProposalGoal = 'maximize' | 'minimize' | { target: number };
export type ProposalStrategy = 'exploit' | 'explore' | 'balance';
export type ProposalReasonKind = 'best predicted' | 'most informative' | 'balance (upper confidence bound)' | 'exploratory';
export type ProposalKind = 'supported' | 'exploratory';

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
  /** proposals inside the trust region */
  count: number;
  strategy: ProposalStrategy;
  constraints?: ProposalConstraints;
  seed?: number;
  /** where to hold factors the model has no term for (e.g. the best build so far); default mid-range or the first level */
  hold?: Record<string, number | string>;
  /** extra exploratory proposals outside the trust region (default 0) */
  exploratory?: number;
  /** how far outside an exploratory proposal may go: its leverage at most this multiple of the limit (default 3) */
  exploreLeverageFactor?: number;
  /** physical limits of the response (none when absent) */
  limits?: LimitContext;
  /** the response in words, for the reason sentences (default: the fit's response key) */
  responseLabel?: string;
  /** formats a response value with its unit, for the reason sentences */
  format?: (value: number) => string;
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
  /** predicted response, held inside the physical limits */
  predicted: number;
  /** the model's own prediction before the limits */
  modelPredicted: number;
  /** 95 % prediction interval for one build made at this recipe (held inside the limits) */
  low: number;
  high: number;
  kind: ProposalKind;
  reasonKind: ProposalReasonKind;
  /** the kind, then one sentence on why */
  reason: string;
  /** outside the trust region (same as kind === 'exploratory') */
  extrapolation: boolean;
  support: SupportCheck;
  limit: BoundedValue;
  /** why a person should look twice, in words: outside the support, at a physical limit */
  flags: string[];
  /** true when flags is not empty: planning it needs a written reason */
  flagged: boolean;
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
  label: string;
  unit: string;
  note?: string;
}

const MAX_COUNT = 50;
const MAX_EXPLORATORY = 10;

function isGoal(goal: unknown): goal is ProposalGoal {
  if (goal === 'maximize' || goal === 'minimize') return true;
  return !!goal && typeof goal === 'object' && typeof (goal as { target?: unknown }).target === 'number' && Number.isFinite((goal as { target: number }).target);
}

/** Works out, per factor, the allowed range or levels after bounds and fixed values. */
function searchSpace(fit: SurfaceFit, factors: Factor[] | undefined, constraints: ProposalConstraints, hold: Record<string, number | string>): SearchFactor[] {
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
      space.push({ key: factor.key, label: factorName(factor), unit: factor.unit ?? '', kind: 'categorical', modelIndex, min: NaN, max: NaN, levels, fixed: fixedValue === undefined ? undefined : String(fixedValue) });
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
      space.push({ key: factor.key, label: factorName(factor), unit: factor.unit ?? '', kind: 'continuous', modelIndex, min: fixedValue, max: fixedValue, levels: [], fixed: fixedValue });
      continue;
    }
    if (min === undefined || max === undefined) {
      throw new DoeInputError('invalid-factor', `${fn}: factor "${factor.key}" needs low and high, or a fixed value (factors)`);
    }
    if (!(min <= max)) {
      throw new DoeInputError('invalid-constraint', `${fn}: the bounds of factor "${factor.key}" leave nothing to choose from (${min}–${max}; constraints.bounds)`);
    }
    space.push({ key: factor.key, label: factorName(factor), unit: factor.unit ?? '', kind: 'continuous', modelIndex, min, max, levels: [], fixed: undefined });
  }
  // factors the model does not use (not a factor of the fit, or no estimated term of it) are
  // held: at a fixed value, at the caller's held value (e.g. the best build so far), or at
  // mid-range / the first level
  const used = new Set<number>();
  for (const j of fit.basis.estimated) {
    const column = fit.basis.columns[j];
    column.powers.forEach((power, f) => {
      if (power > 0) used.add(f);
    });
    for (const indicator of column.indicators) used.add(indicator.factor);
  }
  for (const entry of space) {
    if ((entry.modelIndex >= 0 && used.has(entry.modelIndex)) || entry.fixed !== undefined) continue;
    if (entry.modelIndex >= 0 && !hold[entry.key]) {
      // a factor of the fit with no term yet: left free, so its setting varies across the
      // candidates and the next fit can tell whether it matters
      entry.note = `${entry.label} has no term in the model yet; its setting is left to vary so the next fit can tell whether it matters`;
      continue;
    }
    const wanted = hold[entry.key];
    if (entry.kind === 'continuous') {
      entry.fixed = typeof wanted === 'number' && wanted >= entry.min && wanted <= entry.max ? wanted : (entry.min + entry.max) / 2;
      entry.min = entry.max = entry.fixed;
    } else {
      entry.fixed = wanted !== undefined && entry.levels.includes(String(wanted)) ? String(wanted) : entry.levels[0];
      entry.levels = [entry.fixed];
    }
    entry.note = `${entry.label} ${entry.modelIndex >= 0 ? 'has no term in the model' : 'is not in the model'} and was held at ${typeof entry.fixed === 'number' ? roundForText(entry.fixed) : String(entry.fixed)}${entry.kind === 'continuous' && entry.unit ? ` ${entry.unit}` : ''}`;
  }
  return space;
}


interface Evaluated {
  actual: Record<string, number | string>;
  encoded: (number | string)[];
  row: number[];
  estimatedRow: number[];
  modelPoint: Record<string, number | string>;
  leverage: number;
  inside: boolean;
}

/**
 * Proposes the next builds to make from a fitted surface.
 * Definition: a seeded candidate set (box vertices, grid, random points × categorical levels)
 * over the allowed box, plus one over the part of it the builds span, is scored; the best
 * candidate at least `minDistance` (coded units; a different level counts as 1) from earlier
 * proposals is taken and polished by coordinate search. `count` proposals come from inside
 * the trust region (checkSupport); `exploratory` more from outside it with leverage at most
 * exploreLeverageFactor × the limit, each scored by the upper confidence bound. exploit scores
 * the predicted response (or −|ŷ − target|); explore the prediction variance x₀ᵀM⁻¹x₀ with
 * M = XᵀX updated after each pick (greedy D-optimal augmentation, Sherman–Morrison); balance
 * ŷ + κ·se (κ = 1.96 by default) with the same update so a batch spreads. A predicted value
 * past a physical limit is reflected back (limit − excess), so the search never prefers an
 * impossible prediction; the reported prediction and interval are held inside the limits.
 * When no recipe inside the trust region meets the constraints, the remaining proposals are
 * exploratory and say so.
 * Reference: Atkinson, Donev & Tobias, Optimum Experimental Designs, with SAS (2007), ch. 11–12
 * (D-optimum augmentation, sequential construction); Srinivas et al. (2010), ICML, "Gaussian
 * process optimization in the bandit setting" (upper confidence bound); trust regions in
 * sequential response-surface work: Myers, Montgomery & Anderson-Cook, Response Surface
 * Methodology, §6.4 (confidence regions on the optimum, staying near the data).
 * Cost: O((count + exploratory)·(C + polish)·p²) for C candidates and p model columns.
 * @throws DoeInputError: 'invalid-goal', 'invalid-constraint', 'invalid-factor' for bad input.
 * @example proposeBuilds({ fit, goal: 'maximize', count: 3, strategy: 'balance', seed: 7, exploratory: 1 })
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
  const exploratoryCount = input.exploratory ?? 0;
  if (!(Number.isInteger(exploratoryCount) && exploratoryCount >= 0 && exploratoryCount <= MAX_EXPLORATORY)) {
    throw new DoeInputError('invalid-goal', `${fn}: exploratory must be a whole number from 0 to ${MAX_EXPLORATORY} (exploratory = ${String(exploratoryCount)})`);
  }
  if (strategy !== 'exploit' && strategy !== 'explore' && strategy !== 'balance') {
    throw new DoeInputError('invalid-goal', `${fn}: strategy must be "exploit", "explore" or "balance" (strategy = ${JSON.stringify(strategy)})`);
  }
  const minDistance = input.minDistance ?? 0.3;
  if (!(Number.isFinite(minDistance) && minDistance >= 0)) throw new DoeInputError('invalid-goal', `${fn}: minDistance must be a number ≥ 0 (minDistance)`);
  const kappa = input.kappa ?? 1.96;
  if (!(Number.isFinite(kappa) && kappa >= 0)) throw new DoeInputError('invalid-goal', `${fn}: kappa must be a number ≥ 0 (kappa)`);
  const exploreFactor = input.exploreLeverageFactor ?? 3;
  if (!(Number.isFinite(exploreFactor) && exploreFactor >= 1)) throw new DoeInputError('invalid-goal', `${fn}: exploreLeverageFactor must be a number ≥ 1 (exploreLeverageFactor)`);
  const constraints = input.constraints ?? {};
  if (typeof constraints !== 'object' || constraints === null) throw new DoeInputError('invalid-constraint', `${fn}: constraints must be an object (constraints)`);

  const basis = fit.basis;
  const modelFactors = basis.factors;
  const space = searchSpace(fit, input.factors, constraints, input.hold ?? {});
  const freeContinuous = space.filter((entry) => entry.kind === 'continuous' && entry.fixed === undefined && entry.max > entry.min);
  const freeCategorical = space.filter((entry) => entry.kind === 'categorical' && entry.levels.length > 1);
  const random = mulberry32(input.seed ?? 1);
  const plan = { dimensions: freeContinuous.length, levelChoices: freeCategorical.map((entry) => entry.levels) };
  const candidates = candidateSet(plan, random);
  // a second set over the part of the allowed box the builds span, so the trust region is
  // sampled densely even when it is a small corner of the box
  const spanned = freeContinuous.map((entry) => {
    const factor = modelFactors[entry.modelIndex] as ResolvedFactor | undefined;
    const low = factor?.dataMin ?? entry.min;
    const high = factor?.dataMax ?? entry.max;
    const a = Math.min(1, Math.max(0, (low - entry.min) / (entry.max - entry.min)));
    const b = Math.min(1, Math.max(0, (high - entry.min) / (entry.max - entry.min)));
    return [a, Math.max(a, b)] as const;
  });
  if (spanned.some(([a, b]) => a > 0.05 || b < 0.95)) {
    for (const candidate of candidateSet(plan, random)) {
      candidates.push({ unit: candidate.unit.map((u, d) => spanned[d][0] + u * (spanned[d][1] - spanned[d][0])), levels: candidate.levels });
    }
  }

  const responseLabel = input.responseLabel ?? fit.response ?? 'response';
  const format = input.format ?? ((value: number) => roundForText(value));
  const limitContext: LimitContext = input.limits ?? { response: '' };
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
  const rangeOk = (modelPoint: Record<string, number | string>): boolean => {
    for (const factor of modelFactors) {
      const value = modelPoint[factor.key];
      if (factor.kind === 'continuous') {
        const low = factor.dataMin ?? (factor.low as number);
        const high = factor.dataMax ?? (factor.high as number);
        const slack = 1e-9 * Math.max(1e-12, high - low);
        if ((value as number) < low - slack || (value as number) > high + slack) return false;
      } else if (factor.levelsRun && !factor.levelsRun.includes(String(value))) return false;
    }
    return true;
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
    const leverage = rowLeverage(basis, row);
    const inside = leverage <= basis.maxLeverage * (1 + 1e-9) && rangeOk(modelPoint);
    return { actual, encoded, row, estimatedRow: basis.estimated.map((j) => row[j]), modelPoint, leverage, inside };
  };

  /** the prediction the search may chase: past a physical limit it is reflected back */
  const chased = (point: Evaluated, predicted: number): number => {
    const limits = limitsAt(limitContext, point.actual);
    if (limits.upper !== null && predicted > limits.upper) return limits.upper - (predicted - limits.upper);
    if (limits.lower !== null && predicted < limits.lower) return limits.lower + (limits.lower - predicted);
    return predicted;
  };
  const goalScore = (predicted: number): number => {
    if (goal === 'maximize') return predicted;
    if (goal === 'minimize') return -predicted;
    return -Math.abs(predicted - goal.target);
  };
  const scoreFor = (mode: ProposalStrategy) => (point: Evaluated): number => {
    if (mode === 'explore') return quadratic(point.estimatedRow);
    const predicted = chased(point, rowValue(basis, point.row));
    if (mode === 'exploit') return goalScore(predicted);
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
  const inExploreStep = (point: Evaluated): boolean => !point.inside && point.leverage <= exploreFactor * basis.maxLeverage * (1 + 1e-9);
  const notes = space.filter((entry) => entry.note).map((entry) => entry.note as string);

  const proposals: Proposal[] = [];
  const pick = (kind: ProposalKind, mode: ProposalStrategy, wanted: number, region: (point: Evaluated) => boolean): number => {
    const score = scoreFor(mode);
    let made = 0;
    let limit = minDistance;
    let relaxations = 0;
    while (made < wanted) {
      let best: { candidate: Candidate; point: Evaluated; value: number } | undefined;
      for (const entry of evaluatedCandidates) {
        if (!region(entry.point) || !farEnough(entry.point, limit)) continue;
        const value = score(entry.point);
        if (!best || value > best.value) best = { candidate: entry.candidate, point: entry.point, value };
      }
      if (!best) {
        // the region is too small for this spacing: halve it a few times, then stop
        if (relaxations >= 4 || limit === 0) break;
        limit /= 2;
        relaxations++;
        continue;
      }
      const polished = polish(best.candidate, best.value, evaluate, score, (point) => region(point) && farEnough(point, limit));
      const chosen = polished.point;
      picked.push(chosen);
      proposals.push(describe(kind, mode, chosen));
      made++;
      if (mode !== 'exploit') {
        // Sherman–Morrison: (M + xxᵀ)⁻¹ = M⁻¹ − M⁻¹x xᵀM⁻¹ / (1 + xᵀM⁻¹x)
        const x = chosen.estimatedRow;
        const mx = new Array<number>(rank).fill(0);
        for (let a = 0; a < rank; a++) for (let b = 0; b < rank; b++) mx[a] += mInverse[a][b] * x[b];
        const denominator = 1 + quadratic(x);
        for (let a = 0; a < rank; a++) for (let b = 0; b < rank; b++) mInverse[a][b] -= (mx[a] * mx[b]) / denominator;
      }
    }
    return made;
  };

  const describe = (kind: ProposalKind, mode: ProposalStrategy, chosen: Evaluated): Proposal => {
    const modelValue = rowValue(basis, chosen.row);
    const leverage = chosen.leverage;
    const halfWidth = tPrediction * Math.sqrt(mse * (1 + leverage));
    const se = Math.sqrt(mse * leverage);
    const limit = boundPrediction(limitsAt(limitContext, chosen.actual), modelValue, modelValue - halfWidth, modelValue + halfWidth, format);
    const coded: Record<string, number | string> = {};
    modelFactors.forEach((factor, f) => {
      coded[factor.key] = chosen.encoded[f];
    });
    const support = checkSupport(fit, chosen.modelPoint);
    const reasonKind: ProposalReasonKind = kind === 'exploratory' ? 'exploratory' : mode === 'exploit' ? 'best predicted' : mode === 'explore' ? 'most informative' : 'balance (upper confidence bound)';
    const interval = `95 % prediction interval ${format(limit.low)} to ${format(limit.high)}`;
    let sentence: string;
    if (kind === 'exploratory') {
      sentence = `a step outside the builds' support (leverage ${roundForText(leverage, 3)} against a limit of ${roundForText(basis.maxLeverage, 3)}), where the model is optimistic: predicted ${format(limit.value)} but a build could land anywhere in the ${interval}; it tests the model rather than trusting it.`;
    } else if (mode === 'exploit') {
      const aim = goal === 'maximize' ? `highest predicted ${responseLabel}` : goal === 'minimize' ? `lowest predicted ${responseLabel}` : `predicted ${responseLabel} closest to the target ${format(goal.target)}`;
      sentence = `${aim} inside the builds' support${proposals.length > 0 ? ', away from the earlier proposals' : ''}: ${format(limit.value)} (${interval}).`;
    } else if (mode === 'explore') {
      sentence = `the surface is least certain here within the builds' support (standard error of the mean ${format(se)} against a residual spread of ${format(Math.sqrt(mse))}); a build here sharpens the model most, given the runs so far and the earlier proposals. Predicted ${format(limit.value)} (${interval}).`;
    } else {
      sentence = `predicted ${format(limit.value)} plus ${roundForText(kappa, 3)} standard errors (${format(se)}) gives the most promising optimistic value inside the builds' support (${interval}).`;
    }
    if (notes.length > 0) sentence += ` ${notes.join('; ')}.`;
    const flags: string[] = [];
    if (!support.inside) flags.push(`Outside the builds' support. ${support.reasons.join(' ')}`);
    if (limit.hitsLimit && limit.note) flags.push(limit.note);
    if (limit.note && !limit.hitsLimit) sentence += ` ${limit.note}`;
    return {
      factors: { ...chosen.actual },
      coded,
      predicted: limit.value,
      modelPredicted: modelValue,
      low: limit.low,
      high: limit.high,
      kind,
      reasonKind,
      reason: `${reasonKind}: ${sentence}`,
      extrapolation: !support.inside,
      support,
      limit,
      flags,
      flagged: flags.length > 0,
    };
  };

  const inside = pick('supported', strategy, count, (point) => point.inside);
  // no room inside the support (constraints away from the builds): say so and step outside
  const outside = exploratoryCount + (count - inside);
  if (outside > 0) pick('exploratory', 'balance', outside, inExploreStep);
  // when even the stated step holds nothing, the proposals still asked for go further out, labelled
  if (proposals.length < count) pick('exploratory', 'balance', count - proposals.length, (point) => !point.inside);
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

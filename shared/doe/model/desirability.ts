// Desirability functions for weighing several responses at once (e.g. high V at j_ref, low
// Pt loading, low cost), and the Pareto set of observed builds.
import { DoeInputError } from './errors';

/**
 * Goal of one response, Derringer–Suich form. `weight` is the shape exponent s (1 = linear,
 * > 1 = insists on getting close to the target, < 1 = content with partway).
 */
export type DesirabilityGoal =
  | { goal: 'maximize'; low: number; target: number; weight?: number }
  | { goal: 'minimize'; target: number; high: number; weight?: number }
  | { goal: 'target'; low: number; target: number; high: number; weightLow?: number; weightHigh?: number };

function checkNumber(fn: string, name: string, value: unknown): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new DoeInputError('invalid-goal', `${fn}: ${name} must be a finite number (got ${String(value)})`);
  }
}

function checkWeight(fn: string, name: string, value: number | undefined): number {
  if (value === undefined) return 1;
  if (!(typeof value === 'number' && Number.isFinite(value) && value > 0)) {
    throw new DoeInputError('invalid-goal', `${fn}: ${name} must be a positive number (got ${String(value)})`);
  }
  return value;
}

/**
 * Individual desirability d ∈ [0, 1] of a response value.
 * Definition (Derringer & Suich): maximize — 0 below low, ((y − low)/(target − low))^s between,
 * 1 at or above target; minimize — 1 at or below target, ((high − y)/(high − target))^s
 * between, 0 at or above high; target — rises as ((y − low)/(target − low))^s₁ to 1 at the
 * target and falls as ((high − y)/(high − target))^s₂, 0 outside low…high.
 * Reference: Derringer & Suich (1980), "Simultaneous optimization of several response
 * variables", J. Quality Technology 12(4), 214–219.
 * Cost: O(1).
 * @throws DoeInputError ('invalid-goal') for non-finite values, unordered limits, weights ≤ 0.
 * @example individualDesirability(0.65, { goal: 'maximize', low: 0.6, target: 0.7 }) // 0.5
 */
export function individualDesirability(y: number, goal: DesirabilityGoal): number {
  const fn = 'individualDesirability';
  checkNumber(fn, 'y', y);
  if (!goal || typeof goal !== 'object') throw new DoeInputError('invalid-goal', `${fn}: goal must be an object (goal)`);
  if (goal.goal === 'maximize') {
    checkNumber(fn, 'low', goal.low);
    checkNumber(fn, 'target', goal.target);
    if (!(goal.low < goal.target)) throw new DoeInputError('invalid-goal', `${fn}: low must be below target (low = ${goal.low}, target = ${goal.target})`);
    const s = checkWeight(fn, 'weight', goal.weight);
    if (y <= goal.low) return 0;
    if (y >= goal.target) return 1;
    return ((y - goal.low) / (goal.target - goal.low)) ** s;
  }
  if (goal.goal === 'minimize') {
    checkNumber(fn, 'target', goal.target);
    checkNumber(fn, 'high', goal.high);
    if (!(goal.target < goal.high)) throw new DoeInputError('invalid-goal', `${fn}: target must be below high (target = ${goal.target}, high = ${goal.high})`);
    const s = checkWeight(fn, 'weight', goal.weight);
    if (y <= goal.target) return 1;
    if (y >= goal.high) return 0;
    return ((goal.high - y) / (goal.high - goal.target)) ** s;
  }
  if (goal.goal === 'target') {
    checkNumber(fn, 'low', goal.low);
    checkNumber(fn, 'target', goal.target);
    checkNumber(fn, 'high', goal.high);
    if (!(goal.low < goal.target && goal.target < goal.high)) {
      throw new DoeInputError('invalid-goal', `${fn}: need low < target < high (low = ${goal.low}, target = ${goal.target}, high = ${goal.high})`);
    }
    const s1 = checkWeight(fn, 'weightLow', goal.weightLow);
    const s2 = checkWeight(fn, 'weightHigh', goal.weightHigh);
    if (y <= goal.low || y >= goal.high) return 0;
    if (y === goal.target) return 1;
    if (y < goal.target) return ((y - goal.low) / (goal.target - goal.low)) ** s1;
    return ((goal.high - y) / (goal.high - goal.target)) ** s2;
  }
  throw new DoeInputError('invalid-goal', `${fn}: goal must be "maximize", "minimize" or "target" (got ${JSON.stringify((goal as { goal?: unknown }).goal)})`);
}

/**
 * Overall desirability: the weighted geometric mean D = (Π dᵢ^rᵢ)^(1/Σrᵢ), 0 when any dᵢ is 0
 * (one unacceptable response makes the whole recipe unacceptable).
 * Reference: Derringer & Suich (1980), J. Quality Technology 12(4); weighted form as in
 * Derringer (1994), "A balancing act: optimizing a product's properties", Quality Progress 27.
 * Cost: O(m) for m responses.
 * @throws DoeInputError ('invalid-goal') for an empty list, d outside [0, 1], bad importances.
 * @example overallDesirability([0.5, 0.8]) // 0.632…
 */
export function overallDesirability(values: number[], importances?: number[]): number {
  const fn = 'overallDesirability';
  if (!Array.isArray(values) || values.length === 0) throw new DoeInputError('invalid-goal', `${fn}: at least one desirability is needed (values)`);
  if (importances !== undefined && (!Array.isArray(importances) || importances.length !== values.length)) {
    throw new DoeInputError('invalid-goal', `${fn}: importances must have one entry per desirability (importances)`);
  }
  let logSum = 0;
  let weightSum = 0;
  for (let i = 0; i < values.length; i++) {
    const d = values[i];
    if (!(typeof d === 'number' && d >= 0 && d <= 1)) throw new DoeInputError('invalid-goal', `${fn}: desirabilities must lie in [0, 1] (value ${i + 1} = ${String(d)})`);
    const r = importances ? importances[i] : 1;
    if (!(typeof r === 'number' && Number.isFinite(r) && r > 0)) throw new DoeInputError('invalid-goal', `${fn}: importances must be positive numbers (importance ${i + 1} = ${String(r)})`);
    if (d === 0) return 0;
    logSum += r * Math.log(d);
    weightSum += r;
  }
  return Math.exp(logSum / weightSum);
}

/** Direction of one response for the Pareto set; a target means "closest to it". */
export type ParetoGoal = 'maximize' | 'minimize' | { target: number };

/**
 * The Pareto (non-dominated) set of observed builds: a build is kept unless another build is
 * at least as good on every response and strictly better on one. Builds with a missing or
 * non-finite value for any listed response are left out (they cannot be compared).
 * Reference: Miettinen, Nonlinear Multiobjective Optimization (1999), §2.2 (Pareto optimality).
 * Cost: O(m·n²) for n builds and m responses.
 * @throws DoeInputError ('invalid-goal') when goals is empty or a goal is not understood.
 * @example paretoSet([{ values: { v: 0.6, cost: 3 } }, { values: { v: 0.5, cost: 4 } }], { v: 'maximize', cost: 'minimize' }) // first build only
 */
export function paretoSet<T extends { values: Record<string, number | null | undefined> }>(
  points: T[],
  goals: Record<string, ParetoGoal>,
): T[] {
  const fn = 'paretoSet';
  if (!Array.isArray(points)) throw new DoeInputError('invalid-goal', `${fn}: points must be an array (points)`);
  const keys = goals && typeof goals === 'object' ? Object.keys(goals) : [];
  if (keys.length === 0) throw new DoeInputError('invalid-goal', `${fn}: at least one response goal is needed (goals)`);
  // turn every goal into "larger is better" scores
  const scorers = keys.map((key) => {
    const goal = goals[key];
    if (goal === 'maximize') return (value: number) => value;
    if (goal === 'minimize') return (value: number) => -value;
    if (goal && typeof goal === 'object' && typeof goal.target === 'number' && Number.isFinite(goal.target)) {
      const target = goal.target;
      return (value: number) => -Math.abs(value - target);
    }
    throw new DoeInputError('invalid-goal', `${fn}: goal must be "maximize", "minimize" or { target } (response "${key}")`);
  });
  const candidates: { point: T; scores: number[] }[] = [];
  for (const point of points) {
    const scores: number[] = [];
    let complete = true;
    for (let m = 0; m < keys.length; m++) {
      const value = point?.values?.[keys[m]];
      if (typeof value !== 'number' || !Number.isFinite(value)) {
        complete = false;
        break;
      }
      scores.push(scorers[m](value));
    }
    if (complete) candidates.push({ point, scores });
  }
  const kept: T[] = [];
  for (let i = 0; i < candidates.length; i++) {
    let dominated = false;
    for (let j = 0; j < candidates.length && !dominated; j++) {
      if (i === j) continue;
      let allAtLeast = true;
      let oneBetter = false;
      for (let m = 0; m < keys.length; m++) {
        if (candidates[j].scores[m] < candidates[i].scores[m]) {
          allAtLeast = false;
          break;
        }
        if (candidates[j].scores[m] > candidates[i].scores[m]) oneBetter = true;
      }
      dominated = allAtLeast && oneBetter;
    }
    if (!dominated) kept.push(candidates[i].point);
  }
  return kept;
}

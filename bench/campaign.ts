// Benchmark: a simulated electrode campaign on an invented response, to show that the guard
// rails (automatic model choice, trust region, physical limits) do not make the search slow.
// Three ways to look for the best recipe on the same function with the same build-to-build
// noise: Cellwright's loop (a small space-filling start, then fit → propose → "measure" →
// refit), one factor at a time from the centre, and random recipes. Reported: builds until one
// is within 1 % of the optimum (the true, noise-free value of the build's recipe), median over
// several seeds.
import {
  chooseModel,
  fitSurface,
  latinHypercube,
  proposeBuilds,
  type Factor,
  type Observation,
  type Proposal,
} from '../shared/doe/index';
import { mulberry32 } from '../shared/stats/random';

// The invented campaign: four recipe factors and a GDL choice, response V at 0.2 A/cm² in V.
export const FACTORS: Factor[] = [
  { key: 'binder', label: 'PTFE binder', unit: 'wt %', kind: 'continuous', low: 10, high: 40 },
  { key: 'activationTemp', label: 'Activation temperature', unit: '°C', kind: 'continuous', low: 300, high: 380 },
  { key: 'activationTime', label: 'Activation time', unit: 'h', kind: 'continuous', low: 1, high: 4 },
  { key: 'cellTemp', label: 'Cell temperature', unit: '°C', kind: 'continuous', low: 160, high: 200 },
  { key: 'gdl', label: 'GDL', unit: '', kind: 'categorical', levels: ['carbon paper', 'woven carbon', 'felt'] },
];
const CONTINUOUS = FACTORS.filter((f) => f.kind === 'continuous');
const LEVELS = FACTORS[4]!.levels!;
const GDL_OFFSET: Record<string, number> = { 'carbon paper': 0, 'woven carbon': 0.008, felt: -0.012 };
/** build-to-build noise, V (standard deviation) */
export const NOISE_SD = 0.003;

const coded = (f: Factor, value: number) => (value - ((f.low! + f.high!) / 2)) / ((f.high! - f.low!) / 2);
const actual = (f: Factor, z: number) => (f.low! + f.high!) / 2 + (z * (f.high! - f.low!)) / 2;

/**
 * The invented response (V). Binder and activation temperature form a ridge along their
 * diagonal: with u = (z₁ + z₂)/2 along it and w = (z₁ − z₂)/2 across it, the ridge rises as
 * 0.12u² + 0.04u³ − 0.12u⁴ (peak at u ≈ 0.84, +49 mV; 8.6 mV lower at the corner u = 1)
 * and falls across it as −0.15w². The centre is a saddle: moving binder or activation
 * temperature alone, from the centre, only loses voltage (u = w = z/2 gives
 * −0.0075z² + 0.005z³ − 0.0075z⁴ < 0 for every z ≠ 0 in −1…1). Activation time
 * peaks at z₃ = 0.3, cell temperature at z₄ = 0.75, and woven carbon is the best GDL.
 */
export function trueVoltage(recipe: Record<string, number | string>): number {
  const z = CONTINUOUS.map((f) => coded(f, recipe[f.key] as number));
  const u = (z[0]! + z[1]!) / 2;
  const w = (z[0]! - z[1]!) / 2;
  return 0.52 + 0.12 * u * u + 0.04 * u ** 3 - 0.12 * u ** 4 - 0.15 * w * w - 0.025 * (z[2]! - 0.3) ** 2 + 0.012 * z[3]! - 0.008 * z[3]! ** 2 + GDL_OFFSET[recipe.gdl as string]!;
}

/** The optimum of trueVoltage, by a fine search (grid, then coordinate refinement). */
export function optimum(): { value: number; recipe: Record<string, number | string> } {
  let best = { value: -Infinity, recipe: {} as Record<string, number | string> };
  const steps = 21;
  for (const gdl of LEVELS) {
    for (let a = 0; a < steps; a++) for (let b = 0; b < steps; b++) for (let c = 0; c < steps; c++) for (let d = 0; d < steps; d++) {
      const zs = [a, b, c, d].map((i) => -1 + (2 * i) / (steps - 1));
      const recipe: Record<string, number | string> = { gdl };
      CONTINUOUS.forEach((f, i) => (recipe[f.key] = actual(f, zs[i]!)));
      const value = trueVoltage(recipe);
      if (value > best.value) best = { value, recipe };
    }
  }
  let step = 0.05;
  while (step > 1e-6) {
    let improved = false;
    for (const f of CONTINUOUS) {
      for (const sign of [1, -1]) {
        const z = Math.min(1, Math.max(-1, coded(f, best.recipe[f.key] as number) + sign * step));
        const recipe = { ...best.recipe, [f.key]: actual(f, z) };
        const value = trueVoltage(recipe);
        if (value > best.value) { best = { value, recipe }; improved = true; }
      }
    }
    if (!improved) step /= 2;
  }
  return best;
}

/** Normal noise from a seeded uniform stream (Box–Muller). */
function noiseSource(seed: number): () => number {
  const uniform = mulberry32(seed);
  return () => {
    const u1 = Math.max(1e-12, uniform());
    const u2 = uniform();
    return NOISE_SD * Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
  };
}

export interface CampaignResult {
  /** builds until the first within 1 % of the optimum (null: not within the budget) */
  builds: number | null;
  budget: number;
  bestTrue: number;
}

export interface ProductCampaignResult extends CampaignResult {
  startBuilds: number;
  rounds: number;
  proposals: number;
  exploratory: number;
  /** proposals labelled inside the trust region that were not inside it (must be 0) */
  unlabelledOutside: number;
  /** proposals whose prediction passed a physical limit without being flagged (must be 0) */
  unflaggedLimit: number;
  /** the models the product chose, round by round */
  models: string[];
}

const START_BUILDS = 10;
const PER_ROUND = 2;

/** A sliced space-filling start: a maximin Latin hypercube in five dimensions, the fifth read as the GDL level (so levels stay balanced). */
function startDesign(seed: number, runs: number): Record<string, number | string>[] {
  const design = latinHypercube(5, { runs, seed, maximin: true });
  return design.points.map((point) => {
    const recipe: Record<string, number | string> = {};
    CONTINUOUS.forEach((f, i) => (recipe[f.key] = actual(f, point.coded[i]!)));
    recipe.gdl = LEVELS[Math.min(LEVELS.length - 1, Math.floor(((point.coded[4]! + 1) / 2) * LEVELS.length))]!;
    return recipe;
  });
}

/** Cellwright's loop: start design, then rounds of automatic model choice, proposals inside the trust region (plus one labelled exploratory), measure, refit. */
export interface LoopOptions {
  startBuilds?: number;
  perRound?: number;
  exploratory?: number;
  strategy?: 'exploit' | 'explore' | 'balance';
}

export function productCampaign(seed: number, target: number, budget = 40, options: LoopOptions = {}): ProductCampaignResult {
  const startBuilds = options.startBuilds ?? START_BUILDS;
  const perRound = options.perRound ?? PER_ROUND;
  const noise = noiseSource(seed * 7919 + 1);
  const rows: Observation[] = [];
  let found: number | null = null;
  let bestTrue = -Infinity;
  const measure = (recipe: Record<string, number | string>) => {
    const truth = trueVoltage(recipe);
    rows.push({ factors: recipe, y: truth + noise(), label: `B-${rows.length + 1}` });
    bestTrue = Math.max(bestTrue, truth);
    if (found === null && truth >= target) found = rows.length;
  };
  for (const recipe of startDesign(seed, startBuilds)) measure(recipe);
  let rounds = 0;
  let proposals = 0;
  let exploratory = 0;
  let unlabelledOutside = 0;
  let unflaggedLimit = 0;
  const models: string[] = [];
  while (found === null && rows.length < budget) {
    rounds++;
    const choice = chooseModel({ factors: FACTORS, rows });
    models.push(choice.chosen.name === 'selected' ? `${choice.chosen.columns} terms` : choice.chosen.name);
    const fit = fitSurface({ factors: FACTORS, rows, model: { terms: choice.chosen.terms }, responseKey: 'vAtRef' });
    const batch: Proposal[] = proposeBuilds({
      fit,
      factors: FACTORS,
      goal: 'maximize',
      count: perRound,
      exploratory: options.exploratory ?? 0,
      strategy: options.strategy ?? 'balance',
      seed: seed * 100 + rounds,
      limits: { response: 'vAtRef', cellTemperatureFactor: 'cellTemp' },
    });
    for (const p of batch) {
      proposals++;
      if (p.kind === 'exploratory') exploratory++;
      if (p.kind === 'supported' && !p.support.inside) unlabelledOutside++;
      if (p.modelPredicted > p.predicted + 1e-12 && !p.flagged) unflaggedLimit++;
      if (rows.length < budget) measure(p.factors);
    }
  }
  return { builds: found, budget, bestTrue, startBuilds, rounds, proposals, exploratory, unlabelledOutside, unflaggedLimit, models };
}

/** One factor at a time from the centre: each factor in turn at four other settings (or the other levels), keep the best measured, repeat. */
export function oneFactorAtATime(seed: number, target: number, budget = 40): CampaignResult {
  const noise = noiseSource(seed * 104729 + 3);
  const current: Record<string, number | string> = { gdl: LEVELS[0]! };
  for (const f of CONTINUOUS) current[f.key] = actual(f, 0);
  let builds = 0;
  let found: number | null = null;
  let bestTrue = -Infinity;
  const measure = (recipe: Record<string, number | string>) => {
    builds++;
    const truth = trueVoltage(recipe);
    bestTrue = Math.max(bestTrue, truth);
    if (found === null && truth >= target) found = builds;
    return truth + noise();
  };
  let currentMeasured = measure(current);
  while (builds < budget && found === null) {
    for (const f of FACTORS) {
      const options: (number | string)[] = f.kind === 'categorical' ? f.levels!.filter((l) => l !== current[f.key]) : [-1, -0.5, 0.5, 1].map((z) => actual(f, z));
      let best = { value: currentMeasured, setting: current[f.key]! };
      for (const setting of options) {
        if (builds >= budget || found !== null) break;
        const value = measure({ ...current, [f.key]: setting });
        if (value > best.value) best = { value, setting };
      }
      current[f.key] = best.setting;
      currentMeasured = best.value;
      if (builds >= budget || found !== null) break;
    }
  }
  return { builds: found, budget, bestTrue };
}

/** Random recipes, uniform over the box and the levels. */
export function randomBuilds(seed: number, target: number, budget = 3000): CampaignResult {
  const uniform = mulberry32(seed * 31 + 17);
  let found: number | null = null;
  let bestTrue = -Infinity;
  for (let i = 1; i <= budget && found === null; i++) {
    const recipe: Record<string, number | string> = { gdl: LEVELS[Math.floor(uniform() * LEVELS.length)]! };
    for (const f of CONTINUOUS) recipe[f.key] = f.low! + uniform() * (f.high! - f.low!);
    const truth = trueVoltage(recipe);
    bestTrue = Math.max(bestTrue, truth);
    if (truth >= target) found = i;
  }
  return { builds: found, budget, bestTrue };
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

export interface CampaignBench {
  name: string;
  seeds: number;
  optimumV: number;
  targetV: number;
  product: { median: number | null; perSeed: (number | null)[]; exploratory: number; proposals: number; unlabelledOutside: number; unflaggedLimit: number; models: string[][]; ms: number };
  oneFactor: { median: number | null; perSeed: (number | null)[]; budget: number };
  random: { median: number | null; perSeed: (number | null)[]; budget: number };
}

/** Runs the three searches on `seeds` seeds and reports medians (a campaign that never gets there counts as worse than any that does). */
export function benchCampaign(options: { seeds?: number } = {}): CampaignBench {
  const seeds = options.seeds ?? 15;
  const best = optimum();
  const target = best.value * 0.99;
  const started = performance.now();
  const product = Array.from({ length: seeds }, (_, i) => productCampaign(i + 1, target));
  const ms = performance.now() - started;
  const oneFactor = Array.from({ length: seeds }, (_, i) => oneFactorAtATime(i + 1, target));
  const random = Array.from({ length: seeds }, (_, i) => randomBuilds(i + 1, target));
  const med = (list: CampaignResult[]) => {
    const values = list.map((r) => (r.builds === null ? Infinity : r.builds));
    const m = median(values);
    return Number.isFinite(m) ? m : null;
  };
  return {
    name: 'simulated campaign: builds until within 1 % of the optimum (5 factors, 3 mV noise)',
    seeds,
    optimumV: best.value,
    targetV: target,
    product: {
      median: med(product),
      perSeed: product.map((r) => r.builds),
      exploratory: product.reduce((s, r) => s + r.exploratory, 0),
      proposals: product.reduce((s, r) => s + r.proposals, 0),
      unlabelledOutside: product.reduce((s, r) => s + r.unlabelledOutside, 0),
      unflaggedLimit: product.reduce((s, r) => s + r.unflaggedLimit, 0),
      models: product.map((r) => r.models),
      ms,
    },
    oneFactor: { median: med(oneFactor), perSeed: oneFactor.map((r) => r.builds), budget: 40 },
    random: { median: med(random), perSeed: random.map((r) => r.builds), budget: 3000 },
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  if (process.argv[2] === 'try') {
    const options = JSON.parse(process.argv[3] ?? '{}') as LoopOptions;
    const target = optimum().value * 0.99;
    const runs = Array.from({ length: 15 }, (_, i) => productCampaign(i + 1, target, 40, options));
    const values = runs.map((r) => r.builds ?? Infinity);
    console.log(JSON.stringify({ options, median: median(values), values, exploratory: runs.reduce((s, r) => s + r.exploratory, 0) }));
  } else console.log(JSON.stringify(benchCampaign({ seeds: Number(process.argv[2] ?? 15) }), null, 1));
}

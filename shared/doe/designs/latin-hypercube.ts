// Latin hypercube sample in coded units [−1, 1): n points such that, on every factor, each of
// the n equal-width strata holds exactly one point. Optionally spread out by the maximin
// criterion (make the smallest distance between two points as large as possible).
import { DesignInputError } from './design-input-error';
import { MAX_DESIGN_RUNS } from './full-factorial-2';
import { mulberry32, shuffle } from '../../stats/random';
import type { RandomSource } from '../../stats/random';
import type { CoreDesign, CorePoint } from './types';

export interface LatinHypercubeOptions {
  runs: number;
  seed: number;
  maximin?: boolean;
  /** random candidates tried, and as many swap attempts; default from a work budget (≤ 100) */
  iterations?: number;
}

/** Distance-component operations one default maximin search may spend (≈ a fraction of a second). */
const DEFAULT_WORK_BUDGET = 1e8;
/** Hard ceiling on the same, whatever iterations the caller asks for (a few seconds). */
const MAX_WORK_BUDGET = 1e9;
const MAX_ITERATIONS = 10000;

interface ClosestPair {
  squaredDistance: number;
  first: number;
  second: number;
}

function closestPair(points: readonly (readonly number[])[]): ClosestPair {
  let best: ClosestPair = { squaredDistance: Number.POSITIVE_INFINITY, first: 0, second: 0 };
  for (let first = 0; first < points.length; first++) {
    const firstPoint = points[first] as readonly number[];
    for (let second = first + 1; second < points.length; second++) {
      const secondPoint = points[second] as readonly number[];
      let squared = 0;
      for (let factor = 0; factor < firstPoint.length; factor++) {
        const gap = (firstPoint[factor] as number) - (secondPoint[factor] as number);
        squared += gap * gap;
      }
      if (squared < best.squaredDistance) best = { squaredDistance: squared, first, second };
    }
  }
  return best;
}

/**
 * Smallest Euclidean distance between any two points (coded units); Infinity for fewer than 2 points.
 * Reference: the maximin distance criterion for space-filling designs (from memory).
 * Cost: O(n² · k).
 * @example minPairwiseDistance([[0, 0], [3, 4], [10, 0]]) // 5
 */
export function minPairwiseDistance(points: readonly (readonly number[])[]): number {
  return Math.sqrt(closestPair(points).squaredDistance);
}

function drawLatinHypercube(runs: number, k: number, random: RandomSource): number[][] {
  const points: number[][] = [];
  for (let run = 0; run < runs; run++) points.push(new Array<number>(k).fill(0));
  const strata: number[] = [];
  for (let stratum = 0; stratum < runs; stratum++) strata.push(stratum);
  for (let factor = 0; factor < k; factor++) {
    const order = shuffle(strata, random);
    for (let run = 0; run < runs; run++) {
      // A uniform position inside the stratum, mapped from [0, 1) to [−1, 1).
      const unit = ((order[run] as number) + random()) / runs;
      (points[run] as number[])[factor] = -1 + 2 * unit;
    }
  }
  return points;
}

/**
 * Latin hypercube design: for each factor an independent random permutation of the n strata,
 * with a uniform random position inside each stratum, in coded units [−1, 1).
 * maximin: best of `iterations` random designs by the smallest pairwise distance, then
 * `iterations` swap attempts — swap one coordinate of a point of the closest pair with the same
 * coordinate of another point (which keeps one point per stratum) and keep the swap only when
 * the smallest distance grows. info.minPairwiseDistance reports the result either way.
 * Reference: McKay, Beckman & Conover (1979), Technometrics 21, 239–245 (Latin hypercube sampling);
 * maximin criterion as in minPairwiseDistance (both from memory).
 * Cost: O(n · k) plain; O(iterations · n² · k) with maximin.
 * @throws DesignInputError when k < 1, runs is not an integer from 2 to 4096, the seed is not an
 *   integer, or iterations is not an integer from 1 to 10000.
 * @example latinHypercube(2, { runs: 10, seed: 1 }).points.length // 10
 */
export function latinHypercube(k: number, options: LatinHypercubeOptions): CoreDesign {
  const functionName = 'latinHypercube';
  if (!Number.isInteger(k) || k < 1) throw new DesignInputError(functionName, 'factors', `needs at least 1 continuous factor, got ${k}`);
  const { runs, seed } = options;
  if (runs === undefined) throw new DesignInputError(functionName, 'runs', 'is required for a Latin hypercube (the number of points)');
  if (!Number.isInteger(runs) || runs < 2 || runs > MAX_DESIGN_RUNS) {
    throw new DesignInputError(functionName, 'runs', `must be a whole number from 2 to ${MAX_DESIGN_RUNS}, got ${runs}`);
  }
  if (!Number.isInteger(seed)) throw new DesignInputError(functionName, 'seed', `must be an integer, got ${String(seed)}`);
  const maximin = options.maximin ?? false;
  const warnings: string[] = [];
  const notes: string[] = [];
  const pairWork = ((runs * (runs - 1)) / 2) * k;
  let iterations = 1;
  if (maximin) {
    if (options.iterations !== undefined) {
      if (!Number.isInteger(options.iterations) || options.iterations < 1 || options.iterations > MAX_ITERATIONS) {
        throw new DesignInputError(functionName, 'iterations', `must be a whole number from 1 to ${MAX_ITERATIONS}, got ${options.iterations}`);
      }
      iterations = options.iterations;
      const affordable = Math.max(1, Math.floor(MAX_WORK_BUDGET / (2 * pairWork)));
      if (iterations > affordable) {
        warnings.push(`iterations reduced from ${iterations} to ${affordable} to keep the maximin search to a few seconds for ${runs} runs.`);
        iterations = affordable;
      }
    } else {
      iterations = Math.min(100, Math.max(1, Math.floor(DEFAULT_WORK_BUDGET / (2 * pairWork))));
    }
  } else if (options.iterations !== undefined) {
    warnings.push('iterations was ignored: it only applies with maximin.');
  }

  const random = mulberry32(seed);
  let best = drawLatinHypercube(runs, k, random);
  let bestPair = closestPair(best);
  if (maximin) {
    for (let candidate = 1; candidate < iterations; candidate++) {
      const points = drawLatinHypercube(runs, k, random);
      const pair = closestPair(points);
      if (pair.squaredDistance > bestPair.squaredDistance) {
        best = points;
        bestPair = pair;
      }
    }
    let acceptedSwaps = 0;
    for (let attempt = 0; attempt < iterations; attempt++) {
      const row = random() < 0.5 ? bestPair.first : bestPair.second;
      const factor = Math.min(k - 1, Math.floor(random() * k));
      let other = Math.min(runs - 2, Math.floor(random() * (runs - 1)));
      if (other >= row) other++;
      const rowPoint = best[row] as number[];
      const otherPoint = best[other] as number[];
      const held = rowPoint[factor] as number;
      rowPoint[factor] = otherPoint[factor] as number;
      otherPoint[factor] = held;
      const pair = closestPair(best);
      if (pair.squaredDistance > bestPair.squaredDistance) {
        bestPair = pair;
        acceptedSwaps++;
      } else {
        otherPoint[factor] = rowPoint[factor] as number;
        rowPoint[factor] = held;
      }
    }
    notes.push(`Maximin Latin hypercube: best of ${iterations} random designs, then ${iterations} coordinate-swap attempts (${acceptedSwaps} kept).`);
  } else {
    notes.push('Random Latin hypercube (one point per stratum on every factor, uniform within the stratum).');
  }
  const points: CorePoint[] = best.map((coded) => ({ coded, pointType: 'lhs' }));
  return {
    points,
    info: { minPairwiseDistance: Math.sqrt(bestPair.squaredDistance), maximin, iterations, notes },
    warnings,
  };
}

// Blocks for two-level designs by confounding interactions: the runs are split on the signs of
// b chosen interaction columns into 2^b blocks, so the block effect is mixed only with those
// interactions (and their products), never — when it can be helped — with main effects or
// two-factor interactions.
import { DesignInputError } from './design-input-error';
import { compareWords, wordLength, wordOfMask } from './factor-letters';
import { mulberry32 } from '../../stats/random';
import type { CorePoint, TwoLevelStructure } from './types';

export interface TwoLevelBlocking {
  /** 1-based block of each factorial point, indexed like structure.factorialPointIndices */
  blockOfFactorialPoint: number[];
  /** the chosen block generators, as words (shortest member of each alias chain) */
  blockGenerators: string[];
  /** every effect mixed with blocks (all 2^b − 1 products), shortest chain members, e.g. "ABCD" or "AB = CE" */
  confoundedWithBlocks: string[];
  /** the lowest order of any effect mixed with blocks */
  lowestConfoundedOrder: number;
}

/** Pairs kept for extending to three block generators (9 or more base factors). */
const PAIR_POOL = 300;
/** Up to 8 base factors (255 columns) every triple of block generators is tried (≈ 2.7·10⁶). */
const EXHAUSTIVE_TRIPLES_UP_TO = 255;

interface Score {
  lowest: number;
  countAtLowest: number;
  totalOrder: number;
}

function betterScore(candidate: Score, incumbent: Score | undefined): boolean {
  if (incumbent === undefined) return true;
  if (candidate.lowest !== incumbent.lowest) return candidate.lowest > incumbent.lowest;
  if (candidate.countAtLowest !== incumbent.countAtLowest) return candidate.countAtLowest < incumbent.countAtLowest;
  return candidate.totalOrder > incumbent.totalOrder;
}

function scoreOf(products: readonly number[], shortest: Int8Array): Score {
  let lowest = Number.POSITIVE_INFINITY;
  let countAtLowest = 0;
  let totalOrder = 0;
  for (const product of products) {
    const order = shortest[product] as number;
    totalOrder += order;
    if (order < lowest) {
      lowest = order;
      countAtLowest = 1;
    } else if (order === lowest) countAtLowest++;
  }
  return { lowest, countAtLowest, totalOrder };
}

function allProducts(generators: readonly number[]): number[] {
  const products: number[] = [];
  for (let subset = 1; subset < 2 ** generators.length; subset++) {
    let product = 0;
    for (let index = 0; index < generators.length; index++) if ((subset >>> index) & 1) product ^= generators[index] as number;
    products.push(product);
  }
  return products;
}

function shortestMembers(baseWord: number, definingWords: readonly number[]): number[] {
  const members = [baseWord];
  for (const word of definingWords) members.push(baseWord ^ word);
  let lowest = Number.POSITIVE_INFINITY;
  for (const member of members) lowest = Math.min(lowest, wordLength(member));
  return members.filter((member) => wordLength(member) === lowest).sort(compareWords);
}

/**
 * Splits the factorial points of a two-level design into 2^b blocks (b = 1, 2, 3).
 * The b block generators are chosen among products of the base (free) columns to maximise the
 * lowest order of any effect confounded with blocks (counting aliases in a fraction), then to
 * have the fewest effects at that order, then the highest total order. b = 1 and b = 2 are
 * exhaustive, so is b = 3 up to 8 base factors; beyond that b = 3 extends a fixed-seed sample
 * of 300 best pairs by every possible third column (a heuristic). For a full 2^k in 2 blocks this is
 * the k-factor interaction; 2^4 in 4 blocks gives ABC, ABD (CD confounded, unavoidably a two-factor interaction).
 * Block 1 holds the first factorial point in standard order.
 * Reference: NIST/SEMATECH e-Handbook §5.3.3.3.3 (blocking of full factorial designs); confounding
 * in 2^k blocks as in Montgomery, Design and Analysis of Experiments, ch. 7 (from memory).
 * Cost: O(2^m · 2^p) for the alias lengths, O(4^m) pairs for b ≥ 2 (m base factors, ≤ 12), plus C(2^m − 1, 3) ≤ 2.7·10⁶ triples (m ≤ 8) or 300 · 2^m triples for b = 3.
 * @throws DesignInputError when blockCount is not 2, 4 or 8 or leaves fewer than 2 factorial runs per block.
 * @example blockTwoLevel(points, structure, 2).blockGenerators // ['ABC'] for a 2^3
 */
export function blockTwoLevel(points: readonly CorePoint[], structure: TwoLevelStructure, blockCount: number, field = 'blocks'): TwoLevelBlocking {
  const functionName = 'blockTwoLevel';
  const factorialRuns = structure.factorialPointIndices.length;
  const generatorCount = Math.log2(blockCount);
  if (!Number.isInteger(generatorCount) || generatorCount < 1 || generatorCount > 3) {
    throw new DesignInputError(functionName, field, `the factorial part can be split into 2, 4 or 8 blocks, not ${blockCount}`);
  }
  if (factorialRuns / blockCount < 2) {
    throw new DesignInputError(functionName, field, `${factorialRuns} factorial runs cannot be split into ${blockCount} blocks of at least 2 runs`);
  }

  // Lowest order in the alias chain of each product of base columns.
  const firstPoint = points[structure.factorialPointIndices[0] as number] as CorePoint;
  const shortest = new Int8Array(2 ** firstPoint.coded.length);
  const candidates: number[] = [];
  for (let subset = structure.baseMask; subset !== 0; subset = (subset - 1) & structure.baseMask) {
    let lowest = wordLength(subset);
    for (const word of structure.definingWords) lowest = Math.min(lowest, wordLength(subset ^ word));
    shortest[subset] = lowest;
    candidates.push(subset);
  }
  candidates.sort((first, second) => (shortest[second] as number) - (shortest[first] as number) || compareWords(first, second));

  let bestGenerators: number[] = [];
  let bestScore: Score | undefined;
  if (generatorCount === 1) {
    bestGenerators = [candidates[0] as number];
    bestScore = scoreOf(bestGenerators, shortest);
  } else {
    // Every pair, exhaustively (at most 4095²/2 ≈ 8·10⁶ for 12 base factors).
    const goodPairs: [number, number][] = [];
    let pairsSeen = 0;
    const sampler = mulberry32(candidates.length);
    let bestPairScore: Score | undefined;
    for (let first = 0; first < candidates.length; first++) {
      const firstMask = candidates[first] as number;
      const firstOrder = shortest[firstMask] as number;
      if (bestPairScore !== undefined && firstOrder < bestPairScore.lowest) break; // sorted: nothing later can do better
      for (let second = first + 1; second < candidates.length; second++) {
        const secondMask = candidates[second] as number;
        const secondOrder = shortest[secondMask] as number;
        if (bestPairScore !== undefined && secondOrder < bestPairScore.lowest) break;
        const productOrder = shortest[firstMask ^ secondMask] as number;
        const lowest = Math.min(firstOrder, secondOrder, productOrder);
        if (bestPairScore !== undefined && lowest < bestPairScore.lowest) continue;
        const score: Score = {
          lowest,
          countAtLowest: (firstOrder === lowest ? 1 : 0) + (secondOrder === lowest ? 1 : 0) + (productOrder === lowest ? 1 : 0),
          totalOrder: firstOrder + secondOrder + productOrder,
        };
        if (bestPairScore === undefined || lowest > bestPairScore.lowest) {
          goodPairs.length = 0;
          pairsSeen = 0;
        }
        // Reservoir sample of the pairs at the best lowest order, so the pool is not biased
        // towards the longest words (which multiply into short ones).
        pairsSeen++;
        if (goodPairs.length < PAIR_POOL) goodPairs.push([firstMask, secondMask]);
        else {
          const slot = Math.floor(sampler() * pairsSeen);
          if (slot < PAIR_POOL) goodPairs[slot] = [firstMask, secondMask];
        }
        if (betterScore(score, bestPairScore)) {
          bestPairScore = score;
          if (generatorCount === 2) {
            bestScore = score;
            bestGenerators = [firstMask, secondMask];
          }
        }
      }
    }
    if (generatorCount === 3) {
      const products = new Array<number>(7).fill(0);
      const tryTriple = (firstMask: number, secondMask: number, thirdMask: number): void => {
        if (thirdMask === firstMask || thirdMask === secondMask || thirdMask === (firstMask ^ secondMask)) return; // dependent: fewer than 8 blocks
        products[0] = firstMask;
        products[1] = secondMask;
        products[2] = firstMask ^ secondMask;
        products[3] = thirdMask;
        products[4] = firstMask ^ thirdMask;
        products[5] = secondMask ^ thirdMask;
        products[6] = firstMask ^ secondMask ^ thirdMask;
        const score = scoreOf(products, shortest);
        if (betterScore(score, bestScore)) {
          bestScore = score;
          bestGenerators = [firstMask, secondMask, thirdMask];
        }
      };
      if (candidates.length <= EXHAUSTIVE_TRIPLES_UP_TO) {
        for (let first = 0; first < candidates.length; first++) {
          for (let second = first + 1; second < candidates.length; second++) {
            for (let third = second + 1; third < candidates.length; third++) tryTriple(candidates[first] as number, candidates[second] as number, candidates[third] as number);
          }
        }
      } else {
        // Heuristic for 9 or more base factors: extend a sample of the best pairs by every third column.
        for (const [firstMask, secondMask] of goodPairs) for (const thirdMask of candidates) tryTriple(firstMask, secondMask, thirdMask);
      }
    }
  }
  if (bestScore === undefined || bestGenerators.length !== generatorCount) {
    throw new DesignInputError(functionName, field, `no set of ${generatorCount} independent block generators exists for ${factorialRuns} factorial runs`);
  }

  // Block bit j flips when the sign of generator column j differs from the first factorial point's.
  const signOf = (point: CorePoint, mask: number): number => {
    let sign = 1;
    for (let factor = 0; factor < point.coded.length; factor++) {
      if ((mask >>> factor) & 1 && (point.coded[factor] as number) < 0) sign = -sign;
    }
    return sign;
  };
  const referenceSigns = bestGenerators.map((mask) => signOf(firstPoint, mask));
  const blockOfFactorialPoint: number[] = [];
  for (const pointIndex of structure.factorialPointIndices) {
    const point = points[pointIndex] as CorePoint;
    let block = 0;
    for (let index = 0; index < bestGenerators.length; index++) {
      if (signOf(point, bestGenerators[index] as number) !== referenceSigns[index]) block += 2 ** index;
    }
    blockOfFactorialPoint.push(block + 1);
  }
  const describe = (mask: number): string => shortestMembers(mask, structure.definingWords).map(wordOfMask).join(' = ');
  return {
    blockOfFactorialPoint,
    blockGenerators: bestGenerators.map((mask) => wordOfMask(shortestMembers(mask, structure.definingWords)[0] as number)),
    confoundedWithBlocks: allProducts(bestGenerators).sort((first, second) => (shortest[first] as number) - (shortest[second] as number) || compareWords(first, second)).map(describe),
    lowestConfoundedOrder: bestScore.lowest,
  };
}

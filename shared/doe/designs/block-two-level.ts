// Blocks for two-level designs by confounding interactions: the runs are split on the signs of
// b chosen interaction columns into 2^b blocks, so the block effect is mixed only with those
// interactions (and their products), never — when it can be helped — with main effects or
// two-factor interactions.
import { DesignInputError } from './design-input-error';
import { compareWords, wordLength, wordOfMask } from './factor-letters';
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
 * have the fewest effects at that order; b ≥ 2 searches the most promising candidates
 * exhaustively (all of them for up to 400 / 60 candidates). For a full 2^k in 2 blocks this is
 * the k-factor interaction; 2^4 in 4 blocks gives ABC, ABD (CD confounded, unavoidably a two-factor interaction).
 * Block 1 holds the first factorial point in standard order.
 * Reference: NIST/SEMATECH e-Handbook §5.3.3.3.3 (blocking of full factorial designs); confounding
 * in 2^k blocks as in Montgomery, Design and Analysis of Experiments, ch. 7 (from memory).
 * Cost: O(2^m · 2^p) for the alias lengths, plus at most ~2·10⁵ candidate sets.
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
  } else if (generatorCount === 2) {
    const pool = candidates.slice(0, 400);
    for (let first = 0; first < pool.length; first++) {
      for (let second = first + 1; second < pool.length; second++) {
        const generators = [pool[first] as number, pool[second] as number];
        const score = scoreOf(allProducts(generators), shortest);
        if (betterScore(score, bestScore)) {
          bestScore = score;
          bestGenerators = generators;
        }
      }
    }
  } else {
    const pool = candidates.slice(0, 60);
    for (let first = 0; first < pool.length; first++) {
      for (let second = first + 1; second < pool.length; second++) {
        for (let third = second + 1; third < pool.length; third++) {
          const generators = [pool[first] as number, pool[second] as number, pool[third] as number];
          const products = allProducts(generators);
          if (products.includes(0)) continue; // dependent: fewer than 8 distinct blocks
          const score = scoreOf(products, shortest);
          if (betterScore(score, bestScore)) {
            bestScore = score;
            bestGenerators = generators;
          }
        }
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

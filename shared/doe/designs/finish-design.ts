// The one entry point for designs: builds the coded core of the requested kind, then finishes
// it the same way for every kind — centre points, crossing with categorical levels,
// replicates, blocks, a seeded run order within blocks, and actual settings.
import { boxBehnken } from './box-behnken';
import { blockTwoLevel } from './block-two-level';
import { centralComposite } from './central-composite';
import { codedToActual } from './coded-to-actual';
import { DesignInputError } from './design-input-error';
import { letterMap } from './factor-letters';
import { fractionalFactorial } from './fractional-factorial';
import { MAX_DESIGN_RUNS, fullFactorial2 } from './full-factorial-2';
import { fullFactorial3 } from './full-factorial-3';
import { latinHypercube } from './latin-hypercube';
import { checkDesignRequest } from './validate-design-request';
import { deriveSeed, freshSeed, mulberry32, shuffle } from '../../stats/random';
import type { CheckedDesignRequest } from './validate-design-request';
import type { CoreDesign, CorePoint, Design, DesignInfo, DesignRequest, DesignRun, PointType } from './types';

const FUNCTION_NAME = 'generateDesign';
/** Independent random streams derived from the one seed (see deriveSeed). */
const POINT_STREAM = 1;
const ORDER_STREAM = 2;
const COUNTED_TYPES: readonly PointType[] = ['factorial', 'axial', 'edge', 'lhs', 'level', 'centre'];

function buildCore(checked: CheckedDesignRequest, seed: number): CoreDesign {
  const k = checked.continuous.length;
  const needsContinuous = (minimum: number, what: string): void => {
    if (k < minimum) throw new DesignInputError(FUNCTION_NAME, 'factors', `a ${what} needs at least ${minimum} continuous factor${minimum > 1 ? 's' : ''}, got ${k}`);
  };
  switch (checked.kind) {
    case 'full-factorial-2':
      return fullFactorial2(k);
    case 'full-factorial-3':
      return fullFactorial3(k);
    case 'fractional-factorial': {
      needsContinuous(3, 'fractional factorial');
      const options: { generators?: string[]; runs?: number } = {};
      if (checked.generators !== undefined) options.generators = checked.generators;
      if (checked.runs !== undefined) options.runs = checked.runs;
      return fractionalFactorial(k, options);
    }
    case 'central-composite': {
      needsContinuous(2, 'central composite design');
      const options: Parameters<typeof centralComposite>[1] = { centerPoints: checked.centerPoints };
      if (checked.variant !== undefined) options.variant = checked.variant;
      if (checked.alpha !== undefined) options.alpha = checked.alpha;
      if (checked.generators !== undefined) options.generators = checked.generators;
      return centralComposite(k, options);
    }
    case 'box-behnken':
      if (k < 3 || k > 7) throw new DesignInputError(FUNCTION_NAME, 'factors', `a Box–Behnken design needs 3 to 7 continuous factors, got ${k}`);
      return boxBehnken(k, checked.centerPoints);
    case 'latin-hypercube': {
      needsContinuous(1, 'Latin hypercube');
      if (checked.runs === undefined) throw new DesignInputError(FUNCTION_NAME, 'runs', 'is required for a Latin hypercube (the number of points)');
      const options: Parameters<typeof latinHypercube>[1] = { runs: checked.runs, seed: deriveSeed(seed, POINT_STREAM) };
      if (checked.maximin !== undefined) options.maximin = checked.maximin;
      if (checked.iterations !== undefined) options.iterations = checked.iterations;
      return latinHypercube(k, options);
    }
  }
}

/** Every combination of the categorical levels, first categorical factor changing fastest. */
function levelCombinations(checked: CheckedDesignRequest): string[][] {
  let combinations: string[][] = [[]];
  // Each new factor's level is the outer loop, so earlier factors keep changing fastest.
  for (const factor of checked.categorical) {
    const next: string[][] = [];
    for (const level of factor.levels) {
      for (const combination of combinations) next.push([...combination, level]);
    }
    combinations = next;
  }
  return combinations;
}

interface Blocking {
  blocksPerReplicate: number;
  byReplicate: boolean;
  /** 1-based block within a replicate for every point (core points, then centre points) */
  blockOfPoint: number[];
  description: string;
  blockGenerators?: string[];
  confoundedWithBlocks?: string[];
  warnings: string[];
}

function planBlocks(checked: CheckedDesignRequest, core: CoreDesign, pointCount: number): Blocking {
  const replicates = checked.replicates;
  const oneBlock = (description: string): Blocking => ({ blocksPerReplicate: 1, byReplicate: false, blockOfPoint: new Array<number>(pointCount).fill(1), description, warnings: [] });
  let blocks = checked.blocks;
  let blockBy = checked.blockBy;
  if (blockBy === 'replicate') {
    if (blocks === undefined) blocks = replicates;
    if (blocks !== replicates) throw new DesignInputError(FUNCTION_NAME, 'blocks', `blocking by replicate gives one block per replicate (${replicates}), got blocks = ${blocks}`);
  }
  if (blocks === undefined || blocks === 1) return oneBlock('none (one block)');
  if (blockBy === undefined) blockBy = blocks === replicates ? 'replicate' : 'interaction';
  if (blockBy === 'replicate') {
    return { blocksPerReplicate: 1, byReplicate: true, blockOfPoint: new Array<number>(pointCount).fill(1), description: `by replicate: block r holds replicate r (${replicates} blocks)`, warnings: [] };
  }

  // Interaction blocking: only two-level factorial points can be split on interaction signs.
  if (core.twoLevel === undefined || (checked.kind !== 'full-factorial-2' && checked.kind !== 'fractional-factorial' && checked.kind !== 'central-composite')) {
    throw new DesignInputError(
      FUNCTION_NAME,
      'blocks',
      `splitting one replicate into blocks needs a two-level design (full-factorial-2, fractional-factorial, central-composite); for a ${checked.kind} design use blockBy 'replicate' with blocks = replicates`,
    );
  }
  if (blocks % replicates !== 0) {
    throw new DesignInputError(FUNCTION_NAME, 'blocks', `${blocks} blocks cannot be shared equally among ${replicates} replicates`);
  }
  const blocksPerReplicate = blocks / replicates;
  const isComposite = checked.kind === 'central-composite';
  // A CCD keeps its axial points in a block of their own, the usual way to block a CCD.
  const factorialBlocks = isComposite ? blocksPerReplicate - 1 : blocksPerReplicate;
  if (isComposite && ![1, 2, 4, 8].includes(factorialBlocks)) {
    throw new DesignInputError(
      FUNCTION_NAME,
      'blocks',
      `a central composite design takes 2, 3, 5 or 9 blocks per replicate (factorial runs in 1, 2, 4 or 8 blocks plus one block of axial runs), got ${blocksPerReplicate}`,
    );
  }
  const blockOfPoint = new Array<number>(pointCount).fill(1);
  const warnings: string[] = [];
  let blockGenerators: string[] | undefined;
  let confoundedWithBlocks: string[] | undefined;
  let description: string;
  if (factorialBlocks > 1) {
    const split = blockTwoLevel(core.points, core.twoLevel, factorialBlocks, 'blocks');
    for (let index = 0; index < core.twoLevel.factorialPointIndices.length; index++) {
      blockOfPoint[core.twoLevel.factorialPointIndices[index] as number] = split.blockOfFactorialPoint[index] as number;
    }
    blockGenerators = split.blockGenerators;
    confoundedWithBlocks = split.confoundedWithBlocks;
    description = `by interaction: the factorial runs of each replicate are split on ${split.blockGenerators.join(', ')} (confounded with blocks: ${split.confoundedWithBlocks.join('; ')})`;
    if (split.lowestConfoundedOrder <= 2) {
      warnings.push(
        `Blocks are confounded with ${split.lowestConfoundedOrder === 1 ? 'a main effect' : 'a two-factor interaction'} (${split.confoundedWithBlocks.join('; ')}): use fewer blocks or more runs.`,
      );
    }
  } else {
    description = 'by point type: factorial runs in one block';
  }
  if (isComposite) {
    for (let index = 0; index < core.points.length; index++) {
      if ((core.points[index] as CorePoint).pointType === 'axial') blockOfPoint[index] = blocksPerReplicate;
    }
    description += `, axial runs in block ${blocksPerReplicate} of each replicate`;
    warnings.push('Blocked central composite: blocks are orthogonal to the model only for a matching α and centre-point split; check the block effect in the fit.');
  }
  // Centre points are shared round-robin over the blocks of the replicate.
  let nextBlock = 0;
  for (let index = core.points.length; index < pointCount; index++) {
    blockOfPoint[index] = nextBlock + 1;
    nextBlock = (nextBlock + 1) % blocksPerReplicate;
  }
  if (pointCount > core.points.length) description += '; centre points shared round-robin over the blocks';
  const result: Blocking = { blocksPerReplicate, byReplicate: false, blockOfPoint, description, warnings };
  if (blockGenerators !== undefined) result.blockGenerators = blockGenerators;
  if (confoundedWithBlocks !== undefined) result.confoundedWithBlocks = confoundedWithBlocks;
  return result;
}

function rangeWarnings(checked: CheckedDesignRequest, runs: readonly DesignRun[]): string[] {
  const beyond: string[] = [];
  const negative: string[] = [];
  for (const factor of checked.continuous) {
    let lowest = Number.POSITIVE_INFINITY;
    let highest = Number.NEGATIVE_INFINITY;
    for (const run of runs) {
      const value = run.actual[factor.key] as number;
      if (value < lowest) lowest = value;
      if (value > highest) highest = value;
    }
    // Tolerance: coded ±1 maps back to low/high only up to rounding.
    const slack = 1e-9 * (factor.high - factor.low);
    if (lowest < factor.low - slack || highest > factor.high + slack) {
      beyond.push(`${factor.key} ${lowest} to ${highest} (low/high ${factor.low} to ${factor.high})`);
    }
    if (factor.low >= 0 && lowest < 0) negative.push(`${factor.key} ${lowest}`);
  }
  const warnings: string[] = [];
  if (beyond.length > 0) warnings.push(`Settings beyond low/high: ${beyond.join('; ')}. Check that the equipment and the recipe allow them.`);
  if (negative.length > 0) {
    warnings.push(`Negative settings for factors whose low is not negative: ${negative.join('; ')}. Use a smaller alpha, or the inscribed or face-centred variant.`);
  }
  return warnings;
}

/**
 * Generates a finished design: the coded core for request.kind (2^k, 2^(k−p), 3^k, central
 * composite, Box–Behnken, Latin hypercube), plus
 *  - centerPoints runs at the centre of the continuous factors (per replicate and per level combination);
 *  - every categorical level combination crossed with every continuous run (coded = the level name);
 *  - replicates: the whole design repeated;
 *  - blocks: one per replicate (blockBy 'replicate'), or for two-level designs a split of each
 *    replicate on high-order interactions (blockBy 'interaction'; a CCD keeps its axial runs in
 *    a block of their own);
 *  - run order randomised within each block with a seeded Fisher–Yates shuffle (randomize = false
 *    keeps standard order), blocks run in sequence;
 *  - actual settings = centre + coded · halfRange.
 * The seed (given or fresh) is reported in info.seed; the same request and seed give the same design.
 * Reference: NIST/SEMATECH e-Handbook of Statistical Methods §5.3 (choosing an experimental design).
 * Cost: O(runs · factors), plus the core generator's cost (maximin LHS: O(iterations · n² · k)).
 * @throws DesignInputError ("generateDesign: <field>: <problem>", or the core generator's name)
 *   for a bad request, a kind that does not fit the factors, or more than 4096 runs.
 * @example generateDesign({ kind: 'box-behnken', factors, centerPoints: 3, seed: 7 }).runs.length // 15 for 3 factors
 */
export function generateDesign(request: DesignRequest): Design {
  const checked = checkDesignRequest(request);
  const seed = checked.seed ?? freshSeed();
  const k = checked.continuous.length;
  const warnings = [...checked.warnings];

  // Size check before building: the core generators check their own size, the rest is a product.
  const core = buildCore(checked, seed);
  warnings.push(...core.warnings);
  const centerPoints = k === 0 ? 0 : checked.centerPoints;
  if (k === 0 && checked.centerPoints > 0) warnings.push('centerPoints was ignored: there are no continuous factors to centre.');
  const pointsPerCombination = core.points.length + centerPoints;
  let levelCombinationCount = 1;
  for (const factor of checked.categorical) levelCombinationCount *= factor.levels.length;
  const totalRuns = pointsPerCombination * levelCombinationCount * checked.replicates;
  if (totalRuns > MAX_DESIGN_RUNS) {
    throw new DesignInputError(
      FUNCTION_NAME,
      'factors',
      `${pointsPerCombination} runs × ${levelCombinationCount} level combinations × ${checked.replicates} replicates = ${totalRuns} runs is more than ${MAX_DESIGN_RUNS}`,
    );
  }
  const points: CorePoint[] = core.points.slice();
  for (let index = 0; index < centerPoints; index++) points.push({ coded: new Array<number>(k).fill(0), pointType: 'centre' });
  const blocking = planBlocks(checked, core, points.length);
  warnings.push(...blocking.warnings);
  const combinations = levelCombinations(checked);

  // Systematic (standard-order) listing.
  const systematic: DesignRun[] = [];
  for (let replicate = 1; replicate <= checked.replicates; replicate++) {
    for (const combination of combinations) {
      for (let pointIndex = 0; pointIndex < points.length; pointIndex++) {
        const point = points[pointIndex] as CorePoint;
        const coded: Record<string, number | string> = {};
        const actual: Record<string, number | string> = {};
        for (let factor = 0; factor < k; factor++) {
          const { key, low, high } = checked.continuous[factor] as { key: string; low: number; high: number };
          const value = (point.coded[factor] as number) + 0; // + 0 turns −0 into 0
          coded[key] = value;
          actual[key] = codedToActual(value, low, high);
        }
        for (let factor = 0; factor < checked.categorical.length; factor++) {
          const key = (checked.categorical[factor] as { key: string }).key;
          coded[key] = combination[factor] as string;
          actual[key] = combination[factor] as string;
        }
        const withinReplicate = blocking.blockOfPoint[pointIndex] as number;
        const block = blocking.byReplicate ? replicate : (replicate - 1) * blocking.blocksPerReplicate + withinReplicate;
        systematic.push({ runOrder: 0, standardOrder: systematic.length + 1, block, pointType: point.pointType, coded, actual });
      }
    }
  }

  // Run order: blocks in sequence, shuffled inside each block.
  const byBlock = new Map<number, DesignRun[]>();
  for (const run of systematic) {
    const list = byBlock.get(run.block);
    if (list === undefined) byBlock.set(run.block, [run]);
    else list.push(run);
  }
  const blockNumbers = [...byBlock.keys()].sort((first, second) => first - second);
  const random = mulberry32(deriveSeed(seed, ORDER_STREAM));
  const runs: DesignRun[] = [];
  for (const blockNumber of blockNumbers) {
    const members = byBlock.get(blockNumber) as DesignRun[];
    const ordered = checked.randomize ? shuffle(members, random) : members;
    for (const run of ordered) {
      run.runOrder = runs.length + 1;
      runs.push(run);
    }
  }

  const runsByType: Partial<Record<PointType, number>> = {};
  for (const type of COUNTED_TYPES) {
    let count = 0;
    for (const run of runs) if (run.pointType === type) count++;
    if (count > 0) runsByType[type] = count;
  }
  warnings.push(...rangeWarnings(checked, runs));
  const totalBlocks = blockNumbers.length;
  const info: DesignInfo = {
    ...core.info,
    totalRuns: runs.length,
    runsByType,
    runsPerReplicate: pointsPerCombination,
    continuousFactors: k,
    levelCombinations: levelCombinationCount,
    factorLetters: letterMap(checked.continuous.map((factor) => factor.key)),
    centerPoints,
    replicates: checked.replicates,
    blocks: totalBlocks,
    blocking: blocking.description,
    randomized: checked.randomize,
    seed,
    notes: [
      ...core.info.notes,
      levelCombinationCount > 1 ? `Every continuous run is crossed with all ${levelCombinationCount} categorical level combinations.` : '',
      checked.randomize ? 'Run order randomised within each block (seeded Fisher–Yates shuffle); blocks run in sequence.' : 'Run order = standard order within each block (not randomised).',
    ].filter((note) => note !== ''),
  };
  if (blocking.blockGenerators !== undefined) info.blockGenerators = blocking.blockGenerators;
  if (blocking.confoundedWithBlocks !== undefined) info.confoundedWithBlocks = blocking.confoundedWithBlocks;
  return { kind: checked.kind, factorKeys: checked.factorKeys, runs, info, warnings };
}

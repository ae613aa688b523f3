// Shapes shared by every design generator: the request a caller sends, the finished design
// that comes back, and the bare "core" point set each generator produces in coded units
// before centre points, categorical crossing, replicates, blocks and run order are applied.

export type DesignKind =
  | 'full-factorial-2'
  | 'fractional-factorial'
  | 'full-factorial-3'
  | 'central-composite'
  | 'box-behnken'
  | 'latin-hypercube';

/**
 * Where a run sits in the design geometry (continuous factors only):
 * factorial = a corner at ±1 (or ±1/α in an inscribed CCD), axial = a star point on one axis,
 * centre = all continuous factors at 0, edge = a Box–Behnken edge midpoint,
 * lhs = a Latin hypercube point, level = any other grid point (3^k) or a purely categorical run.
 */
export type PointType = 'factorial' | 'axial' | 'centre' | 'edge' | 'lhs' | 'level';

export interface DesignFactor {
  key: string;
  kind: 'continuous' | 'categorical';
  /** continuous only: the setting that coded −1 stands for, in the factor's own unit */
  low?: number;
  /** continuous only: the setting that coded +1 stands for */
  high?: number;
  /** categorical only: the level names */
  levels?: string[];
}

export type CcdVariant = 'circumscribed' | 'inscribed' | 'face-centred';
export type CcdAlpha = 'rotatable' | 'orthogonal' | number;
export type BlockBy = 'replicate' | 'interaction';

export interface DesignRequest {
  kind: DesignKind;
  factors: DesignFactor[];
  /** extra runs with every continuous factor at its centre, per replicate and per categorical level combination */
  centerPoints?: number;
  /** how many times the whole design (centre points included) is repeated; default 1 */
  replicates?: number;
  /** total number of blocks; default 1 */
  blocks?: number;
  /** how blocks are formed; default: by replicate when blocks = replicates, else by interaction */
  blockBy?: BlockBy;
  /** integer seed for run order and Latin hypercube draws; a fresh one is chosen (and reported) when absent */
  seed?: number;
  /** randomise run order within each block; default true */
  randomize?: boolean;
  /** fractional factorial (or the factorial part of a CCD): generators like "E=ABCD" */
  generators?: string[];
  /** central composite only; default 'circumscribed' */
  variant?: CcdVariant;
  /** central composite only; default 'rotatable' */
  alpha?: CcdAlpha;
  /** Latin hypercube: number of points; fractional factorial without generators: size of the fraction */
  runs?: number;
  /** Latin hypercube only: spread the points out (maximise the smallest pairwise distance) */
  maximin?: boolean;
  /** Latin hypercube with maximin: random candidate designs tried, and as many swap attempts */
  iterations?: number;
}

export interface DesignRun {
  /** 1-based order in which to make the builds (randomised within blocks unless randomize = false) */
  runOrder: number;
  /** 1-based position in the systematic listing: replicate by replicate, level combination by
   *  level combination, core points in generator order (Yates order for factorials), then centre points */
  standardOrder: number;
  /** 1-based block number */
  block: number;
  pointType: PointType;
  /** continuous factors in coded units; categorical factors as the level name */
  coded: Record<string, number | string>;
  /** continuous factors in their own units (rounded to 12 significant digits); categorical as the level name */
  actual: Record<string, number | string>;
}

/** One alias chain: an effect and every effect whose column is the same (± sign) in this fraction. */
export interface AliasChain {
  effect: string;
  aliases: string[];
}

export interface DesignInfo {
  totalRuns: number;
  runsByType: Partial<Record<PointType, number>>;
  /** runs in one replicate of one categorical level combination, centre points included */
  runsPerReplicate: number;
  continuousFactors: number;
  /** product of the categorical factors' level counts (1 when there are none) */
  levelCombinations: number;
  /** factor letter → factor key, for reading generators, words and aliases */
  factorLetters: Record<string, string>;
  centerPoints: number;
  replicates: number;
  blocks: number;
  /** plain words on how blocks were formed */
  blocking: string;
  randomized: boolean;
  seed: number;
  /** two-level designs */
  generators?: string[];
  definingRelation?: string;
  definingWords?: string[];
  resolution?: number;
  aliases?: string[];
  aliasChains?: AliasChain[];
  blockGenerators?: string[];
  confoundedWithBlocks?: string[];
  /** central composite */
  variant?: CcdVariant;
  alpha?: number;
  alphaRule?: string;
  factorialRuns?: number;
  axialRuns?: number;
  /** Latin hypercube: smallest Euclidean distance between two points, coded units */
  minPairwiseDistance?: number;
  maximin?: boolean;
  iterations?: number;
  /** sources and construction notes, in plain words */
  notes: string[];
}

export interface Design {
  kind: DesignKind;
  /** every factor key, in the order the factors were given */
  factorKeys: string[];
  runs: DesignRun[];
  info: DesignInfo;
  warnings: string[];
}

/** One point of a generator's output, coded values in the order of the continuous factors. */
export interface CorePoint {
  coded: number[];
  pointType: PointType;
}

/**
 * What the finishing step needs to block a two-level design by confounding interactions:
 * words are bit masks over the continuous-factor letters (bit i = letter i).
 */
export interface TwoLevelStructure {
  /** bit mask of the letters whose columns are free (not generated) */
  baseMask: number;
  /** defining-relation words (masks); empty for a full factorial */
  definingWords: number[];
  /** indices into CorePoint list of the two-level (factorial) points */
  factorialPointIndices: number[];
}

export type CoreInfo = Partial<
  Pick<
    DesignInfo,
    | 'generators'
    | 'definingRelation'
    | 'definingWords'
    | 'resolution'
    | 'aliases'
    | 'aliasChains'
    | 'variant'
    | 'alpha'
    | 'alphaRule'
    | 'factorialRuns'
    | 'axialRuns'
    | 'minPairwiseDistance'
    | 'maximin'
    | 'iterations'
  >
> & { notes: string[] };

export interface CoreDesign {
  points: CorePoint[];
  info: CoreInfo;
  warnings: string[];
  /** present for designs whose factorial points can be split into blocks on an interaction */
  twoLevel?: TwoLevelStructure;
}

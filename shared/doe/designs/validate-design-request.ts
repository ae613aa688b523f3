// Checks a design request field by field before anything is generated, so a bad request fails
// with one clear "generateDesign: <field>: <problem>" message instead of a half-built design.
import { DesignInputError } from './design-input-error';
import { MAX_DESIGN_RUNS } from './full-factorial-2';
import type { BlockBy, CcdAlpha, CcdVariant, DesignKind, DesignRequest } from './types';

export interface ContinuousFactor {
  key: string;
  low: number;
  high: number;
}

export interface CategoricalFactor {
  key: string;
  levels: string[];
}

export interface CheckedDesignRequest {
  kind: DesignKind;
  factorKeys: string[];
  continuous: ContinuousFactor[];
  categorical: CategoricalFactor[];
  centerPoints: number;
  replicates: number;
  /** undefined when the caller gave none (the finishing step picks a default) */
  blocks: number | undefined;
  blockBy: BlockBy | undefined;
  seed: number | undefined;
  randomize: boolean;
  generators: string[] | undefined;
  variant: CcdVariant | undefined;
  alpha: CcdAlpha | undefined;
  runs: number | undefined;
  maximin: boolean | undefined;
  iterations: number | undefined;
  warnings: string[];
}

const KINDS: readonly DesignKind[] = ['full-factorial-2', 'fractional-factorial', 'full-factorial-3', 'central-composite', 'box-behnken', 'latin-hypercube'];
const FUNCTION_NAME = 'generateDesign';
/** Upper bounds that keep a request from asking for absurd work before the run count is known. */
const MAX_FACTORS = 50;
const MAX_CENTER_POINTS = 100;
const MAX_REPLICATES = 100;

function fail(field: string, problem: string): never {
  throw new DesignInputError(FUNCTION_NAME, field, problem);
}

function describe(value: unknown): string {
  if (typeof value === 'string') return `"${value}"`;
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'an object';
  return String(value);
}

function optionalWholeNumber(value: unknown, field: string, minimum: number, maximum: number): number | undefined {
  if (value === undefined) return undefined;
  if (typeof value !== 'number' || !Number.isInteger(value) || value < minimum || value > maximum) {
    fail(field, `must be a whole number from ${minimum} to ${maximum}, got ${describe(value)}`);
  }
  return value;
}

/**
 * Validates and normalises a design request: the kind, every factor (unique non-empty keys;
 * continuous with finite low < high; categorical with at least 2 distinct, non-empty level
 * names), and every option's type and range. Options the chosen kind does not use are
 * reported in warnings rather than rejected.
 * Cost: O(number of factors + number of levels).
 * @throws DesignInputError naming the first bad field.
 * @example checkDesignRequest({ kind: 'box-behnken', factors }).continuous.length // 3
 */
export function checkDesignRequest(request: DesignRequest): CheckedDesignRequest {
  if (typeof request !== 'object' || request === null) fail('request', `must be an object, got ${describe(request)}`);
  const kind = request.kind;
  if (!KINDS.includes(kind)) fail('kind', `must be one of ${KINDS.join(', ')}, got ${describe(kind)}`);
  const factors: unknown = request.factors;
  if (!Array.isArray(factors) || factors.length === 0) fail('factors', 'must be a non-empty list of factors');
  if (factors.length > MAX_FACTORS) fail('factors', `at most ${MAX_FACTORS} factors, got ${factors.length}`);

  const factorKeys: string[] = [];
  const continuous: ContinuousFactor[] = [];
  const categorical: CategoricalFactor[] = [];
  const seenKeys = new Set<string>();
  for (let index = 0; index < factors.length; index++) {
    const field = `factors[${index}]`;
    const factor: unknown = factors[index];
    if (typeof factor !== 'object' || factor === null) fail(field, `must be an object, got ${describe(factor)}`);
    const { key, kind: factorKind, low, high, levels } = factor as Record<string, unknown>;
    if (typeof key !== 'string' || key.trim() === '') fail(`${field}.key`, `must be a non-empty string, got ${describe(key)}`);
    if (seenKeys.has(key)) fail(`${field}.key`, `"${key}" is used by another factor`);
    seenKeys.add(key);
    factorKeys.push(key);
    if (factorKind === 'continuous') {
      if (typeof low !== 'number' || !Number.isFinite(low)) fail(`${field}.low`, `must be a finite number, got ${describe(low)}`);
      if (typeof high !== 'number' || !Number.isFinite(high)) fail(`${field}.high`, `must be a finite number, got ${describe(high)}`);
      if (!(high > low)) fail(`${field}.high`, `must be greater than low (${low}), got ${high}`);
      continuous.push({ key, low, high });
    } else if (factorKind === 'categorical') {
      if (!Array.isArray(levels)) fail(`${field}.levels`, `must be a list of level names, got ${describe(levels)}`);
      const seenLevels = new Set<string>();
      for (let levelIndex = 0; levelIndex < levels.length; levelIndex++) {
        const level: unknown = levels[levelIndex];
        if (typeof level !== 'string' || level.trim() === '') fail(`${field}.levels[${levelIndex}]`, `must be a non-empty string, got ${describe(level)}`);
        if (seenLevels.has(level)) fail(`${field}.levels[${levelIndex}]`, `"${level}" is listed twice`);
        seenLevels.add(level);
      }
      if (levels.length < 2) fail(`${field}.levels`, `needs at least 2 levels, got ${levels.length}`);
      categorical.push({ key, levels: (levels as string[]).slice() });
    } else {
      fail(`${field}.kind`, `must be 'continuous' or 'categorical', got ${describe(factorKind)}`);
    }
  }

  const warnings: string[] = [];
  const centerPoints = optionalWholeNumber(request.centerPoints, 'centerPoints', 0, MAX_CENTER_POINTS) ?? 0;
  const replicates = optionalWholeNumber(request.replicates, 'replicates', 1, MAX_REPLICATES) ?? 1;
  const blocks = optionalWholeNumber(request.blocks, 'blocks', 1, MAX_DESIGN_RUNS);
  const blockBy = request.blockBy;
  if (blockBy !== undefined && blockBy !== 'replicate' && blockBy !== 'interaction') {
    fail('blockBy', `must be 'replicate' or 'interaction', got ${describe(blockBy)}`);
  }
  const seed = request.seed;
  if (seed !== undefined && (typeof seed !== 'number' || !Number.isInteger(seed))) fail('seed', `must be an integer, got ${describe(seed)}`);
  const randomize = request.randomize ?? true;
  if (typeof randomize !== 'boolean') fail('randomize', `must be true or false, got ${describe(randomize)}`);

  let generators: string[] | undefined;
  if (request.generators !== undefined) {
    if (!Array.isArray(request.generators)) fail('generators', `must be a list of strings like "E=ABCD", got ${describe(request.generators)}`);
    for (let index = 0; index < request.generators.length; index++) {
      if (typeof request.generators[index] !== 'string') fail(`generators[${index}]`, `must be a string like "E=ABCD", got ${describe(request.generators[index])}`);
    }
    generators = request.generators.slice();
  }
  const variant = request.variant;
  if (variant !== undefined && variant !== 'circumscribed' && variant !== 'inscribed' && variant !== 'face-centred') {
    fail('variant', `must be 'circumscribed', 'inscribed' or 'face-centred', got ${describe(variant)}`);
  }
  const alpha = request.alpha;
  if (alpha !== undefined && alpha !== 'rotatable' && alpha !== 'orthogonal' && !(typeof alpha === 'number' && Number.isFinite(alpha) && alpha > 0)) {
    fail('alpha', `must be 'rotatable', 'orthogonal' or a positive number, got ${describe(alpha)}`);
  }
  const runs = optionalWholeNumber(request.runs, 'runs', 2, MAX_DESIGN_RUNS);
  const maximin = request.maximin;
  if (maximin !== undefined && typeof maximin !== 'boolean') fail('maximin', `must be true or false, got ${describe(maximin)}`);
  const iterations = optionalWholeNumber(request.iterations, 'iterations', 1, 10000);

  // Options that the chosen kind does not read: say so rather than silently drop them.
  const unused: string[] = [];
  if (generators !== undefined && generators.length > 0 && kind !== 'fractional-factorial' && kind !== 'central-composite') unused.push('generators');
  if (kind !== 'central-composite') {
    if (variant !== undefined) unused.push('variant');
    if (alpha !== undefined) unused.push('alpha');
  }
  if (runs !== undefined && kind !== 'latin-hypercube' && kind !== 'fractional-factorial') unused.push('runs');
  if (kind !== 'latin-hypercube') {
    if (maximin !== undefined) unused.push('maximin');
    if (iterations !== undefined) unused.push('iterations');
  }
  if (unused.length > 0) warnings.push(`Ignored for a ${kind} design: ${unused.join(', ')}.`);

  return {
    kind,
    factorKeys,
    continuous,
    categorical,
    centerPoints,
    replicates,
    blocks,
    blockBy,
    seed,
    randomize,
    generators,
    variant,
    alpha,
    runs,
    maximin,
    iterations,
    warnings,
  };
}

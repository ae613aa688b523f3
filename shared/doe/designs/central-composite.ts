// Central composite design (CCD) in coded units: a two-level factorial (full, or a fraction
// when generators are given), 2k axial (star) points at ±α on each axis, and — added by the
// finishing step — centre points.
import { DesignInputError } from './design-input-error';
import { fractionalFactorial, romanResolution } from './fractional-factorial';
import { MAX_DESIGN_RUNS, fullFactorial2 } from './full-factorial-2';
import type { CcdAlpha, CcdVariant, CoreDesign, CorePoint } from './types';

export interface CentralCompositeOptions {
  variant?: CcdVariant;
  alpha?: CcdAlpha;
  /** centre points per replicate (per categorical level combination); needed for the orthogonal α */
  centerPoints?: number;
  /** fractional factorial part, e.g. ['F=ABCDE'] */
  generators?: readonly string[];
}

/**
 * Rotatable axial distance α = F^(1/4), F = number of factorial runs, which makes the
 * prediction variance depend only on the distance from the centre.
 * Reference: NIST/SEMATECH e-Handbook §5.3.3.6.1 (α = [2^k]^(1/4): 1.414, 1.682, 2.000 for k = 2, 3, 4);
 * Myers & Montgomery, Response Surface Methodology, ch. 7 (from memory).
 * Cost: O(1).
 * @throws RangeError when F is not a positive number.
 * @example rotatableAlpha(8) // 1.6818
 */
export function rotatableAlpha(factorialRuns: number): number {
  if (!(Number.isFinite(factorialRuns) && factorialRuns > 0)) throw new RangeError(`rotatableAlpha: factorialRuns: must be a positive number, got ${factorialRuns}`);
  return Math.pow(factorialRuns, 0.25);
}

/**
 * Orthogonal axial distance α = [ (√(F + 2k + n0) − √F)² · F / 4 ]^(1/4), which makes the
 * centred pure-quadratic columns x_i² of the model matrix orthogonal to each other.
 * Why: each x_i² column has F ones and two α² entries, so Σx_i² = F + 2α² and Σx_i²x_j² = F;
 * zero covariance needs F·N = (F + 2α²)² with N = F + 2k + n0, i.e. α² = (√(F·N) − F)/2.
 * Reference: Myers & Montgomery, Response Surface Methodology, ch. 7 (orthogonal CCD), from memory;
 * the derivation above is checked numerically in tests/unit/doe/designs-ccd.test.ts.
 * Cost: O(1).
 * @throws RangeError when F ≤ 0, k < 1 or n0 < 0.
 * @example orthogonalAlpha(4, 2, 1) // 1 (the 3² grid)
 */
export function orthogonalAlpha(factorialRuns: number, k: number, centerPoints: number): number {
  if (!(Number.isFinite(factorialRuns) && factorialRuns > 0)) throw new RangeError(`orthogonalAlpha: factorialRuns: must be a positive number, got ${factorialRuns}`);
  if (!(Number.isInteger(k) && k >= 1)) throw new RangeError(`orthogonalAlpha: k: must be a positive integer, got ${k}`);
  if (!(Number.isInteger(centerPoints) && centerPoints >= 0)) throw new RangeError(`orthogonalAlpha: centerPoints: must be a whole number ≥ 0, got ${centerPoints}`);
  const totalRuns = factorialRuns + 2 * k + centerPoints;
  const rootGap = Math.sqrt(totalRuns) - Math.sqrt(factorialRuns);
  return Math.pow((rootGap * rootGap * factorialRuns) / 4, 0.25);
}

/**
 * The central composite design in coded units, in standard order: factorial points (Yates
 * order, or the fraction's order), then axial points (−α, +α on the first factor, then the
 * second…). Centre points are added by the finishing step.
 * Variants: circumscribed (factorial at ±1, axial at ±α, beyond the low/high range);
 * inscribed (the circumscribed design divided by α: axial at ±1, factorial at ±1/α);
 * face-centred (α = 1: axial points on the faces of the cube).
 * Reference: NIST/SEMATECH e-Handbook of Statistical Methods §5.3.3.6.1 (central composite designs).
 * Cost: O(k · (F + 2k)).
 * @throws DesignInputError when k < 2, the variant or α is not recognised, α ≤ 0, the factorial
 *   part fails (bad generators) or the design would exceed 4096 runs.
 * @example centralComposite(3, {}).points.length // 14 (8 factorial + 6 axial)
 */
export function centralComposite(k: number, options: CentralCompositeOptions): CoreDesign {
  const functionName = 'centralComposite';
  if (!Number.isInteger(k) || k < 2) throw new DesignInputError(functionName, 'factors', `needs at least 2 continuous factors, got ${k}`);
  const variant = options.variant ?? 'circumscribed';
  if (variant !== 'circumscribed' && variant !== 'inscribed' && variant !== 'face-centred') {
    throw new DesignInputError(functionName, 'variant', `must be 'circumscribed', 'inscribed' or 'face-centred', got ${String(variant)}`);
  }
  const alphaOption = options.alpha ?? 'rotatable';
  if (alphaOption !== 'rotatable' && alphaOption !== 'orthogonal' && !(typeof alphaOption === 'number' && Number.isFinite(alphaOption) && alphaOption > 0)) {
    throw new DesignInputError(functionName, 'alpha', `must be 'rotatable', 'orthogonal' or a positive number, got ${String(alphaOption)}`);
  }
  const centerPoints = options.centerPoints ?? 0;
  if (!Number.isInteger(centerPoints) || centerPoints < 0) throw new DesignInputError(functionName, 'centerPoints', `must be a whole number ≥ 0, got ${centerPoints}`);

  const warnings: string[] = [];
  const notes: string[] = [];
  const useFraction = options.generators !== undefined && options.generators.length > 0;
  if (!useFraction && 2 ** k + 2 * k > MAX_DESIGN_RUNS) {
    throw new DesignInputError(functionName, 'factors', `2^${k} + ${2 * k} runs is more than ${MAX_DESIGN_RUNS}; give generators for a fractional factorial part`);
  }
  const factorialPart = useFraction ? fractionalFactorial(k, { generators: options.generators ?? [] }) : fullFactorial2(k);
  const factorialRuns = factorialPart.points.length;
  if (factorialRuns + 2 * k > MAX_DESIGN_RUNS) {
    throw new DesignInputError(functionName, 'generators', `${factorialRuns} + ${2 * k} runs is more than ${MAX_DESIGN_RUNS}`);
  }
  const resolution = factorialPart.info.resolution;
  if (resolution !== undefined && resolution < 5) {
    warnings.push(
      `The factorial part is resolution ${romanResolution(resolution)}: two-factor interactions are aliased, so a full quadratic model cannot be separated; use resolution V or higher.`,
    );
  }

  let alpha: number;
  let alphaRule: string;
  if (variant === 'face-centred') {
    alpha = 1;
    alphaRule = 'face-centred: α = 1';
    if (options.alpha !== undefined && options.alpha !== 1) warnings.push(`alpha ${String(options.alpha)} was ignored: a face-centred design has α = 1.`);
  } else if (alphaOption === 'rotatable') {
    alpha = rotatableAlpha(factorialRuns);
    alphaRule = `rotatable: α = F^(1/4) = ${factorialRuns}^(1/4)`;
  } else if (alphaOption === 'orthogonal') {
    alpha = orthogonalAlpha(factorialRuns, k, centerPoints);
    alphaRule = `orthogonal: α = [(√(F + 2k + n0) − √F)² · F / 4]^(1/4) with F = ${factorialRuns}, k = ${k}, n0 = ${centerPoints} (Myers & Montgomery, from memory)`;
    notes.push('The orthogonal α assumes the centre points of one replicate of one categorical level combination, as given in centerPoints.');
  } else {
    alpha = alphaOption;
    alphaRule = `given: α = ${alphaOption}`;
    if (alphaOption < 1) warnings.push(`α = ${alphaOption} is below 1: the axial points sit inside the factorial cube.`);
  }

  // Inscribed = circumscribed shrunk by α so nothing leaves the low/high box.
  const factorialLevel = variant === 'inscribed' ? 1 / alpha : 1;
  const axialLevel = variant === 'inscribed' ? 1 : alpha;
  const points: CorePoint[] = [];
  for (const point of factorialPart.points) {
    points.push({ coded: point.coded.map((value) => value * factorialLevel), pointType: 'factorial' });
  }
  for (let factor = 0; factor < k; factor++) {
    for (const side of [-1, 1]) {
      const coded = new Array<number>(k).fill(0);
      coded[factor] = side * axialLevel;
      points.push({ coded, pointType: 'axial' });
    }
  }
  if (centerPoints === 0) warnings.push('No centre points: add some (3–6 is common practice) to estimate pure error and curvature.');
  if (variant === 'circumscribed' && alpha > 1) notes.push(`Axial points lie at ±${alpha.toFixed(4)} coded units, outside the low/high settings.`);
  if (variant === 'inscribed') notes.push(`Inscribed: axial points at ±1, factorial points at ±1/α = ±${(1 / alpha).toFixed(4)} coded units.`);
  notes.push(...factorialPart.info.notes);

  const design: CoreDesign = {
    points,
    info: { ...factorialPart.info, variant, alpha, alphaRule, factorialRuns, axialRuns: 2 * k, notes },
    warnings,
  };
  // Only a ±1 factorial part can be split on interactions by the finishing step.
  if (factorialPart.twoLevel !== undefined) design.twoLevel = factorialPart.twoLevel;
  return design;
}

// Lot-to-lot comparison of one response at matched recipes: a scale-up batch judged against the
// small one on the builds both lots were made into with the same recipe. Pure.
import { welchInterval, type WelchInterval } from '../gains/welch';
import { summarizeSample } from '../gains/sample-summary';

export interface LotValue {
  /** the lot the build was made from */
  lotId: number;
  /** a key of the build's recipe without the lot (factor values, loading); equal keys = matched recipe */
  recipe: string;
  value: number;
}

export interface LotSide {
  n: number;
  mean: number | null;
  /** sample SD (n − 1); null below 2 values */
  sd: number | null;
}

export interface LotComparison {
  /** recipes made from both lots, in first-seen order */
  matchedRecipes: string[];
  /** the reference lot (a) and the lot judged against it (b), over matched recipes only */
  a: LotSide;
  b: LotSide;
  /** Welch interval of mean(b) − mean(a); null when a side has fewer than 2 values */
  welch: WelchInterval | null;
  /** the same per matched recipe */
  byRecipe: { recipe: string; a: LotSide; b: LotSide; welch: WelchInterval | null }[];
  /** values left out because their recipe was made from one lot only */
  unmatched: number;
}

function side(values: number[]): LotSide {
  if (values.length === 0) return { n: 0, mean: null, sd: null };
  const s = summarizeSample(values, 'compareLots');
  return { n: s.n, mean: s.mean, sd: s.sd };
}

function welchOrNull(a: number[], b: number[], confidence: number): WelchInterval | null {
  return a.length >= 2 && b.length >= 2 ? welchInterval(a, b, confidence) : null;
}

/**
 * Means, SDs, counts and the Welch interval of mean(b) − mean(a) for lot b against lot a, using
 * only builds whose recipe was made from both lots (so a recipe change is not read as a lot
 * effect), overall and recipe by recipe.
 * Reference: Welch (1947), Biometrika 34, 28–35 (see welchInterval); matching on recipe is the
 * usual blocking of a comparison (NIST/SEMATECH e-Handbook 5.3.3.2, blocking).
 * Cost: O(n) plus the interval.
 * @throws RangeError when the two lots are the same or confidence is outside (0, 1).
 * @example compareLots(1, 2, [{lotId: 1, recipe: 'r', value: 0.6}, …]).welch?.diff
 */
export function compareLots(lotA: number, lotB: number, values: readonly LotValue[], confidence = 0.95): LotComparison {
  if (lotA === lotB) throw new RangeError('compareLots: choose two different lots');
  const byRecipe = new Map<string, { a: number[]; b: number[] }>();
  for (const v of values) {
    if (!Number.isFinite(v.value) || (v.lotId !== lotA && v.lotId !== lotB)) continue;
    let entry = byRecipe.get(v.recipe);
    if (!entry) byRecipe.set(v.recipe, (entry = { a: [], b: [] }));
    (v.lotId === lotA ? entry.a : entry.b).push(v.value);
  }
  const a: number[] = [];
  const b: number[] = [];
  const matched: LotComparison['byRecipe'] = [];
  let unmatched = 0;
  for (const [recipe, entry] of byRecipe) {
    if (entry.a.length === 0 || entry.b.length === 0) {
      unmatched += entry.a.length + entry.b.length;
      continue;
    }
    a.push(...entry.a);
    b.push(...entry.b);
    matched.push({ recipe, a: side(entry.a), b: side(entry.b), welch: welchOrNull(entry.a, entry.b, confidence) });
  }
  return { matchedRecipes: matched.map((m) => m.recipe), a: side(a), b: side(b), welch: welchOrNull(a, b, confidence), byRecipe: matched, unmatched };
}

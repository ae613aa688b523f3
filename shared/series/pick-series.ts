// Which builds form a series: those whose recipe and test conditions differ only in the series
// variable (cell temperature, back-pressure, …), found with the recipe diff; the rest are listed
// with what else differs.
import { diffRecipe } from '../lineage/recipe-diff';
import type { RecipeChange, RecipeFactor, RecipeSnapshot } from '../lineage/recipe-diff';
import { describeChanges } from '../lineage/describe-changes';

/** A build offered for a series: its recipe snapshot plus its id and code. */
export interface SeriesCandidate extends RecipeSnapshot {
  buildId: number;
  /** build code (e.g. B-014), for the messages; default the id */
  code?: string;
}

export interface PickSeriesOptions {
  /**
   * 'auto' (default): keep the largest group of builds that differ only in the series variable.
   * 'as-given': the builds were picked by hand; keep them all and list what else differs.
   */
  mode?: 'auto' | 'as-given';
  /** the build the others are compared with; default: the one matching most others (auto) or the first (as-given) */
  referenceBuildId?: number;
}

export interface SeriesMismatch {
  buildId: number;
  code: string;
  /** what differs from the reference build besides the series variable (empty when the value is missing) */
  differences: RecipeChange[];
  /** one sentence, e.g. "B-007 differs from B-001 in binder 20 → 30 wt %" */
  reason: string;
}

export interface SeriesSelection {
  /** the builds of the series, in the order given */
  members: number[];
  /** the series variable's value for each member (a number; °C, kPa … as recorded) */
  values: { buildId: number; value: number }[];
  /** the build every other was compared with */
  referenceBuildId: number;
  /** builds left out (auto) or kept despite other differences (as-given) */
  mismatches: SeriesMismatch[];
  /** how many different values of the series variable the members cover */
  distinctValues: number;
  /** the keys treated as the series variable */
  seriesKeys: string[];
}

/** The series variable's numeric value on a build, read from the first series key it has. */
function seriesValue(candidate: SeriesCandidate, keys: readonly string[]): number | null {
  for (const key of keys) {
    let raw: unknown;
    if (key.startsWith('conditions.')) raw = candidate.testConditions?.[key.slice('conditions.'.length)];
    else if (key === 'loadingMgCm2' || key === 'metalLoadingMgCm2') raw = candidate[key];
    else raw = candidate.factors[key];
    if (typeof raw === 'number' && Number.isFinite(raw)) return raw;
  }
  return null;
}

function otherDifferences(reference: SeriesCandidate, other: SeriesCandidate, keys: ReadonlySet<string>, factors: readonly RecipeFactor[]): RecipeChange[] {
  return diffRecipe(reference, other, factors).filter((change) => !keys.has(change.key));
}

const codeOf = (candidate: SeriesCandidate): string => candidate.code ?? `build ${candidate.buildId}`;

/**
 * Picks a series: builds that differ from one another only in the series variable.
 * Method: the series variable is named by the keys the recipe diff uses (a factor key, or
 * `conditions.temperatureC`, `conditions.backPressureKPa`, …; give both when the project records
 * cell temperature as a factor and as a test condition). Each build's value is read from the first
 * of those keys it holds. In 'auto' mode every build is tried as the reference; the one whose
 * "differs only in the series variable" group is largest (then covers most distinct values, then
 * comes first) wins, and its group is the series. In 'as-given' mode every build with a value is
 * kept. Either way each build left out or kept with other differences is listed with those
 * differences (diffRecipe, numbers equal within a relative 1e-9). Builds without a numeric value
 * of the series variable are always left out and listed.
 * Reference: none needed (bookkeeping on the recipe diff).
 * Cost: O(n²·f) for n builds and f factors and conditions (every pair diffed in 'auto' mode).
 * @throws RangeError when candidates or seriesKeys are empty or malformed, build ids repeat, or the
 *   reference build is not among the candidates.
 * @example pickSeries(builds, ['conditions.temperatureC'], factors).members // e.g. [11, 12, 13]
 */
export function pickSeries(candidates: readonly SeriesCandidate[], seriesKeys: readonly string[], factors: readonly RecipeFactor[], options: PickSeriesOptions = {}): SeriesSelection {
  if (!Array.isArray(candidates) || candidates.length === 0) throw new RangeError('pickSeries: candidates must be a non-empty array of builds');
  if (!Array.isArray(seriesKeys) || seriesKeys.length === 0 || seriesKeys.some((key) => typeof key !== 'string' || key === '')) {
    throw new RangeError('pickSeries: seriesKeys must name at least one factor key or conditions.<key>');
  }
  if (!Array.isArray(factors)) throw new RangeError('pickSeries: factors must be an array');
  const mode = options.mode ?? 'auto';
  if (mode !== 'auto' && mode !== 'as-given') throw new RangeError(`pickSeries: mode must be 'auto' or 'as-given', got ${String(mode)}`);
  const ids = new Set<number>();
  candidates.forEach((candidate, index) => {
    if (candidate === null || typeof candidate !== 'object' || typeof candidate.factors !== 'object' || candidate.factors === null) {
      throw new RangeError(`pickSeries: candidate ${index} must be a build with a factors record`);
    }
    if (!Number.isFinite(candidate.buildId)) throw new RangeError(`pickSeries: candidate ${index} has no numeric buildId`);
    if (ids.has(candidate.buildId)) throw new RangeError(`pickSeries: build ${candidate.buildId} is listed twice`);
    ids.add(candidate.buildId);
  });
  if (options.referenceBuildId !== undefined && !ids.has(options.referenceBuildId)) {
    throw new RangeError(`pickSeries: the reference build ${options.referenceBuildId} is not among the candidates`);
  }
  const keys = new Set(seriesKeys);
  const variableText = seriesKeys.join(' / ');
  const mismatches: SeriesMismatch[] = [];
  const withValue: SeriesCandidate[] = [];
  for (const candidate of candidates) {
    if (seriesValue(candidate, seriesKeys) === null) {
      mismatches.push({ buildId: candidate.buildId, code: codeOf(candidate), differences: [], reason: `${codeOf(candidate)} has no recorded value of ${variableText}` });
    } else {
      withValue.push(candidate);
    }
  }
  if (withValue.length === 0) {
    const first = candidates[0];
    return { members: [], values: [], referenceBuildId: options.referenceBuildId ?? first.buildId, mismatches, distinctValues: 0, seriesKeys: [...seriesKeys] };
  }

  let reference: SeriesCandidate;
  if (options.referenceBuildId !== undefined) {
    const chosen = withValue.find((candidate) => candidate.buildId === options.referenceBuildId);
    if (chosen === undefined) throw new RangeError(`pickSeries: the reference build ${options.referenceBuildId} has no value of ${variableText}`);
    reference = chosen;
  } else if (mode === 'as-given') {
    reference = withValue[0];
  } else {
    let best = withValue[0];
    let bestSize = -1;
    let bestDistinct = -1;
    for (const candidate of withValue) {
      const group = withValue.filter((other) => other === candidate || otherDifferences(candidate, other, keys, factors).length === 0);
      const distinct = new Set(group.map((member) => seriesValue(member, seriesKeys))).size;
      if (group.length > bestSize || (group.length === bestSize && distinct > bestDistinct)) {
        best = candidate;
        bestSize = group.length;
        bestDistinct = distinct;
      }
    }
    reference = best;
  }

  const members: number[] = [];
  const values: { buildId: number; value: number }[] = [];
  for (const candidate of withValue) {
    const differences = candidate === reference ? [] : otherDifferences(reference, candidate, keys, factors);
    if (differences.length > 0) {
      mismatches.push({
        buildId: candidate.buildId,
        code: codeOf(candidate),
        differences,
        reason: `${codeOf(candidate)} differs from ${codeOf(reference)} in ${describeChanges(differences)}${mode === 'as-given' ? ' (kept: picked by hand)' : ''}`,
      });
      if (mode === 'auto') continue;
    }
    members.push(candidate.buildId);
    values.push({ buildId: candidate.buildId, value: seriesValue(candidate, seriesKeys) as number });
  }
  // mismatches in the order the candidates were given
  const order = new Map(candidates.map((candidate, index) => [candidate.buildId, index]));
  mismatches.sort((a, b) => (order.get(a.buildId) as number) - (order.get(b.buildId) as number));
  return {
    members,
    values,
    referenceBuildId: reference.buildId,
    mismatches,
    distinctValues: new Set(values.map((entry) => entry.value)).size,
    seriesKeys: [...seriesKeys],
  };
}

// What changed from a parent build to its child, worked out from the recorded recipe (factor
// values, loading, catalyst lot, lab, test conditions) so a change note can be checked against it.

export interface RecipeFactor {
  key: string;
  label: string;
  unit: string;
}

export interface RecipeSnapshot {
  factors: Record<string, number | string>;
  loadingMgCm2?: number | null;
  metalLoadingMgCm2?: number | null;
  catalystLot?: string | null;
  labName?: string | null;
  testConditions?: Record<string, number | string | null | undefined> | null;
}

export interface RecipeChange {
  /** factor key, or one of loadingMgCm2, metalLoadingMgCm2, catalystLot, lab, or conditions.<key> */
  key: string;
  label: string;
  unit: string;
  from: number | string | null;
  to: number | string | null;
}

const CONDITION_LABELS: Record<string, { label: string; unit: string }> = {
  temperatureC: { label: 'test temperature', unit: '°C' },
  anodeGas: { label: 'anode gas', unit: '' },
  cathodeGas: { label: 'cathode gas', unit: '' },
  backPressureKPa: { label: 'back-pressure', unit: 'kPa' },
  anodeStoich: { label: 'anode stoichiometry', unit: '' },
  cathodeStoich: { label: 'cathode stoichiometry', unit: '' },
  h2CrossoverMAcm2: { label: 'H₂ crossover', unit: 'mA/cm²' },
};

const blank = (value: unknown): value is null | undefined | '' => value === null || value === undefined || value === '';

function same(a: unknown, b: unknown): boolean {
  if (blank(a) && blank(b)) return true;
  if (typeof a === 'number' && typeof b === 'number') {
    // recipes are typed in by hand: 0.1 + 0.2 style noise must not read as a change
    return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
  }
  return a === b;
}

const norm = (value: unknown): number | string | null => (blank(value) ? null : (value as number | string));

/**
 * The list of recipe differences between a parent and a child build, in a fixed order: the
 * project's factors (in definition order, then any unknown keys alphabetically), catalyst
 * loading, metal loading, catalyst lot, lab, then test conditions.
 * Numbers equal to within a relative 1e-9 count as unchanged; empty and missing count as equal.
 * A test-condition change with the same old and new values as a factor change already listed
 * (cell temperature kept both as a factor and as a test condition) is not repeated.
 * Reference: none needed (bookkeeping); wording follows the change-note habit "binder 20 → 30 wt %".
 * Cost: O(number of factors + conditions).
 * @throws TypeError when a snapshot has no factors record.
 * @example diffRecipe({ factors: { binder: 20 } }, { factors: { binder: 30 } }, [{ key: 'binder', label: 'binder', unit: 'wt %' }])
 *   // [{ key: 'binder', label: 'binder', unit: 'wt %', from: 20, to: 30 }]
 */
export function diffRecipe(parent: RecipeSnapshot, child: RecipeSnapshot, factors: readonly RecipeFactor[]): RecipeChange[] {
  if (!parent || typeof parent.factors !== 'object' || parent.factors === null) throw new TypeError('diffRecipe: parent.factors must be a record, got none');
  if (!child || typeof child.factors !== 'object' || child.factors === null) throw new TypeError('diffRecipe: child.factors must be a record, got none');
  const changes: RecipeChange[] = [];
  const known = new Set<string>();
  for (const factor of factors) {
    known.add(factor.key);
    const from = parent.factors[factor.key];
    const to = child.factors[factor.key];
    if (!same(from, to)) changes.push({ key: factor.key, label: factor.label, unit: factor.unit, from: norm(from), to: norm(to) });
  }
  const extraKeys = [...new Set([...Object.keys(parent.factors), ...Object.keys(child.factors)])].filter((k) => !known.has(k)).sort();
  for (const key of extraKeys) {
    const from = parent.factors[key];
    const to = child.factors[key];
    if (!same(from, to)) changes.push({ key, label: key, unit: '', from: norm(from), to: norm(to) });
  }
  const fields: [keyof RecipeSnapshot, string, string, string][] = [
    ['loadingMgCm2', 'loadingMgCm2', 'catalyst loading', 'mg/cm²'],
    ['metalLoadingMgCm2', 'metalLoadingMgCm2', 'metal loading', 'mg/cm²'],
    ['catalystLot', 'catalystLot', 'catalyst lot', ''],
    ['labName', 'lab', 'lab', ''],
  ];
  for (const [field, key, label, unit] of fields) {
    const from = parent[field];
    const to = child[field];
    if (!same(from, to)) changes.push({ key, label, unit, from: norm(from), to: norm(to) });
  }
  const before = parent.testConditions ?? {};
  const after = child.testConditions ?? {};
  const conditionKeys = [...new Set([...Object.keys(CONDITION_LABELS), ...Object.keys(before), ...Object.keys(after)])];
  for (const key of conditionKeys) {
    const from = before[key];
    const to = after[key];
    if (same(from, to)) continue;
    // a test condition that is also a factor (cell temperature) is said once, as the factor
    if (changes.some((c) => !c.key.startsWith('conditions.') && same(c.from, norm(from)) && same(c.to, norm(to)))) continue;
    const info = CONDITION_LABELS[key] ?? { label: key, unit: '' };
    changes.push({ key: `conditions.${key}`, label: info.label, unit: info.unit, from: norm(from), to: norm(to) });
  }
  return changes;
}

// Which kind of change each waterfall step is: a change of how the cell was tested (temperature,
// pressure, gases, stoichiometry) or a change of the electrode itself (recipe, lot, loading, GDL),
// so a gain bought by running hotter is not read as a better electrode.

/** one recorded difference from the previous build (see diffRecipe): its key is a factor key,
 * loadingMgCm2, metalLoadingMgCm2, catalystLot, lab or conditions.<key> */
export interface StepChange {
  key: string;
}

export type ChangeClass = 'electrode' | 'test-conditions' | 'mixed' | 'unchanged';

export interface ClassifiedStep {
  /** value − previous value; null for the baseline */
  gain: number | null;
  /** the step's recorded differences from the previous build; null for the baseline */
  changes: readonly StepChange[] | null;
}

export interface StepClasses {
  /** one entry per step; null for the baseline */
  classes: (ChangeClass | null)[];
  /** Σ gains of the steps that changed the electrode only (and of unchanged replicate steps) */
  recipeOnlyTotal: number;
  /** Σ gains of the steps that changed a test condition only */
  testConditionTotal: number;
  /** Σ gains of the steps that changed both at once: neither total can claim them */
  mixedTotal: number;
}

/**
 * Whether one change is a test condition: a key under conditions.* (the curve's recorded test
 * conditions), or a factor the project marks as a test variable. The lab a build was tested in is
 * also a test-side change. Everything else (factors of the recipe, catalyst and metal loading,
 * catalyst lot) is an electrode change.
 */
export function isTestConditionChange(change: StepChange, testVariableKeys: ReadonlySet<string>): boolean {
  return change.key.startsWith('conditions.') || change.key === 'lab' || testVariableKeys.has(change.key);
}

/**
 * Class of each step of a waterfall and the totals split by class.
 * class = 'test-conditions' when every change is a test condition, 'electrode' when none is,
 * 'mixed' when both kinds changed, 'unchanged' when nothing recorded changed (a repeat build).
 * recipeOnlyTotal = Σ gain over 'electrode' and 'unchanged' steps; testConditionTotal over
 * 'test-conditions' steps; mixedTotal over 'mixed' steps, so the three add up to the overall total.
 * Reference: none needed (bookkeeping over the recipe diff).
 * Cost: O(total changes).
 * @throws RangeError when a step after the first has no gain or a non-finite gain.
 * @example classifySteps([{ gain: null, changes: null }, { gain: 0.02, changes: [{ key: 'conditions.temperatureC' }] }, { gain: 0.01, changes: [{ key: 'binder' }] }], new Set())
 *   // { classes: [null, 'test-conditions', 'electrode'], recipeOnlyTotal: 0.01, testConditionTotal: 0.02, mixedTotal: 0 }
 */
export function classifySteps(steps: readonly ClassifiedStep[], testVariableKeys: ReadonlySet<string>): StepClasses {
  const classes: (ChangeClass | null)[] = [];
  let recipeOnlyTotal = 0;
  let testConditionTotal = 0;
  let mixedTotal = 0;
  steps.forEach((step, position) => {
    if (position === 0) {
      classes.push(null);
      return;
    }
    if (step.gain === null || !Number.isFinite(step.gain)) {
      throw new RangeError(`classifySteps: step ${position + 1} needs a finite gain, got ${step.gain}`);
    }
    const changes = step.changes ?? [];
    const test = changes.filter((c) => isTestConditionChange(c, testVariableKeys)).length;
    const electrode = changes.length - test;
    const kind: ChangeClass = changes.length === 0 ? 'unchanged' : test === 0 ? 'electrode' : electrode === 0 ? 'test-conditions' : 'mixed';
    classes.push(kind);
    if (kind === 'test-conditions') testConditionTotal += step.gain;
    else if (kind === 'mixed') mixedTotal += step.gain;
    else recipeOnlyTotal += step.gain;
  });
  return { classes, recipeOnlyTotal, testConditionTotal, mixedTotal };
}

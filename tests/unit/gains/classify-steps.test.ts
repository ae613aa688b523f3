import { describe, expect, it } from 'vitest';
import { classifySteps, isTestConditionChange } from '../../../shared/gains';

describe('classifySteps: electrode changes apart from test-condition changes', () => {
  it('a four-step chain: binder, then hotter cell, then lot plus back-pressure, then a repeat', () => {
    // Chain worked by hand: gains +0.012 V (binder 20 → 30 wt %), +0.020 V (cell 160 → 180 °C),
    // −0.004 V (new lot and back-pressure 0 → 50 kPa together), +0.001 V (repeat build, nothing changed).
    // Overall 0.029 V = recipe-only 0.012 + 0.001 = 0.013 V, test conditions 0.020 V, mixed −0.004 V (derived by hand).
    const result = classifySteps(
      [
        { gain: null, changes: null },
        { gain: 0.012, changes: [{ key: 'binder' }] },
        { gain: 0.02, changes: [{ key: 'conditions.temperatureC' }] },
        { gain: -0.004, changes: [{ key: 'catalystLot' }, { key: 'conditions.backPressureKPa' }] },
        { gain: 0.001, changes: [] },
      ],
      new Set(),
    );
    expect(result.classes).toEqual([null, 'electrode', 'test-conditions', 'mixed', 'unchanged']);
    expect(result.recipeOnlyTotal).toBeCloseTo(0.013, 12);
    expect(result.testConditionTotal).toBeCloseTo(0.02, 12);
    expect(result.mixedTotal).toBeCloseTo(-0.004, 12);
    expect(result.recipeOnlyTotal + result.testConditionTotal + result.mixedTotal).toBeCloseTo(0.029, 12);
  });

  it('a factor the project marks as a test variable counts as a test condition', () => {
    // cellTemp is a design factor but a condition of the test; gdl is part of the electrode (derived by hand)
    const tests = new Set(['cellTemp']);
    const result = classifySteps(
      [
        { gain: null, changes: null },
        { gain: 0.015, changes: [{ key: 'cellTemp' }] },
        { gain: 0.006, changes: [{ key: 'gdl' }, { key: 'loadingMgCm2' }] },
        { gain: -0.002, changes: [{ key: 'cellTemp' }, { key: 'lab' }] },
      ],
      tests,
    );
    expect(result.classes).toEqual([null, 'test-conditions', 'electrode', 'test-conditions']);
    expect(result.recipeOnlyTotal).toBeCloseTo(0.006, 12);
    expect(result.testConditionTotal).toBeCloseTo(0.013, 12);
    expect(result.mixedTotal).toBe(0);
    expect(isTestConditionChange({ key: 'cellTemp' }, new Set())).toBe(false);
    expect(isTestConditionChange({ key: 'conditions.cathodeGas' }, new Set())).toBe(true);
    expect(isTestConditionChange({ key: 'metalLoadingMgCm2' }, tests)).toBe(false);
  });

  it('only the baseline: nothing to split', () => {
    expect(classifySteps([{ gain: null, changes: null }], new Set())).toEqual({ classes: [null], recipeOnlyTotal: 0, testConditionTotal: 0, mixedTotal: 0 });
  });

  it('a later step without a gain is refused, naming its position', () => {
    expect(() => classifySteps([{ gain: null, changes: null }, { gain: null, changes: [] }], new Set())).toThrow(/step 2/);
  });
});

import { describe, it, expect } from 'vitest';
import { individualDesirability, overallDesirability, paretoSet } from '../../../shared/doe/model';

describe('individualDesirability (Derringer & Suich 1980)', () => {
  it('maximize: 0 below low, ((y − L)/(T − L))^s between, 1 above target', () => {
    const goal = { goal: 'maximize' as const, low: 0.6, target: 0.7 };
    // derived by hand: (0.65 − 0.6)/(0.7 − 0.6) = 0.5
    expect(individualDesirability(0.65, goal)).toBeCloseTo(0.5, 12);
    // derived by hand: 0.5² = 0.25 with s = 2
    expect(individualDesirability(0.65, { ...goal, weight: 2 })).toBeCloseTo(0.25, 12);
    expect(individualDesirability(0.55, goal)).toBe(0);
    expect(individualDesirability(0.75, goal)).toBe(1);
  });

  it('minimize: 1 below target, ((U − y)/(U − T))^s between, 0 above high', () => {
    const goal = { goal: 'minimize' as const, target: 1, high: 3 };
    // derived by hand: (3 − 2)/(3 − 1) = 0.5; with s = 0.5: √0.5
    expect(individualDesirability(2, goal)).toBeCloseTo(0.5, 12);
    expect(individualDesirability(2, { ...goal, weight: 0.5 })).toBeCloseTo(Math.SQRT1_2, 12);
    expect(individualDesirability(0.5, goal)).toBe(1);
    expect(individualDesirability(3.5, goal)).toBe(0);
  });

  it('target: two-sided with separate shapes', () => {
    const goal = { goal: 'target' as const, low: 0, target: 10, high: 20, weightHigh: 2 };
    // derived by hand: (5 − 0)/(10 − 0) = 0.5; (20 − 15)/(20 − 10) = 0.5, squared = 0.25
    expect(individualDesirability(5, goal)).toBeCloseTo(0.5, 12);
    expect(individualDesirability(15, goal)).toBeCloseTo(0.25, 12);
    expect(individualDesirability(10, goal)).toBe(1);
    expect(individualDesirability(-1, goal)).toBe(0);
    expect(individualDesirability(21, goal)).toBe(0);
  });

  it('throws on unordered limits, bad weights and unknown goals', () => {
    expect(() => individualDesirability(1, { goal: 'maximize', low: 2, target: 1 })).toThrow(/low must be below target/);
    expect(() => individualDesirability(1, { goal: 'minimize', target: 2, high: 2 })).toThrow(/target must be below high/);
    expect(() => individualDesirability(1, { goal: 'target', low: 0, target: 5, high: 4 })).toThrow(/low < target < high/);
    expect(() => individualDesirability(1, { goal: 'maximize', low: 0, target: 2, weight: 0 })).toThrow(/positive/);
    expect(() => individualDesirability(Number.NaN, { goal: 'maximize', low: 0, target: 2 })).toThrow(/finite/);
    expect(() => individualDesirability(1, { goal: 'best' } as never)).toThrow(/goal must be/);
  });
});

describe('overallDesirability', () => {
  it('is the (weighted) geometric mean, 0 when any response is unacceptable', () => {
    // derived by hand: √(0.5·0.8) = √0.4
    expect(overallDesirability([0.5, 0.8])).toBeCloseTo(Math.sqrt(0.4), 12);
    // derived by hand: (0.5¹·0.8³)^(1/4) = 0.256^0.25
    expect(overallDesirability([0.5, 0.8], [1, 3])).toBeCloseTo(0.256 ** 0.25, 12);
    expect(overallDesirability([0.9, 0, 1])).toBe(0);
    expect(overallDesirability([1, 1])).toBe(1);
  });

  it('throws on empty input, values outside [0, 1] and mismatched importances', () => {
    expect(() => overallDesirability([])).toThrow(/at least one/);
    expect(() => overallDesirability([1.2])).toThrow(/\[0, 1\]/);
    expect(() => overallDesirability([0.5], [1, 2])).toThrow(/one entry per/);
    expect(() => overallDesirability([0.5], [-1])).toThrow(/positive/);
  });
});

describe('paretoSet', () => {
  // invented builds: V at 0.2 A/cm² (maximize) and Pt loading in mg/cm² (minimize)
  const builds = [
    { code: 'B-001', values: { vAtRef: 0.62, loading: 1.0 } },
    { code: 'B-002', values: { vAtRef: 0.65, loading: 1.5 } },
    { code: 'B-003', values: { vAtRef: 0.6, loading: 1.2 } }, // dominated by B-001
    { code: 'B-004', values: { vAtRef: 0.65, loading: 1.6 } }, // dominated by B-002 (tie on V)
    { code: 'B-005', values: { vAtRef: 0.58, loading: 0.6 } },
    { code: 'B-006', values: { vAtRef: null, loading: 0.1 } }, // not comparable: left out
  ];

  it('keeps only non-dominated builds, in input order', () => {
    // derived by hand from the table above
    const kept = paretoSet(builds, { vAtRef: 'maximize', loading: 'minimize' }).map((b) => b.code);
    expect(kept).toEqual(['B-001', 'B-002', 'B-005']);
  });

  it('handles a target goal as closeness to the target', () => {
    // derived by hand: loading closest to 1.2 is B-003 (0), then B-001/B-002 (0.2/0.3)
    const kept = paretoSet(builds, { loading: { target: 1.2 } }).map((b) => b.code);
    expect(kept).toEqual(['B-003']);
  });

  it('throws without goals or with an unknown goal', () => {
    expect(() => paretoSet(builds, {})).toThrow(/at least one/);
    expect(() => paretoSet(builds, { vAtRef: 'best' as never })).toThrow(/goal must be/);
  });
});

import { describe, it, expect } from 'vitest';
import { kaplanMeier, survivalAt, survivalUnits } from '../../../shared/durability/survival';

// Invented accelerated tests: onsets at 300, 500, 500, 900 h; logs ended without onset at 400, 500, 1200 h.
const UNITS = [
  { buildId: 1, hours: 300, failed: true },
  { buildId: 2, hours: 400, failed: false },
  { buildId: 3, hours: 500, failed: true },
  { buildId: 4, hours: 500, failed: true },
  { buildId: 5, hours: 500, failed: false },
  { buildId: 6, hours: 900, failed: true },
  { buildId: 7, hours: 1200, failed: false },
];

describe('kaplanMeier', () => {
  const curve = kaplanMeier(UNITS);

  it('matches scipy.stats.ecdf on censored data (tests/reference/survival_reference.py)', () => {
    expect(curve.steps.map((step) => step.hours)).toEqual([300, 500, 900]);
    const expected = [
      [0.857142857142857, 0.334053879292222, 0.978561058526175],
      [0.514285714285714, 0.117759583916573, 0.813248607575758],
      [0.257142857142857, 0.0125842620704628, 0.656015963204495],
    ]; // scipy: S, log-log 95 % low, high
    curve.steps.forEach((step, index) => {
      expect(step.survival).toBeCloseTo(expected[index][0], 12);
      expect(step.low!).toBeCloseTo(expected[index][1], 8);
      expect(step.high!).toBeCloseTo(expected[index][2], 8);
    });
  });

  it('counts a log censored at a failure time as at risk there (hand-worked: 5 at risk at 500 h)', () => {
    expect(curve.steps[1].atRisk).toBe(5);
    expect(curve.steps[1].failures).toBe(2);
    expect(curve.steps[1].censoredHere).toBe(1);
    expect(curve.medianHours).toBe(900); // first S ≤ 0.5
    expect(curve.failures).toBe(4);
    expect(curve.censored).toBe(3);
  });

  it('refuses malformed units', () => {
    expect(() => kaplanMeier([])).toThrow(/non-empty/);
    expect(() => kaplanMeier([{ buildId: 1, hours: -1, failed: true }])).toThrow(/build 1/);
    expect(() => kaplanMeier(UNITS, 1)).toThrow(/confidence/);
  });
});

describe('survivalAt and survivalUnits', () => {
  it('counts builds that reached N hours, failed before, or ended before', () => {
    const at = survivalAt(UNITS, 600);
    expect(at.reached).toBe(2); // hand-worked: 900 (failed later) and 1200
    expect(at.failedBefore).toBe(3);
    expect(at.censoredBefore).toBe(2);
    expect(at.survival).toBeCloseTo(0.514285714285714, 12); // scipy: S just after 500 h
    expect(at.summary).toBe('2 of 7 builds reached 600 h (3 failed before, 2 logs ended before)');
  });

  it('turns onset results into units, censoring logs without an onset at their end', () => {
    expect(survivalUnits([{ buildId: 7, onsetHours: null, hoursRun: 1500 }, { buildId: 8, onsetHours: 1100, hoursRun: 1500 }])).toEqual([
      { buildId: 7, hours: 1500, failed: false },
      { buildId: 8, hours: 1100, failed: true },
    ]);
  });
});

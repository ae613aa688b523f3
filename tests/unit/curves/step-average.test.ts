import { describe, it, expect } from 'vitest';
import { stepAverage } from '../../../shared/curves/index';
import type { CurveData } from '../../../shared/curves/index';

const curveOf = (j: number[], v: number[], hfr?: number[]): CurveData => ({
  kind: 'polarization',
  j: Float64Array.from(j),
  v: Float64Array.from(v),
  ...(hfr ? { hfr: Float64Array.from(hfr) } : {}),
});

describe('stepAverage', () => {
  it('groups readings within 2 % or 1 mA/cm² and averages them', () => {
    const result = stepAverage(
      curveOf([0, 0.0004, 0.1, 0.101, 0.099, 0.2, 0.203, 0.198], [0.95, 0.949, 0.72, 0.719, 0.721, 0.65, 0.648, 0.652], [0.2, 0.2, 0.2, 0.2, 0.2, 0.21, 0.21, 0.21]),
    );
    expect(result.steps.length).toBe(3); // three current levels typed above
    expect(result.steps.map((step) => step.readings)).toEqual([2, 3, 3]); // typed above: 2 readings near 0, 3 near 0.1, 3 near 0.2
    expect(result.steps[1].j).toBeCloseTo(0.1, 12); // derived by hand: (0.1 + 0.101 + 0.099) / 3
    expect(result.steps[1].v).toBeCloseTo(0.72, 12); // derived by hand: (0.72 + 0.719 + 0.721) / 3
    expect(result.steps[1].vSd).toBeCloseTo(0.001, 12); // derived by hand: deviations −0,−0.001,+0.001 → √(2e-6/2)
    expect(result.steps[2].hfr).toBeCloseTo(0.21, 12); // typed above
    expect(result.steps[2].vIrFree).toBeCloseTo((0.65 + 0.2 * 0.21 + 0.648 + 0.203 * 0.21 + 0.652 + 0.198 * 0.21) / 3, 12); // derived by hand: mean of V + j·HFR
    expect(result.readingsPerStep).toEqual({ min: 2, median: 3, max: 3 }); // derived by hand from the counts 2, 3, 3
  });
  it('splits up and down sweeps, sharing the turning step', () => {
    const result = stepAverage(curveOf([0, 0.1, 0.2, 0.3, 0.2, 0.1, 0], [0.95, 0.72, 0.65, 0.6, 0.655, 0.725, 0.95]));
    expect(result.sweeps).toEqual([
      { direction: 'up', steps: [0, 1, 2, 3] },
      { direction: 'down', steps: [3, 4, 5, 6] },
    ]);
  });
  it('flags a voltage collapse and a current turning back while V falls, then keeps the down sweep', () => {
    const result = stepAverage(curveOf([0, 0.5, 1.0, 1.2, 1.1, 1.0, 0.9, 0.5], [0.95, 0.6, 0.4, 0.3, 0.2, 0.1, 0.02, 0.62]));
    expect(result.pastLimitSteps).toEqual([4, 5, 6]); // j 1.1, 1.0 (turned back, V lower) and 0.9 at 0.02 V (collapse)
    expect(result.steps[6].pastLimitReason).toMatch(/collapsed/);
    expect(result.steps[4].pastLimitReason).toMatch(/turned back/);
    expect(result.sweeps.map((sweep) => sweep.direction)).toEqual(['up', 'down']);
    expect(result.sweeps[1].steps).toEqual([3, 7]); // derived by hand: turning step 3 (1.2 A/cm²) then step 7 (0.5 A/cm², V back up)
    expect(result.pastLimitReadings).toBe(3); // one reading in each of the three flagged steps
    expect(result.notes[0]).toMatch(/3 steps \(3 readings\) past the limiting current/);
  });
  it('a single reading is one flat sweep', () => {
    const result = stepAverage(curveOf([0], [0.95]));
    expect(result.sweeps).toEqual([{ direction: 'flat', steps: [0] }]); // one step only
  });
  it('throws on malformed curves', () => {
    expect(() => stepAverage(curveOf([], []))).toThrow(/no readings/);
    expect(() => stepAverage(curveOf([0, 1], [0.9]))).toThrow(/v has 1/);
    expect(() => stepAverage({ kind: 'polarization', j: [0] as never, v: [0.9] as never })).toThrow(RangeError);
    expect(() => stepAverage(curveOf([0], [0.9]), { relativeTolerance: -1 })).toThrow(RangeError);
  });
});

import { describe, it, expect } from 'vitest';
import { stepAverage, generatePolarizationCurve, semiEmpiricalVoltage } from '../../../shared/curves/index';
import { FIXTURE_MODEL } from '../../fixtures/curves/model-parameters';
import type { CurveData } from '../../../shared/curves/index';

const curveOf = (j: number[], v: number[], hfr?: number[]): CurveData => ({
  kind: 'polarization',
  j: Float64Array.from(j),
  v: Float64Array.from(v),
  ...(hfr ? { hfr: Float64Array.from(hfr) } : {}),
});

describe('stepAverage', () => {
  it('groups readings by set point (sorted neighbours within 1 % + 10 µA/cm²) and averages them', () => {
    const result = stepAverage(
      curveOf([0, 0.000005, 0.1, 0.1005, 0.0995, 0.2, 0.201, 0.199], [0.95, 0.949, 0.72, 0.719, 0.721, 0.65, 0.648, 0.652], [0.2, 0.2, 0.2, 0.2, 0.2, 0.21, 0.21, 0.21]),
    );
    expect(result.steps.length).toBe(3); // three current levels typed above
    expect(result.openCircuitStep).toBe(2); // the zero-current set point, listed after the loaded steps
    expect(result.steps[2].openCircuit).toBe(true);
    expect(result.steps.map((step) => step.readings)).toEqual([3, 3, 2]); // typed above: 3 near 0.1, 3 near 0.2, 2 at 0
    expect(result.steps[0].j).toBeCloseTo(0.1, 12); // derived by hand: (0.1 + 0.1005 + 0.0995) / 3
    expect(result.steps[0].v).toBeCloseTo(0.72, 12); // derived by hand: (0.72 + 0.719 + 0.721) / 3
    expect(result.steps[0].vSd).toBeCloseTo(0.001, 12); // derived by hand: deviations −0,−0.001,+0.001 → √(2e-6/2)
    expect(result.steps[1].hfr).toBeCloseTo(0.21, 12); // typed above
    expect(result.steps[1].vIrFree).toBeCloseTo((0.65 + 0.2 * 0.21 + 0.648 + 0.201 * 0.21 + 0.652 + 0.199 * 0.21) / 3, 12); // derived by hand: mean of V + j·HFR
    expect(result.readingsPerStep).toEqual({ min: 2, median: 3, max: 3 }); // derived by hand from the counts 3, 3, 2
    expect(result.loadedSteps).toEqual([0, 1]);
  });
  it('keeps 0, 1, 2 and 3 mA/cm² apart (tolerance relative to the current, not a fixed 1 mA/cm²)', () => {
    const j = [0, 0, 0.001, 0.001, 0.002, 0.002, 0.003, 0.003, 0.005, 0.005];
    const result = stepAverage(curveOf(j, j.map((value) => 0.95 - value * 20)));
    expect(result.steps.length).toBe(5); // five set points typed above
    expect(result.loadedSteps.map((index) => result.steps[index].setPoint)).toEqual([0.001, 0.002, 0.003, 0.005]); // typed above
    expect(result.steps[result.openCircuitStep as number].readings).toBe(2); // the two zero-current readings only
  });
  it('splits up and down sweeps, sharing the turning step; open circuit belongs to no sweep', () => {
    const result = stepAverage(curveOf([0, 0.1, 0.2, 0.3, 0.2, 0.1, 0], [0.95, 0.72, 0.65, 0.6, 0.655, 0.725, 0.95]));
    expect(result.sweeps).toEqual([
      { direction: 'up', steps: [0, 1, 2] },
      { direction: 'down', steps: [2, 3, 4] },
    ]); // derived by hand: loaded steps 0.1, 0.2, 0.3 up, then 0.2, 0.1 down; open circuit after them
    expect(result.sweepsKeptApart).toBe(true);
    expect(result.openCircuitStep).toBe(5);
    expect(result.steps[5].dwells).toBe(2); // open circuit at the start and at the end, merged
  });
  it('flags a voltage collapse and a current turning back while V falls; a two-step return is not a sweep', () => {
    const result = stepAverage(curveOf([0, 0.5, 1.0, 1.2, 1.1, 1.0, 0.9, 0.5], [0.95, 0.6, 0.4, 0.3, 0.2, 0.1, 0.02, 0.62]));
    // derived by hand: 1.1 and 1.0 A/cm² come after 1.2 at lower voltage (turned back), 0.9 at 0.02 V collapsed
    expect(result.pastLimitSteps.map((index) => result.steps[index].j)).toEqual([1.1, 1.0, 0.9]);
    expect(result.steps[result.pastLimitSteps[2]].pastLimitReason).toMatch(/collapsed/);
    expect(result.steps[result.pastLimitSteps[0]].pastLimitReason).toMatch(/turned back/);
    // 1.2 → 0.5 A/cm² is a return of two steps, not a sweep: one up sweep, and the two visits of 0.5 averaged
    expect(result.sweeps.map((sweep) => sweep.direction)).toEqual(['up']);
    expect(result.steps[0].j).toBe(0.5);
    expect(result.steps[0].v).toBeCloseTo(0.61, 12); // derived by hand: (0.6 + 0.62) / 2
    expect(result.pastLimitReadings).toBe(3); // one reading in each of the three flagged steps
    expect(result.notes.join('; ')).toMatch(/3 steps \(3 readings\) past the limiting current/);
  });
  it('a single reading: no loaded step, no sweep', () => {
    const result = stepAverage(curveOf([0], [0.95]));
    expect(result.sweeps).toEqual([]); // one open-circuit reading only
    expect(result.openCircuitStep).toBe(0);
    expect(result.loadedSteps).toEqual([]);
  });
  it('a row order that does not read as sweeps → steps sorted by current, said in the method', () => {
    const j = [0.3, 0.05, 0.6, 0.1, 0.4, 0.02, 0.2, 0.5];
    const result = stepAverage(curveOf(j, j.map((value) => 0.9 - 0.4 * value)));
    expect(result.order).toBe('sorted');
    expect(result.sweeps).toEqual([]);
    expect(result.loadedSteps.map((index) => result.steps[index].j)).toEqual([0.02, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6]); // typed above, sorted
    expect(result.method).toMatch(/sorted by current/);
  });
  it('averages only the last half of a dwell that shows a transient', () => {
    // one 10-reading dwell at 0.2 A/cm² with a 15 mV undershoot decaying by e each reading (typed here)
    const v = Array.from({ length: 10 }, (_, k) => 0.65 - 0.015 * Math.exp(-k));
    const result = stepAverage(curveOf([0.1, 0.1, 0.1, ...Array(10).fill(0.2), 0.3, 0.3, 0.3], [0.7, 0.7, 0.7, ...v, 0.6, 0.6, 0.6]));
    const step = result.steps.find((candidate) => Math.abs(candidate.j - 0.2) < 1e-12)!;
    expect(step.transientDwells).toBe(1);
    expect(step.readings).toBe(5);
    // derived by hand: mean of the last five readings, 0.65 − 0.015·(e⁻⁵ + … + e⁻⁹)/5
    expect(step.v).toBeCloseTo(0.65 - (0.015 * (Math.exp(-5) + Math.exp(-6) + Math.exp(-7) + Math.exp(-8) + Math.exp(-9))) / 5, 12);
    expect(result.steps.find((candidate) => Math.abs(candidate.j - 0.1) < 1e-12)!.transientDwells).toBe(0); // flat dwells averaged whole
  });
  it('skips missing and zero HFR readings; uses a file iR-free column when given', () => {
    const curve = curveOf([0, 0.1, 0.1, 0.1], [0.95, 0.7, 0.7, 0.7], [Number.NaN, 0, 0.2, 0.3]);
    curve.vIrFree = Float64Array.from([Number.NaN, 0.72, Number.NaN, 0.74]);
    const result = stepAverage(curve);
    expect(result.steps[0].hfr).toBeCloseTo(0.25, 12); // derived by hand: mean of 0.2 and 0.3 (0 and blank left out)
    expect(result.steps[0].vIrFree).toBeCloseTo(0.73, 12); // derived by hand: mean of the file's 0.72 and 0.74
    expect(result.hfrMissing).toBe(2); // the blank at open circuit and the 0
  });
  it('a noisy galvanostatic curve with dense steps stays under current control', () => {
    // FIXTURE_MODEL, 60 steps 10 mA/cm² apart, 10 readings each, 2 mV noise: neighbouring steps' voltages overlap
    const jPoints = Array.from({ length: 60 }, (_, index) => 0.01 * (index + 1));
    const result = stepAverage(generatePolarizationCurve(FIXTURE_MODEL, { jPoints, readingsPerStep: 10, noiseV: 0.002, seed: 5 }));
    expect(result.control).toBe('current');
    expect(result.steps.length).toBe(60); // the generator's 60 set points
    expect(result.sweeps.map((sweep) => sweep.direction)).toEqual(['up']);
  });
  it('a continuous current ramp (every reading its own current) reads as one sweep', () => {
    const j = Array.from({ length: 600 }, (_, index) => 0.001 + index * 0.001);
    const result = stepAverage(curveOf(j, j.map((value) => semiEmpiricalVoltage(FIXTURE_MODEL, value))));
    expect(result.order).toBe('sweeps');
    expect(result.sweeps.length).toBe(1);
    expect(result.steps.length).toBeGreaterThan(100); // pieces no wider than 1 % + 10 µA/cm² of the current
  });
  it('throws on malformed curves', () => {
    expect(() => stepAverage(curveOf([], []))).toThrow(/no readings/);
    expect(() => stepAverage(curveOf([0, 1], [0.9]))).toThrow(/v has 1/);
    expect(() => stepAverage({ kind: 'polarization', j: [0] as never, v: [0.9] as never })).toThrow(RangeError);
    expect(() => stepAverage(curveOf([0], [0.9]), { relativeTolerance: -1 })).toThrow(RangeError);
  });
});

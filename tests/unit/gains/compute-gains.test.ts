import { describe, it, expect } from 'vitest';
import { computeGains, pooledReplicateSd, welchInterval } from '../../../shared/gains';
import { tQuantile } from '../../../shared/stats/distributions';

// Invented chain of builds (V at 0.2 A/cm², V) for a PGM-free cathode campaign.
const chain = [
  { buildId: 11, code: 'B-011', changeNote: null, values: [0.58] },
  { buildId: 14, code: 'B-014', changeNote: 'activation 900 → 950 °C', values: [0.6] },
  { buildId: 17, code: 'B-017', changeNote: 'PTFE 20 → 30 wt %', values: [0.603] },
  { buildId: 21, code: 'B-021', changeNote: 'GDL type A → B', values: [0.625] },
];

describe('computeGains with single builds and a pooled replicate SD', () => {
  const result = computeGains({ steps: chain, pooled: { sd: 0.005, df: 10 } });

  it('reports the baseline and no gain for it', () => {
    expect(result.baseline).toEqual({ buildId: 11, code: 'B-011', value: 0.58 }); // input data
    expect(result.steps[0].gain).toBeNull();
    expect(result.steps[0].withinNoise).toBeNull();
  });

  it('gives each step gain and makes the steps sum to the total exactly', () => {
    expect(result.steps[1].gain).toBeCloseTo(0.02, 12); // derived by hand: 0.600 − 0.580
    expect(result.steps[2].gain).toBeCloseTo(0.003, 12); // derived by hand: 0.603 − 0.600
    expect(result.steps[3].gain).toBeCloseTo(0.022, 12); // derived by hand: 0.625 − 0.603
    let sum = 0;
    for (const step of result.steps) sum += step.gain ?? 0;
    expect(result.total.gain).toBe(sum); // telescoping: the total is the sum of the bars
    expect(result.total.gain).toBeCloseTo(0.045, 12); // derived by hand: 0.625 − 0.580
  });

  it('calls a 3 mV step with a 5 mV replicate SD within noise', () => {
    // derived by hand: half-width = t(0.975, 10)·0.005·√(1/1 + 1/1) = 2.228·0.007071 = 0.015755 V
    // (t from the NIST/SEMATECH e-Handbook table 1.3.6.7.2); 3 mV sits inside ±15.8 mV.
    const step = result.steps[2];
    expect(step.method).toBe('pooled');
    expect(step.high! - step.gain!).toBeCloseTo(2.228 * 0.005 * Math.SQRT2, 4); // derived by hand above
    expect(step.withinNoise).toBe(true); // common practice: a step smaller than the noise is not a gain
    expect(step.note).toBe('no replicates: pooled replicate SD (0.005, df 10) used');
  });

  it('calls a 20 mV step with a 5 mV replicate SD a real gain', () => {
    expect(result.steps[1].withinNoise).toBe(false); // derived by hand: 0.020 − 0.0158 > 0
    expect(result.total.withinNoise).toBe(false); // derived by hand: 0.045 − 0.0158 > 0
    expect(result.total.method).toBe('pooled');
  });
});

describe('computeGains with replicated builds', () => {
  const steps = [
    { buildId: 1, code: 'B-001', changeNote: null, values: [10, 12, 14] },
    { buildId: 2, code: 'B-002', changeNote: 'binder 15 → 25 wt %', values: [14, 18, 22, 26] },
  ];
  it('uses Welch when both builds have replicates', () => {
    const result = computeGains({ steps, pooled: null });
    const welch = welchInterval(steps[0].values, steps[1].values);
    expect(result.steps[1].method).toBe('welch');
    expect(result.steps[1].gain).toBeCloseTo(8, 12); // derived by hand: 20 − 12
    expect(result.steps[1].low).toBeCloseTo(0.204049, 5); // welch.test.ts worked example (hand + scipy)
    expect(result.steps[1].high).toBeCloseTo(welch.high, 12); // same formula
    expect(result.steps[1].sd).toBeCloseTo(Math.sqrt(80 / 3), 12); // derived by hand: s² = 80/3
    expect(result.steps[1].withinNoise).toBe(false); // derived by hand: 0.204 > 0
  });

  it('falls back on the replicated side when one side has no replicates and no pooled SD is given', () => {
    const result = computeGains({
      steps: [steps[0], { buildId: 3, code: 'B-003', changeNote: 'new lot', values: [13] }],
      pooled: null,
    });
    // derived by hand: s = 2 (B-001, df 2); half-width = t(0.975, 2)·2·√(1/3 + 1) = 4.303·2.3094 = 9.937
    // (t from the NIST/SEMATECH e-Handbook table 1.3.6.7.2)
    expect(result.steps[1].method).toBe('pooled');
    expect(result.steps[1].high! - result.steps[1].gain!).toBeCloseTo(tQuantile(0.975, 2) * 2 * Math.sqrt(4 / 3), 12);
    expect(result.steps[1].high! - result.steps[1].gain!).toBeCloseTo(9.937, 2); // derived by hand above
    expect(result.steps[1].withinNoise).toBe(true); // derived by hand: 1 ± 9.9 contains 0
  });
});

describe('computeGains without any noise estimate', () => {
  it('gives gains but no intervals', () => {
    const result = computeGains({ steps: chain, pooled: pooledReplicateSd(chain.map((step) => step.values)) });
    expect(result.steps[1].method).toBe('none');
    expect(result.steps[1].low).toBeNull();
    expect(result.steps[1].withinNoise).toBeNull();
    expect(result.total.low).toBeNull();
    expect(result.total.gain).toBeCloseTo(0.045, 12); // derived by hand: 0.625 − 0.580
  });

  it('handles a chain of one build', () => {
    const result = computeGains({ steps: [chain[0]], pooled: null });
    expect(result.total.gain).toBe(0); // derived by hand: no steps
    expect(result.steps).toHaveLength(1);
  });
});

describe('computeGains throws', () => {
  it('on no steps, an empty step, a non-finite value, a bad pooled SD or a bad confidence', () => {
    expect(() => computeGains({ steps: [], pooled: null })).toThrow(/at least 1 step/);
    expect(() => computeGains({ steps: [{ ...chain[0], values: [] }], pooled: null })).toThrow(/no values/);
    expect(() => computeGains({ steps: [{ ...chain[0], values: [NaN] }], pooled: null })).toThrow(/finite/);
    expect(() => computeGains({ steps: chain, pooled: { sd: -1, df: 3 } })).toThrow(/pooled SD/);
    expect(() => computeGains({ steps: chain, pooled: { sd: 0.005, df: 0 } })).toThrow(/pooled SD/);
    expect(() => computeGains({ steps: chain, pooled: null, confidence: 0 })).toThrow(/confidence/);
  });
});

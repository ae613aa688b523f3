import { describe, it, expect } from 'vitest';
import { detectFailureOnset, DEFAULT_ONSET_RULE } from '../../../shared/durability/onset';
import { demoAcceleratedTest } from '../../../shared/demo';

// Synthetic accelerated tests (invented): 1500 h at 0.6 A/cm², 15 µV/h stable loss, a known change
// point after which the loss rate is higher, break-in over the first 24 h (left out: startHours 48).
const RULE = { startHours: 48 };

describe('detectFailureOnset on logs with a known change point', () => {
  it('recovers the onset within 24 h and both rates (1 mV noise, lag-1 0.6 per 10 min)', () => {
    const curve = demoAcceleratedTest({ onsetHours: 1100, stableRateUvPerH: 15, failureRateUvPerH: 250, seed: 2 });
    const result = detectFailureOnset({ tHours: curve.tHours!, v: curve.v, j: curve.j }, RULE);
    expect(Math.abs(result.onsetHours! - 1100)).toBeLessThanOrEqual(24); // generator input; stated tolerance 24 h
    expect(result.onsetLowHours!).toBeLessThanOrEqual(result.onsetHours!);
    expect(result.onsetHighHours!).toBeGreaterThanOrEqual(result.onsetHours!);
    expect(Math.abs(result.stableRateUvPerH! - 15)).toBeLessThan(2); // generator input
    expect(Math.abs(result.failureRateUvPerH! - 250)).toBeLessThan(15); // generator input
    expect(result.verdict).toMatch(/^onset of rapid failure at 1\d{3} h/);
    expect(result.rule).toEqual({ ...DEFAULT_ONSET_RULE, startHours: 48 });
  });

  it('finds a milder rise (80 µV/h) within 24 h in each of 20 seeded logs', () => {
    for (let seed = 1; seed <= 20; seed++) {
      const curve = demoAcceleratedTest({ onsetHours: 900, failureRateUvPerH: 80, noiseMv: 2, seed });
      const result = detectFailureOnset({ tHours: curve.tHours!, v: curve.v }, RULE);
      expect(result.onsetHours, `seed ${seed}`).not.toBeNull();
      expect(Math.abs(result.onsetHours! - 900), `seed ${seed}`).toBeLessThanOrEqual(24); // generator input; measured max 8 h over 50 seeds
    }
  });

  it('finds it within 72 h under slowly drifting noise (lag-1 0.99 per 10 min, τ ≈ 17 h)', () => {
    for (let seed = 1; seed <= 10; seed++) {
      const curve = demoAcceleratedTest({ onsetHours: 900, failureRateUvPerH: 80, noiseMv: 2, noiseCorrelation: 0.99, seed });
      const result = detectFailureOnset({ tHours: curve.tHours!, v: curve.v }, RULE);
      expect(Math.abs(result.onsetHours! - 900), `seed ${seed}`).toBeLessThanOrEqual(72); // generator input; measured max 52 h over 50 seeds
    }
  });
});

describe('detectFailureOnset on logs without a change point', () => {
  it('reports no onset and the stable rate, and names the rejected candidate', () => {
    const curve = demoAcceleratedTest({ onsetHours: null, seed: 2 });
    const result = detectFailureOnset({ tHours: curve.tHours!, v: curve.v, j: curve.j }, RULE);
    expect(result.onsetHours).toBeNull();
    expect(result.failureRateUvPerH).toBeNull();
    expect(Math.abs(result.stableRateUvPerH! - 15)).toBeLessThan(2); // generator input
    expect(result.verdict).toMatch(/^no onset of rapid failure within 1500 h: best candidate at \d+ h rejected/);
    expect(result.hoursRun).toBeCloseTo(1500, 9);
  });

  it('raises no false alarm in 30 seeded logs, white-ish or drifting noise', () => {
    for (const noiseCorrelation of [0.6, 0.99]) {
      for (let seed = 1; seed <= 15; seed++) {
        const curve = demoAcceleratedTest({ onsetHours: null, noiseMv: 2, noiseCorrelation, seed });
        expect(detectFailureOnset({ tHours: curve.tHours!, v: curve.v }, RULE).onsetHours, `φ ${noiseCorrelation}, seed ${seed}`).toBeNull();
      }
    }
  });

  it('reads the break-in as no onset (a falling loss rate is not a failure)', () => {
    const curve = demoAcceleratedTest({ onsetHours: null, breakInHours: 200, breakInDropMv: 40, seed: 4 });
    expect(detectFailureOnset({ tHours: curve.tHours!, v: curve.v }).onsetHours).toBeNull();
  });
});

describe('detectFailureOnset rule and input', () => {
  it('follows an edited rule: a stricter ratio rejects a mild rise', () => {
    const curve = demoAcceleratedTest({ onsetHours: 900, failureRateUvPerH: 80, seed: 3 });
    const strict = detectFailureOnset({ tHours: curve.tHours!, v: curve.v }, { ...RULE, minRateRatio: 8 });
    expect(strict.onsetHours).toBeNull();
    expect(strict.verdict).toContain('rule: ≥ 8×');
    expect(strict.candidate!.hours).toBeGreaterThan(850); // the candidate is still the true change point
  });

  it('leaves out rows at another current', () => {
    const curve = demoAcceleratedTest({ onsetHours: 1100, seed: 2 });
    const j = Float64Array.from(curve.j);
    for (let i = 3000; i < 3060; i++) j[i] = 0.2; // a 10 h excursion to 0.2 A/cm²
    const result = detectFailureOnset({ tHours: curve.tHours!, v: curve.v, j }, RULE);
    expect(result.rowsLeftOut).toBe(60);
    expect(result.notes[0]).toContain('60 rows at another current');
  });

  it('takes the held current as the middle reading, blanks and other currents left out', () => {
    // derived by hand: finite j sorted = [0.2, 0.2, 0.6, 0.6, 0.6, 0.6, 0.6]; the middle (index 3) is 0.6 A/cm²,
    // so the two 0.2 readings and the blank one are left out
    const j = [0.6, 0.2, NaN, 0.6, 0.6, 0.2, 0.6, 0.6];
    const result = detectFailureOnset({ tHours: j.map((_, i) => i), v: j.map(() => 0.55), j }, { startHours: 0 });
    expect(result.rowsLeftOut).toBe(3);
    expect(result.notes[0]).toBe('3 rows at another current than the held 0.6 A/cm² left out');
  });

  it('says a log is too short to judge', () => {
    const result = detectFailureOnset({ tHours: [0, 1, 2], v: [0.5, 0.5, 0.5] });
    expect(result.onsetHours).toBeNull();
    expect(result.verdict).toContain('too short to judge');
  });

  it('refuses malformed logs and rules', () => {
    expect(() => detectFailureOnset({ tHours: [0, 1], v: [0.5] })).toThrow(/v has 1/);
    expect(() => detectFailureOnset({ tHours: [0, 2, 1], v: [0.5, 0.5, 0.5] })).toThrow(/backwards at reading 2/);
    expect(() => detectFailureOnset({ tHours: [0, 1], v: [0.5, 0.5] }, { alpha: 0 })).toThrow(/alpha/);
    expect(() => detectFailureOnset({ tHours: [0, 1], v: [0.5, 0.5] }, { blockHours: -1 })).toThrow(/blockHours/);
  });
});

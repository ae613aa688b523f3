import { describe, it, expect } from 'vitest';
import { holdMetrics, DEFAULT_HOLD_RULE } from '../../../shared/hold';
import { demoOcvHold } from '../../../shared/demo';

// Hand-worked hold: a reading every minute for 5 h, V = 0.95 − 0.002·t (2 mV/h) after 15 min of
// settling during which the voltage sits 30 mV low.
const t = Array.from({ length: 301 }, (_, k) => k / 60);
const v = t.map((hours, k) => 0.95 - 0.002 * hours - (k < 15 ? 0.03 : 0));

describe('holdMetrics', () => {
  it('skips the settling minutes and fits the decay exactly', () => {
    const result = holdMetrics({ tHours: t, v });
    expect(result.rule).toEqual(DEFAULT_HOLD_RULE);
    expect(result.readingsSettling).toBe(15); // minutes 0–14 are before t₀ + 15 min
    expect(result.holdDecay!).toBeCloseTo(2, 10); // hand-worked: 2 mV/h
    expect(result.window!.fromHours).toBeCloseTo(0.25, 12);
    // hand-worked: first 10 min of the window (15–25 min) average t = 20 min, last 10 min (290–300) average 295 min:
    // loss = 2 mV/h × (295 − 20)/60 h = 9.1667 mV
    expect(result.holdLoss!).toBeCloseTo((2 * 275) / 60, 9);
    // hand-worked: the first reading sits 30 mV low, so from it to the end edge: −30 + 2 × 295/60 = −20.17 mV (a net rise)
    expect(result.lossFromStartMv!).toBeCloseTo(-30 + (2 * 295) / 60, 9);
    expect(result.method).toContain('15 min after the start');
  });

  it('follows an edited settling rule', () => {
    const noSettling = holdMetrics({ tHours: t, v }, { settleMinutes: 0 });
    expect(noSettling.readingsSettling).toBe(0);
    expect(noSettling.holdDecay!).toBeLessThan(2); // hand-worked: 15 low readings at the start pull the line's start down, flattening it
  });

  it('recovers the demo hold’s decay inside its interval', () => {
    const curve = demoOcvHold({ decayMvPerH: 0.8, seed: 3 });
    const result = holdMetrics({ tHours: curve.tHours!, v: curve.v, j: curve.j });
    expect(result.decayLow!).toBeLessThanOrEqual(0.8); // generator input
    expect(result.decayHigh!).toBeGreaterThanOrEqual(0.8);
    expect(Math.abs(result.holdDecay! - 0.8)).toBeLessThan(0.02); // 6000 readings, 0.5 mV noise
    // generator input: 0.8 mV/h over 99.75 h less the edges ≈ 79.7 mV
    expect(Math.abs(result.holdLoss! - 0.8 * (100 - 10 / 60 - 0.25))).toBeLessThan(1);
    expect(result.notes).toEqual([]);
  });

  it('gives no decay for a hold shorter than the settling time, with the reason', () => {
    const result = holdMetrics({ tHours: [0, 0.05, 0.1, 0.15], v: [0.9, 0.91, 0.92, 0.93] });
    expect(result.holdDecay).toBeNull();
    expect(result.holdLoss).toBeNull();
    expect(result.notes[0]).toContain('after the 15 min settling time');
  });

  it('notes a curve that is not at open circuit', () => {
    const result = holdMetrics({ tHours: t, v, j: t.map(() => 0.2) });
    expect(result.notes[0]).toContain('not an open-circuit hold');
  });

  it('refuses malformed holds', () => {
    expect(() => holdMetrics({ tHours: [0, 1], v: [0.9, 0.9] })).toThrow(/at least 3/);
    expect(() => holdMetrics({ tHours: [0, 2, 1], v: [0.9, 0.9, 0.9] })).toThrow(/backwards at reading 2/);
    expect(() => holdMetrics({ tHours: [0, 1, 2], v: [0.9, NaN, 0.9] })).toThrow(/reading 1/);
    expect(() => holdMetrics({ tHours: t, v }, { edgeMinutes: 0 })).toThrow(/edgeMinutes/);
  });
});

import { describe, it, expect } from 'vitest';
import { detectInterruptions, generateSyntheticLog, type SyntheticLogOptions } from '../../../shared/durability';

// Invented logs: 300 h at 0.2 A/cm², a row every 5 min, 1 mV noise.
const base = { hours: 300, stepMinutes: 5, v0: 0.65, breakInHours: 0, breakInDropMv: 0, rateUvPerH: 8, noiseMv: 1, currentDensity: 0.2 };

function run(extra: Partial<SyntheticLogOptions>) {
  const log = generateSyntheticLog({ ...base, ...extra });
  return detectInterruptions(log.tHours!, log.v, log.j);
}

describe('detectInterruptions', () => {
  it('finds nothing in an uninterrupted log', () => {
    expect(run({ seed: 3 })).toEqual([]);
  });

  it('finds a logging gap without a voltage step', () => {
    const found = run({ gapAtHours: 120, gapHours: 6, seed: 4 });
    expect(found).toHaveLength(1);
    expect(found[0].kind).toBe('gap');
    expect(found[0].startHours).toBeCloseTo(120 - 5 / 60, 9); // generator: last row before the gap
    expect(found[0].endHours).toBeCloseTo(126, 9); // generator: first row after 6 h
    expect(found[0].detail).toMatch(/no data for 6\.08 h/);
  });

  it('calls a gap with a voltage step a restart', () => {
    const found = run({ restartAtHours: 150, restartShiftMv: 12, restartPauseHours: 1, seed: 5 });
    expect(found).toHaveLength(1);
    expect(found[0].kind).toBe('restart');
    // generator: +12 mV step; each side is the median of an hour (12 rows) of 1 mV noise, ≈ ±0.5 mV
    expect(Math.abs(found[0].voltageStep! * 1000 - 12)).toBeLessThan(1.5);
  });

  it('finds a restart whose pause is shorter than a gap', () => {
    // derived by hand: a 20 min pause < gap threshold 0.83 h, but rows are missing and V steps 10 mV
    const found = run({ restartAtHours: 150, restartShiftMv: 10, restartPauseHours: 1 / 3, seed: 11 });
    expect(found.map((event) => event.kind)).toEqual(['restart']);
  });

  it('ignores a small step across a gap (under 5× the local noise)', () => {
    const found = run({ restartAtHours: 150, restartShiftMv: 2, restartPauseHours: 1, seed: 6 });
    expect(found.map((event) => event.kind)).toEqual(['gap']); // derived by hand: 2 mV < 5 × 1 mV noise
  });

  it('does not take a short break in logging for a gap', () => {
    // derived by hand: 20 min < max(10 × 5 min, 0.5 h) = 0.83 h
    expect(run({ gapAtHours: 100, gapHours: 0.3, seed: 7 })).toEqual([]);
  });

  it('finds a sustained current change and its length', () => {
    const found = run({ currentChange: { atHours: 200, hours: 10, currentDensity: 0.6 }, seed: 8 });
    expect(found).toHaveLength(1);
    expect(found[0].kind).toBe('current-change');
    expect(found[0].startHours).toBeCloseTo(200, 9); // generator: change at 200 h
    expect(found[0].endIndex - found[0].index).toBe(120); // derived by hand: 10 h at 12 rows/h
    expect(found[0].detail).toMatch(/0\.600 A\/cm² instead of 0\.200 A\/cm²/);
  });

  it('ignores a current blip shorter than 0.25 h', () => {
    expect(run({ currentChange: { atHours: 200, hours: 0.1, currentDensity: 0.6 }, seed: 9 })).toEqual([]);
  });

  it('reads an open-circuit hold (current ≈ 0) without inventing current changes', () => {
    expect(run({ currentDensity: 0, v0: 0.95, seed: 10 })).toEqual([]);
  });

  it('calls time going backwards a restart', () => {
    const t = new Float64Array([0, 1, 2, 3, 0, 1, 2, 3]);
    const v = new Float64Array([0.65, 0.65, 0.65, 0.65, 0.66, 0.66, 0.66, 0.66]);
    const j = new Float64Array(8).fill(0.2);
    const found = detectInterruptions(t, v, j);
    expect(found).toHaveLength(1);
    expect(found[0].kind).toBe('restart');
    expect(found[0].index).toBe(4); // input data: time resets at row index 4
    expect(found[0].detail).toMatch(/time went back/);
  });

  it('throws on mismatched lengths, non-finite values and bad options', () => {
    const ok = new Float64Array([0, 1, 2]);
    expect(() => detectInterruptions(ok, ok, new Float64Array(2))).toThrow(/same length/);
    expect(() => detectInterruptions(ok, new Float64Array([1, NaN, 1]), ok)).toThrow(/finite/);
    expect(() => detectInterruptions(ok, ok, ok, { gapFactor: 0 })).toThrow(/gapFactor/);
  });
});

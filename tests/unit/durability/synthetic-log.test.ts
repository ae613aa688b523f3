import { describe, it, expect } from 'vitest';
import {
  DURABILITY_CSV_HEADER,
  TYPICAL_DEGRADATION_BAND,
  durabilityMetrics,
  generateSyntheticLog,
  mulberry32,
  writeDurabilityCsv,
} from '../../../shared/durability';

// Invented log shape: HT-PEM single cell at 0.2 A/cm², 160 °C.
const base = { hours: 400, stepMinutes: 10, v0: 0.65, breakInHours: 40, breakInDropMv: 20, rateUvPerH: 8, noiseMv: 1, currentDensity: 0.2 };

describe('generateSyntheticLog', () => {
  it('is reproducible from its seed', () => {
    const first = generateSyntheticLog({ ...base, seed: 5 });
    const second = generateSyntheticLog({ ...base, seed: 5 });
    const other = generateSyntheticLog({ ...base, seed: 6 });
    expect(Array.from(first.v.slice(0, 5))).toEqual(Array.from(second.v.slice(0, 5)));
    expect(first.v[3]).not.toBe(other.v[3]);
  });

  it('has one row per step, in hours, of kind durability', () => {
    const log = generateSyntheticLog(base);
    expect(log.kind).toBe('durability');
    expect(log.tHours!.length).toBe(2401); // derived by hand: 400 h · 6 rows/h + the row at 0 h
    expect(log.tHours![1]).toBeCloseTo(10 / 60, 12); // derived by hand: 10 min in hours
    expect(log.j[0]).toBeCloseTo(0.2, 2); // input current density, A/cm²
    // derived by hand: V(0) = v0 + break-in drop = 0.65 + 0.020 V, ± a few mV of noise
    expect(log.v[0]).toBeGreaterThan(0.66);
    expect(log.v[0]).toBeLessThan(0.68);
  });

  it('leaves out the rows of a gap and of the restart pause', () => {
    const log = generateSyntheticLog({ ...base, gapAtHours: 100, gapHours: 5, restartAtHours: 200, restartPauseHours: 2, restartShiftMv: 10 });
    expect(log.tHours!.length).toBe(2401 - 30 - 12); // derived by hand: 5 h and 2 h at 6 rows/h
  });

  it('makes an open-circuit hold when the current is 0', () => {
    const log = generateSyntheticLog({ ...base, currentDensity: 0, v0: 0.95 });
    expect(log.kind).toBe('hold');
    expect(Math.abs(log.j[10])).toBeLessThan(1e-4); // derived by hand: ≈ 0 A/cm²
  });

  it('writes the three-column CSV', () => {
    const log = generateSyntheticLog({ ...base, hours: 1 });
    const lines = writeDurabilityCsv(log).trimEnd().split('\n');
    expect(lines[0]).toBe('Time (h),Current density (A/cm2),Voltage (V)'); // the header of the generated log
    expect(DURABILITY_CSV_HEADER).toBe(lines[0]);
    expect(lines).toHaveLength(1 + 7); // derived by hand: 0, 10, …, 60 min
    expect(lines[1].split(',').map(Number)[0]).toBe(0); // first time, h
  });

  it('throws on bad options and curves', () => {
    expect(() => generateSyntheticLog({ ...base, hours: 0 })).toThrow(/hours must be positive/);
    expect(() => generateSyntheticLog({ ...base, stepMinutes: NaN })).toThrow(/finite/);
    expect(() => generateSyntheticLog({ ...base, noiseCorrelation: 1 })).toThrow(/noiseCorrelation/);
    expect(() => writeDurabilityCsv({ kind: 'durability', v: new Float64Array(1), j: new Float64Array(1) })).toThrow(/time column/);
    expect(() => mulberry32(NaN)).toThrow(/seed/);
  });
});

describe('typical degradation band', () => {
  it('exports the trade figures', () => {
    // common practice in the trade: standard HT-PEM assemblies 10–15 µV/h at 0.2 A/cm², improved ≈ 5 µV/h
    expect(TYPICAL_DEGRADATION_BAND).toEqual({ standard: [10, 15], improved: 5 });
  });

  it('the generator reproduces rates in that band, as measured by durabilityMetrics', () => {
    const standard = durabilityMetrics(generateSyntheticLog({ ...base, hours: 600, rateUvPerH: 12, seed: 21 }));
    expect(standard.degradationRate!).toBeGreaterThanOrEqual(TYPICAL_DEGRADATION_BAND.standard[0]); // common practice: 10 µV/h
    expect(standard.degradationRate!).toBeLessThanOrEqual(TYPICAL_DEGRADATION_BAND.standard[1]); // common practice: 15 µV/h
    const improved = durabilityMetrics(generateSyntheticLog({ ...base, hours: 600, rateUvPerH: 5, seed: 22 }));
    expect(Math.abs(improved.degradationRate! - TYPICAL_DEGRADATION_BAND.improved)).toBeLessThan(1); // common practice: ≈ 5 µV/h
  });
});

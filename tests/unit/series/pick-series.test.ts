import { describe, it, expect } from 'vitest';
import { pickSeries } from '../../../shared/series';
import type { SeriesCandidate } from '../../../shared/series';

const FACTORS = [
  { key: 'binder', label: 'binder', unit: 'wt %' },
  { key: 'activation', label: 'activation temperature', unit: '°C' },
];

// Invented builds: four at 160/180/200/180 °C with one recipe, one with another binder, one without a temperature.
const base = { factors: { binder: 20, activation: 350 }, loadingMgCm2: 1.0, catalystLot: 'L-07', labName: 'Home lab' };
const BUILDS: SeriesCandidate[] = [
  { ...base, buildId: 11, code: 'B-011', testConditions: { temperatureC: 160, backPressureKPa: 101 } },
  { ...base, buildId: 12, code: 'B-012', testConditions: { temperatureC: 180, backPressureKPa: 101 } },
  { ...base, buildId: 13, code: 'B-013', factors: { binder: 30, activation: 350 }, testConditions: { temperatureC: 190, backPressureKPa: 101 } },
  { ...base, buildId: 14, code: 'B-014', testConditions: { temperatureC: 200, backPressureKPa: 101 } },
  { ...base, buildId: 15, code: 'B-015', testConditions: { backPressureKPa: 101 } },
  { ...base, buildId: 16, code: 'B-016', testConditions: { temperatureC: 180, backPressureKPa: 101 } },
];

describe('pickSeries', () => {
  it('keeps the builds that differ only in the series variable and lists the rest', () => {
    const selection = pickSeries(BUILDS, ['conditions.temperatureC'], FACTORS);
    expect(selection.members).toEqual([11, 12, 14, 16]);
    expect(selection.values.map((entry) => entry.value)).toEqual([160, 180, 200, 180]);
    expect(selection.distinctValues).toBe(3);
    expect(selection.mismatches.map((m) => m.buildId)).toEqual([13, 15]);
    expect(selection.mismatches[0].reason).toBe('B-013 differs from B-011 in binder 20 → 30 wt %');
    expect(selection.mismatches[0].differences[0].key).toBe('binder');
    expect(selection.mismatches[1].reason).toContain('no recorded value');
  });

  it('chooses the reference that matches most builds, not just the first', () => {
    const odd: SeriesCandidate = { ...base, buildId: 10, code: 'B-010', catalystLot: 'L-99', testConditions: { temperatureC: 170, backPressureKPa: 101 } };
    const selection = pickSeries([odd, ...BUILDS], ['conditions.temperatureC'], FACTORS);
    expect(selection.referenceBuildId).toBe(11);
    expect(selection.members).toEqual([11, 12, 14, 16]);
    expect(selection.mismatches[0].reason).toBe('B-010 differs from B-011 in catalyst lot L-07 → L-99');
  });

  it('keeps hand-picked builds and still lists their other differences', () => {
    const selection = pickSeries(BUILDS.slice(0, 4), ['conditions.temperatureC'], FACTORS, { mode: 'as-given' });
    expect(selection.members).toEqual([11, 12, 13, 14]);
    expect(selection.mismatches).toHaveLength(1);
    expect(selection.mismatches[0].reason).toContain('kept: picked by hand');
  });

  it('treats a temperature kept as a factor and as a condition as one variable', () => {
    const factors = [...FACTORS, { key: 'cellT', label: 'cell temperature', unit: '°C' }];
    const builds = [160, 180, 200].map((t, i) => ({ ...base, buildId: i, factors: { ...base.factors, cellT: t }, testConditions: { temperatureC: t } }));
    const selection = pickSeries(builds, ['cellT', 'conditions.temperatureC'], factors);
    expect(selection.members).toEqual([0, 1, 2]);
    expect(selection.mismatches).toEqual([]);
  });

  it('refuses malformed input', () => {
    expect(() => pickSeries([], ['conditions.temperatureC'], FACTORS)).toThrow(/non-empty/);
    expect(() => pickSeries(BUILDS, [], FACTORS)).toThrow(/seriesKeys/);
    expect(() => pickSeries([BUILDS[0], BUILDS[0]], ['conditions.temperatureC'], FACTORS)).toThrow(/listed twice/);
    expect(() => pickSeries(BUILDS, ['conditions.temperatureC'], FACTORS, { referenceBuildId: 99 })).toThrow(/not among/);
  });
});

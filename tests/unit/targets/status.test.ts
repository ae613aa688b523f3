import { describe, it, expect } from 'vitest';
import { targetStatus, conversionFactor, type TargetObservation } from '../../../shared/targets';

// Invented builds of a cathode campaign (V at j_ref in V, internal unit).
const obs = (code: string, date: string, value: number, unit = 'V', basis: 'catalyst' | 'metal' | null = null): TargetObservation => ({
  buildId: Number(code.slice(2)), code, date, value, unit, basis,
});

describe('conversionFactor', () => {
  it('converts within a dimension and refuses across dimensions', () => {
    expect(conversionFactor('V', 'mV')).toBe(1000); // derived by hand: 1 V = 1000 mV
    expect(conversionFactor('mV', 'V')).toBe(0.001); // derived by hand
    expect(conversionFactor('mA/mg', 'A/g')).toBe(1); // derived by hand: 1 mA/mg = 1 A/g
    expect(conversionFactor('mV/h', 'µV/h')).toBe(1000); // derived by hand
    expect(conversionFactor('V', 'A/g')).toBeNull();
    expect(conversionFactor('€/kW', '€/kW')).toBe(1);
  });
});

describe('targetStatus, ≥ target', () => {
  const target = { comparator: '>=' as const, value: 650, unit: 'mV' };

  it('not yet: best so far and the gap in the target’s unit (mV from V)', () => {
    const s = targetStatus(target, [obs('B-011', '2026-02-01', 0.58), obs('B-014', '2026-03-01', 0.612), obs('B-017', '2026-03-20', 0.603)]);
    expect(s.state).toBe('not-yet');
    expect(s.best).toMatchObject({ code: 'B-014', value: 612 }); // derived by hand: 0.612 V = 612 mV
    expect(s.gap).toBeCloseTo(38, 9); // derived by hand: 650 − 612 mV
    expect(s.metBy).toBeNull();
    // best-to-date: 580, 612, 612 (B-017 is worse than B-014) — derived by hand
    expect(s.series.map((p) => [p.code, p.best, p.bestCode])).toEqual([['B-011', 580, 'B-011'], ['B-014', 612, 'B-014'], ['B-017', 612, 'B-014']]);
  });

  it('met by the earliest build that reaches it, by date not by input order', () => {
    const s = targetStatus(target, [obs('B-030', '2026-05-10', 0.671), obs('B-021', '2026-04-02', 0.655), obs('B-014', '2026-03-01', 0.612)]);
    expect(s.state).toBe('met');
    expect(s.metBy).toMatchObject({ code: 'B-021', date: '2026-04-02' }); // derived by hand: first ≥ 650 mV by date
    expect(s.best?.code).toBe('B-030');
    expect(s.gap).toBeCloseTo(-21, 9); // derived by hand: 650 − 671, negative = beyond target
  });

  it('a value equal to the target meets it, even after conversion (0.65 V vs 650 mV)', () => {
    const s = targetStatus(target, [obs('B-005', '2026-01-05', 0.65)]);
    expect(s.state).toBe('met');
    expect(s.gap).toBe(0); // derived by hand: tie
  });

  it('two builds on the same date: the one listed first wins the tie', () => {
    const s = targetStatus(target, [obs('B-008', '2026-01-05', 0.66), obs('B-007', '2026-01-05', 0.66)]);
    expect(s.metBy?.code).toBe('B-008');
    expect(s.best?.code).toBe('B-008'); // a later equal value does not replace the best
  });

  it('no data', () => {
    const s = targetStatus(target, []);
    expect(s).toMatchObject({ state: 'no-data', best: null, gap: null, metBy: null, series: [] });
  });
});

describe('targetStatus, ≤ target', () => {
  it('degradation rate below 10 µV/h, values in mV/h', () => {
    const target = { comparator: '<=' as const, value: 10, unit: 'µV/h' };
    const s = targetStatus(target, [obs('B-002', '2026-01-10', 0.025, 'mV/h'), obs('B-003', '2026-02-10', 0.012, 'mV/h')]);
    expect(s.state).toBe('not-yet');
    expect(s.best?.code).toBe('B-003');
    expect(s.gap).toBeCloseTo(2, 9); // derived by hand: 12 − 10 µV/h
    const met = targetStatus(target, [obs('B-004', '2026-03-01', 9.5, 'µV/h')]);
    expect(met.state).toBe('met');
    expect(met.gap).toBeCloseTo(-0.5, 9); // derived by hand: 9.5 − 10
  });

  it('metal loading at most 0.1 mg/cm², given in µg/cm²', () => {
    const s = targetStatus({ comparator: '<=', value: 0.1, unit: 'mg/cm²' }, [obs('B-009', '2026-02-01', 100, 'µg/cm²')]);
    expect(s.state).toBe('met'); // derived by hand: 100 µg/cm² = 0.1 mg/cm², a tie
  });
});

describe('targetStatus, basis and units that do not compare', () => {
  it('A/g per gram of catalyst is not comparable with a target per gram of metal', () => {
    const target = { comparator: '>=' as const, value: 40, unit: 'A/g', basis: 'metal' as const };
    const s = targetStatus(target, [obs('B-012', '2026-02-01', 12, 'A/g', 'catalyst'), obs('B-013', '2026-02-03', 35, 'mA/mg', 'metal')]);
    expect(s.notComparable).toEqual([{ code: 'B-012', reason: 'per gram of catalyst, the target is per gram of metal' }]);
    expect(s.best?.code).toBe('B-013');
    expect(s.gap).toBeCloseTo(5, 9); // derived by hand: 40 − 35 A/g
  });

  it('only non-comparable values → no data, with the reasons', () => {
    const s = targetStatus({ comparator: '>=', value: 0.6, unit: 'V' }, [obs('B-001', '2026-01-01', 1, 'A/g')]);
    expect(s.state).toBe('no-data');
    expect(s.notComparable[0].reason).toBe('A/g does not convert to V');
  });

  it('refuses a non-finite target', () => {
    expect(() => targetStatus({ comparator: '>=', value: Number.NaN, unit: 'V' }, [])).toThrow(RangeError);
  });
});

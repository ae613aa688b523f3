import { describe, it, expect } from 'vitest';
import { reactionOrder } from '../../../shared/series';

const P = [101, 150, 200, 250, 300]; // kPa absolute, invented

describe('reactionOrder', () => {
  it('gives the order and its 95 % interval as scipy does', () => {
    const j = [0.01, 0.0123, 0.014, 0.0159, 0.0171];
    const result = reactionOrder(P.map((value, i) => ({ buildId: i + 1, value, currentDensity: j[i] })));
    expect(result.kind).toBe('order');
    expect(result.unit).toBe('dimensionless');
    expect(result.estimate).toBeCloseTo(0.495928234277, 10); // scipy reference, block 2
    expect(result.low!).toBeCloseTo(0.461275602288, 10); // scipy reference, block 2
    expect(result.high!).toBeCloseTo(0.530580866266, 10); // scipy reference, block 2
    expect(result.noDependenceWithinNoise).toBe(false);
    expect(result.xLabel).toBe('ln(pressure / kPa)');
    expect(result.points[2].x).toBeCloseTo(Math.log(200), 15);
  });

  it('reports "no dependence within noise" when the interval holds 0', () => {
    const j = [0.01, 0.0103, 0.0098, 0.0101, 0.0102];
    const result = reactionOrder(P.map((value, i) => ({ buildId: i + 1, value, currentDensity: j[i] })));
    expect(result.estimate).toBeCloseTo(0.00597508731431, 10); // scipy reference, block 3
    expect(result.low!).toBeCloseTo(-0.0750812286085, 10); // scipy reference, block 3
    expect(result.high!).toBeCloseTo(0.0870314032372, 10); // scipy reference, block 3
    expect(result.noDependenceWithinNoise).toBe(true);
    expect(result.notes.join(' ')).toContain('no dependence within noise');
  });

  it('is independent of the pressure unit (kPa or bar give the same slope)', () => {
    // hand-worked: ln(c·p) = ln c + ln p, so a unit change only moves the intercept
    const j = [0.01, 0.0123, 0.014, 0.0159, 0.0171];
    const kPa = reactionOrder(P.map((value, i) => ({ buildId: i, value, currentDensity: j[i] })));
    const bar = reactionOrder(P.map((value, i) => ({ buildId: i, value: value / 100, currentDensity: j[i] })), { unit: 'bar' });
    expect(bar.estimate).toBeCloseTo(kPa.estimate, 12);
    expect(bar.xLabel).toBe('ln(pressure / bar)');
  });

  it('refuses non-positive pressures and currents', () => {
    expect(() => reactionOrder([{ buildId: 1, value: 0, currentDensity: 0.01 }, { buildId: 2, value: 100, currentDensity: 0.01 }])).toThrow(/build 1.*pressure/);
    expect(() => reactionOrder([{ buildId: 1, value: 100, currentDensity: 0.01 }, { buildId: 2, value: 100, currentDensity: 0.02 }])).toThrow(/2 different values/);
    expect(() => reactionOrder([{ buildId: 1, value: 100, currentDensity: 0.01 }])).toThrow(/at least 2/);
    expect(() => reactionOrder([{ buildId: 1, value: 100, currentDensity: 0.01 }, { buildId: 2, value: 200, currentDensity: 0.02 }], { variable: 'flow' as never })).toThrow(/variable/);
  });
});

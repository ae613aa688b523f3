import { describe, it, expect } from 'vitest';
import { activationEnergy, slopeWithInterval } from '../../../shared/series';

// Invented temperature series (j at a fixed iR-free voltage); expected values from scipy
// (tests/reference/series_reference.py, block 1: stats.linregress + stats.t.ppf(0.975, 3)).
const SERIES = [
  { buildId: 1, temperatureC: 160, currentDensity: 0.00412 },
  { buildId: 2, temperatureC: 170, currentDensity: 0.00601 },
  { buildId: 3, temperatureC: 180, currentDensity: 0.00853 },
  { buildId: 4, temperatureC: 190, currentDensity: 0.0121 },
  { buildId: 5, temperatureC: 200, currentDensity: 0.0166 },
];

describe('activationEnergy', () => {
  const result = activationEnergy(SERIES);

  it('gives Eₐ and its 95 % interval as scipy does', () => {
    expect(result.kind).toBe('arrhenius');
    expect(result.unit).toBe('kJ/mol');
    expect(result.estimate).toBeCloseTo(59.43980529, 7); // scipy reference, block 1
    expect(result.low!).toBeCloseTo(58.5853912373, 7); // scipy reference, block 1
    expect(result.high!).toBeCloseTo(60.2942193427, 7); // scipy reference, block 1
    expect(result.fit.slope).toBeCloseTo(-7148.96536564, 5); // scipy reference: slope of ln j vs 1/T, K
    expect(result.fit.slopeSE!).toBeCloseTo(32.2903767876, 7); // scipy reference: stderr
    expect(result.fit.tCritical!).toBeCloseTo(3.18244630528, 9); // scipy t.ppf(0.975, 3)
    expect(result.fit.r2!).toBeCloseTo(0.999938799564, 10); // scipy rvalue²
    expect(result.fit.df).toBe(3);
  });

  it('plots x = 1/T in K⁻¹ and y = ln j, one point per build', () => {
    expect(result.points).toHaveLength(5);
    expect(result.points[0].buildId).toBe(1);
    expect(result.points[0].x).toBeCloseTo(1 / 433.15, 15); // 160 °C = 433.15 K (BIPM SI Brochure)
    expect(result.points[0].y).toBeCloseTo(Math.log(0.00412), 15);
    expect(result.xLabel).toBe('1/T (1/K)');
    expect(result.method).toContain('8.314462618');
  });

  it('recovers an exact Arrhenius law to round-off', () => {
    // hand-worked: j = 1e3·exp(−75 000/(R·T)) at 150–210 °C gives Eₐ = 75 kJ/mol exactly
    const R = 8.314462618; // CODATA 2018
    const exact = [150, 165, 180, 195, 210].map((t, i) => ({ buildId: i, temperatureC: t, currentDensity: 1e3 * Math.exp(-75000 / (R * (t + 273.15))) }));
    const fit = activationEnergy(exact);
    expect(fit.estimate).toBeCloseTo(75, 9);
    expect(fit.high! - fit.low!).toBeLessThan(1e-8);
  });

  it('gives an estimate without interval from two points, and says so', () => {
    const two = activationEnergy(SERIES.slice(0, 2));
    expect(two.low).toBeNull();
    expect(two.high).toBeNull();
    // hand-worked: −R·ln(0.00601/0.00412)/(1/443.15 − 1/433.15)/1000
    const expected = (-8.314462618 * Math.log(0.00601 / 0.00412)) / (1 / 443.15 - 1 / 433.15) / 1000;
    expect(two.estimate).toBeCloseTo(expected, 10);
    expect(two.notes.join(' ')).toContain('two points');
    expect(two.notes.join(' ')).toContain('narrow range'); // 10 K span
  });

  it('flags a current that falls with temperature', () => {
    const falling = activationEnergy(SERIES.map((p, i) => ({ ...p, currentDensity: SERIES[4 - i].currentDensity })));
    expect(falling.estimate).toBeLessThan(0);
    expect(falling.notes.join(' ')).toContain('not an activated process');
  });

  it('refuses bad input naming the build', () => {
    expect(() => activationEnergy([])).toThrow(/at least 2 points/);
    expect(() => activationEnergy([SERIES[0], { ...SERIES[1], currentDensity: 0 }])).toThrow(/build 2.*currentDensity/);
    expect(() => activationEnergy([SERIES[0], { ...SERIES[1], temperatureC: -300 }])).toThrow(/temperatureC/);
    expect(() => activationEnergy([SERIES[0], { ...SERIES[1], temperatureC: 160 }])).toThrow(/2 different temperatures/);
    expect(() => activationEnergy(SERIES, { confidence: 1 })).toThrow(/confidence/);
  });
});

describe('slopeWithInterval', () => {
  it('refuses constant x, mismatched lengths and non-finite values', () => {
    expect(() => slopeWithInterval([1, 1, 1], [1, 2, 3])).toThrow(/2 different values/);
    expect(() => slopeWithInterval([1, 2], [1])).toThrow(/same length/);
    expect(() => slopeWithInterval([1, 2, NaN], [1, 2, 3])).toThrow(/finite/);
  });
});

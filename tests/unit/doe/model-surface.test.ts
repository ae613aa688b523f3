import { describe, it, expect } from 'vitest';
import { canonicalAnalysis, DoeInputError, fitSurface, isExtrapolation, checkExtrapolation, predict } from '../../../shared/doe/model';
import type { Factor, Observation } from '../../../shared/doe/model';

// Montgomery, Design and Analysis of Experiments, ch. 11 (response surface methods): the
// chemical process yield example, a central composite design in reaction time (85 ± 5 min)
// and temperature (175 ± 5 °F) with five centre runs and axial points at α = 1.414.
// Data typed in FROM MEMORY; the fitted coefficients, stationary point and eigenvalues the
// book prints (also from memory) are reproduced below, which cross-checks the recollection.
const yieldFactors: Factor[] = [
  { key: 'time', kind: 'continuous', low: 80, high: 90, unit: 'min' },
  { key: 'temp', kind: 'continuous', low: 170, high: 180, unit: '°F' },
];
const yieldCoded: [number, number, number][] = [
  [-1, -1, 76.5], [-1, 1, 77.0], [1, -1, 78.0], [1, 1, 79.5],
  [0, 0, 79.9], [0, 0, 80.3], [0, 0, 80.0], [0, 0, 79.7], [0, 0, 79.8],
  [1.414, 0, 78.4], [-1.414, 0, 75.6], [0, 1.414, 78.5], [0, -1.414, 77.0],
];
const yieldRows: Observation[] = yieldCoded.map(([a, b, y]) => ({ factors: { time: 85 + 5 * a, temp: 175 + 5 * b }, y }));

describe('Montgomery chemical-process yield CCD (from memory)', () => {
  const fit = fitSurface({ factors: yieldFactors, rows: yieldRows, model: 'quadratic', responseKey: 'yield' });
  const canonical = canonicalAnalysis(fit);

  it('reproduces the printed second-order fit', () => {
    const coded = Object.fromEntries(fit.coefficients.map((c) => [c.term, c.coded]));
    // from memory (Montgomery's printed fit): ŷ = 79.94 + 0.995x₁ + 0.515x₂ − 1.376x₁² − 1.001x₂² + 0.250x₁x₂
    expect(coded.intercept).toBeCloseTo(79.94, 2);
    expect(coded.time).toBeCloseTo(0.995, 3);
    expect(coded.temp).toBeCloseTo(0.515, 3);
    expect(coded['time^2']).toBeCloseTo(-1.376, 3);
    expect(coded['temp^2']).toBeCloseTo(-1.001, 3);
    expect(coded['time*temp']).toBeCloseTo(0.25, 3);
    // derived by hand from the data: five centre runs, mean 79.94, pure error SS 0.212 on 4 df
    expect(fit.anova.pureError?.ss).toBeCloseTo(0.212, 10);
    expect(fit.anova.pureError?.df).toBe(4);
    expect(fit.anova.lackOfFit?.df).toBe(3);
    // from memory (Montgomery's ANOVA of this fit): lack of fit SS 0.2844 on 3 df, R² = 0.9827
    expect(fit.anova.lackOfFit?.ss).toBeCloseTo(0.2844, 3);
    expect(fit.r2).toBeCloseTo(0.9827, 3);
    expect(fit.distinctRuns).toBe(9);
  });

  it('locates the stationary point and its nature by canonical analysis', () => {
    // from memory (Montgomery): x₁,s = 0.389, x₂,s = 0.306 → 86.95 min, 176.53 °F; ŷ_s = 80.21
    expect(canonical.nature).toBe('maximum');
    expect(canonical.stationaryCoded?.time).toBeCloseTo(0.389, 2);
    expect(canonical.stationaryCoded?.temp).toBeCloseTo(0.306, 2);
    expect(canonical.stationaryActual?.time).toBeCloseTo(86.95, 1);
    expect(canonical.stationaryActual?.temp).toBeCloseTo(176.53, 1);
    expect(canonical.prediction?.value).toBeCloseTo(80.21, 1);
    // from memory (Montgomery): λ₁ = −0.9634, λ₂ = −1.4141
    expect(canonical.eigenvalues[0]).toBeCloseTo(-0.9634, 2);
    expect(canonical.eigenvalues[1]).toBeCloseTo(-1.4141, 2);
    expect(canonical.extrapolation).toBe(false);
  });

  it('PRESS equals the sum of squared leave-one-out prediction errors', () => {
    let pressByRefit = 0;
    for (let i = 0; i < yieldRows.length; i++) {
      const refit = fitSurface({ factors: yieldFactors, rows: yieldRows.filter((_, j) => j !== i), model: 'quadratic' });
      const deleted = yieldRows[i].y - predict(refit, yieldRows[i].factors).value;
      pressByRefit += deleted * deleted;
    }
    // derived by hand: PRESS = Σ(eᵢ/(1 − hᵢᵢ))² is an identity for least squares (Sherman–Morrison)
    expect(Math.abs((fit.press as number) - pressByRefit) / pressByRefit).toBeLessThan(1e-10);
  });
});

// A surface built by hand with a known maximum:
//   y = 5 + 3.5z₁ − 2.5z₂ − 3z₁² − 3z₂² + 2z₁z₂,  z₁ = (x₁ − 150)/50, z₂ = (x₂ − 5)/5.
// B = [[−3, 1], [1, −3]] has eigenvalues −2 (vector (1, 1)/√2) and −4 (vector (1, −1)/√2);
// x_s = −½B⁻¹b with b = (3.5, −2.5) gives z_s = (0.5, −0.25), i.e. x₁ = 175, x₂ = 3.75,
// and ŷ_s = 5 + ½(0.5·3.5 + 0.25·2.5) = 6.1875.
const handFactors: Factor[] = [
  { key: 'x1', kind: 'continuous', low: 100, high: 200 },
  { key: 'x2', kind: 'continuous', low: 0, high: 10 },
];
function handSurface(z1: number, z2: number): number {
  return 5 + 3.5 * z1 - 2.5 * z2 - 3 * z1 * z1 - 3 * z2 * z2 + 2 * z1 * z2;
}
const handRows: Observation[] = [];
for (const z1 of [-1, 0, 1]) {
  for (const z2 of [-1, 0, 1]) handRows.push({ factors: { x1: 150 + 50 * z1, x2: 5 + 5 * z2 }, y: handSurface(z1, z2) });
}
// a replicated centre pair (±0.01) gives an error estimate without moving any cell mean
handRows.push({ factors: { x1: 150, x2: 5 }, y: 5.01 }, { factors: { x1: 150, x2: 5 }, y: 4.99 });

describe('constructed quadratic with a known stationary point', () => {
  const fit = fitSurface({ factors: handFactors, rows: handRows, model: 'quadratic' });

  it('recovers coded and actual-unit coefficients exactly', () => {
    const byTerm = Object.fromEntries(fit.coefficients.map((c) => [c.term, c]));
    // derived by hand (coded): the generating polynomial above
    expect(byTerm.x1.coded).toBeCloseTo(3.5, 10);
    expect(byTerm['x1*x2'].coded).toBeCloseTo(2, 10);
    expect(byTerm['x2^2'].coded).toBeCloseTo(-3, 10);
    // derived by hand (actual): x₁² −3/2500, x₂² −3/25, x₁x₂ 2/250,
    // x₁: 3.5/50 + 3·300/2500 − 2·5/250 = 0.39; x₂: −2.5/5 + 3·10/25 − 2·150/250 = −0.5;
    // intercept: 5 − 10.5 + 2.5 − 27 − 3 + 6 = −27
    expect(byTerm['x1^2'].actual).toBeCloseTo(-0.0012, 14);
    expect(byTerm['x2^2'].actual).toBeCloseTo(-0.12, 12);
    expect(byTerm['x1*x2'].actual).toBeCloseTo(0.008, 13);
    expect(byTerm.x1.actual).toBeCloseTo(0.39, 11);
    expect(byTerm.x2.actual).toBeCloseTo(-0.5, 11);
    expect(byTerm.intercept.actual).toBeCloseTo(-27, 9);
  });

  it('actual-unit standard errors match coded ones through the expansion', () => {
    const byTerm = Object.fromEntries(fit.coefficients.map((c) => [c.term, c]));
    // derived by hand: a top-order term only rescales, SE(x₁²) = SE(z₁²)/50², SE(x₁x₂) = SE(z₁z₂)/(50·5)
    expect(byTerm['x1^2'].actualSE as number).toBeCloseTo((byTerm['x1^2'].codedSE as number) / 2500, 15);
    expect(byTerm['x1*x2'].actualSE as number).toBeCloseTo((byTerm['x1*x2'].codedSE as number) / 250, 15);
  });

  it('canonical analysis: stationary point, eigenvalues, eigenvectors', () => {
    const result = canonicalAnalysis(fit);
    expect(result.nature).toBe('maximum');
    // derived by hand (see the comment above the data)
    expect(result.stationaryCoded?.x1).toBeCloseTo(0.5, 10);
    expect(result.stationaryCoded?.x2).toBeCloseTo(-0.25, 10);
    expect(result.stationaryActual?.x1).toBeCloseTo(175, 8);
    expect(result.stationaryActual?.x2).toBeCloseTo(3.75, 9);
    expect(result.prediction?.value).toBeCloseTo(6.1875, 10);
    expect(result.eigenvalues[0]).toBeCloseTo(-2, 10);
    expect(result.eigenvalues[1]).toBeCloseTo(-4, 10);
    expect(Math.abs(result.eigenvectors[0][0])).toBeCloseTo(Math.SQRT1_2, 10);
    expect(result.eigenvectors[0][1]).toBeCloseTo(result.eigenvectors[0][0], 10);
    expect(result.eigenvectors[1][1]).toBeCloseTo(-result.eigenvectors[1][0], 10);
    expect(result.B).toEqual([[expect.closeTo(-3, 10), expect.closeTo(1, 10)], [expect.closeTo(1, 10), expect.closeTo(-3, 10)]]);
  });

  it('recognises a saddle and a ridge', () => {
    const saddleRows = handRows.map((row) => {
      const z1 = ((row.factors.x1 as number) - 150) / 50;
      const z2 = ((row.factors.x2 as number) - 5) / 5;
      // derived by hand: y = z₁² − z₂² has B = diag(1, −1), a saddle at the origin
      return { ...row, y: z1 * z1 - z2 * z2 + (row.y - handSurface(z1, z2)) };
    });
    const saddle = canonicalAnalysis(fitSurface({ factors: handFactors, rows: saddleRows, model: 'quadratic' }));
    expect(saddle.nature).toBe('saddle');
    expect(saddle.stationaryCoded?.x1).toBeCloseTo(0, 10);
    const ridgeRows = saddleRows.map((row) => {
      const z1 = ((row.factors.x1 as number) - 150) / 50;
      const z2 = ((row.factors.x2 as number) - 5) / 5;
      // derived by hand: y = −z₁² + z₂ has B = diag(−1, 0): a rising ridge, no stationary point
      return { ...row, y: -z1 * z1 + z2 };
    });
    const ridge = canonicalAnalysis(fitSurface({ factors: handFactors, rows: ridgeRows, model: 'quadratic' }));
    expect(ridge.nature).toBe('ridge');
    expect(ridge.stationaryCoded).toBeNull();
  });

  it('throws for models without second-order terms or with unknown levels', () => {
    const linear = fitSurface({ factors: handFactors, rows: handRows, model: 'linear' });
    expect(() => canonicalAnalysis(linear)).toThrow(DoeInputError);
    expect(() => canonicalAnalysis(linear)).toThrow(/no second-order terms/);
    const cubic = fitSurface({ factors: handFactors, rows: handRows, model: { terms: ['x1^3', 'x2^2', 'x1*x2'] } });
    expect(() => canonicalAnalysis(cubic)).toThrow(/above second order/);
  });
});

describe('canonical analysis at a chosen categorical level', () => {
  it('uses the level-specific linear terms', () => {
    const factors: Factor[] = [
      { key: 'temp', kind: 'continuous', low: 160, high: 200 },
      { key: 'gdl', kind: 'categorical', levels: ['paper', 'cloth'] },
    ];
    const rows: Observation[] = [];
    for (const gdl of ['paper', 'cloth']) {
      for (const z of [-1, -0.5, 0, 0.5, 1]) {
        // derived by hand: y = 1 − z² + (cloth ? 0.6z : 0.2z) → maximum at z = 0.1 (paper), 0.3 (cloth)
        const slope = gdl === 'cloth' ? 0.6 : 0.2;
        rows.push({ factors: { temp: 180 + 20 * z, gdl }, y: 1 - z * z + slope * z });
      }
    }
    rows.push({ factors: { temp: 180, gdl: 'paper' }, y: 1.01 }, { factors: { temp: 180, gdl: 'paper' }, y: 0.99 });
    const fit = fitSurface({ factors, rows, model: 'quadratic' });
    expect(canonicalAnalysis(fit).stationaryCoded?.temp).toBeCloseTo(0.1, 8);
    expect(canonicalAnalysis(fit, { levels: { gdl: 'cloth' } }).stationaryCoded?.temp).toBeCloseTo(0.3, 8);
    expect(canonicalAnalysis(fit, { levels: { gdl: 'cloth' } }).stationaryActual?.temp).toBeCloseTo(186, 6);
    expect(() => canonicalAnalysis(fit, { levels: { gdl: 'mesh' } })).toThrow(/"mesh" is not a level/);
  });
});

describe('predict and isExtrapolation', () => {
  // one factor, x = −1, −1, 0, 0, 0, 1, 1; hand-worked in model-fit.test.ts
  const factors: Factor[] = [{ key: 'x', kind: 'continuous', low: -1, high: 1 }];
  const rows: Observation[] = [[-1, 1], [-1, 3], [0, 5], [0, 6], [0, 7], [1, 8], [1, 10]].map(([x, y]) => ({ factors: { x }, y }));
  const fit = fitSurface({ factors, rows, model: 'linear' });

  it('gives 95 % confidence and prediction intervals', () => {
    const at = predict(fit, { x: 0.5 });
    // derived by hand: ŷ = 40/7 + 3.5·0.5; h₀ = 1/7 + 0.5²/4 = 23/112; MSE = 9/7 on 5 df
    const value = 40 / 7 + 1.75;
    const h0 = 1 / 7 + 0.0625;
    // t(0.975, 5) = 2.570582 — Student-t table (e.g. NIST/SEMATECH e-Handbook 1.3.6.7.2)
    const t = 2.5705818366;
    expect(at.value).toBeCloseTo(value, 12);
    expect(at.leverage).toBeCloseTo(h0, 12);
    expect(at.se).toBeCloseTo(Math.sqrt((9 / 7) * h0), 12);
    expect(at.ciLow).toBeCloseTo(value - t * Math.sqrt((9 / 7) * h0), 6);
    expect(at.ciHigh).toBeCloseTo(value + t * Math.sqrt((9 / 7) * h0), 6);
    expect(at.piLow).toBeCloseTo(value - t * Math.sqrt((9 / 7) * (1 + h0)), 6);
    expect(at.piHigh).toBeCloseTo(value + t * Math.sqrt((9 / 7) * (1 + h0)), 6);
  });

  it('flags points outside the bounds, and points inside the box but away from the data', () => {
    expect(isExtrapolation(fit, { x: 0.9 })).toBe(false);
    expect(isExtrapolation(fit, { x: 1 })).toBe(false);
    expect(isExtrapolation(fit, { x: 1.5 })).toBe(true);
    // runs along the diagonal a ≈ b: the corner (1, −1) is inside the box but far from every run
    const diagonal: Observation[] = [[-1, -1], [-1, -0.8], [1, 1], [1, 0.8], [0, 0], [0, 0.1], [0.5, 0.5], [-0.5, -0.4]].map(([a, b], i) => ({
      factors: { a, b },
      y: a + 2 * b + 0.01 * (i % 3),
    }));
    const twoFactors: Factor[] = [
      { key: 'a', kind: 'continuous', low: -1, high: 1 },
      { key: 'b', kind: 'continuous', low: -1, high: 1 },
    ];
    const diagonalFit = fitSurface({ factors: twoFactors, rows: diagonal, model: 'linear' });
    const check = checkExtrapolation(diagonalFit, { a: 1, b: -1 });
    expect(check.extrapolation).toBe(true);
    expect(check.reasons.join(' ')).toMatch(/Leverage/);
    expect(isExtrapolation(diagonalFit, { a: 0, b: 0 })).toBe(false);
  });

  it('counts axial runs beyond low/high as inside the data range', () => {
    const ccd = fitSurface({ factors: yieldFactors, rows: yieldRows, model: 'quadratic' });
    // the axial run at time = 85 + 5·1.414 = 92.07 min is data, not extrapolation
    expect(isExtrapolation(ccd, { time: 92.07, temp: 175 })).toBe(false);
    expect(isExtrapolation(ccd, { time: 95, temp: 175 })).toBe(true);
  });

  it('throws on missing or bad point values', () => {
    expect(() => predict(fit, {})).toThrow(/missing value for factor "x"/);
    expect(() => predict(fit, { x: Number.NaN })).toThrow(/finite number/);
    expect(() => isExtrapolation(fit, { x: 'high' })).toThrow(DoeInputError);
  });
});

import { describe, it, expect } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { DoeInputError, fitSurface, predict } from '../../../shared/doe/model';
import type { Factor, Observation } from '../../../shared/doe/model';
import { longleyCertified, longleyRows } from '../../fixtures/nist/longley';
import { norrisCertified, norrisRows } from '../../fixtures/nist/norris';

function relativeError(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}

const longleyKeys = ['x1', 'x2', 'x3', 'x4', 'x5', 'x6'];
const longleyFactors: Factor[] = longleyKeys.map((key, j) => {
  const values = longleyRows.map((row) => row.x[j]);
  return { key, kind: 'continuous', low: Math.min(...values), high: Math.max(...values) };
});
const longleyObservations: Observation[] = longleyRows.map((row) => ({
  y: row.y,
  factors: Object.fromEntries(longleyKeys.map((key, j) => [key, row.x[j]])),
}));

describe('fitSurface against NIST StRD certified values', () => {
  it('Longley: coefficients and standard errors to at least 10 significant digits', () => {
    const fit = fitSurface({ factors: longleyFactors, rows: longleyObservations, model: 'linear' });
    expect(fit.coefficients.map((c) => c.term)).toEqual(['intercept', ...longleyKeys]);
    for (let j = 0; j < 7; j++) {
      // NIST StRD Longley.dat certified estimates and standard deviations (15 digits)
      expect(relativeError(fit.coefficients[j].actual, longleyCertified.estimates[j])).toBeLessThan(1e-10);
      expect(relativeError(fit.coefficients[j].actualSE as number, longleyCertified.standardErrors[j])).toBeLessThan(1e-10);
    }
    // NIST StRD Longley.dat: residual standard deviation, R², certified ANOVA table
    expect(relativeError(fit.rmse, longleyCertified.residualSD)).toBeLessThan(1e-10);
    expect(relativeError(fit.r2, longleyCertified.rSquared)).toBeLessThan(1e-12);
    expect(relativeError(fit.anova.model.ss, longleyCertified.regressionSS)).toBeLessThan(1e-10);
    expect(relativeError(fit.anova.model.ms, longleyCertified.regressionMS)).toBeLessThan(1e-10);
    expect(relativeError(fit.anova.residual.ss, longleyCertified.residualSS)).toBeLessThan(1e-10);
    expect(relativeError(fit.anova.residual.ms, longleyCertified.residualMS)).toBeLessThan(1e-10);
    expect(relativeError(fit.anova.model.f as number, longleyCertified.fStatistic)).toBeLessThan(1e-10);
    expect(fit.anova.model.df).toBe(longleyCertified.regressionDf);
    expect(fit.anova.residual.df).toBe(longleyCertified.residualDf);
    // the coded t statistics equal the actual-unit ones (coding is a linear change of scale)
    for (let j = 1; j < 7; j++) {
      const actualT = longleyCertified.estimates[j] / longleyCertified.standardErrors[j];
      expect(relativeError(fit.coefficients[j].t as number, actualT)).toBeLessThan(1e-9);
    }
  });

  it('Longley: variance inflation factors and the collinearity warning', () => {
    const fit = fitSurface({ factors: longleyFactors, rows: longleyObservations, model: 'linear' });
    // from memory: the VIFs widely quoted for Longley's six predictors (135.5, 1788.5, 33.6,
    // 3.59, 399.2, 759.0); checked to 3 significant digits
    const expected = [135.5, 1788.5, 33.62, 3.589, 399.2, 759.0];
    for (let j = 0; j < 6; j++) expect(relativeError(fit.coefficients[j + 1].vif as number, expected[j])).toBeLessThan(2e-3);
    expect(fit.coefficients[0].vif).toBeNull();
    expect(fit.warnings.join(' ')).toMatch(/Variance inflation above 10.*x2/);
  });

  it('Longley: the plain normal equations in raw units lose most of the digits (why we code and use QR)', () => {
    const x = new Matrix(longleyRows.map((row) => [1, ...row.x]));
    const y = Matrix.columnVector(longleyRows.map((row) => row.y));
    const xt = x.transpose();
    const beta = solve(xt.mmul(x), xt.mmul(y)).getColumn(0);
    let worstNormal = 0;
    for (let j = 0; j < 7; j++) worstNormal = Math.max(worstNormal, relativeError(beta[j], longleyCertified.estimates[j]));
    const fit = fitSurface({ factors: longleyFactors, rows: longleyObservations, model: 'linear' });
    let worstCoded = 0;
    for (let j = 0; j < 7; j++) worstCoded = Math.max(worstCoded, relativeError(fit.coefficients[j].actual, longleyCertified.estimates[j]));
    // measured on this code (Node 20, x86-64): normal equations solved by LU in raw units give
    // a worst relative error of 3.9e-8 (about 7 digits); coded QR gives 2.5e-14 (13 digits)
    expect(worstNormal).toBeGreaterThan(1e-9);
    expect(worstCoded).toBeLessThan(1e-12);
  });

  it('Norris: slope, intercept, their standard errors, residual SD and R²', () => {
    const fit = fitSurface({
      factors: [{ key: 'x', kind: 'continuous', low: 0.2, high: 999 }],
      rows: norrisRows.map((row) => ({ y: row.y, factors: { x: row.x } })),
      model: 'linear',
    });
    for (let j = 0; j < 2; j++) {
      // NIST StRD Norris.dat certified estimates and standard deviations
      expect(relativeError(fit.coefficients[j].actual, norrisCertified.estimates[j])).toBeLessThan(1e-10);
      expect(relativeError(fit.coefficients[j].actualSE as number, norrisCertified.standardErrors[j])).toBeLessThan(1e-10);
    }
    // NIST StRD Norris.dat: residual SD, R², regression and residual SS, F
    expect(relativeError(fit.rmse, norrisCertified.residualSD)).toBeLessThan(1e-10);
    expect(relativeError(fit.r2, norrisCertified.rSquared)).toBeLessThan(1e-12);
    expect(relativeError(fit.anova.model.ss, norrisCertified.regressionSS)).toBeLessThan(1e-10);
    expect(relativeError(fit.anova.residual.ss, norrisCertified.residualSS)).toBeLessThan(1e-9);
    expect(relativeError(fit.anova.model.f as number, norrisCertified.fStatistic)).toBeLessThan(1e-9);
  });
});

// A one-factor example small enough to do by hand: x = −1, −1, 0, 0, 0, 1, 1 (coded = actual).
const smallFactors: Factor[] = [{ key: 'x', kind: 'continuous', low: -1, high: 1 }];
const smallRows: Observation[] = [
  [-1, 1], [-1, 3], [0, 5], [0, 6], [0, 7], [1, 8], [1, 10],
].map(([x, y], i) => ({ factors: { x }, y, buildId: 100 + i }));

describe('fitSurface: ANOVA, lack of fit and PRESS on a hand-worked example', () => {
  const fit = fitSurface({ factors: smallFactors, rows: smallRows, model: 'linear', responseKey: 'vAtRef' });

  it('coefficients, sums of squares and R²', () => {
    // derived by hand: x̄ = 0, Sxx = 4, Sxy = −(1 + 3) + (8 + 10) = 14, slope = 3.5, intercept = ȳ = 40/7
    expect(fit.coefficients[0].coded).toBeCloseTo(40 / 7, 12);
    expect(fit.coefficients[1].coded).toBeCloseTo(3.5, 12);
    // derived by hand: SS_total = Σy² − (Σy)²/n = 284 − 1600/7 = 388/7; SS_model = 3.5²·4 = 49
    expect(fit.anova.total.ss).toBeCloseTo(388 / 7, 10);
    expect(fit.anova.model.ss).toBeCloseTo(49, 10);
    // derived by hand: SS_residual = 388/7 − 49 = 45/7 on 5 df, MS = 9/7
    expect(fit.anova.residual.ss).toBeCloseTo(45 / 7, 10);
    expect(fit.anova.residual.df).toBe(5);
    expect(fit.anova.residual.ms).toBeCloseTo(9 / 7, 10);
    // derived by hand: R² = 49/(388/7) = 343/388; adj R² = 1 − (9/7)/((388/7)/6) = 1 − 54/388
    expect(fit.r2).toBeCloseTo(343 / 388, 12);
    expect(fit.adjR2).toBeCloseTo(1 - 54 / 388, 12);
    // derived by hand: F = 49/(9/7) = 343/9
    expect(fit.anova.model.f as number).toBeCloseTo(343 / 9, 10);
    expect(fit.n).toBe(7);
    expect(fit.distinctRuns).toBe(3);
    expect(fit.response).toBe('vAtRef');
  });

  it('pure error from replicates and lack of fit = residual − pure error', () => {
    // derived by hand: group means 2, 6, 9; within-group SS 2 + 2 + 2 = 6 on 1 + 2 + 1 = 4 df
    expect(fit.anova.pureError?.ss).toBeCloseTo(6, 12);
    expect(fit.anova.pureError?.df).toBe(4);
    expect(fit.anova.pureError?.ms).toBeCloseTo(1.5, 12);
    // derived by hand: LOF = 45/7 − 6 = 3/7 on 5 − 4 = 1 df (= Σ n_g(ȳ_g − ŷ_g)² = 2·(3/14)² + 3·(2/7)² + 2·(3/14)²)
    expect(fit.anova.lackOfFit?.ss).toBeCloseTo(3 / 7, 12);
    expect(fit.anova.lackOfFit?.df).toBe(1);
    // derived by hand: F_LOF = (3/7)/1.5 = 2/7
    expect(fit.anova.lackOfFit?.f as number).toBeCloseTo(2 / 7, 12);
    expect(fit.anova.lackOfFit?.p as number).toBeGreaterThan(0.5);
  });

  it('leverage, residuals and PRESS (by hand and by leave-one-out refits)', () => {
    // derived by hand: h = 1/n + x²/Sxx = 1/7 + 1/4 = 11/28 at x = ±1, 1/7 at x = 0
    expect(fit.leverage[0]).toBeCloseTo(11 / 28, 12);
    expect(fit.leverage[2]).toBeCloseTo(1 / 7, 12);
    // derived by hand: residual of the first run 1 − (40/7 − 3.5) = −17/14
    expect(fit.residuals[0]).toBeCloseTo(-17 / 14, 12);
    expect(fit.predicted[0]).toBeCloseTo(40 / 7 - 3.5, 12);
    // derived by hand: PRESS = 2·(2² + (22/17)²) + (5/6)² + (1/3)² + (3/2)² = 8 + 968/289 + 55/18
    const pressByHand = 8 + 968 / 289 + 55 / 18;
    expect(fit.press as number).toBeCloseTo(pressByHand, 10);
    expect(fit.predR2 as number).toBeCloseTo(1 - pressByHand / (388 / 7), 10);
    // leave-one-out: refit without run i and predict it
    let pressByRefit = 0;
    for (let i = 0; i < smallRows.length; i++) {
      const others = smallRows.filter((_, j) => j !== i);
      const refit = fitSurface({ factors: smallFactors, rows: others, model: 'linear' });
      const deleted = smallRows[i].y - predict(refit, smallRows[i].factors).value;
      pressByRefit += deleted * deleted;
    }
    expect(relativeError(fit.press as number, pressByRefit)).toBeLessThan(1e-12);
  });

  it('reports the partial sum of squares of each term', () => {
    // derived by hand: a single term's partial SS equals the model SS, 49, F = 343/9
    expect(fit.anova.terms).toHaveLength(1);
    expect(fit.anova.terms[0].term).toBe('x');
    expect(fit.anova.terms[0].ss).toBeCloseTo(49, 10);
    expect(fit.anova.terms[0].f as number).toBeCloseTo(343 / 9, 10);
  });
});

describe('fitSurface: categorical factors, warnings and refusals', () => {
  // invented example: heat-treatment temperature and GDL type, each cell built twice (±0.1)
  const factors: Factor[] = [
    { key: 'temp', kind: 'continuous', low: 160, high: 180, unit: '°C' },
    { key: 'gdl', kind: 'categorical', levels: ['paper', 'cloth', 'felt'] },
  ];
  const offsets: Record<string, number> = { paper: 0, cloth: 1, felt: -2 };
  const rows: Observation[] = [];
  for (const gdl of ['paper', 'cloth', 'felt']) {
    for (const temp of [160, 170, 180]) {
      for (const noise of [0.1, -0.1]) {
        rows.push({ factors: { temp, gdl }, y: 2 + 3 * ((temp - 170) / 10) + offsets[gdl] + noise });
      }
    }
  }

  it('recovers treatment-coded effects exactly (cell means carry the fit) and converts to actual units', () => {
    const fit = fitSurface({ factors, rows, model: 'linear' });
    const byTerm = Object.fromEntries(fit.coefficients.map((c) => [c.term, c]));
    // derived by hand: y = 2 + 3·(temp − 170)/10 + {0, 1, −2}; the ±0.1 noise cancels in every cell
    expect(byTerm.intercept.coded).toBeCloseTo(2, 12);
    expect(byTerm.temp.coded).toBeCloseTo(3, 12);
    expect(byTerm['gdl[cloth]'].coded).toBeCloseTo(1, 12);
    expect(byTerm['gdl[felt]'].coded).toBeCloseTo(-2, 12);
    // derived by hand: actual slope 3/10 = 0.3 per °C, actual intercept 2 − 0.3·170 = −49
    expect(byTerm.temp.actual).toBeCloseTo(0.3, 12);
    expect(byTerm.intercept.actual).toBeCloseTo(-49, 10);
    expect(byTerm['gdl[felt]'].actual).toBeCloseTo(-2, 12);
    // derived by hand: pure error 9 cells × 2·0.1² = 0.18 on 9 df, and the fit is exact on cell means
    expect(fit.anova.pureError?.ss).toBeCloseTo(0.18, 12);
    expect(fit.anova.pureError?.df).toBe(9);
    expect(fit.anova.lackOfFit?.ss).toBeCloseTo(0, 10);
    // the gdl term has 2 df in the partial ANOVA
    const gdlRow = fit.anova.terms.find((row) => row.term === 'gdl');
    expect(gdlRow?.df).toBe(2);
  });

  it('warns about an aliased column and keeps fitting the rest', () => {
    // felt never built: its indicator column is all zeros, aliased with nothing and not estimable
    const noFelt = rows.filter((row) => row.factors.gdl !== 'felt');
    const fit = fitSurface({ factors, rows: noFelt, model: 'linear' });
    const felt = fit.coefficients.find((c) => c.term === 'gdl[felt]');
    expect(felt?.aliased).toBe(true);
    expect(felt?.coded).toBe(0);
    expect(felt?.codedSE).toBeNull();
    expect(fit.warnings.join(' ')).toMatch(/Aliased terms.*gdl: felt/);
    // derived by hand: same data model as above without the felt cells
    expect(fit.coefficients.find((c) => c.term === 'gdl[cloth]')?.coded).toBeCloseTo(1, 12);
  });

  it('detects perfectly collinear continuous factors (rank deficiency)', () => {
    const collinear: Factor[] = [
      { key: 'ptLoading', kind: 'continuous', low: 0.2, high: 1.0 },
      { key: 'inkVolume', kind: 'continuous', low: 10, high: 50 },
    ];
    // ink volume was always set from the loading: 50·loading, so the two columns coincide
    const data: Observation[] = [0.2, 0.4, 0.6, 0.8, 1.0, 0.6].map((loading, i) => ({
      factors: { ptLoading: loading, inkVolume: 50 * loading },
      y: 0.5 + 0.1 * loading + (i % 2 === 0 ? 0.01 : -0.01),
    }));
    const fit = fitSurface({ factors: collinear, rows: data, model: 'linear' });
    expect(fit.coefficients[2].aliased).toBe(true);
    expect(fit.coefficients[1].aliased).toBe(false);
    expect(fit.warnings.join(' ')).toMatch(/Aliased terms.*inkVolume/);
  });

  it('warns about high-leverage runs and uncovered ranges', () => {
    const lone: Observation[] = [
      ...[0, 0.1, 0.2, 0.3, 0.1, 0.2, 0, 0.3].map((x, i) => ({ factors: { x }, y: x + 0.01 * i, buildId: 10 + i })),
      { factors: { x: 1 }, y: 1.2, buildId: 99 },
    ];
    const fit = fitSurface({ factors: [{ key: 'x', kind: 'continuous', low: -1, high: 1 }], rows: lone, model: 'linear' });
    expect(fit.warnings.join(' ')).toMatch(/High-leverage runs.*row 9, build 99/);
    expect(fit.warnings.join(' ')).toMatch(/cover only 0–1 of the range -1–1/);
  });

  it('refuses to fit with no more runs than model columns (n ≤ p)', () => {
    const twoFactors: Factor[] = [
      { key: 'a', kind: 'continuous', low: -1, high: 1 },
      { key: 'b', kind: 'continuous', low: -1, high: 1 },
    ];
    const six: Observation[] = [[-1, -1], [1, -1], [-1, 1], [1, 1], [0, 0], [0, 1]].map(([a, b]) => ({ factors: { a, b }, y: a + b }));
    // derived by hand: the quadratic in 2 factors has 1 + 2 + 1 + 2 = 6 columns
    expect(() => fitSurface({ factors: twoFactors, rows: six, model: 'quadratic' })).toThrow(DoeInputError);
    expect(() => fitSurface({ factors: twoFactors, rows: six, model: 'quadratic' })).toThrow(/need more runs than model terms to estimate the error \(6 runs, 6 model columns/);
    let code: string | undefined;
    try {
      fitSurface({ factors: twoFactors, rows: six.slice(0, 5), model: 'quadratic' });
    } catch (error) {
      code = (error as DoeInputError).code;
    }
    expect(code).toBe('too-few-runs');
  });

  it('throws on bad factors and bad rows, naming the place', () => {
    const ok: Factor[] = [{ key: 'temp', kind: 'continuous', low: 160, high: 180 }];
    const data: Observation[] = [160, 170, 180, 175].map((temp) => ({ factors: { temp }, y: temp / 100 }));
    expect(() => fitSurface({ factors: [{ key: 'temp', kind: 'continuous', low: 180, high: 160 }], rows: data, model: 'linear' })).toThrow(/low must be a finite number below high/);
    expect(() => fitSurface({ factors: [{ key: 'temp', kind: 'continuous', low: 160 }], rows: data, model: 'linear' })).toThrow(/give both low and high/);
    expect(() => fitSurface({ factors: [...ok, ...ok], rows: data, model: 'linear' })).toThrow(/duplicate factor key "temp"/);
    expect(() => fitSurface({ factors: [{ key: 'gdl', kind: 'categorical', levels: [] }], rows: data, model: 'linear' })).toThrow(/at least one level/);
    expect(() => fitSurface({ factors: ok, rows: [...data, { factors: {}, y: 1, buildId: 7 }], model: 'linear' })).toThrow(/missing value for factor "temp" \(row 5, build 7\)/);
    expect(() => fitSurface({ factors: ok, rows: [...data, { factors: { temp: 170 }, y: Number.NaN }], model: 'linear' })).toThrow(/finite number \(row 5/);
    expect(() => fitSurface({ factors: ok, rows: [...data, { factors: { temp: '170' }, y: 1 }], model: 'linear' })).toThrow(/must be a finite number \(row 5/);
    expect(() => fitSurface({ factors, rows: [...rows, { factors: { temp: 170, gdl: 'mesh' }, y: 1 }], model: 'linear' })).toThrow(/"mesh" is not a level of factor "gdl"/);
    expect(() => fitSurface({ factors: ok, rows: [], model: 'linear' })).toThrow(/no observed runs/);
    expect(() => fitSurface({ factors: [], rows: data, model: 'linear' })).toThrow(/at least one factor/);
  });

  it('uses the data range when a continuous factor has no low/high', () => {
    const fit = fitSurface({
      factors: [{ key: 'x', kind: 'continuous' }],
      rows: smallRows.map((row) => ({ ...row, factors: { x: row.factors.x as number * 10 + 50 } })),
      model: 'linear',
    });
    // derived by hand: x runs 40…60, so centre 50, half-range 10, and the coded slope stays 3.5
    expect(fit.basis.factors[0].low).toBe(40);
    expect(fit.basis.factors[0].high).toBe(60);
    expect(fit.coefficients[1].coded).toBeCloseTo(3.5, 12);
    expect(fit.coefficients[1].actual).toBeCloseTo(0.35, 12);
  });
});

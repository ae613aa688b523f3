import { describe, it, expect } from 'vitest';
import { generateDesign, orthogonalAlpha, rotatableAlpha } from '../../../shared/doe/designs';
import type { Design, DesignFactor } from '../../../shared/doe/designs';

function factors(count: number): DesignFactor[] {
  // Invented HT-PEM electrode factors (binder wt %, cell °C, loading mg/cm², …), ranges made up.
  const base: DesignFactor[] = [
    { key: 'binderWt', kind: 'continuous', low: 10, high: 30 },
    { key: 'cellC', kind: 'continuous', low: 160, high: 200 },
    { key: 'loadingMgCm2', kind: 'continuous', low: 0.5, high: 1.5 },
    { key: 'acidDoping', kind: 'continuous', low: 8, high: 12 },
    { key: 'hotPressMin', kind: 'continuous', low: 2, high: 10 },
  ];
  return base.slice(0, count);
}

function codedMatrix(design: Design): number[][] {
  const keys = design.factorKeys;
  return design.runs.map((run) => keys.map((key) => run.coded[key] as number));
}

function centredSquareColumns(design: Design): number[][] {
  const rows = codedMatrix(design);
  const k = design.factorKeys.length;
  const columns: number[][] = [];
  for (let factor = 0; factor < k; factor++) {
    const squares = rows.map((row) => (row[factor] as number) ** 2);
    const mean = squares.reduce((sum, value) => sum + value, 0) / squares.length;
    columns.push(squares.map((value) => value - mean));
  }
  return columns;
}

describe('central composite design', () => {
  it('rotatable α = (2^k)^(1/4): 1.414, 1.682, 2.000 for k = 2, 3, 4', () => {
    // NIST/SEMATECH e-Handbook §5.3.3.6.1, table of rotatable α: 1.414 (k=2), 1.682 (k=3), 2.000 (k=4)
    const expected: Record<number, number> = { 2: 1.414, 3: 1.682, 4: 2.0 };
    for (const k of [2, 3, 4]) {
      const design = generateDesign({ kind: 'central-composite', factors: factors(k), centerPoints: 4, seed: 1 });
      expect(design.info.alpha).toBeCloseTo(expected[k] as number, 3);
      const axial = design.runs.filter((run) => run.pointType === 'axial');
      for (const run of axial) {
        const nonZero = design.factorKeys.map((key) => run.coded[key] as number).filter((value) => value !== 0);
        expect(nonZero.length).toBe(1); // derived by hand: a star point moves one factor only
        expect(Math.abs(nonZero[0] as number)).toBeCloseTo(expected[k] as number, 3);
      }
    }
    expect(rotatableAlpha(16)).toBe(2); // derived by hand: 16^(1/4) = 2
  });

  it('three factors: 8 factorial + 6 axial + centre runs', () => {
    const design = generateDesign({ kind: 'central-composite', factors: factors(3), centerPoints: 6, seed: 12 });
    // NIST/SEMATECH e-Handbook §5.3.3.6.1: a 3-factor CCD has 2^3 = 8 factorial, 2·3 = 6 axial, plus centre runs
    expect(design.info.runsByType).toEqual({ factorial: 8, axial: 6, centre: 6 });
    expect(design.runs.length).toBe(20); // derived by hand: 8 + 6 + 6
    expect(design.info.factorialRuns).toBe(8);
    expect(design.info.axialRuns).toBe(6);
  });

  it('face-centred puts the axial points on the faces (α = 1)', () => {
    const design = generateDesign({ kind: 'central-composite', factors: factors(3), variant: 'face-centred', centerPoints: 2, seed: 3 });
    expect(design.info.alpha).toBe(1); // NIST/SEMATECH e-Handbook §5.3.3.6.1: face-centred CCD has α = ±1
    for (const row of codedMatrix(design)) for (const value of row) expect(Math.abs(value)).toBeLessThanOrEqual(1);
    expect(design.warnings.some((warning) => warning.startsWith('Settings beyond low/high'))).toBe(false);
  });

  it('inscribed keeps axial points at ±1 and shrinks the factorial to ±1/α', () => {
    const design = generateDesign({ kind: 'central-composite', factors: factors(2), variant: 'inscribed', centerPoints: 3, seed: 3 });
    const alpha = Math.SQRT2; // NIST/SEMATECH e-Handbook §5.3.3.6.1: rotatable α for k = 2 is √2 = 1.414
    for (const run of design.runs) {
      const values = design.factorKeys.map((key) => Math.abs(run.coded[key] as number));
      if (run.pointType === 'axial') expect(Math.max(...values)).toBeCloseTo(1, 12); // NIST §5.3.3.6.1: CCI star points at the limits
      if (run.pointType === 'factorial') for (const value of values) expect(value).toBeCloseTo(1 / alpha, 12); // derived by hand: 1/√2 = 0.7071
    }
    const binder = design.runs.find((run) => run.pointType === 'factorial')?.actual.binderWt as number;
    expect([20 - 10 / alpha, 20 + 10 / alpha].some((value) => Math.abs(value - binder) < 1e-9)).toBe(true); // derived by hand: centre 20 ± 10/√2 wt %
  });

  it('orthogonal α makes the centred quadratic columns orthogonal', () => {
    for (const [k, centerPoints] of [
      [2, 1],
      [2, 5],
      [3, 4],
      [3, 6],
      [4, 2],
    ] as const) {
      const design = generateDesign({ kind: 'central-composite', factors: factors(k), alpha: 'orthogonal', centerPoints, seed: 9 });
      const columns = centredSquareColumns(design);
      for (let first = 0; first < k; first++) {
        for (let second = first + 1; second < k; second++) {
          const dot = (columns[first] as number[]).reduce((sum, value, run) => sum + value * ((columns[second] as number[])[run] as number), 0);
          expect(Math.abs(dot)).toBeLessThan(1e-9); // derived by hand: zero covariance is what defines the orthogonal α (see orthogonalAlpha)
        }
      }
    }
    // derived by hand: F = 4, k = 2, n0 = 1 → N = 9, (√9 − √4)² · 4 / 4 = 1, α = 1 (the 3² grid)
    expect(orthogonalAlpha(4, 2, 1)).toBeCloseTo(1, 12);
    // derived by hand: F = 8, k = 3, n0 = 6 → N = 20, √20 − √8 = 4.4721 − 2.8284 = 1.6437, 1.6437² · 8 / 4 = 5.4036, α = 5.4036^(1/4) = 1.5246
    expect(orthogonalAlpha(8, 3, 6)).toBeCloseTo(1.5246, 4);
  });

  it('a rotatable CCD is not orthogonal in general (the check above is not vacuous)', () => {
    const design = generateDesign({ kind: 'central-composite', factors: factors(3), alpha: 'rotatable', centerPoints: 6, seed: 9 });
    const columns = centredSquareColumns(design);
    const dot = (columns[0] as number[]).reduce((sum, value, run) => sum + value * ((columns[1] as number[])[run] as number), 0);
    expect(Math.abs(dot)).toBeGreaterThan(0.1); // derived by hand: F − (F + 2α²)²/N = 8 − (8 + 5.657)²/20 = −1.33 ≠ 0
  });

  it('uses a fractional factorial part when generators are given, and warns below resolution V', () => {
    const half = generateDesign({ kind: 'central-composite', factors: factors(5), generators: ['E=ABCD'], centerPoints: 6, seed: 4 });
    expect(half.info.runsByType).toEqual({ factorial: 16, axial: 10, centre: 6 }); // derived by hand: 2^(5−1) = 16, 2·5 = 10
    expect(half.info.alpha).toBeCloseTo(2.0, 3); // NIST/SEMATECH e-Handbook §5.3.3.6.1: k = 5 half fraction, α = 16^(1/4) = 2.000
    expect(half.warnings.some((warning) => warning.includes('resolution'))).toBe(false);
    const quarter = generateDesign({ kind: 'central-composite', factors: factors(5), generators: ['D=AB', 'E=AC'], centerPoints: 3, seed: 4 });
    expect(quarter.warnings.some((warning) => warning.includes('resolution III'))).toBe(true);
  });

  it('warns when circumscribed axial settings leave the low/high range or go negative', () => {
    const design = generateDesign({
      kind: 'central-composite',
      factors: [
        { key: 'loadingMgCm2', kind: 'continuous', low: 0.1, high: 1.1 },
        { key: 'cellC', kind: 'continuous', low: 160, high: 200 },
        { key: 'binderWt', kind: 'continuous', low: 5, high: 25 },
      ],
      centerPoints: 4,
      seed: 5,
    });
    // derived by hand: centre 0.6 − 1.682 · 0.5 = −0.24 mg/cm², physically impossible
    expect(design.warnings.some((warning) => warning.startsWith('Negative settings') && warning.includes('loadingMgCm2'))).toBe(true);
    expect(design.warnings.some((warning) => warning.startsWith('Settings beyond low/high'))).toBe(true);
  });

  it('throws for bad input', () => {
    expect(() => generateDesign({ kind: 'central-composite', factors: factors(1) })).toThrow('generateDesign: factors: a central composite design needs at least 2 continuous factors, got 1');
    expect(() => generateDesign({ kind: 'central-composite', factors: factors(3), variant: 'spherical' as never })).toThrow("generateDesign: variant: must be 'circumscribed', 'inscribed' or 'face-centred'");
    expect(() => generateDesign({ kind: 'central-composite', factors: factors(3), alpha: -1 })).toThrow("generateDesign: alpha: must be 'rotatable', 'orthogonal' or a positive number, got -1");
    expect(() => generateDesign({ kind: 'central-composite', factors: factors(3), generators: ['C=AZ'] })).toThrow('names factor letter Z');
    expect(() => orthogonalAlpha(0, 2, 1)).toThrow('orthogonalAlpha: factorialRuns: must be a positive number');
    expect(() => rotatableAlpha(Number.NaN)).toThrow(RangeError);
  });
});

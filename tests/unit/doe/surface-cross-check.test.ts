// Independent cross-check of the coded-unit surface fit: ml-regression-multivariate-linear (normal
// equations through ml-matrix's solver) on the same coded model matrix must give the same
// coefficients as fitSurface's Householder QR on a well-conditioned central composite design.
import { describe, expect, it } from 'vitest';
import MLR from 'ml-regression-multivariate-linear';
import { fitSurface } from '../../../shared/doe/model';
import type { Factor, Observation } from '../../../shared/doe/model';
import { mulberry32 } from '../../../shared/stats/random';

// An invented three-factor electrode recipe; rotatable CCD (α = 8^(1/4) ≈ 1.682, derived by hand),
// 8 cube + 6 axial + 6 centre runs.
const FACTORS: Factor[] = [
  { key: 'binder', kind: 'continuous', low: 20, high: 40, unit: 'wt %' },
  { key: 'pressTemp', kind: 'continuous', low: 130, high: 170, unit: '°C' },
  { key: 'loading', kind: 'continuous', low: 0.6, high: 1.2, unit: 'mg/cm²' },
];
const ALPHA = Math.pow(8, 0.25);
const CODED: number[][] = [];
for (const a of [-1, 1]) for (const b of [-1, 1]) for (const c of [-1, 1]) CODED.push([a, b, c]);
for (let f = 0; f < 3; f++) for (const s of [-ALPHA, ALPHA]) CODED.push([0, 1, 2].map((k) => (k === f ? s : 0)));
for (let i = 0; i < 6; i++) CODED.push([0, 0, 0]);

// invented true surface (coded units, V) plus 2 mV seeded noise
const random = mulberry32(2026);
const truth = ([a, b, c]: number[]) => 0.62 + 0.011 * a - 0.006 * b + 0.004 * c - 0.009 * a * a - 0.003 * b * b - 0.002 * c * c + 0.0025 * a * b - 0.0015 * b * c + 0.001 * a * c;
const Y = CODED.map((x) => truth(x) + 0.002 * (random() + random() + random() - 1.5));
const ROWS: Observation[] = CODED.map(([a, b, c], i) => ({ factors: { binder: 30 + 10 * a, pressTemp: 150 + 20 * b, loading: 0.9 + 0.3 * c }, y: Y[i]! }));

describe('coded-unit surface fit, cross-checked with ml-regression-multivariate-linear', () => {
  it('agrees to 1e-8 on every coefficient of the full quadratic', () => {
    const fit = fitSurface({ factors: FACTORS, rows: ROWS, model: 'quadratic', responseKey: 'vAtRef' });
    const ours = Object.fromEntries(fit.coefficients.map((c) => [c.term, c.coded]));
    // the same model in the same coded units, built here by hand: linear, interaction and square terms
    const columns: [string, (x: number[]) => number][] = [
      ['binder', (x) => x[0]!], ['pressTemp', (x) => x[1]!], ['loading', (x) => x[2]!],
      ['binder*pressTemp', (x) => x[0]! * x[1]!], ['binder*loading', (x) => x[0]! * x[2]!], ['pressTemp*loading', (x) => x[1]! * x[2]!],
      ['binder^2', (x) => x[0]! ** 2], ['pressTemp^2', (x) => x[1]! ** 2], ['loading^2', (x) => x[2]! ** 2],
    ];
    const mlr = new MLR(CODED.map((x) => columns.map(([, f]) => f(x))), Y.map((y) => [y]), { intercept: true });
    const weights = mlr.weights.map((w) => w[0]!);
    expect(Object.keys(ours).sort()).toEqual(['intercept', ...columns.map(([term]) => term)].sort());
    columns.forEach(([term], index) => expect(Math.abs(ours[term]! - weights[index]!), term).toBeLessThan(1e-8));
    expect(Math.abs(ours.intercept! - weights[columns.length]!)).toBeLessThan(1e-8);
  });
});

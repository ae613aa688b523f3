// Benchmark: a full-quadratic response-surface fit on 500 invented builds (4 continuous factors
// and one categorical factor of 3 levels) plus 10 proposals, against the bare least-squares
// solve of the same coded model matrix by ml-matrix. Aim: the whole call under 100 ms.
import { Matrix, solve } from 'ml-matrix';
import { encodePoint, fitSurface, modelRow, proposeBuilds, type Factor, type Observation } from '../shared/doe/index';
import { mulberry32 } from '../shared/stats/random';

const FACTORS: Factor[] = [
  { key: 'binder', kind: 'continuous', low: 10, high: 40, unit: 'wt %' },
  { key: 'activationTemp', kind: 'continuous', low: 300, high: 380, unit: '°C' },
  { key: 'activationTime', kind: 'continuous', low: 1, high: 4, unit: 'h' },
  { key: 'cellTemp', kind: 'continuous', low: 160, high: 200, unit: '°C' },
  { key: 'gdl', kind: 'categorical', levels: ['woven carbon', 'carbon paper', 'felt'] },
];

/** 500 invented builds: a smooth made-up V at j_ref (V) with a ridge, a GDL offset and 3 mV noise. */
function inventBuilds(count: number, seed: number): Observation[] {
  const random = mulberry32(seed);
  const rows: Observation[] = [];
  const gdlOffset: Record<string, number> = { 'woven carbon': 0, 'carbon paper': -0.006, felt: 0.004 };
  for (let i = 0; i < count; i++) {
    const binder = 10 + 30 * random();
    const activationTemp = 300 + 80 * random();
    const activationTime = 1 + 3 * random();
    const cellTemp = 160 + 40 * random();
    const gdl = FACTORS[4]!.levels![Math.floor(random() * 3)]!;
    const b = (binder - 28) / 15;
    const t = (activationTemp - 350) / 40;
    const noise = (random() + random() + random() - 1.5) * 0.006;
    const y = 0.58 - 0.02 * b * b - 0.015 * t * t + 0.004 * b * t + 0.003 * (activationTime - 2.5) + 0.0006 * (cellTemp - 180) + gdlOffset[gdl]! + noise;
    rows.push({ factors: { binder, activationTemp, activationTime, cellTemp, gdl }, y, buildId: i + 1 });
  }
  return rows;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

export async function benchFitProposals(options: { repeats?: number } = {}): Promise<{ name: string; medianMs: number; baselineMedianMs: number; ratio: number; details: Record<string, number | string> }> {
  const repeats = options.repeats ?? 15;
  const rows = inventBuilds(500, 20261124);
  // one untimed fit for the model matrix of the baseline and to warm the JIT
  const warm = fitSurface({ factors: FACTORS, rows, model: 'quadratic', responseKey: 'vAtRef' });
  proposeBuilds({ fit: warm, goal: 'maximize', count: 10, strategy: 'balance', seed: 3 });
  const design = rows.map((row) => modelRow(warm.basis.columns, encodePoint('bench', warm.basis.factors, row.factors)));
  const X = new Matrix(design);
  const y = Matrix.columnVector(rows.map((row) => row.y));
  solve(X, y);

  const ours: number[] = [];
  const fitOnly: number[] = [];
  const baseline: number[] = [];
  let proposals = 0;
  for (let r = 0; r < repeats; r++) {
    const started = performance.now();
    const fit = fitSurface({ factors: FACTORS, rows, model: 'quadratic', responseKey: 'vAtRef' });
    const fitted = performance.now();
    proposals = proposeBuilds({ fit, goal: 'maximize', count: 10, strategy: 'balance', seed: 3 + r }).length;
    ours.push(performance.now() - started);
    fitOnly.push(fitted - started);
    const baseStart = performance.now();
    solve(X, y);
    baseline.push(performance.now() - baseStart);
  }
  const medianMs = median(ours);
  const baselineMedianMs = median(baseline);
  return {
    name: 'surface fit (quadratic, 5 factors, 500 builds) + 10 proposals',
    medianMs,
    baselineMedianMs,
    ratio: medianMs / baselineMedianMs,
    details: {
      builds: rows.length,
      modelColumns: warm.basis.columns.length,
      proposals,
      repeats,
      fitMedianMs: median(fitOnly),
      proposalsMedianMs: median(ours.map((t, i) => t - fitOnly[i]!)),
      targetMs: 100,
      baseline: 'ml-matrix solve (QR least squares) of the same coded model matrix',
    },
  };
}

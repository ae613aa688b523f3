// The project's benchmark as a polarization plot draws it (the plot's `benchmark` prop), unless the
// plot already draws the benchmark build's curve. The badge and the difference switch live in
// src/components/ui/benchmark-badge.tsx, the difference numbers in src/lib/benchmark-difference.ts.
import type { CurvePoints } from '@shared/api-types';
import type { BenchmarkView } from '../api/benchmarks';

/** The benchmark's curve for a plot, unless the plot already draws it (its build or its curve). */
export function benchmarkForPlot(benchmark: BenchmarkView | null | undefined, drawn: { buildIds?: number[]; curveIds?: number[] } = {}): { name: string; points: CurvePoints } | null {
  if (!benchmark?.points) return null;
  if (benchmark.kind === 'build' && benchmark.curveId != null && drawn.curveIds?.includes(benchmark.curveId)) return null;
  if (benchmark.kind === 'build' && benchmark.buildId != null && drawn.buildIds?.includes(benchmark.buildId) && !drawn.curveIds) return null;
  return { name: `Benchmark: ${benchmark.label}`, points: { ...benchmark.points, downsampled: false, total: benchmark.points.v.length } };
}


// Small pieces every page uses with the project's benchmark: its trace for a polarization plot,
// the badge on the benchmark build, the "difference from benchmark" switch and its numbers.
import type { BenchmarkView } from '../api/benchmarks';
import type { PlotBenchmark } from '@/features/curves/components/polarization-plot';
import { formatNumber, METRICS, type ResponseDisplay } from '@/lib/format';

/** The benchmark's curve for a plot, unless the plot already draws it (its build or its curve). */
export function benchmarkForPlot(benchmark: BenchmarkView | null | undefined, drawn: { buildIds?: number[]; curveIds?: number[] } = {}): PlotBenchmark | null {
  if (!benchmark?.points) return null;
  if (benchmark.kind === 'build' && benchmark.curveId != null && drawn.curveIds?.includes(benchmark.curveId)) return null;
  if (benchmark.kind === 'build' && benchmark.buildId != null && drawn.buildIds?.includes(benchmark.buildId) && !drawn.curveIds) return null;
  return { name: `Benchmark: ${benchmark.label}`, points: { ...benchmark.points, downsampled: false, total: benchmark.points.v.length } };
}

export function BenchmarkBadge({ note }: { note?: string }) {
  return (
    <span title={note || 'The project’s benchmark: every polarization plot of the project can show it.'} className="inline-flex items-center gap-1 rounded-full border border-ink-300 bg-paper px-2 py-0.5 text-xs font-medium text-ink-700">
      <svg aria-hidden width="10" height="10" viewBox="0 0 10 10"><path d="M1 5h8" stroke="currentColor" strokeWidth="1.6" strokeDasharray="2.2 1.4" /></svg>
      Benchmark
    </span>
  );
}

/** "Values as difference from benchmark": off when the project has no benchmark. */
export function DifferenceToggle({ benchmark, checked, onChange }: { benchmark: BenchmarkView | null | undefined; checked: boolean; onChange: (on: boolean) => void }) {
  if (!benchmark) return null;
  return (
    <label className="inline-flex items-center gap-1.5 text-sm" title={`Each value less the benchmark’s (${benchmark.label})`}>
      <input type="checkbox" checked={checked} onChange={(e) => onChange(e.target.checked)} /> Values as difference from benchmark ({benchmark.label})
    </label>
  );
}

/** value − benchmark value, or null when either is missing. */
export function differenceFromBenchmark(benchmark: BenchmarkView | null | undefined, key: string, value: number | null | undefined): number | null {
  const base = benchmark?.values[key];
  if (value == null || base == null || !Number.isFinite(value) || !Number.isFinite(base)) return null;
  return value - base;
}

/** A difference in a display unit with its sign: "+12.3 mV", "−4.0 mV", "±0.0 mV". */
export function formatDifference(display: Pick<ResponseDisplay, 'unit' | 'scale' | 'digits'>, difference: number | null): string {
  if (difference == null || !Number.isFinite(difference)) return '—';
  const scaled = difference * display.scale;
  const text = formatNumber(Math.abs(scaled), display.digits);
  const sign = Number(Math.abs(scaled).toFixed(display.digits)) === 0 ? '±' : scaled > 0 ? '+' : '−';
  return `${sign}${text}${display.unit ? ` ${display.unit}` : ''}`;
}

/** A curve metric's difference from the benchmark in the metric's display unit. */
export function formatMetricDifference(key: string, difference: number | null): string {
  const info = METRICS[key];
  return formatDifference(info ? { unit: info.unit, scale: info.scale, digits: info.digits } : { unit: '', scale: 1, digits: 3 }, difference);
}

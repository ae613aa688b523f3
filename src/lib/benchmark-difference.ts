// Values as differences from the project's benchmark: value − the benchmark's, written with its
// sign in a display unit. Pure; used by the builds table, compare and gains.
import type { BenchmarkView } from '@shared/schemas/benchmarks';
import { formatNumber, METRICS, type ResponseDisplay } from '@/lib/format';

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

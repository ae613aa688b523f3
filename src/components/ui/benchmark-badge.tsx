// The mark of the project's benchmark build and the switch that shows values as differences from
// the benchmark: plain pieces any page or feature can place.
import type { BenchmarkView } from '@shared/schemas/benchmarks';

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


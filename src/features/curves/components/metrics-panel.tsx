// Metrics of one polarization curve with units, conditions and method on hover; a what-if
// reference point recomputes them instantly in the browser with the same shared code.
import { useMemo, useState } from 'react';
import type { CurvePoints, CurveSummary, ProjectSettings } from '@shared/api-types';
import type { CurveMetrics, MetricsResult } from '@shared/curves/types';
import { polarizationMetrics } from '@shared/curves';
import { metricsOfKind } from '@shared/curves/metric-catalogue';
import { METRICS, formatMetric, formatNumber, formatQuantity, massActivityLabel } from '@/lib/format';
import { Hint } from '@/components/ui/hint';

/** Catalogue order of the metrics a polarization curve carries. */
const ORDER = metricsOfKind('polarization');

/** How a metric was obtained, for people: the method, its inputs with units, the reference point. */
export function methodText(result: Pick<MetricsResult, 'method' | 'metricNotes'>, key: string, settings: ProjectSettings) {
  const m = result.method[key as keyof CurveMetrics];
  const inputs = m ? Object.entries(m.inputs).map(([k, v]) => formatQuantity(k, v)).join(' · ') : '';
  const reference = `reference point: j_ref ${formatNumber(settings.refCurrentDensity, 3)} A/cm², V_ref ${formatNumber(settings.refVoltage, 3)} V${settings.irFree ? ', iR-free' : ''}, ${settings.loadingBasis} loading basis`;
  return [m?.method ? `${m.method[0]!.toUpperCase()}${m.method.slice(1)}.` : null, inputs, reference].filter(Boolean).join('\n');
}

const missing = (value: number | null): number => (value == null ? Number.NaN : value);

/** Mass activity per mg of metal (A/mg) from A/g, three significant digits. */
function perMilligram(valueAPerG: number): string {
  return `${Number((valueAPerG / 1000).toPrecision(3))} A/mg metal`;
}

export function MetricsList({ result, settings }: { result: Pick<MetricsResult, 'metrics' | 'metricNotes' | 'method'> & { summary?: Record<string, unknown> }; settings: ProjectSettings }) {
  const crossover = typeof result.summary?.h2CrossoverMAcm2 === 'number' ? result.summary.h2CrossoverMAcm2 : null;
  return (
    <>
      <div className="grid grid-cols-2 gap-x-6 gap-y-2 sm:grid-cols-3" role="list" aria-label="Metrics at the reference point">
        {ORDER.map((key) => {
          const value = result.metrics[key];
          const note = result.metricNotes[key];
          return (
            <Hint key={key} hint={methodText(result, key, settings)} role="listitem">
              <div className="text-xs text-ink-500">{key === 'massActivity' ? massActivityLabel(settings) : METRICS[key]!.label}</div>
              <div className="num text-[15px] text-ink-950">{value == null ? <span className="text-ink-500">— <span className="sr-only">not available</span></span> : formatMetric(key, value)}</div>
              {key === 'massActivity' && value != null && settings.loadingBasis === 'metal' && <div className="num whitespace-nowrap text-[12px] text-ink-700">{perMilligram(value)}</div>}
              {note && <div className={`text-[11px] leading-tight ${value == null ? 'text-amber-700' : 'text-ink-500'}`}>{note}</div>}
            </Hint>
          );
        })}
      </div>
      {crossover != null && (
        <p className="mt-2 text-[11px] text-ink-500">H₂ crossover of {crossover} mA/cm² (from the build’s test conditions) added to the cell current for the Tafel slope, mass activity and iR-free j at V_ref.</p>
      )}
    </>
  );
}

export function WhatIfReference({ curve, points, settings, loading }: { curve: CurveSummary; points: CurvePoints; settings: ProjectSettings; loading: { loadingMgCm2: number | null; metalLoadingMgCm2: number | null } }) {
  const [jRef, setJRef] = useState(settings.refCurrentDensity);
  const [vRef, setVRef] = useState(settings.refVoltage);
  const data = useMemo(
    // JSON carries missing readings as null: keep them missing (NaN), not 0
    () => ({ kind: curve.kind, j: Float64Array.from(points.j ?? []), v: Float64Array.from(points.v, missing), hfr: points.hfr ? Float64Array.from(points.hfr, missing) : undefined, vIrFree: points.vIrFree ? Float64Array.from(points.vIrFree, missing) : undefined }),
    [curve, points],
  );
  const maxJ = Math.max(0.05, ...Array.from(data.j));
  const crossoverAcm2 = typeof curve.summary.h2CrossoverMAcm2 === 'number' ? curve.summary.h2CrossoverMAcm2 / 1000 : 0;
  const what = useMemo(() => {
    try {
      return polarizationMetrics(data, { ...settings, refCurrentDensity: jRef, refVoltage: vRef }, loading, { h2CrossoverAcm2: crossoverAcm2 });
    } catch {
      return null;
    }
  }, [data, settings, jRef, vRef, loading, crossoverAcm2]);
  return (
    <div className="rounded-md border border-line bg-paper/50 p-3">
      <div className="mb-2 text-xs font-semibold text-ink-700">What if the reference point were…</div>
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="text-xs text-ink-700">
          j_ref <span className="num">{jRef.toFixed(3)} A/cm²</span>
          <input aria-label="What-if reference current density" type="range" min={0.01} max={Math.round(maxJ * 100) / 100} step={0.005} value={jRef} onChange={(e) => setJRef(Number(e.target.value))} className="w-full accent-copper-600" />
        </label>
        <label className="text-xs text-ink-700">
          V_ref <span className="num">{vRef.toFixed(3)} V</span>
          <input aria-label="What-if reference voltage" type="range" min={0.2} max={1.0} step={0.005} value={vRef} onChange={(e) => setVRef(Number(e.target.value))} className="w-full accent-copper-600" />
        </label>
      </div>
      {what && (
        <div className="mt-2 grid grid-cols-2 gap-2 text-sm sm:grid-cols-4">
          {(['vAtRef', 'vAtRefIrFree', 'jAtRef', 'massActivity'] as const).map((k) => (
            <div key={k}>
              <div className="text-[11px] text-ink-500">{METRICS[k]!.label}</div>
              <div className="num">{formatMetric(k, what.metrics[k])}</div>
            </div>
          ))}
        </div>
      )}
      <p className="mt-2 text-[11px] text-ink-500">Computed in your browser with the same code as the server. The stored metrics change only when a PI changes the project’s reference point in Settings.</p>
    </div>
  );
}

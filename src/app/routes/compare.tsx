// Compare view: overlay the polarization curves of chosen builds; legend by code and change
// note; export the plot (PNG/SVG) and exactly the points shown (CSV). It opens on the lineage's
// best path (baseline → best build) until the user picks builds of their own.
import type { TestConditions } from '@shared/api-types';
import { useMemo, useState } from 'react';
import { useParams, useSearchParams } from 'react-router-dom';
import { useQueries } from '@tanstack/react-query';
import { useProject } from '@/features/projects/api/projects';
import { useBuildBriefs, buildQueryOptions } from '@/features/builds/api/builds';
import { curveQueryOptions } from '@/features/curves/api/curves';
import { PolarizationPlot, type PlotSeries } from '@/features/curves/components/polarization-plot';
import { useLineage } from '@/features/lineage/api/get-lineage';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Button } from '@/components/ui/button';
import { METRICS, formatMetric, formatNumber } from '@/lib/format';
import { comparedCurvesCsv } from '@/features/curves/components/compare-csv';
import type { CurveMetricKey } from '@shared/curves/metric-catalogue';
import { useBenchmark } from '@/features/benchmarks/api/benchmarks';
import { useTargets } from '@/features/targets/api/targets';
import { targetLinesFor } from '@/features/targets/components/target-lines';
import { benchmarkForPlot } from '@/features/benchmarks/components/benchmark-parts';
import { DifferenceToggle } from '@/components/ui/benchmark-badge';
import { differenceFromBenchmark, formatMetricDifference } from '@/lib/benchmark-difference';

/** The metrics side by side in the comparison table (catalogue keys, catalogue order). */
const COMPARED_METRICS: CurveMetricKey[] = ['vAtRef', 'vAtRefIrFree', 'massActivity', 'peakPower', 'hfr', 'tafelSlope'];

/** The conditions the chosen builds share, or their spread ("160–180 °C"). */
function sharedConditions(all: (TestConditions | null | undefined)[], settings: { refCurrentDensity: number; refVoltage: number }): string {
  const range = (values: (number | null | undefined)[], unit: string) => {
    const v = values.filter((x): x is number => typeof x === 'number');
    if (v.length === 0) return null;
    const lo = Math.min(...v), hi = Math.max(...v);
    return lo === hi ? `${formatNumber(lo, 0)} ${unit}` : `${formatNumber(lo, 0)}–${formatNumber(hi, 0)} ${unit}`;
  };
  const gases = [...new Set(all.map((c) => (c?.anodeGas && c?.cathodeGas ? `${c.anodeGas}/${c.cathodeGas}` : null)).filter(Boolean))];
  return [range(all.map((c) => c?.temperatureC), '°C'), gases.join(', ') || null, range(all.map((c) => c?.backPressureKPa), 'kPa(g)'), `j_ref ${formatNumber(settings.refCurrentDensity, 2)} A/cm²`, `V_ref ${formatNumber(settings.refVoltage, 2)} V`].filter(Boolean).join(' · ');
}

export default function ComparePage() {
  const projectId = Number(useParams().projectId);
  const [params, setParams] = useSearchParams();
  const project = useProject(projectId);
  const builds = useBuildBriefs(projectId);
  const lineage = useLineage(projectId, 'vAtRef');
  const benchmark = useBenchmark(projectId);
  const targets = useTargets(projectId);
  const [asDifference, setAsDifference] = useState(false);
  const chosen = params.get('builds');
  const withCurveIds = new Set((builds.data ?? []).filter((b) => b.curveCount > 0).map((b) => b.id));
  const bestPath = (lineage.data?.bestPath?.buildIds ?? []).filter((id) => withCurveIds.has(id));
  // without a choice in the address: the best path, else the first few builds with curves
  const fallback = bestPath.length > 0 ? bestPath : [...withCurveIds].slice(0, 4);
  const fromBestPath = chosen == null && bestPath.length > 0;
  const ids = chosen != null ? chosen.split(',').map(Number).filter((n) => n > 0) : fallback;
  const details = useQueries({ queries: ids.map((id) => buildQueryOptions(id)) });
  // each build's polarization curve of record: the curve its values come from
  const curveIds = details.map((d) => (d.data?.curves.find((c) => c.kind === 'polarization' && c.isRecord) ?? d.data?.curves.find((c) => c.kind === 'polarization'))?.id).filter((x): x is number => x != null);
  const curves = useQueries({ queries: curveIds.map((id) => curveQueryOptions(id)) });

  const series: PlotSeries[] = useMemo(() => curves.flatMap((c) => {
    if (!c.data) return [];
    const d = details.find((x) => x.data?.build.id === c.data!.curve.buildId)?.data;
    return [{ name: `${d?.build.code ?? c.data.curve.buildId}${d?.build.changeNote ? ` (${d.build.changeNote})` : ''}`, points: c.data.points }];
  }), [curves, details]);

  if (project.isLoading || builds.isLoading || (chosen == null && lineage.isLoading)) return <Loading />;
  if (project.error || builds.error) return <ErrorNote error={project.error ?? builds.error} />;
  const toggle = (id: number) => {
    const next = ids.includes(id) ? ids.filter((x) => x !== id) : [...ids, id];
    setParams({ builds: next.join(',') });
  };
  const exportCsv = () => {
    const blob = new Blob([comparedCurvesCsv(series)], { type: 'text/csv' });
    const a = document.createElement('a');
    a.href = URL.createObjectURL(blob);
    a.download = 'cellwright-compare.csv';
    a.click();
    URL.revokeObjectURL(a.href);
  };
  const withCurves = builds.data!.filter((b) => b.curveCount > 0);
  const codeOf = new Map(builds.data!.map((b) => [b.id, b.code]));

  return (
    <div className="max-w-7xl">
      <PageHeader eyebrow={project.data!.name} title="Compare polarization curves" subtitle="Pick builds on the left; the overlay, the metrics table and the exports follow your choice. The address keeps the selection, so it can be shared." actions={series.length > 0 ? <Button onClick={exportCsv}>Export CSV</Button> : undefined} />
      {fromBestPath && (
        <p role="status" className="mb-3 text-sm text-ink-700">
          Showing the best path of the lineage by V at j_ref: {ids.map((id) => codeOf.get(id) ?? id).join(' → ')}. Tick or untick builds to compare others{' '}
          <button type="button" className="text-copper-700 underline" onClick={() => setParams({ builds: '' })}>or start from none</button>.
        </p>
      )}
      <div className="grid gap-4 lg:grid-cols-[14rem_minmax(0,1fr)]">
        <Panel title="Builds" bodyClassName="max-h-[36rem] overflow-y-auto p-2">
          <ul className="space-y-0.5 text-sm">
            {withCurves.map((b) => (
              <li key={b.id}>
                <label className="flex items-start gap-2 rounded px-1.5 py-1 hover:bg-paper">
                  <input type="checkbox" className="mt-0.5" checked={ids.includes(b.id)} onChange={() => toggle(b.id)} aria-label={`Compare ${b.code}`} />
                  <span><span className="font-medium">{b.code}</span> <span className="block text-xs text-ink-500">{b.changeNote}</span></span>
                </label>
              </li>
            ))}
          </ul>
        </Panel>
        <div className="space-y-4">
          <Panel>
            {ids.length === 0 ? <EmptyState title="Choose builds to overlay">{withCurves.length ? 'Tick two or more builds with polarization curves.' : 'No build has a polarization curve yet: upload one from a build page or the Upload page.'}</EmptyState>
              : curves.some((c) => c.isLoading) || details.some((d) => d.isLoading) ? <Loading label="Loading curves…" />
              : <PolarizationPlot series={series} settings={project.data!.settings} subtitle={sharedConditions(details.map((d) => d.data?.build.testConditions), project.data!.settings)} title="Polarization curves" fileName="cellwright-compare" benchmark={benchmarkForPlot(benchmark.data, { curveIds })} targets={targetLinesFor(targets.data, 'vAtRef', 'V')} />}
          </Panel>
          {ids.length > 0 && (
            <Panel title={asDifference && benchmark.data ? `Metrics at the project reference point, as difference from the benchmark (${benchmark.data.label})` : 'Metrics at the project reference point'} actions={<DifferenceToggle benchmark={benchmark.data} checked={asDifference} onChange={setAsDifference} />}>
              <table className="w-full text-sm">
                <thead className="text-left text-xs text-ink-500"><tr><th className="py-1">Build</th>{COMPARED_METRICS.map((k) => <th key={k}>{asDifference && benchmark.data ? `Δ ${METRICS[k]!.label}` : METRICS[k]!.label}</th>)}</tr></thead>
                <tbody className="divide-y divide-line">
                  {benchmark.data && (
                    <tr className="text-ink-500"><td className="py-1">Benchmark: {benchmark.data.label}</td>{COMPARED_METRICS.map((k) => <td key={k} className="num">{formatMetric(k, benchmark.data!.values[k])}</td>)}</tr>
                  )}
                  {details.map((d) => d.data && (
                    <tr key={d.data.build.id}><td className="py-1 font-medium">{d.data.build.code}</td>{COMPARED_METRICS.map((k) => <td key={k} className="num">{asDifference && benchmark.data ? formatMetricDifference(k, differenceFromBenchmark(benchmark.data, k, d.data!.build.values[k])) : formatMetric(k, d.data!.build.values[k])}</td>)}</tr>
                  ))}
                </tbody>
              </table>
            </Panel>
          )}
        </div>
      </div>
    </div>
  );
}

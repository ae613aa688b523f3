// Compare view: overlay the polarization curves of chosen builds; legend by code and change
// note; export the plot (PNG/SVG) and exactly the points shown (CSV).
import { useMemo } from 'react';
import { useParams, useSearchParams } from 'react-router-dom';
import { useQueries } from '@tanstack/react-query';
import { useProject } from '@/features/projects/api/projects';
import { useBuilds, buildQueryOptions } from '@/features/builds/api/builds';
import { curveQueryOptions } from '@/features/curves/api/curves';
import { PolarizationPlot, type PlotSeries } from '@/features/curves/components/polarization-plot';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Button } from '@/components/ui/button';
import { METRICS, formatMetric } from '@/lib/format';
import { comparedCurvesCsv } from '@/features/curves/components/compare-csv';

export default function ComparePage() {
  const projectId = Number(useParams().projectId);
  const [params, setParams] = useSearchParams();
  const project = useProject(projectId);
  const builds = useBuilds(projectId);
  const ids = (params.get('builds') ?? '').split(',').map(Number).filter((n) => n > 0);
  const details = useQueries({ queries: ids.map((id) => buildQueryOptions(id)) });
  const curveIds = details.map((d) => d.data?.curves.find((c) => c.kind === 'polarization')?.id).filter((x): x is number => x != null);
  const curves = useQueries({ queries: curveIds.map((id) => curveQueryOptions(id)) });

  const series: PlotSeries[] = useMemo(() => curves.flatMap((c) => {
    if (!c.data) return [];
    const d = details.find((x) => x.data?.build.id === c.data!.curve.buildId)?.data;
    return [{ name: `${d?.build.code ?? c.data.curve.buildId}${d?.build.changeNote ? ` (${d.build.changeNote})` : ''}`, points: c.data.points }];
  }), [curves, details]);

  if (project.isLoading || builds.isLoading) return <Loading />;
  if (project.error || builds.error) return <ErrorNote error={project.error ?? builds.error} />;
  const toggle = (id: number) => {
    const next = ids.includes(id) ? ids.filter((x) => x !== id) : [...ids, id];
    setParams(next.length ? { builds: next.join(',') } : {});
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

  return (
    <div className="max-w-7xl">
      <PageHeader eyebrow={project.data!.name} title="Compare polarization curves" subtitle="Pick builds on the left; the overlay, the metrics table and the exports follow your choice. The address keeps the selection, so it can be shared." actions={series.length > 0 ? <Button onClick={exportCsv}>Export CSV</Button> : undefined} />
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
            {ids.length === 0 ? <EmptyState title="Choose builds to overlay">Tick two or more builds with polarization curves.</EmptyState>
              : curves.some((c) => c.isLoading) || details.some((d) => d.isLoading) ? <Loading label="Loading curves…" />
              : <PolarizationPlot series={series} settings={project.data!.settings} conditions={details[0]?.data?.build.testConditions} title="Polarization curves" fileName="cellwright-compare" />}
          </Panel>
          {ids.length > 0 && (
            <Panel title="Metrics at the project reference point">
              <table className="w-full text-sm">
                <thead className="text-left text-xs text-ink-500"><tr><th className="py-1">Build</th>{['vAtRef', 'vAtRefIrFree', 'massActivity', 'peakPower', 'hfr', 'tafelSlope'].map((k) => <th key={k}>{METRICS[k]!.label}</th>)}</tr></thead>
                <tbody className="divide-y divide-line">
                  {details.map((d) => d.data && (
                    <tr key={d.data.build.id}><td className="py-1 font-medium">{d.data.build.code}</td>{['vAtRef', 'vAtRefIrFree', 'massActivity', 'peakPower', 'hfr', 'tafelSlope'].map((k) => <td key={k} className="num">{formatMetric(k, d.data!.build.values[k])}</td>)}</tr>
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

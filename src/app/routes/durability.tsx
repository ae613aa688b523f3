// Durability comparison of a project's builds: rate ± 95 % interval against the typical band,
// hours run, break-in and held conditions, one row per durability or hold log.
import { Link, useParams } from 'react-router-dom';
import { useRef, useState } from 'react';
import { useProject } from '@/features/projects/api/projects';
import { useDurability, type DurabilityRow } from '@/features/durability/api/durability';
import { bandWord } from '@/features/durability/components/durability-controls';
import { LazyPlot } from '@/components/plot/lazy-plot';
import { PlotActions } from '@/components/plot/plot-actions';
import { OKABE_ITO, PLOT_FONT } from '@/components/plot/theme';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { formatNumber } from '@/lib/format';
import { RecordMark } from '@/features/curves/components/record-parts';
import { HoldComparison, SurvivalPanel } from '@/features/durability/components/hold-survival';
import { useTargets } from '@/features/targets/api/targets';
import { targetLinesFor } from '@/features/targets/components/target-lines';
import { PLOT_COLORS } from '@/components/plot/theme';

const fmt = (value: number | null, digits: number, unit: string) => (value == null ? '—' : `${formatNumber(value, digits)} ${unit}`);

/** `targets`: the project's targets on the degradation rate (label, value in µV/h), drawn as dashed lines. */
function WhiskerChart({ rows, band, title, targets = [] }: { rows: DurabilityRow[]; band: { standard: readonly [number, number]; improved: number }; title: string; targets?: { label: string; value: number }[] }) {
  const box = useRef<HTMLDivElement>(null);
  const shown = rows.filter((r) => r.degradationRate != null && r.kind === 'durability');
  const labels = shown.map((r) => `${r.code} · ${r.label.length > 22 ? `${r.label.slice(0, 21)}…` : r.label}`);
  const conditions = [...new Set(shown.map((r) => `${fmt(r.currentDensity, 2, 'A/cm²')}, ${fmt(r.temperatureC, 0, '°C')}`))].join('; ');
  if (shown.length === 0) return <p className="text-sm text-ink-500">No log has a degradation rate yet (see each log’s note in the table below).</p>;
  return (
    <div ref={box}>
      <div className="mb-2 flex justify-end"><PlotActions target={box} fileName={title} label="degradation chart" /></div>
      <LazyPlot
        fileName={title}
        style={{ height: Math.max(260, 120 + 36 * shown.length) }}
        title={title}
        subtitle={`constant-current logs after break-in · ${conditions || 'conditions not logged'} · band: typical HT-PEM (common practice)`}
        data={[{
          type: 'scatter', mode: 'markers', orientation: 'h', name: 'rate ± 95 % interval',
          x: shown.map((r) => r.degradationRate!), y: labels,
          error_x: { type: 'data', symmetric: false, array: shown.map((r) => (r.high ?? r.degradationRate!) - r.degradationRate!), arrayminus: shown.map((r) => r.degradationRate! - (r.low ?? r.degradationRate!)), color: OKABE_ITO[0], thickness: 1.5, width: 4 },
          marker: { color: OKABE_ITO[0], size: 9, symbol: 'circle' },
          hovertemplate: '%{y}<br>%{x:.1f} µV/h<extra></extra>',
        }]}
        layout={{
          xaxis: { title: { text: 'Degradation rate (µV/h, positive = losing voltage)' }, rangemode: 'tozero' },
          yaxis: { autorange: 'reversed', tickfont: { family: PLOT_FONT, size: 11 }, showgrid: false },
          height: Math.max(260, 120 + 36 * shown.length),
          showlegend: false,
          shapes: [
            { type: 'rect', xref: 'x', yref: 'paper', x0: band.standard[0], x1: band.standard[1], y0: 0, y1: 1, fillcolor: 'rgba(213,94,0,0.10)', line: { width: 0 } },
            { type: 'line', xref: 'x', yref: 'paper', x0: band.improved, x1: band.improved, y0: 0, y1: 1, line: { color: '#009E73', width: 1.5, dash: 'dash' } },
            ...targets.map((t) => ({ type: 'line' as const, xref: 'x' as const, yref: 'paper' as const, x0: t.value, x1: t.value, y0: 0, y1: 1, line: { color: PLOT_COLORS.target, width: 2, dash: 'dash' as const } })),
          ],
          annotations: [
            { x: (band.standard[0] + band.standard[1]) / 2, y: 0, xref: 'x', yref: 'paper', yanchor: 'bottom', showarrow: false, text: `standard ${band.standard[0]}–${band.standard[1]} µV/h`, font: { size: 10, color: '#8a3b00' } },
            { x: band.improved, y: 0, xref: 'x', yref: 'paper', yanchor: 'bottom', xanchor: 'left', showarrow: false, text: `improved ≈${band.improved}`, font: { size: 10, color: '#006b4f' } },
            ...targets.map((t) => ({ x: t.value, y: 1, xref: 'x' as const, yref: 'paper' as const, yanchor: 'bottom' as const, xanchor: 'left' as const, showarrow: false, text: `target: ${t.label}`, bgcolor: 'rgba(255,255,255,0.85)', font: { size: 11, color: PLOT_COLORS.target } })),
          ],
        }}
      />
    </div>
  );
}

export default function DurabilityPage() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const durability = useDurability(projectId);
  const targets = useTargets(projectId);
  const [everyLog, setEveryLog] = useState(false);
  if (project.isLoading || durability.isLoading) return <Loading />;
  const error = project.error ?? durability.error;
  if (error || !project.data || !durability.data) return <ErrorNote error={error} />;
  const { typicalBand } = durability.data;
  // each build is compared by its log of record; other logs (repeats, earlier runs) on request
  const others = durability.data.curves.filter((r) => !r.isRecord).length;
  const curves = everyLog ? durability.data.curves : durability.data.curves.filter((r) => r.isRecord);
  return (
    <div className="max-w-7xl">
      <PageHeader
        eyebrow={<Link to={`/projects/${projectId}`} className="hover:underline">{project.data.name}</Link>}
        title="Durability"
        subtitle="Degradation rate of each build’s constant-current log of record after break-in, with its 95 % interval; time to the onset of rapid failure; open-circuit holds compared by their decay."
      />
      {curves.length === 0 ? (
        <EmptyState title="No durability logs yet">Upload a long constant-current log to a build (kind “durability”) to compare builds here.</EmptyState>
      ) : (
        <>
          {others > 0 && (
            <label className="mb-3 inline-flex items-center gap-2 text-sm text-ink-700">
              <input type="checkbox" checked={everyLog} onChange={(e) => setEveryLog(e.target.checked)} />
              Also show the {others} log{others === 1 ? '' : 's'} that {others === 1 ? 'is' : 'are'} not a build’s curve of record
            </label>
          )}
          <Panel title="Rate against the typical band">
            <WhiskerChart rows={curves} band={typicalBand} title={`${project.data.name} · durability`} targets={targetLinesFor(targets.data, 'degradationRate', 'µV/h')} />
          </Panel>
          <Panel title="Builds with durability logs" className="mt-4" bodyClassName="overflow-x-auto">
            <table className="w-full text-sm">
              <thead>
                <tr className="border-b border-line text-left text-xs text-ink-500">
                  <th className="px-3 py-2">Build</th><th className="px-3 py-2">Log</th><th className="px-3 py-2 text-right">Rate (µV/h)</th><th className="px-3 py-2 text-right">95 % interval (µV/h)</th>
                  <th className="px-3 py-2">Against typical</th><th className="px-3 py-2 text-right">Hours run</th><th className="px-3 py-2 text-right">Break-in</th><th className="px-3 py-2 text-right">Loss over fit</th>
                  <th className="px-3 py-2 text-right">j</th><th className="px-3 py-2 text-right">T</th><th className="px-3 py-2 text-right">Interruptions</th><th className="px-3 py-2 text-right">Failure onset</th>
                </tr>
              </thead>
              <tbody>
                {curves.filter((r) => r.kind === 'durability').map((r) => (
                  <tr key={r.curveId} className="border-b border-line/60">
                    <td className="px-3 py-1.5"><Link className="font-medium text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${r.buildId}`}>{r.code}</Link>{r.labName && <div className="text-[11px] text-ink-500">{r.labName}</div>}</td>
                    <td className="px-3 py-1.5 text-xs">{r.kind === 'hold' ? 'open-circuit hold · ' : ''}{r.label}{everyLog && r.isRecord && <RecordMark className="ml-1.5" />}</td>
                    <td className="num whitespace-nowrap px-3 py-1.5 text-right">{r.degradationRate == null ? '—' : formatNumber(r.degradationRate, 1)}</td>
                    <td className="num whitespace-nowrap px-3 py-1.5 text-right text-xs">{r.low == null || r.high == null ? '—' : `${formatNumber(r.low, 1)} – ${formatNumber(r.high, 1)}`}</td>
                    <td className="px-3 py-1.5 text-xs">{r.kind === 'hold' ? 'hold (not compared)' : bandWord(r.degradationRate) || (r.note ?? '—')}</td>
                    <td className="num whitespace-nowrap px-3 py-1.5 text-right">{fmt(r.hoursRun, 0, 'h')}</td>
                    <td className="num whitespace-nowrap px-3 py-1.5 text-right">{fmt(r.breakInHours, 0, 'h')}{r.breakInSource === 'user' ? ' (set)' : ''}</td>
                    <td className="num whitespace-nowrap px-3 py-1.5 text-right">{fmt(r.voltageLossMv, 1, 'mV')}</td>
                    <td className="num whitespace-nowrap px-3 py-1.5 text-right">{fmt(r.currentDensity, 2, 'A/cm²')}</td>
                    <td className="num whitespace-nowrap px-3 py-1.5 text-right">{fmt(r.temperatureC, 0, '°C')}</td>
                    <td className="num whitespace-nowrap px-3 py-1.5 text-right">{r.interruptions}</td>
                    <td className="num whitespace-nowrap px-3 py-1.5 text-right" title={r.onsetNote ?? undefined}>{r.onsetHours == null ? 'none found' : fmt(r.onsetHours, 0, 'h')}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </Panel>
          <Panel title="Time to failure onset (accelerated and long tests)" className="mt-4">
            <SurvivalPanel data={durability.data} title={project.data.name} />
          </Panel>
          {curves.some((r) => r.kind === 'hold') && (
            <Panel title="Open-circuit holds" className="mt-4" bodyClassName="overflow-x-auto p-4">
              <HoldComparison rows={curves} projectId={projectId} title={project.data.name} />
            </Panel>
          )}
        </>
      )}
    </div>
  );
}

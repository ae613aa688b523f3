// Durability log: voltage against time, downsampled by the server for the browser; zooming
// fetches finer detail for the visible window. The fit line and break-in period are drawn;
// other logs of the build can be overlaid on the same time axis.
import { useRef, useState } from 'react';
import { useQueries } from '@tanstack/react-query';
import type { CurveSummary } from '@shared/api-types';
import { curveQueryOptions, useCurve } from '../api/curves';
import { LazyPlot } from '@/components/plot/lazy-plot';
import { PlotActions } from '@/components/plot/plot-actions';
import { OKABE_ITO, PLOT_COLORS } from '@/components/plot/theme';
import { Button } from '@/components/ui/button';
import { Loading, ErrorNote } from '@/components/ui/panel';
import { formatNumber } from '@/lib/format';

// overlay colours: Okabe–Ito entries not already used by the log, its fit line and interruptions
const OVERLAY_COLOURS = ['#009E73', '#CC79A7', '#56B4E9', '#000000'];

export function DurabilityPlot({ curve, title, overlays = [] }: { curve: CurveSummary; title: string; overlays?: CurveSummary[] }) {
  const [range, setRange] = useState<{ fromHours?: number; toHours?: number }>({});
  const box = useRef<HTMLDivElement>(null);
  const { data, isLoading, error, isFetching } = useCurve(curve.id, { ...range, maxPoints: 2000 });
  const others = useQueries({ queries: overlays.map((o) => curveQueryOptions(o.id, { ...range, maxPoints: 2000 })) });
  if (isLoading) return <Loading label="Loading the log…" />;
  if (error || !data) return <ErrorNote error={error} />;
  const t = data.points.tHours ?? [];
  const v = data.points.v;
  const s = curve.summary as Record<string, unknown>;
  const rate = curve.metrics.degradationRate ?? null;
  const breakIn = curve.metrics.breakInHours ?? 0;
  const shapes: Partial<Plotly.Shape>[] = [];
  if (breakIn > 0) shapes.push({ type: 'rect', xref: 'x', yref: 'paper', x0: 0, x1: breakIn, y0: 0, y1: 1, fillcolor: 'rgba(86,102,140,0.12)', line: { width: 0 } });
  // interruptions: gaps and restarts shaded, current changes as a band, each labelled by word
  const interruptions = (() => { try { return JSON.parse(String(curve.summary.interruptions ?? '[]')) as { kind: string; startHours: number; endHours: number }[]; } catch { return []; } })();
  const annotations: Partial<Plotly.Annotation>[] = [];
  for (const i of interruptions) {
    const wide = i.endHours - i.startHours > 0;
    shapes.push({ type: wide ? 'rect' : 'line', xref: 'x', yref: 'paper', x0: i.startHours, x1: wide ? i.endHours : i.startHours, y0: 0, y1: 1, fillcolor: 'rgba(230,159,0,0.18)', line: { color: '#E69F00', width: 1, dash: 'dot' } });
    annotations.push({ x: i.startHours, y: 1, xref: 'x', yref: 'paper', text: i.kind, showarrow: false, yanchor: 'top', xanchor: 'left', font: { size: 10, color: '#8a5a00' } });
  }
  if (breakIn > 0) annotations.push({ x: breakIn / 2, y: 0, xref: 'x', yref: 'paper', text: 'break-in', showarrow: false, yanchor: 'bottom', font: { size: 10, color: PLOT_COLORS.muted } });
  // SVG lines, not WebGL: the server sends at most maxPoints, and WebGL is missing on many lab PCs.
  const traces: Plotly.Data[] = [{ x: t, y: v, type: 'scatter', mode: 'lines', name: overlays.length ? `${curve.label || 'cell voltage'}` : 'cell voltage', line: { color: OKABE_ITO[0], width: 1 }, hovertemplate: '%{x:.1f} h<br>%{y:.4f} V<extra></extra>' }];
  others.forEach((o, i) => {
    if (!o.data) return;
    traces.push({ x: o.data.points.tHours ?? [], y: o.data.points.v, type: 'scatter', mode: 'lines', name: overlays[i]!.label || `log ${overlays[i]!.id}`, line: { color: OVERLAY_COLOURS[i % OVERLAY_COLOURS.length], width: 1 }, hovertemplate: '%{x:.1f} h<br>%{y:.4f} V<extra>%{fullData.name}</extra>' });
  });
  const segments = (() => { try { return JSON.parse(String(curve.summary.segments ?? '[]')) as { fromHours: number; toHours: number; startV: number; endV: number }[]; } catch { return []; } })();
  segments.forEach((g, i) => {
    traces.push({ x: [g.fromHours, g.toHours], y: [g.startV, g.endV], type: 'scatter', mode: 'lines', name: 'fit after break-in', showlegend: i === 0, line: { color: OKABE_ITO[3], width: 2, dash: 'dash' } });
  });
  return (
    <div ref={box}>
      <div className="mb-2 flex flex-wrap items-center gap-3 text-sm text-ink-700">
        <span>{data.points.downsampled ? `showing ${t.length.toLocaleString()} of ${data.points.total.toLocaleString()} points (zoom for detail)` : `${data.points.total.toLocaleString()} points`}</span>
        {isFetching && <span className="text-xs text-ink-500">refining…</span>}
        {range.fromHours != null && <Button onClick={() => setRange({})}>Whole run</Button>}
        <span className="ml-auto"><PlotActions target={box} fileName={title} label="durability plot" /></span>
      </div>
      <LazyPlot
        fileName={title}
        data={traces}
        title={title}
        subtitle={`${rate == null ? 'rate not computed' : `${formatNumber(rate, 1)} µV/h after ${formatNumber(breakIn, 0)} h break-in (shaded)`}${typeof s.currentDensity === 'number' ? ` · ${formatNumber(s.currentDensity, 2)} A/cm²` : ''}${typeof s.temperatureC === 'number' ? ` · ${formatNumber(s.temperatureC, 0)} °C` : ''}`}
        onRelayout={(e: Record<string, unknown>) => {
          const a = e['xaxis.range[0]'], b = e['xaxis.range[1]'];
          if (typeof a === 'number' && typeof b === 'number') setRange({ fromHours: Math.max(0, a), toHours: b });
          else if (e['xaxis.autorange']) setRange({});
        }}
        layout={{
          xaxis: { title: { text: 'Time (h)' }, ...(range.fromHours != null && { range: [range.fromHours, range.toHours] }) },
          yaxis: { title: { text: 'Cell voltage (V)' }, tickformat: '.3f' },
          shapes,
          annotations,
        }}
      />
    </div>
  );
}

// The series plot: ln j against 1000/T (Arrhenius) or against ln p (reaction order), one marker
// per build labelled with its code, and the fitted straight line whose slope gives the estimate.
import { useRef } from 'react';
import { LazyPlot } from '@/components/plot/lazy-plot';
import { PlotActions } from '@/components/plot/plot-actions';
import { OKABE_ITO, PLOT_COLORS } from '@/components/plot/theme';
import { formatNumber } from '@/lib/format';
import type { SeriesData } from '../api/run-series';

const KELVIN = 273.15;

export function seriesCsv(data: SeriesData): string {
  const byId = new Map(data.members.map((m) => [m.buildId, m]));
  const head = data.kind === 'arrhenius' ? 'build,temperature_C,inverse_T_per_K,j_A_per_cm2,ln_j' : 'build,pressure_kPa_abs,ln_p,j_A_per_cm2,ln_j';
  const rows = data.points.map((p) => {
    const m = byId.get(p.buildId);
    return [m?.code ?? '', m?.value ?? '', p.x, m?.currentDensity ?? '', p.y].join(',');
  });
  return [head, ...rows].join('\n') + '\n';
}

export function SeriesPlot({ data, subtitle, fileName }: { data: SeriesData; subtitle: string; fileName: string }) {
  const ref = useRef<HTMLElement>(null);
  const arrhenius = data.kind === 'arrhenius';
  const byId = new Map(data.members.map((m) => [m.buildId, m]));
  // Arrhenius x shown as 1000/T for readable ticks
  const scale = arrhenius ? 1000 : 1;
  const xs = data.points.map((p) => p.x * scale);
  const codes = data.points.map((p) => byId.get(p.buildId)?.code ?? '');
  const hover = data.points.map((p) => {
    const m = byId.get(p.buildId);
    const condition = arrhenius ? `${formatNumber(m?.value, 0)} °C (${formatNumber((m?.value ?? 0) + KELVIN, 1)} K)` : `${formatNumber(m?.value, 1)} kPa absolute`;
    return `${m?.code ?? ''}<br>${condition}<br>j = ${formatNumber((m?.currentDensity ?? 0) * 1000, 2)} mA/cm²`;
  });
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  const pad = (hi - lo) * 0.08 || Math.abs(lo) * 0.01 || 0.1;
  const lineX = [lo - pad, hi + pad];
  const lineY = data.fit ? lineX.map((x) => data.fit!.intercept + (data.fit!.slope * x) / scale) : [];
  const xTitle = arrhenius ? '1000/T (1/K)' : 'ln(p / kPa), absolute pressure';
  const yTitle = 'ln(j / A·cm⁻²)';
  const title = arrhenius ? 'Arrhenius plot' : 'Reaction-order plot';
  return (
    <div>
      <figure ref={ref} aria-label={`${title} of ${data.points.length} builds`}>
        <LazyPlot
          fileName={fileName}
          title={title}
          subtitle={subtitle}
          data={[
            {
              type: 'scatter', mode: 'markers+text', x: xs, y: data.points.map((p) => p.y), text: codes, textposition: 'top center',
              marker: { size: 10, color: OKABE_ITO[5], symbol: 'circle' }, name: 'builds', hovertext: hover, hovertemplate: '%{hovertext}<extra></extra>',
            },
            ...(data.fit ? [{ type: 'scatter', mode: 'lines', x: lineX, y: lineY, line: { color: PLOT_COLORS.ink, width: 1.5, dash: 'dash' }, name: 'least-squares line', hoverinfo: 'skip' }] : []),
          ] as never}
          layout={{ xaxis: { title: { text: xTitle }, zeroline: false }, yaxis: { title: { text: yTitle }, zeroline: false }, height: 420, legend: { orientation: 'h', y: -0.2 } } as never}
          style={{ height: 420 }}
        />
      </figure>
      <div className="mt-2 flex items-center justify-end">
        <PlotActions target={ref} fileName={fileName} csv={() => seriesCsv(data)} label={arrhenius ? 'Arrhenius plot' : 'reaction-order plot'} />
      </div>
    </div>
  );
}

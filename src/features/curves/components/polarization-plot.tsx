// Polarization plot: cell voltage (and iR-free voltage) and power density against current
// density, with markers at j_ref and V_ref. Units on every axis, conditions in the subtitle.
import { useRef, useState } from 'react';
import type { CurvePoints, CurveSummary, ProjectSettings, TestConditions } from '@shared/api-types';
import { LazyPlot, OKABE_ITO, exportPlot } from '@/components/plot/lazy-plot';
import { Button } from '@/components/ui/button';

export interface PlotSeries {
  name: string;
  points: CurvePoints;
  color?: string;
}

export function conditionsLine(c: TestConditions | null | undefined, settings: ProjectSettings) {
  const parts = [
    c?.temperatureC != null ? `${c.temperatureC} °C` : null,
    c?.anodeGas && c?.cathodeGas ? `${c.anodeGas}/${c.cathodeGas}` : null,
    c?.backPressureKPa != null ? `${c.backPressureKPa} kPa(g)` : null,
    `j_ref ${settings.refCurrentDensity} A/cm²`,
    `V_ref ${settings.refVoltage} V`,
  ].filter(Boolean);
  return parts.join(' · ');
}

export function PolarizationPlot({ series, settings, conditions, title, fileName }: { series: PlotSeries[]; settings: ProjectSettings; conditions?: TestConditions | null; title: string; fileName: string }) {
  const [irFree, setIrFree] = useState(false);
  const [showPower, setShowPower] = useState(series.length <= 2);
  const box = useRef<HTMLDivElement>(null);
  const hasHfr = series.some((s) => s.points.hfr && s.points.hfr.length);
  const traces: Plotly.Data[] = [];
  series.forEach((s, i) => {
    const color = s.color ?? OKABE_ITO[i % OKABE_ITO.length];
    const j = (s.points.j ?? []).map((x) => x * 1000);
    const v = s.points.v;
    traces.push({ x: j, y: v, type: 'scatter', mode: 'lines+markers', name: showPower || irFree ? `${s.name} V` : s.name, line: { color, width: 2 }, marker: { size: 4, color }, hovertemplate: 'j %{x:.1f} mA/cm²<br>V %{y:.3f} V<extra>%{fullData.name}</extra>' });
    if (irFree && s.points.hfr) {
      const vIr = v.map((vv, k) => vv + (s.points.j![k]! * s.points.hfr![k]!));
      traces.push({ x: j, y: vIr, type: 'scatter', mode: 'lines', name: `${s.name} iR-free V`, line: { color, width: 1.5, dash: 'dash' }, hovertemplate: 'j %{x:.1f} mA/cm²<br>iR-free V %{y:.3f} V<extra>%{fullData.name}</extra>' });
    }
    if (showPower) {
      traces.push({ x: j, y: v.map((vv, k) => vv * s.points.j![k]! * 1000), type: 'scatter', mode: 'lines', yaxis: 'y2', name: `${s.name} power`, line: { color, width: 1.2, dash: 'dot' }, hovertemplate: 'j %{x:.1f} mA/cm²<br>P %{y:.0f} mW/cm²<extra>%{fullData.name}</extra>' });
    }
  });
  const jRef = settings.refCurrentDensity * 1000;
  return (
    <div ref={box}>
      <div className="mb-2 flex flex-wrap items-center gap-3 text-sm">
        <label className="inline-flex items-center gap-1.5">
          <input type="checkbox" checked={irFree} onChange={(e) => setIrFree(e.target.checked)} disabled={!hasHfr} /> iR-free voltage {hasHfr ? '' : '(no HFR in file)'}
        </label>
        <label className="inline-flex items-center gap-1.5">
          <input type="checkbox" checked={showPower} onChange={(e) => setShowPower(e.target.checked)} /> Power density
        </label>
        <span className="ml-auto flex gap-1.5">
          <Button onClick={() => exportPlot(box.current, 'png', fileName)}>PNG</Button>
          <Button onClick={() => exportPlot(box.current, 'svg', fileName)}>SVG</Button>
        </span>
      </div>
      <LazyPlot
        fileName={fileName}
        data={traces}
        style={{ height: 400 + 20 * Math.ceil(traces.length / 2) }}
        layout={{
          legend: { orientation: 'h', y: -0.18, yanchor: 'top', x: 0, font: { size: 11 } },
          title: { text: `${title}<br><span style="font-size:11px;color:#56668c">${conditionsLine(conditions, settings)}</span>` },
          xaxis: { title: { text: 'Current density j (mA/cm²)' }, zeroline: false, gridcolor: '#eeeae2' },
          yaxis: { title: { text: 'Cell voltage V (V)' }, gridcolor: '#eeeae2', rangemode: 'tozero' },
          yaxis2: { title: { text: 'Power density (mW/cm²)' }, overlaying: 'y', side: 'right', showgrid: false, rangemode: 'tozero' },
          shapes: [
            { type: 'line', xref: 'x', yref: 'paper', x0: jRef, x1: jRef, y0: 0, y1: 1, line: { color: '#c06a35', width: 1, dash: 'dash' } },
            { type: 'line', xref: 'paper', yref: 'y', x0: 0, x1: 1, y0: settings.refVoltage, y1: settings.refVoltage, line: { color: '#56668c', width: 1, dash: 'dash' } },
          ],
          annotations: [
            { x: jRef, y: 0, xref: 'x', yref: 'paper', text: ' j_ref', showarrow: false, xanchor: 'left', yanchor: 'bottom', font: { color: '#a9592a', size: 11 } },
            { x: 1, y: settings.refVoltage, xref: 'paper', yref: 'y', text: 'V_ref', showarrow: false, xanchor: 'right', yanchor: 'bottom', font: { color: '#56668c', size: 11 } },
          ],
        }}
      />
    </div>
  );
}

export function curveTitle(c: CurveSummary) {
  return c.label || `${c.kind} curve ${c.id}`;
}

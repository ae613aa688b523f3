// Polarization plot: cell voltage (and iR-free voltage) and power density against current
// density, with markers at j_ref and V_ref. Units on every axis, conditions in the subtitle;
// voltage, iR-free voltage and power differ in colour and in dash, power on a round-ticked right axis.
import { useRef, useState } from 'react';
import type { CurvePoints, CurveSummary, ProjectSettings, TestConditions } from '@shared/api-types';
import { LazyPlot } from '@/components/plot/lazy-plot';
import { PlotActions } from '@/components/plot/plot-actions';
import { OKABE_ITO, PLOT_COLORS, QUANTITY_STYLE, roundAxis, shade } from '@/components/plot/theme';

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

/** The project's benchmark as a plot draws it: a grey dashed curve the reader can hide. */
export interface PlotBenchmark {
  /** e.g. "Benchmark: C-001" or "Benchmark: Round-robin cathode MEA (invented)" */
  name: string;
  points: CurvePoints;
}

/** `targets`: the project's targets on V at j_ref (label, value in V), marked at j_ref. */
export function PolarizationPlot({ series, settings, conditions, title, fileName, subtitle, benchmark, targets = [] }: { series: PlotSeries[]; settings: ProjectSettings; conditions?: TestConditions | null; title: string; fileName: string; subtitle?: string; benchmark?: PlotBenchmark | null; targets?: { label: string; value: number }[] }) {
  const [irFree, setIrFree] = useState(false);
  const [showBenchmark, setShowBenchmark] = useState(true);
  const [showPower, setShowPower] = useState(series.length <= 2);
  const box = useRef<HTMLDivElement>(null);
  const hasHfr = series.some((s) => s.points.hfr && s.points.hfr.length);
  const traces: Plotly.Data[] = [];
  const single = series.length === 1;
  let maxV = 0;
  let maxP = 0;
  series.forEach((s, i) => {
    // one build: each quantity its own colour and dash; several: a colour per build, the
    // quantity told by dash and by a darker (iR-free) or lighter (power) shade of that colour
    const hue = s.color ?? OKABE_ITO[i % OKABE_ITO.length]!;
    const look = single && !s.color
      ? { v: QUANTITY_STYLE.voltage.color, ir: QUANTITY_STYLE.irFree.color, p: QUANTITY_STYLE.power.color }
      : { v: hue, ir: shade(hue, -0.35), p: shade(hue, 0.35) };
    const j = (s.points.j ?? []).map((x) => x * 1000);
    const v = s.points.v;
    const name = (what: string) => (single ? what : `${s.name}: ${what}`);
    for (const x of v) if (x > maxV) maxV = x;
    traces.push({ x: j, y: v, type: 'scatter', mode: 'lines+markers', name: single ? 'cell voltage' : `${s.name}${showPower || irFree ? ': V' : ''}`, legendgroup: single ? undefined : s.name, line: { color: look.v, width: QUANTITY_STYLE.voltage.width, dash: QUANTITY_STYLE.voltage.dash }, marker: { size: 4, color: look.v, symbol: 'circle' }, hovertemplate: 'j %{x:.1f} mA/cm²<br>V %{y:.3f} V<extra>%{fullData.name}</extra>' });
    if (irFree && s.points.hfr) {
      const vIr = v.map((vv, k) => vv + (s.points.j![k]! * s.points.hfr![k]!));
      for (const x of vIr) if (x > maxV) maxV = x;
      traces.push({ x: j, y: vIr, type: 'scatter', mode: 'lines', name: name('iR-free V'), legendgroup: single ? undefined : s.name, line: { color: look.ir, width: QUANTITY_STYLE.irFree.width, dash: QUANTITY_STYLE.irFree.dash }, hovertemplate: 'j %{x:.1f} mA/cm²<br>iR-free V %{y:.3f} V<extra>%{fullData.name}</extra>' });
    }
    if (showPower) {
      const p = v.map((vv, k) => vv * s.points.j![k]! * 1000);
      for (const x of p) if (x > maxP) maxP = x;
      traces.push({ x: j, y: p, type: 'scatter', mode: 'lines', yaxis: 'y2', name: name('power density'), legendgroup: single ? undefined : s.name, line: { color: look.p, width: QUANTITY_STYLE.power.width, dash: QUANTITY_STYLE.power.dash }, hovertemplate: 'j %{x:.1f} mA/cm²<br>P %{y:.0f} mW/cm²<extra>%{fullData.name}</extra>' });
    }
  });
  if (benchmark && showBenchmark && benchmark.points.j?.length) {
    // the benchmark: grey and dashed, voltage only (and its iR-free voltage when shown), never a colour of the builds
    const bj = benchmark.points.j.map((x) => x * 1000);
    const bv = benchmark.points.v;
    for (const x of bv) if (x > maxV) maxV = x;
    traces.push({ x: bj, y: bv, type: 'scatter', mode: 'lines', name: benchmark.name, line: { color: PLOT_COLORS.benchmark, width: 2, dash: 'dash' }, hovertemplate: 'j %{x:.1f} mA/cm²<br>V %{y:.3f} V<extra>%{fullData.name}</extra>' });
    const hfr = benchmark.points.hfr;
    if (irFree && hfr?.length) {
      const bIr = bv.map((vv, k) => vv + benchmark.points.j![k]! * hfr[k]!);
      for (const x of bIr) if (x > maxV) maxV = x;
      traces.push({ x: bj, y: bIr, type: 'scatter', mode: 'lines', name: `${benchmark.name}: iR-free V`, line: { color: PLOT_COLORS.benchmark, width: 1.5, dash: 'dot' }, hovertemplate: 'j %{x:.1f} mA/cm²<br>iR-free V %{y:.3f} V<extra>%{fullData.name}</extra>' });
    }
  }
  const jRef = settings.refCurrentDensity * 1000;
  for (const t of targets) if (t.value > maxV) maxV = t.value;
  let maxJ = jRef;
  for (const s of series) for (const x of s.points.j ?? []) if (x * 1000 > maxJ) maxJ = x * 1000;
  // a target on V at j_ref: a short dashed bar across j_ref, in the target colour, with its words
  const half = maxJ * 0.06;
  const targetShapes = targets.map((t) => ({ type: 'line' as const, xref: 'x' as const, yref: 'y' as const, x0: jRef - half, x1: jRef + half, y0: t.value, y1: t.value, line: { color: PLOT_COLORS.target, width: 2, dash: 'dash' as const } }));
  const targetNotes = targets.map((t) => ({ x: jRef + half, y: t.value, xref: 'x' as const, yref: 'y' as const, text: `target: ${t.label}`, showarrow: false, xanchor: 'left' as const, yanchor: 'middle' as const, bgcolor: 'rgba(255,255,255,0.85)', font: { color: PLOT_COLORS.target, size: 11 } }));
  const vAxis = roundAxis(Math.max(maxV, settings.refVoltage), 6);
  const pAxis = roundAxis(maxP, 5);
  return (
    <div ref={box}>
      <div className="mb-2 flex flex-wrap items-center gap-3 text-sm">
        <label className="inline-flex items-center gap-1.5">
          <input type="checkbox" checked={irFree} onChange={(e) => setIrFree(e.target.checked)} disabled={!hasHfr} /> iR-free voltage {hasHfr ? '' : '(no HFR in file)'}
        </label>
        <label className="inline-flex items-center gap-1.5">
          <input type="checkbox" checked={showPower} onChange={(e) => setShowPower(e.target.checked)} /> Power density
        </label>
        {benchmark && (
          <label className="inline-flex items-center gap-1.5" title={benchmark.name}>
            <input type="checkbox" checked={showBenchmark} onChange={(e) => setShowBenchmark(e.target.checked)} /> Show benchmark
          </label>
        )}
        <span className="ml-auto"><PlotActions target={box} fileName={fileName} label="polarization plot" /></span>
      </div>
      <LazyPlot
        fileName={fileName}
        data={traces}
        style={{ height: 400 + 20 * Math.ceil(traces.length / 2) }}
        title={title}
        subtitle={subtitle ?? conditionsLine(conditions, settings)}
        layout={{
          xaxis: { title: { text: 'Current density j (mA/cm²)' }, zeroline: false, rangemode: 'tozero' },
          yaxis: { title: { text: 'Cell voltage V (V)' }, range: vAxis.range, dtick: vAxis.dtick, tick0: 0 },
          ...(showPower && { yaxis2: { title: { text: 'Power density (mW/cm²)' }, overlaying: 'y', side: 'right', showgrid: false, zeroline: false, range: pAxis.range, dtick: pAxis.dtick, tick0: 0 } }),
          shapes: [
            { type: 'line', xref: 'x', yref: 'paper', x0: jRef, x1: jRef, y0: 0, y1: 1, line: { color: PLOT_COLORS.reference, width: 1, dash: 'dashdot' } },
            { type: 'line', xref: 'paper', yref: 'y', x0: 0, x1: 1, y0: settings.refVoltage, y1: settings.refVoltage, line: { color: PLOT_COLORS.muted, width: 1, dash: 'dashdot' } },
            ...targetShapes,
          ],
          annotations: [
            { x: jRef, y: 0, xref: 'x', yref: 'paper', text: ' j_ref', showarrow: false, xanchor: 'left', yanchor: 'bottom', font: { color: PLOT_COLORS.reference, size: 11 } },
            { x: 1, y: settings.refVoltage, xref: 'paper', yref: 'y', text: 'V_ref', showarrow: false, xanchor: 'right', yanchor: 'bottom', font: { color: PLOT_COLORS.muted, size: 11 } },
            ...targetNotes,
          ],
        }}
      />
    </div>
  );
}

export function curveTitle(c: CurveSummary) {
  return c.label || `${c.kind} curve ${c.id}`;
}

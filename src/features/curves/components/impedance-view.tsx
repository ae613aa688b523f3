// An impedance spectrum on the build page: Nyquist plot (equal axes, −Z″ up) and Bode plots
// (|Z| and phase against frequency) with the fitted circuit drawn over the data, the fit table
// (parameter, value, ±, unit), and the spectrum's HFR beside the polarization curve's HFR.
import { useMemo, useRef } from 'react';
import type { CurvePoints, CurveSummary } from '@shared/api-types';
import { circuitImpedance } from '@shared/impedance';
import type { CircuitKind, CircuitParameters, FittedParameter } from '@shared/impedance';
import { LazyPlot } from '@/components/plot/lazy-plot';
import { PlotActions } from '@/components/plot/plot-actions';
import { OKABE_ITO, PLOT_COLORS } from '@/components/plot/theme';
import { Hint } from '@/components/ui/hint';
import { formatMetric, formatNumber, formatSignificant, METRICS } from '@/lib/format';

/** Agreement expected between the spectrum's HFR and a polarization file's HFR column, Ω·cm². */
export const HFR_AGREEMENT = 0.005;

const DATA = OKABE_ITO[0]!;
const FIT = OKABE_ITO[3]!;

function parse<T>(text: unknown): T | null {
  if (typeof text !== 'string') return null;
  try {
    return JSON.parse(text) as T;
  } catch {
    return null;
  }
}

/** The fitted circuit at 20 points per decade over the fitted range. */
function modelLine(summary: Record<string, unknown>) {
  const params = parse<CircuitParameters>(summary.fitParameters);
  const circuit = summary.circuit as CircuitKind | null;
  const from = Math.min(Number(summary.fitFromHz), Number(summary.fitToHz));
  const to = Math.max(Number(summary.fitFromHz), Number(summary.fitToHz));
  if (!params || !circuit || !(from > 0) || !(to > from)) return null;
  const decades = Math.log10(to / from);
  const n = Math.max(20, Math.round(decades * 20));
  const f = Array.from({ length: n + 1 }, (_, k) => to * 10 ** (-(decades * k) / n));
  try {
    const z = circuitImpedance(circuit, params, f);
    return { f, re: Array.from(z.real), im: Array.from(z.imag) };
  } catch {
    return null;
  }
}

const PARAMETER_DISPLAY: Record<string, { scale: number; unit: string }> = {
  rOhm: { scale: 1000, unit: 'mΩ·cm²' },
  rCt: { scale: 1000, unit: 'mΩ·cm²' },
  cpeQ: { scale: 1000, unit: 'mF·s^(n−1)/cm²' },
  cpeN: { scale: 1, unit: '' },
  sigmaW: { scale: 1000, unit: 'mΩ·cm²·s^(−1/2)' },
};

export function FitTable({ summary }: { summary: Record<string, unknown> }) {
  const rows = parse<FittedParameter[]>(summary.fitTable);
  if (!rows) return <p className="text-sm text-amber-700">No equivalent-circuit fit: {String(summary.fitProblem ?? 'the spectrum could not be fitted')}</p>;
  const confidence = Math.round(Number(summary.fitConfidence ?? 0.95) * 100);
  return (
    <table className="w-full text-sm" aria-label="Equivalent-circuit fit">
      <caption className="mb-1 text-left text-xs text-ink-500">{String(summary.fitMethod ?? '')}</caption>
      <thead className="text-left text-xs text-ink-500">
        <tr><th className="py-1 font-medium">Parameter</th><th className="py-1 text-right font-medium">Value</th><th className="py-1 text-right font-medium">± (1 SE)</th><th className="py-1 pl-3 font-medium">Unit</th></tr>
      </thead>
      <tbody>
        {rows.map((row) => {
          const d = PARAMETER_DISPLAY[row.key] ?? { scale: 1, unit: row.unit };
          return (
            <tr key={row.key} className="border-t border-line">
              <td className="py-1">{row.label}</td>
              <td className="py-1 text-right font-mono tabular-nums">{formatSignificant(row.value * d.scale, 4)}</td>
              <td className="py-1 text-right font-mono tabular-nums">
                {row.atBound ? <span className="text-amber-700">at its bound</span> : row.standardError == null ? '—' : (
                  <Hint hint={`${confidence} % interval ${formatSignificant((row.low ?? Number.NaN) * d.scale, 4)} to ${formatSignificant((row.high ?? Number.NaN) * d.scale, 4)} ${d.unit}`}>{formatSignificant(row.standardError * d.scale, 2)}</Hint>
                )}
              </td>
              <td className="py-1 pl-3 text-xs text-ink-600">{d.unit || 'dimensionless'}</td>
            </tr>
          );
        })}
      </tbody>
      <tfoot>
        <tr><td colSpan={4} className="pt-2 text-xs text-ink-500">
          residual: {formatSignificant(Number(summary.rmsRelativePercent), 2)} % of |Z| (root mean square) · {String(summary.fitPoints ?? '?')} points fitted{Number(summary.fitPointsLeftOut) > 0 ? `, ${String(summary.fitPointsLeftOut)} left out (inductive or outside the range)` : ''}{summary.converged === false ? ' · did not converge' : ''}
        </td></tr>
      </tfoot>
    </table>
  );
}

/** The spectrum's HFR beside the build's polarization HFR, with the difference. */
export function HfrComparison({ curve, polarizationHfr }: { curve: CurveSummary; polarizationHfr: number | null | undefined }) {
  const spectrum = curve.metrics.hfr;
  if (spectrum == null) return null;
  if (polarizationHfr == null) return <p className="text-xs text-ink-500">No HFR column in the build’s polarization curve of record to compare with.</p>;
  const difference = spectrum - polarizationHfr;
  const agrees = Math.abs(difference) <= HFR_AGREEMENT;
  return (
    <div className="rounded-md border border-line px-3 py-2 text-sm" data-testid="hfr-comparison">
      <div className="text-xs text-ink-500">HFR: spectrum vs polarization curve</div>
      <div className="font-mono tabular-nums">{formatMetric('hfr', spectrum)} vs {formatMetric('hfr', polarizationHfr)} · difference {difference >= 0 ? '+' : '−'}{formatNumber(Math.abs(difference) * 1000, 1)} mΩ·cm²</div>
      <div className="mt-0.5 flex items-center gap-1.5 text-xs text-ink-700">
        <span aria-hidden>{agrees ? '●' : '▲'}</span>
        {agrees ? `agree within ${formatNumber(HFR_AGREEMENT * 1000, 0)} mΩ·cm²` : `differ by more than ${formatNumber(HFR_AGREEMENT * 1000, 0)} mΩ·cm²: check the area, the cables and the HFR frequency of the station`}
      </div>
    </div>
  );
}

export function ImpedancePlots({ curve, points, title, fileName }: { curve: CurveSummary; points: CurvePoints; title: string; fileName: string }) {
  const nyquistRef = useRef<HTMLElement>(null);
  const bodeRef = useRef<HTMLElement>(null);
  const summary = curve.summary as Record<string, unknown>;
  const model = useMemo(() => modelLine(summary), [summary]);
  const f = points.frequencyHz ?? [];
  const re = (points.zReal ?? []).map((v) => v * 1000);
  const negIm = (points.zImag ?? []).map((v) => -v * 1000);
  const modulus = f.map((_, k) => Math.hypot(points.zReal![k]!, points.zImag![k]!) * 1000);
  // −phase, so a capacitive arc plots upwards as in the Nyquist plot
  const phase = f.map((_, k) => (-Math.atan2(points.zImag![k]!, points.zReal![k]!) * 180) / Math.PI);
  const hover = f.map((fk) => `${formatSignificant(fk, 3)} Hz`);
  const subtitle = `${curve.label} · Ω·cm² ×1000 (mΩ·cm²) · ${String(summary.circuit ?? 'no fit') === 'charge-transfer-diffusion' ? 'fit: R_Ω + CPE ∥ (R_ct + Warburg)' : 'fit: R_Ω + (R_ct ∥ CPE)'}`;
  const modelRe = model?.re.map((v) => v * 1000) ?? [];
  const modelIm = model?.im.map((v) => -v * 1000) ?? [];
  return (
    <div className="space-y-4">
      <div>
        <figure ref={nyquistRef} aria-label={`Nyquist plot of ${title}`}>
          <LazyPlot
            fileName={`${fileName}-nyquist`}
            title={`${title} · Nyquist`}
            subtitle={subtitle}
            data={[
              { type: 'scatter', mode: 'markers', x: re, y: negIm, name: 'measured', marker: { color: DATA, size: 7, symbol: 'circle-open', line: { width: 1.5 } }, hovertext: hover, hovertemplate: "%{hovertext}<br>Z′ %{x:.1f} mΩ·cm²<br>−Z″ %{y:.1f} mΩ·cm²<extra></extra>" },
              ...(model ? [{ type: 'scatter', mode: 'lines', x: modelRe, y: modelIm, name: 'fitted circuit', line: { color: FIT, width: 2 }, hoverinfo: 'skip' }] : []),
            ] as never}
            layout={{
              xaxis: { title: { text: 'Z′ (mΩ·cm²)' }, zeroline: false },
              // equal axes: a semicircle looks like one
              yaxis: { title: { text: '−Z″ (mΩ·cm²)' }, scaleanchor: 'x', scaleratio: 1, zeroline: true, zerolinecolor: PLOT_COLORS.zero },
              height: 380, legend: { orientation: 'h', y: -0.25 },
            } as never}
            style={{ height: 380 }}
          />
        </figure>
        <div className="mt-1 flex justify-end"><PlotActions target={nyquistRef} fileName={`${fileName}-nyquist`} label="Nyquist plot" /></div>
      </div>
      <div>
        <figure ref={bodeRef} aria-label={`Bode plots of ${title}`}>
          <LazyPlot
            fileName={`${fileName}-bode`}
            title={`${title} · Bode`}
            subtitle="modulus (left axis, circles) and −phase (right axis, triangles) against frequency"
            data={[
              { type: 'scatter', mode: 'markers', x: f, y: modulus, name: '|Z| measured', marker: { color: DATA, size: 6, symbol: 'circle-open' }, hovertemplate: '%{x:.3s} Hz<br>|Z| %{y:.1f} mΩ·cm²<extra></extra>' },
              { type: 'scatter', mode: 'markers', x: f, y: phase, name: '−phase measured', yaxis: 'y2', marker: { color: OKABE_ITO[2], size: 6, symbol: 'triangle-up-open' }, hovertemplate: '%{x:.3s} Hz<br>−phase %{y:.1f}°<extra></extra>' },
              ...(model ? [
                { type: 'scatter', mode: 'lines', x: model.f, y: model.f.map((_, k) => Math.hypot(model.re[k]!, model.im[k]!) * 1000), name: '|Z| fitted', line: { color: FIT, width: 2 }, hoverinfo: 'skip' },
                { type: 'scatter', mode: 'lines', x: model.f, y: model.f.map((_, k) => (-Math.atan2(model.im[k]!, model.re[k]!) * 180) / Math.PI), name: '−phase fitted', yaxis: 'y2', line: { color: FIT, width: 2, dash: 'dot' }, hoverinfo: 'skip' },
              ] : []),
            ] as never}
            layout={{
              xaxis: { title: { text: 'frequency (Hz)' }, type: 'log' },
              yaxis: { title: { text: '|Z| (mΩ·cm²)' }, type: 'log' },
              yaxis2: { title: { text: '−phase (°)' }, overlaying: 'y', side: 'right', zeroline: false, showgrid: false, tickmode: 'auto', nticks: 6 },
              height: 360, legend: { orientation: 'h', y: -0.3 }, margin: { r: 70 },
            } as never}
            style={{ height: 360 }}
          />
        </figure>
        <div className="mt-1 flex justify-end"><PlotActions target={bodeRef} fileName={`${fileName}-bode`} label="Bode plots" /></div>
      </div>
    </div>
  );
}

/** The four impedance metrics with their method on hover. */
export function ImpedanceMetrics({ curve }: { curve: CurveSummary }) {
  const keys = ['hfr', 'rct', 'cpeQ', 'cpeN', ...(curve.metrics.sigmaW != null ? ['sigmaW'] : [])] as const;
  return (
    <div className="grid grid-cols-2 gap-x-6 gap-y-2" role="list" aria-label="Impedance metrics">
      {keys.map((key) => {
        const value = (curve.metrics as unknown as Record<string, number | null | undefined>)[key];
        const note = (curve.metricNotes as Record<string, string | undefined>)[key];
        const method = (curve.method as Record<string, { method: string } | undefined>)[key]?.method ?? 'not computed';
        const label = key === 'hfr' ? 'HFR (spectrum)' : METRICS[key]!.label;
        return (
          <Hint key={key} hint={method} role="listitem">
            <div className="text-xs text-ink-500">{label}</div>
            <div className="num text-[15px] text-ink-950">{value == null ? <span className="text-ink-500">— <span className="sr-only">not available</span></span> : formatMetric(key, value)}</div>
            {note && <div className={`text-[11px] leading-tight ${value == null ? 'text-amber-700' : 'text-ink-500'}`}>{note}</div>}
          </Hint>
        );
      })}
    </div>
  );
}

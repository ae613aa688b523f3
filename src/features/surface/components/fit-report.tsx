// The honest summary of a fit: how much it explains and how well it predicts, its warnings,
// coefficients in coded and actual units, ANOVA with lack of fit, and the two residual plots.
import { useRef } from 'react';
import type { SurfaceResult } from '../api/surface';
import { LazyPlot, OKABE_ITO, exportPlot } from '@/components/plot/lazy-plot';
import { Button } from '@/components/ui/button';
import { displayOf, pValue, show, sig } from './display';

function Stat({ label, value, hint }: { label: string; value: string; hint: string }) {
  return (
    <div className="rounded-md border border-line px-3 py-2" title={hint}>
      <div className="text-xs text-ink-500">{label}</div>
      <div className="num text-base text-ink-900">{value}</div>
    </div>
  );
}

export function FitSummary({ result }: { result: SurfaceResult }) {
  const { fit } = result;
  const d = displayOf(result.response);
  return (
    <div className="flex flex-col gap-3">
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-3 xl:grid-cols-6">
        <Stat label="Runs (distinct)" value={`${fit.n} (${fit.distinctRuns})`} hint="tested and reviewed builds with this response; replicates count as separate runs" />
        <Stat label="R²" value={fit.r2.toFixed(3)} hint="share of the variation the model explains" />
        <Stat label="Adjusted R²" value={fit.adjR2.toFixed(3)} hint="R² penalised for the number of terms" />
        <Stat label="Predicted R²" value={fit.predR2 == null ? 'undefined' : fit.predR2.toFixed(3)} hint="1 − PRESS/SS_total: how well the model predicts a run it has not seen" />
        <Stat label="RMSE" value={show(fit.rmse, d, 1)} hint="residual standard deviation" />
        <Stat label="PRESS" value={fit.press == null ? '—' : `${sig(fit.press * d.scale * d.scale)} ${d.unit}²`} hint={`prediction error sum of squares (${d.unit}²)`} />
      </div>
      {fit.predR2 != null && fit.adjR2 - fit.predR2 > 0.2 && (
        <p role="note" className="rounded-md border border-amber-700/30 bg-amber-100 px-3 py-1.5 text-sm text-amber-700">⚠ Predicted R² is more than 0.2 below adjusted R²: the model may be over-fitted; try fewer terms.</p>
      )}
      {fit.warnings.map((w) => <p key={w} role="note" className="rounded-md border border-amber-700/30 bg-amber-100 px-3 py-1.5 text-sm text-amber-700">⚠ {w}</p>)}
      {result.omittedFactors.length > 0 && <p className="text-sm text-ink-500">Left out: {result.omittedFactors.map((o) => `${o.key} (${o.reason})`).join('; ')}.</p>}
      {result.skipped.length > 0 && (
        <details className="text-sm text-ink-500">
          <summary className="cursor-pointer">{result.skipped.length} tested builds not in the fit</summary>
          <ul className="mt-1">{result.skipped.map((s) => <li key={s.buildId}>{s.code}: {s.reason}</li>)}</ul>
        </details>
      )}
    </div>
  );
}

export function CoefficientTable({ result }: { result: SurfaceResult }) {
  const d = displayOf(result.response);
  const scale = (v: number | null) => (v == null ? null : v * d.scale);
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" aria-label="Coefficients">
        <thead className="text-left text-xs text-ink-700">
          <tr>
            <th className="py-1 pr-2">Term</th>
            <th className="pr-2 text-right">Coded ({d.unit || 'response'})</th>
            <th className="pr-2 text-right">SE</th>
            <th className="pr-2 text-right">t</th>
            <th className="pr-2 text-right">p</th>
            <th className="pr-2 text-right" title="coefficient of the same monomial with factors in their own units">Actual ({d.unit || 'response'} per factor unit)</th>
            <th className="pr-2 text-right">SE (actual)</th>
            <th className="text-right" title="variance inflation factor; above 10 means correlated terms">VIF</th>
          </tr>
        </thead>
        <tbody>
          {result.fit.coefficients.map((c) => (
            <tr key={c.term} className={`border-t border-line ${c.aliased ? 'text-ink-300' : ''}`}>
              <td className="py-1 pr-2 font-medium">{c.term}{c.aliased ? ' (aliased, not estimated)' : ''}</td>
              <td className="num pr-2 text-right">{sig(scale(c.coded))}</td>
              <td className="num pr-2 text-right">{sig(scale(c.codedSE))}</td>
              <td className="num pr-2 text-right">{sig(c.t, 3)}</td>
              <td className={`num pr-2 text-right ${c.p != null && c.p < 0.05 ? 'font-semibold' : ''}`}>{pValue(c.p)}{c.p != null && c.p < 0.05 ? ' *' : ''}</td>
              <td className="num pr-2 text-right">{sig(scale(c.actual))}</td>
              <td className="num pr-2 text-right">{sig(scale(c.actualSE))}</td>
              <td className={`num text-right ${c.vif != null && c.vif > 10 ? 'text-rust-700' : ''}`}>{c.vif == null ? '—' : sig(c.vif, 3)}{c.vif != null && c.vif > 10 ? ' ▲' : ''}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-1 text-xs text-ink-500">* p &lt; 0.05. Coded coefficients are per coded unit (half the factor range); ▲ VIF above 10.</p>
    </div>
  );
}

export function AnovaTable({ result }: { result: SurfaceResult }) {
  const { anova } = result.fit;
  const d = displayOf(result.response);
  const s2 = d.scale * d.scale;
  const rows: { name: string; ss: number; df: number; ms?: number; f?: number | null; p?: number | null; indent?: boolean }[] = [
    { name: 'Model', ...anova.model },
    ...anova.terms.map((t) => ({ name: t.term, ss: t.ss, df: t.df, ms: t.ms, f: t.f, p: t.p, indent: true })),
    { name: 'Residual', ...anova.residual },
    ...(anova.lackOfFit ? [{ name: 'Lack of fit', ...anova.lackOfFit, indent: true }] : []),
    ...(anova.pureError ? [{ name: 'Pure error', ...anova.pureError, indent: true }] : []),
    { name: 'Total (corrected)', ss: anova.total.ss, df: anova.total.df },
  ];
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" aria-label="ANOVA">
        <thead className="text-left text-xs text-ink-700">
          <tr><th className="py-1">Source</th><th className="text-right">SS ({d.unit}²)</th><th className="text-right">df</th><th className="text-right">MS ({d.unit}²)</th><th className="text-right">F</th><th className="text-right">p</th></tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.name} className="border-t border-line">
              <td className={`py-1 ${r.indent ? 'pl-4 text-ink-700' : 'font-medium'}`}>{r.name}</td>
              <td className="num text-right">{sig(r.ss * s2)}</td>
              <td className="num text-right">{r.df}</td>
              <td className="num text-right">{r.ms == null ? '' : sig(r.ms * s2)}</td>
              <td className="num text-right">{r.f === undefined ? '' : sig(r.f, 3)}</td>
              <td className="num text-right">{r.p === undefined ? '' : pValue(r.p)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {!anova.lackOfFit && <p className="mt-1 text-xs text-ink-500">No lack-of-fit test: it needs replicate runs (same settings) and more distinct settings than model terms.</p>}
    </div>
  );
}

export function DiagnosticPlots({ result, subtitle }: { result: SurfaceResult; subtitle: string }) {
  const box = useRef<HTMLDivElement>(null);
  const d = displayOf(result.response);
  const predicted = result.runs.map((r) => r.predicted * d.scale);
  const observed = result.runs.map((r) => r.observed * d.scale);
  const residual = result.runs.map((r) => r.residual * d.scale);
  const text = result.runs.map((r) => r.code);
  const lo = Math.min(...predicted, ...observed);
  const hi = Math.max(...predicted, ...observed);
  const highLeverage = 2 * result.fit.basis.estimated.length / Math.max(1, result.fit.n);
  const symbols = result.runs.map((r) => (r.leverage > highLeverage ? 'diamond' : 'circle'));
  const axisTitle = `${d.label} (${d.unit})`;
  return (
    <div ref={box}>
      <div className="mb-1 flex justify-end gap-1.5">
        <Button onClick={() => exportPlot(box.current, 'png', 'residuals')}>PNG</Button>
        <Button onClick={() => exportPlot(box.current, 'svg', 'residuals')}>SVG</Button>
      </div>
      <div className="grid gap-3 xl:grid-cols-2">
        <LazyPlot
          fileName="residuals-vs-predicted"
          style={{ height: 320 }}
          data={[{ x: predicted, y: residual, text, type: 'scatter', mode: 'markers', name: 'builds (◆ high leverage)', marker: { color: OKABE_ITO[0], size: 8, symbol: symbols }, hovertemplate: '%{text}<br>predicted %{x:.4g}<br>residual %{y:.3g}<extra></extra>' }]}
          layout={{
            title: { text: `Residuals vs predicted<br><span style="font-size:11px;color:#56668c">${subtitle}</span>` },
            xaxis: { title: { text: `Predicted ${axisTitle}` }, gridcolor: '#eeeae2' },
            yaxis: { title: { text: `Residual (${d.unit})` }, gridcolor: '#eeeae2', zeroline: true, zerolinecolor: '#a9b4cc' },
            showlegend: true,
            legend: { orientation: 'h', y: -0.38 },
            margin: { l: 64, r: 24, t: 56, b: 96 },
          }}
        />
        <LazyPlot
          fileName="predicted-vs-observed"
          style={{ height: 320 }}
          data={[
            { x: observed, y: predicted, text, type: 'scatter', mode: 'markers', name: 'builds', marker: { color: OKABE_ITO[1], size: 8, symbol: symbols }, hovertemplate: '%{text}<br>observed %{x:.4g}<br>predicted %{y:.4g}<extra></extra>' },
            { x: [lo, hi], y: [lo, hi], type: 'scatter', mode: 'lines', name: 'predicted = observed', line: { color: '#56668c', dash: 'dash', width: 1 } },
          ]}
          layout={{
            title: { text: `Predicted vs observed<br><span style="font-size:11px;color:#56668c">${subtitle}</span>` },
            xaxis: { title: { text: `Observed ${axisTitle}` }, gridcolor: '#eeeae2' },
            yaxis: { title: { text: `Predicted ${axisTitle}` }, gridcolor: '#eeeae2' },
            legend: { orientation: 'h', y: -0.38 },
            margin: { l: 64, r: 24, t: 56, b: 96 },
          }}
        />
      </div>
    </div>
  );
}

// Contour and 3-D surface over any two continuous factors, the others held where the user sets
// them. Predictions are computed in the browser from the fit's basis, so moving a held value
// redraws at once; observed builds are drawn on top.
import { useMemo, useRef, useState } from 'react';
import type { FactorDef } from '@shared/api-types';
import { predict } from '@shared/doe/model/index';
import type { SurfaceFit } from '@shared/doe/model/index';
import { LazyPlot, exportPlot } from '@/components/plot/lazy-plot';
import { Plot3D } from '@/components/plot/plot-3d';
import { Button } from '@/components/ui/button';
import { Field, Select } from '@/components/ui/field';
import type { SurfaceResult } from '../api/surface';
import { displayOf, show } from './display';

export interface View {
  x: string;
  y: string;
  held: Record<string, number | string>;
}

export function defaultView(factors: FactorDef[]): View {
  const continuous = factors.filter((f) => f.kind === 'continuous');
  const held: Record<string, number | string> = {};
  for (const f of factors) held[f.key] = f.kind === 'continuous' ? ((f.low ?? 0) + (f.high ?? 1)) / 2 : (f.levels ?? [''])[0]!;
  return { x: continuous[0]?.key ?? '', y: continuous[1]?.key ?? continuous[0]?.key ?? '', held };
}

const STEPS = 31;

export function axisValues(f: FactorDef): number[] {
  const low = f.low ?? 0;
  const high = f.high ?? 1;
  return Array.from({ length: STEPS }, (_, i) => low + ((high - low) * i) / (STEPS - 1));
}

/** z[j][i] at x[i], y[j]: a grid of any function of a full factor point. */
export function gridOf(factors: FactorDef[], view: View, value: (point: Record<string, number | string>) => number) {
  const fx = factors.find((f) => f.key === view.x)!;
  const fy = factors.find((f) => f.key === view.y)!;
  const xs = axisValues(fx);
  const ys = axisValues(fy);
  const z = ys.map((yv) => xs.map((xv) => value({ ...view.held, [view.x]: xv, [view.y]: yv })));
  return { xs, ys, z, fx, fy };
}

export function ViewControls({ factors, view, onChange }: { factors: FactorDef[]; view: View; onChange: (v: View) => void }) {
  const continuous = factors.filter((f) => f.kind === 'continuous');
  return (
    <div className="flex flex-col gap-3">
      <div className="grid grid-cols-2 gap-3">
        <Field label="Horizontal axis">
          {(p) => <Select {...p} value={view.x} onChange={(e) => onChange({ ...view, x: e.target.value })}>{continuous.map((f) => <option key={f.key} value={f.key}>{f.label}</option>)}</Select>}
        </Field>
        <Field label="Vertical axis">
          {(p) => <Select {...p} value={view.y} onChange={(e) => onChange({ ...view, y: e.target.value })}>{continuous.map((f) => <option key={f.key} value={f.key}>{f.label}</option>)}</Select>}
        </Field>
      </div>
      <div className="grid grid-cols-1 gap-2 sm:grid-cols-2">
        {factors.filter((f) => f.key !== view.x && f.key !== view.y).map((f) =>
          f.kind === 'continuous' ? (
            <label key={f.key} className="flex flex-col gap-0.5 text-xs text-ink-700">
              <span>Hold {f.label} at <span className="num text-ink-900">{Number(Number(view.held[f.key]).toPrecision(4))} {f.unit}</span></span>
              <input type="range" aria-label={`Hold ${f.label} (${f.unit})`} min={f.low ?? 0} max={f.high ?? 1} step={((f.high ?? 1) - (f.low ?? 0)) / 100} value={Number(view.held[f.key])} onChange={(e) => onChange({ ...view, held: { ...view.held, [f.key]: Number(e.target.value) } })} />
            </label>
          ) : (
            <Field key={f.key} label={`Hold ${f.label} at`}>
              {(p) => <Select {...p} value={String(view.held[f.key])} onChange={(e) => onChange({ ...view, held: { ...view.held, [f.key]: e.target.value } })}>{(f.levels ?? []).map((l) => <option key={l} value={l}>{l}</option>)}</Select>}
            </Field>
          ),
        )}
      </div>
    </div>
  );
}

export function heldLine(factors: FactorDef[], view: View): string {
  return factors
    .filter((f) => f.key !== view.x && f.key !== view.y)
    .map((f) => `${f.label} ${typeof view.held[f.key] === 'number' ? Number((view.held[f.key] as number).toPrecision(4)) : view.held[f.key]}${f.kind === 'continuous' && f.unit ? ` ${f.unit}` : ''}`)
    .join(' · ');
}

export function ContourPanel({ result, view, subtitle }: { result: SurfaceResult; view: View; subtitle: string }) {
  const [mode, setMode] = useState<'contour' | '3d'>('contour');
  const box = useRef<HTMLDivElement>(null);
  const d = displayOf(result.response);
  const fit: SurfaceFit = result.fit;
  const factors = result.factors;
  const ready = view.x && view.y && view.x !== view.y;
  const grid = useMemo(() => (ready ? gridOf(factors, view, (point) => predict(fit, point).value * d.scale) : null), [fit, factors, view, ready, d.scale]);
  if (!grid) return <p className="text-sm text-ink-500">Choose two different continuous factors for the axes.</p>;
  const { xs, ys, z, fx, fy } = grid;
  const runs = result.runs;
  const title = `${d.label} (${d.unit}) predicted<br><span style="font-size:11px;color:#56668c">${[heldLine(factors, view), subtitle].filter(Boolean).join(' · ')}</span>`;
  const xTitle = `${fx.label}${fx.unit ? ` (${fx.unit})` : ''}`;
  const yTitle = `${fy.label}${fy.unit ? ` (${fy.unit})` : ''}`;
  const hover = runs.map((r) => `${r.code}: observed ${show(r.observed, d)}, predicted ${show(r.predicted, d)}`);
  return (
    <div ref={box}>
      <div className="mb-2 flex flex-wrap items-center gap-2 text-sm">
        <div role="radiogroup" aria-label="Plot kind" className="inline-flex overflow-hidden rounded-md border border-line">
          <button type="button" role="radio" aria-checked={mode === 'contour'} onClick={() => setMode('contour')} className={`px-3 py-1 ${mode === 'contour' ? 'bg-ink-800 text-white' : 'bg-white'}`}>Contour</button>
          <button type="button" role="radio" aria-checked={mode === '3d'} onClick={() => setMode('3d')} className={`px-3 py-1 ${mode === '3d' ? 'bg-ink-800 text-white' : 'bg-white'}`}>3-D surface</button>
        </div>
        <span className="ml-auto flex gap-1.5">
          <Button onClick={() => exportPlot(box.current, 'png', `surface-${result.response.key}`)}>PNG</Button>
          <Button onClick={() => exportPlot(box.current, 'svg', `surface-${result.response.key}`)}>SVG</Button>
        </span>
      </div>
      {mode === 'contour' ? (
        <LazyPlot
          fileName={`contour-${result.response.key}`}
          style={{ height: 460 }}
          data={[
            { x: xs, y: ys, z, type: 'contour', colorscale: 'Viridis', contours: { coloring: 'heatmap', showlabels: true, labelfont: { size: 10, color: '#ffffff' } }, colorbar: { title: { text: d.unit } }, hovertemplate: `${fx.label} %{x:.4g}<br>${fy.label} %{y:.4g}<br>${d.label} %{z:.4g} ${d.unit}<extra></extra>`, name: 'predicted' },
            { x: runs.map((r) => r.factors[view.x] as number), y: runs.map((r) => r.factors[view.y] as number), text: hover, type: 'scatter', mode: 'markers', name: 'observed builds', marker: { color: '#ffffff', size: 9, line: { color: '#111a2e', width: 1.5 }, symbol: 'circle' }, hovertemplate: '%{text}<extra></extra>' },
          ]}
          layout={{ title: { text: title }, xaxis: { title: { text: xTitle } }, yaxis: { title: { text: yTitle } } }}
        />
      ) : (
        <Plot3D
          fileName={`surface3d-${result.response.key}`}
          style={{ height: 520 }}
          data={[
            { x: xs, y: ys, z, type: 'surface', colorscale: 'Viridis', opacity: 0.9, colorbar: { title: { text: d.unit } }, name: 'predicted' },
            { x: runs.map((r) => r.factors[view.x] as number), y: runs.map((r) => r.factors[view.y] as number), z: runs.map((r) => r.observed * d.scale), text: hover, type: 'scatter3d', mode: 'markers', name: 'observed builds', marker: { color: '#E69F00', size: 4, line: { color: '#111a2e', width: 1 } }, hovertemplate: '%{text}<extra></extra>' },
          ]}
          layout={{ title: { text: title }, scene: { xaxis: { title: { text: xTitle } }, yaxis: { title: { text: yTitle } }, zaxis: { title: { text: `${d.label} (${d.unit})` } } } }}
        />
      )}
      <p className="mt-1 text-xs text-ink-500">Observed builds are drawn at their own settings; factors not on the axes may differ from the held values, so a point can sit off the surface.</p>
    </div>
  );
}
